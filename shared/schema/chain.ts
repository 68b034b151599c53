/**
 * The chain document: the one JSON form of a chain, used by the API, the database
 * (stored as JSONB), the client's editor, the CLI and the `examples/` files.
 *
 * File format "chainwright-chain", formatVersion 1. All values are SI numbers
 * (Hz, ohm, henry, farad, volt, metre, kelvin); levels are in dBm where the key says so.
 * What the user typed (e.g. "22 uH") may be kept in `entered` for display only; the
 * engine reads `values`.
 */
import { z } from 'zod';

export const CHAIN_FORMAT = 'chainwright-chain';
export const CHAIN_FORMAT_VERSION = 1;

const finite = (what: string) =>
  z.number({ error: `${what} must be a number` }).refine(Number.isFinite, {
    message: `${what} must be a finite number (not NaN or Infinity)`,
  });
const positive = (what: string) => finite(what).refine((v) => v > 0, `${what} must be above 0`);

export const paramValueSchema = z.union([z.number(), z.string().max(200), z.boolean()]);

/** A stage value taken from a part in the workspace's parts bin. */
export const partRefSchema = z.object({
  partId: z.string().max(64),
  partNumber: z.string().max(100).default(''),
  /** The part's Q and the frequency it holds at, and its tolerance, as picked. */
  q: z.number().positive().optional(),
  qFreqHz: z.number().positive().optional(),
  tolerancePct: z.number().min(0).max(100).optional(),
});
export type PartRef = z.infer<typeof partRefSchema>;

export const stageInstanceSchema = z.object({
  /** Stable id within the chain (used by flags, comments and the editor). */
  id: z.string().min(1).max(64),
  /** A type from the stage catalogue, e.g. "shunt-lc-tank". */
  type: z.string().min(1).max(64),
  label: z.string().max(120).default(''),
  /** Parameter values in SI units, keyed by the catalogue's parameter keys. */
  values: z.record(z.string(), paramValueSchema).default({}),
  /** What the user typed, for display only (e.g. { l: "22 uH" }). */
  entered: z.record(z.string(), z.string().max(200)).optional(),
  /** Tolerance in percent (± half-range) per value, for Monte Carlo. */
  tolerances: z.record(z.string(), z.number().min(0).max(100)).optional(),
  /** Id of an attached data file (Touchstone, parts list), when the type takes one. */
  dataFileId: z.string().max(64).optional(),
  /**
   * Values picked from the workspace's parts bin, per value key: which part, and the Q and
   * tolerance it brought (copied into the stage's Q value and `tolerances` when picked).
   */
  parts: z.record(z.string(), partRefSchema).optional(),
});
export type StageInstance = z.infer<typeof stageInstanceSchema>;

export const thresholdsSchema = z.object({
  /** Loading ratio Q_attached/Q_detached below which a tank is flagged as a warning. */
  loadingWarn: z.number().gt(0).lt(1).default(0.5),
  /** ...and below which it is flagged as an error. */
  loadingError: z.number().gt(0).lt(1).default(0.2),
  /** A stage is flagged when its input level passes P1dB less this back-off (dB). */
  compressionBackoffDb: z.number().min(0).max(40).default(3),
  /** A designed match is flagged when its return loss at f0 falls below this (dB). */
  matchReturnLossDb: z.number().min(0).max(60).default(15),
  /** A resonator is flagged when tuned off f0 by more than this fraction of its bandwidth. */
  detuneFraction: z.number().gt(0).max(10).default(0.5),
  /**
   * A stated noise figure is flagged when the source a stage really sees differs from the
   * source it was rated at by more than this VSWR.
   */
  noiseMismatchVswr: z.number().gt(1).max(100).default(2),
  /**
   * A matching network or filter is flagged when the loss its parts' finite Q cause at f0
   * exceeds this (dB).
   */
  qBudgetLossDb: z.number().gt(0).max(40).default(1),
});
export type Thresholds = z.infer<typeof thresholdsSchema>;

export const sweepSchema = z
  .object({
    startHz: positive('sweep start'),
    stopHz: positive('sweep stop'),
    points: z.number().int().min(1).max(100001),
    scale: z.enum(['lin', 'log']).default('lin'),
  })
  .refine((s) => s.stopHz >= s.startHz, {
    message: 'sweep stop must not be below sweep start',
    path: ['stopHz'],
  });
export type Sweep = z.infer<typeof sweepSchema>;

/**
 * Receiver-planning inputs (all optional, with defaults): the spurious-response search, a
 * blocker, the tone spacing for off-channel intermodulation, the LO's phase noise, the
 * radio-noise environment at the antenna, and the strongest signal expected there.
 */
export const planningSchema = z.object({
  /** Highest order m + n of mixer products searched. */
  spurMaxOrder: z.number().int().min(1).max(9).default(5),
  /** Rejection a spurious response must reach, dB. */
  spurTargetDb: z.number().min(0).max(200).default(60),
  /** Mixer suppression of each (m, n) product relative to the wanted, dB, indexed [n][m]. */
  mixerSuppressionDb: z.array(z.array(z.number().min(0).max(200)).min(1).max(10)).min(1).max(10).optional(), // prettier-ignore
  /** Tuning range for the spur chart and the IF choice, Hz (default: the sweep's range). */
  tuningStartHz: positive('tuning range start').optional(),
  tuningStopHz: positive('tuning range stop').optional(),
  /** Candidate IFs for the IF choice, Hz (default: common filter frequencies). */
  ifCandidatesHz: z.array(positive('candidate IF')).max(32).optional(),
  /** A strong signal at f0 + offset with this level available at the antenna. */
  blockerOffsetHz: finite('blocker offset').refine((v) => v !== 0, 'blocker offset must not be 0').default(100e3), // prettier-ignore
  blockerLevelDbm: finite('blocker level').default(-30),
  /** Two tones at f0 + spacing and f0 + 2·spacing. */
  toneSpacingHz: positive('tone spacing').default(50e3),
  /** LO phase noise, dBc/Hz at offsets (piecewise log-linear); empty: not stated. */
  loPhaseNoise: z.array(z.object({ offsetHz: positive('phase-noise offset'), dbcHz: z.number().min(-250).max(0) })).max(16).default([]), // prettier-ignore
  /** Radio-noise environment at the antenna (ITU-R P.372 man-made noise). */
  environment: z.enum(['business', 'residential', 'rural', 'quiet-rural', 'none']).default('residential'), // prettier-ignore
  galactic: z.boolean().default(true),
  /** Atmospheric noise figure read off P.372 for the time and place, dB; null: none. */
  atmosphericFaDb: z.number().min(-50).max(250).nullable().default(null),
  /** The strongest signal expected at the antenna, dBm (converter clipping). */
  strongestSignalDbm: finite('strongest signal').default(-20),
});
export type PlanningSettings = z.infer<typeof planningSchema>;

/**
 * What the chain must achieve, judged by studies (Monte Carlo yield). Every field is optional;
 * a target left out is not judged. Frequencies in Hz, levels in dB.
 */
export const chainTargetsSchema = z
  .object({
    /** The response's peak at the judged node must fall inside this window. */
    centreMinHz: positive('lowest centre frequency').optional(),
    centreMaxHz: positive('highest centre frequency').optional(),
    /** −3 dB width at the judged node. */
    minBandwidthHz: positive('minimum bandwidth').optional(),
    maxBandwidthHz: positive('maximum bandwidth').optional(),
    minGainDb: finite('minimum gain').optional(),
    maxNoiseFigureDb: finite('maximum noise figure').optional(),
    minImageRejectionDb: finite('minimum image rejection').optional(),
  })
  .refine((t) => !(t.centreMinHz && t.centreMaxHz && t.centreMaxHz < t.centreMinHz), {
    message: 'the highest centre frequency must not be below the lowest',
    path: ['centreMaxHz'],
  })
  .refine((t) => !(t.minBandwidthHz && t.maxBandwidthHz && t.maxBandwidthHz < t.minBandwidthHz), {
    message: 'the maximum bandwidth must not be below the minimum',
    path: ['maxBandwidthHz'],
  });
export type ChainTargets = z.infer<typeof chainTargetsSchema>;

/**
 * Limits for a transmit mode's analysis (all optional: a figure without its limit is reported
 * but not flagged). Ratings are per stage id: the largest peak voltage across and rms current
 * through any of its parts.
 */
export const transmitSettingsSchema = z.object({
  /** Attenuation the output network must give at 2·f0 and 3·f0, relative to f0, dB. */
  minHarmonicAttenuationDb: z.number().min(0).max(200).optional(),
  /** The most transmit power allowed to reach the receiver's input, dBm. */
  maxReceiverInputDbm: z.number().min(-200).max(100).optional(),
  /** Part ratings by stage id. */
  ratings: z
    .record(
      z.string().max(64),
      z.object({
        maxPeakVolts: positive('rated peak voltage').optional(),
        maxRmsAmps: positive('rated rms current').optional(),
      }),
    )
    .optional(),
});
export type TransmitSettings = z.infer<typeof transmitSettingsSchema>;

/**
 * A value marked variable on the chain: a capacitor or inductor turned between `min` and
 * `max` (a tuning capacitor, a variometer). Marks with the same `gang` turn together on one
 * dial, linearly in value (a straight-line capacitance gang); absent means "main". Band
 * studies and the receiver plan's spur chart tune the chain by them.
 */
export const variableMarkSchema = z
  .object({
    stageId: z.string().min(1).max(64),
    key: z.string().min(1).max(64),
    min: positive('the variable value’s minimum'),
    max: positive('the variable value’s maximum'),
    gang: z.string().trim().min(1).max(40).optional(),
  })
  .refine((m) => m.max > m.min, {
    message: 'the maximum must be above the minimum',
    path: ['max'],
  });
export type VariableMark = z.infer<typeof variableMarkSchema>;
/** The gang a mark without a `gang` belongs to. */
export const MAIN_GANG = 'main';

export const chainSettingsSchema = z.object({
  /** Design frequency f0 in Hz (at the chain's input: RF). */
  f0Hz: positive('design frequency'),
  sweep: sweepSchema,
  /** Reference temperature for noise, K (IEEE T0 = 290 K). */
  temperatureK: positive('temperature').default(290),
  /** Channel (noise) bandwidth target in Hz, for noise floor and sensitivity. */
  channelBandwidthHz: positive('channel bandwidth').default(10e3),
  /** Required SNR at the detector for the sensitivity figure, dB. */
  requiredSnrDb: finite('required SNR').default(10),
  /** Offsets from f0 (Hz) at which cumulative attenuation is reported. */
  offsetsHz: z.array(positive('offset')).max(16).default([]),
  /** Targets for yield studies (optional). */
  targets: chainTargetsSchema.optional(),
  /** Values marked variable (tuning capacitors and their gangs), optional. */
  variables: z.array(variableMarkSchema).max(32).optional(),
  thresholds: thresholdsSchema.default({
    loadingWarn: 0.5,
    loadingError: 0.2,
    compressionBackoffDb: 3,
    matchReturnLossDb: 15,
    detuneFraction: 0.5,
    noiseMismatchVswr: 2,
    qBudgetLossDb: 1,
  }),
  planning: planningSchema.optional(),
  /**
   * Noise temperature of the source (the antenna's own temperature), K, for the system noise
   * temperature; absent: the reference temperature.
   */
  sourceNoiseTemperatureK: positive('source noise temperature').optional(),
  /**
   * Reference resistance for VSWR and return loss at every node, ohm; absent: VSWR and
   * return loss are reported only at the nodes given in `portReferences`.
   */
  referenceOhm: positive('reference resistance').optional(),
  /**
   * Reference resistance per node, ohm, keyed by the id of the stage the node follows (the
   * source's id for the chain input). Overrides `referenceOhm`.
   */
  portReferences: z.record(z.string().max(64), positive('port reference resistance')).optional(),
  /** Limits for the transmit analysis of a transmit mode (optional). */
  transmit: transmitSettingsSchema.optional(),
});
export type ChainSettings = z.infer<typeof chainSettingsSchema>;

/** What a mode is for: receiving, transmitting, or one state of a switched chain (a band). */
export const MODE_KINDS = ['receive', 'transmit', 'state'] as const;
export type ModeKind = (typeof MODE_KINDS)[number];

/**
 * One operating state of a chain (receive, transmit, band 2…). A mode overrides stage values
 * (a switch's state, a capacitor), leaves stages out, or names the stages of its own path in
 * order (the transmit path runs from a power-amplifier source to the antenna's load). A
 * chain without modes has one implicit mode: the chain as written.
 */
export const modeSchema = z.object({
  /** Stable id (a slug: lower-case letters, digits and dashes). */
  id: z
    .string()
    .min(1, 'a mode needs an id')
    .max(40)
    .regex(/^[a-z0-9][a-z0-9-]*$/, 'a mode id uses lower-case letters, digits and dashes only'),
  name: z.string().trim().min(1, 'a mode needs a name').max(80),
  kind: z.enum(MODE_KINDS).default('state'),
  /** Parameter values this mode sets, by stage id and parameter key (SI, like stage values). */
  values: z.record(z.string().max(64), z.record(z.string().max(64), paramValueSchema)).optional(),
  /** Stages left out in this mode, by id. */
  bypass: z.array(z.string().max(64)).max(64).optional(),
  /**
   * Settings this mode changes: its own design frequency and sweep (a band of a band-switched
   * receiver). Absent: the chain's.
   */
  settings: z
    .object({ f0Hz: positive('design frequency').optional(), sweep: sweepSchema.optional() })
    .optional(),
  /** The stages of this mode in order, by id (first a source, last a load); absent: all. */
  path: z.array(z.string().max(64)).min(2, 'a mode path needs at least a source and a load').max(64).optional(), // prettier-ignore
});
export type Mode = z.infer<typeof modeSchema>;
export type ModeInput = z.input<typeof modeSchema>;

/** Stage ids the modes name must exist, and mode ids must be unique (roles: engine). */
function checkModeReferences(
  doc: { stages: { id: string }[]; modes?: Mode[] },
  ctx: z.RefinementCtx,
): void {
  if (!doc.modes) return;
  const stageIds = new Set(doc.stages.map((s) => s.id));
  const seen = new Set<string>();
  doc.modes.forEach((m, i) => {
    if (seen.has(m.id))
      ctx.addIssue({ code: 'custom', path: ['modes', i, 'id'], message: `Mode id "${m.id}" is used twice; give each mode its own id` }); // prettier-ignore
    seen.add(m.id);
    const unknown = (id: string, path: (string | number)[]) => {
      if (!stageIds.has(id))
        ctx.addIssue({ code: 'custom', path: ['modes', i, ...path], message: `Mode "${m.name}" names stage "${id}", which is not in the chain; use the id of one of its stages` }); // prettier-ignore
    };
    Object.keys(m.values ?? {}).forEach((id) => unknown(id, ['values', id]));
    (m.bypass ?? []).forEach((id, k) => unknown(id, ['bypass', k]));
    (m.path ?? []).forEach((id, k) => unknown(id, ['path', k]));
    const inPath = new Set<string>();
    (m.path ?? []).forEach((id, k) => {
      if (inPath.has(id))
        ctx.addIssue({ code: 'custom', path: ['modes', i, 'path', k], message: `Mode "${m.name}" lists stage "${id}" twice in its path; a stage appears once` }); // prettier-ignore
      inPath.add(id);
    });
  });
}

export const chainDocumentSchema = z
  .object({
    format: z.literal(CHAIN_FORMAT).default(CHAIN_FORMAT),
    formatVersion: z.literal(CHAIN_FORMAT_VERSION).default(CHAIN_FORMAT_VERSION),
    name: z.string().trim().min(1, 'a chain needs a name').max(200),
    description: z.string().max(5000).default(''),
    settings: chainSettingsSchema,
    /** Ordered from the source (first) to the load (last). */
    stages: z
      .array(stageInstanceSchema)
      .min(2, 'a chain needs at least a source and a load')
      .max(64),
    /** Operating modes (optional); the first is the one analysed when none is named. */
    modes: z.array(modeSchema).max(16).optional(),
  })
  .superRefine(checkModeReferences);
export type ChainDocument = z.infer<typeof chainDocumentSchema>;
/** The document as written by hand or sent by a client, before defaults are filled. */
export type ChainDocumentInput = z.input<typeof chainDocumentSchema>;
