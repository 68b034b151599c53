/**
 * Studies: the longer runs over a saved chain (Monte Carlo yield, tuning across a band, an
 * optimiser). These schemas are the request bodies; the server checks them with zod and the
 * client builds its forms from the same shapes.
 */
import { z } from 'zod';

const finite = (what: string) =>
  z.number({ error: `${what} must be a number` }).refine(Number.isFinite, {
    message: `${what} must be a finite number`,
  });
const positive = (what: string) => finite(what).refine((v) => v > 0, `${what} must be above 0`);

/** Largest number of Monte Carlo trials in one study. */
export const MAX_TRIALS = 10_000;
/** Largest number of dial positions in one band study. */
export const MAX_DIAL_POSITIONS = 201;
/** Largest number of optimiser iterations. */
export const MAX_OPTIMISER_ITERATIONS = 200;

/** A stage value addressed by stage id and parameter key. */
export const valueRefSchema = z.object({
  stageId: z.string().min(1).max(64),
  key: z.string().min(1).max(64),
});
export type ValueRef = z.infer<typeof valueRefSchema>;

export const monteCarloSpecSchema = z.object({
  kind: z.literal('monte-carlo'),
  /** uniform: the ±% is the half-range; normal: the ±% is read as 3σ. */
  distribution: z.enum(['uniform', 'normal']).default('normal'),
  trials: z.number().int().min(2).max(MAX_TRIALS),
  seed: z
    .number()
    .int()
    .min(0)
    .max(2 ** 31 - 1)
    .default(1),
  /** User-level node whose −3 dB width and peak are judged (default: the last node). */
  node: z.number().int().min(0).optional(),
  /** Sweep points per trial (the chain's own when absent). */
  points: z.number().int().min(3).max(100001).optional(),
});
export type MonteCarloSpec = z.infer<typeof monteCarloSpecSchema>;

/** One section of a ganged tuning capacitor (or inductor): value at each end of the dial. */
export const gangMemberSchema = valueRefSchema.extend({
  min: positive('the minimum'),
  max: positive('the maximum'),
});
export type GangMember = z.infer<typeof gangMemberSchema>;

/**
 * The local oscillator's tuned circuit of a superhet, turned by the same gang: its coil, the
 * gang section (same range as the first member unless given), a trimmer across the section
 * and a padder in series with the two (0 = no padder).
 */
export const oscillatorTankSchema = z.object({
  l: positive('the oscillator coil'),
  trimmer: finite('the oscillator trimmer').refine((v) => v >= 0, 'must not be negative'),
  padder: finite('the padder').refine((v) => v >= 0, 'must not be negative'),
  min: positive('the oscillator section minimum').optional(),
  max: positive('the oscillator section maximum').optional(),
});
export type OscillatorTank = z.infer<typeof oscillatorTankSchema>;

export const bandSpecSchema = z.object({
  kind: z.literal('band'),
  /**
   * The members to turn. Absent: the chain's own variable marks (`settings.variables`) of
   * `gangGroup` (default: the first gang marked); given, they override the marks.
   */
  gang: z.array(gangMemberSchema).min(1).max(8).optional(),
  gangGroup: z.string().trim().min(1).max(40).optional(),
  positions: z.number().int().min(2).max(MAX_DIAL_POSITIONS),
  oscillator: oscillatorTankSchema.optional(),
  /** A ganged circuit off the dial by more than this fraction of its bandwidth is flagged. */
  mistrackFraction: z.number().gt(0).max(10).default(0.5),
  /** Sweep points per position (image rejection and −3 dB width). */
  points: z.number().int().min(3).max(20001).default(401),
});
export type BandSpec = z.infer<typeof bandSpecSchema>;

export const optimiserVariableSchema = valueRefSchema.extend({
  min: positive('the lower bound'),
  max: positive('the upper bound'),
});
export type OptimiserVariable = z.infer<typeof optimiserVariableSchema>;

const weight = z.number().gt(0).max(1000).default(1);
export const optimiserGoalSchema = z.discriminatedUnion('kind', [
  /** A tuned circuit (by its stage id) resonating at targetHz. */
  z.object({
    kind: z.literal('resonance'),
    stageId: z.string().min(1),
    targetHz: positive('target'),
    weight,
  }),
  /** −3 dB width at a node. */
  z.object({
    kind: z.literal('bandwidth'),
    node: z.number().int().min(0),
    targetHz: positive('target'),
    weight,
  }),
  /** Return loss at the chain's input at least minDb over startHz…stopHz. */
  z.object({
    kind: z.literal('return-loss'),
    startHz: positive('start'),
    stopHz: positive('stop'),
    minDb: finite('minimum'),
    weight,
  }),
  z.object({ kind: z.literal('noise-figure'), maxDb: finite('maximum'), weight }),
  z.object({ kind: z.literal('gain'), targetDb: finite('target'), weight }),
  z.object({ kind: z.literal('image-rejection'), minDb: finite('minimum'), weight }),
  /** Peak-to-peak ripple of the response at a node over startHz…stopHz at most maxDb. */
  z.object({
    kind: z.literal('ripple'),
    node: z.number().int().min(0),
    startHz: positive('start'),
    stopHz: positive('stop'),
    maxDb: z.number().min(0),
    weight,
  }),
]);
export type OptimiserGoal = z.infer<typeof optimiserGoalSchema>;

export const optimiserSpecSchema = z.object({
  kind: z.literal('optimiser'),
  variables: z.array(optimiserVariableSchema).min(1).max(12),
  goals: z.array(optimiserGoalSchema).min(1).max(16),
  maxIterations: z.number().int().min(1).max(MAX_OPTIMISER_ITERATIONS).default(60),
  /** Sweep points per evaluation (the chain's own when absent). */
  points: z.number().int().min(3).max(20001).optional(),
});
export type OptimiserSpec = z.infer<typeof optimiserSpecSchema>;

export const studySpecSchema = z.discriminatedUnion('kind', [
  monteCarloSpecSchema,
  bandSpecSchema,
  optimiserSpecSchema,
]);
export type StudySpec = z.infer<typeof studySpecSchema>;
export type StudySpecInput = z.input<typeof studySpecSchema>;
export type StudyKind = StudySpec['kind'];

export type StudyStatus = 'queued' | 'running' | 'done' | 'failed' | 'cancelled';

/** A study as listed for a chain (without its result). */
export interface StudySummaryDto {
  id: string;
  chainId: string;
  /** The chain's saved version the study ran on. */
  chainVersion: number;
  kind: StudyKind;
  status: StudyStatus;
  spec: StudySpec;
  progress: {
    fraction: number;
    done: number;
    total: number;
    interim?: Record<string, unknown>;
  } | null;
  error: string | null;
  /** Runs started (above 1 when a worker stopped and another resumed it). */
  attempts: number;
  cancelRequested: boolean;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  createdBy: { id: string; displayName: string } | null;
}

/** A study with its result (shape by kind: see shared/engine/studies). */
export interface StudyDto extends StudySummaryDto {
  result: unknown;
}
