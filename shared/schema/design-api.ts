/** Request bodies of the design assistants under /api/design (re-exported by api.ts). */
import { z } from 'zod';
import { chainDocumentSchema } from './chain';
import { messageFiguresField } from './chains-api';

const designBase = {
  document: chainDocumentSchema,
  /** The workspace whose data files the document's stages refer to (`dataFileId`). */
  workspaceId: z.uuid({ error: 'workspaceId must be a workspace id' }).optional(),
  /** Significant figures of the answer's texts (2..8; absent: 4). */
  figures: messageFiguresField(z.number).optional(),
};
const idText = (what: string) =>
  z
    .string({ error: `${what} is required` })
    .min(1)
    .max(120);
const hz = (what: string) =>
  z.number({ error: `${what} must be a number of hertz` }).positive(`${what} must be above 0 Hz`);
const complexZ = z.object({ re: z.number(), im: z.number() });
const resonatorRef = z.object({
  stageId: idText('resonator.stageId'),
  label: idText('resonator.label'),
});

/** POST /api/design/tune/candidates: the values that can tune a resonator. */
export const tuneCandidatesRequestSchema = z.object({ ...designBase, resonator: resonatorRef });

/**
 * POST /api/design/tune: solve one value so a resonator sits at the target, or (with
 * `peakNode`) the pass-band peak at that node.
 */
export const tuneRequestSchema = z
  .object({
    ...designBase,
    resonator: resonatorRef.optional(),
    element: z.object({ stageId: idText('element.stageId'), key: idText('element.key') }),
    targetHz: hz('targetHz'),
    peakNode: z.number().int('peakNode must be a whole node number').min(0).max(1000).optional(),
  })
  .refine((b) => b.resonator !== undefined || b.peakNode !== undefined, {
    message: 'name a resonator to tune, or a node (peakNode) whose pass-band peak to tune',
    path: ['resonator'],
  });

/** POST /api/design/tune-pair: a coupled bandpass for centre, bandwidth and shape. */
export const tunePairRequestSchema = z.object({
  ...designBase,
  stageId: idText('stageId'),
  targetHz: hz('targetHz'),
  bandwidthHz: hz('bandwidthHz'),
  kq: z.number().min(0.3).max(3).optional(),
});

/** POST /api/design/match-here: every matching network for the node after a stage. */
export const matchHereRequestSchema = z.object({
  ...designBase,
  afterStageId: idText('afterStageId'),
  fHz: hz('fHz').optional(),
  zSource: complexZ.optional(),
  zLoad: complexZ.optional(),
  q: z.number().positive('q must be above 0').max(1000).optional(),
  k: z.number().gt(0, 'k must be above 0').max(1, 'k cannot exceed 1').optional(),
  parasiticC: z.number().min(0).max(1e-6).optional(),
  partsQ: z
    .object({ ql: z.number().positive().max(1e12), qc: z.number().positive().max(1e12) })
    .partial()
    .optional(),
});

/** POST /api/design/snap: a stage's or the chain's parts snapped to a preferred series. */
export const snapRequestSchema = z.object({
  ...designBase,
  series: z.enum(['E6', 'E12', 'E24', 'E48', 'E96'], {
    error: 'series must be one of E6, E12, E24, E48, E96',
  }),
  stageId: idText('stageId').optional(),
});

const metres = (what: string) =>
  z
    .number({ error: `${what} must be a number of metres` })
    .positive(`${what} must be above 0 m`)
    .max(10);

/** POST /api/design/parts: a stage's parts with coil turns beside each inductance. */
export const partsRequestSchema = z.object({
  ...designBase,
  stageId: idText('stageId'),
  coilForm: z
    .union([
      z.object({ formerDiameterM: metres('formerDiameterM'), lengthM: metres('lengthM') }),
      z.object({
        formerDiameterM: metres('formerDiameterM'),
        wireDiameterM: metres('wireDiameterM'),
        pitchM: metres('pitchM'),
      }),
    ])
    .optional(),
});
