/**
 * The API's chains: the chain list and each chain, revisions, the analysis, data files and
 * exports (re-exported by api.ts, which says how errors are answered).
 */
import { z } from 'zod';
import type { WorkspaceRole } from './account-fields';
import { chainDocumentSchema } from './chain';
import { sweepTracesSchema, type AnalysisDto } from './sweep-columns';
import { sweepPackingSchema } from './sweep-packing';

// ------------------------------------------------------------------ chains
/**
 * Body of POST /api/workspaces/:wid/chains/import: an exported chain file's text. The server
 * parses it so a malformed file is refused with its line and column (422), a file over the
 * size limit with 413.
 */
export const importChainSchema = z.object({
  text: z.string({ error: 'send the chain file\'s content as "text"' }),
  /** The file's name, for messages and the revision note. */
  fileName: z.string().max(200).optional(),
});
export type ImportChainBody = z.infer<typeof importChainSchema>;

export const createChainSchema = z
  .object({
    document: chainDocumentSchema.optional(),
    /** Key of an example from GET /api/examples, instead of a document. */
    fromExample: z.string().max(80).optional(),
    /** Overrides the document's or example's name. */
    name: z.string().trim().min(1).max(200).optional(),
    message: z.string().max(500).optional(),
  })
  .refine((b) => !!b.document !== !!b.fromExample, {
    message: 'send either a document or fromExample, not both and not neither',
  });

export const updateChainSchema = z.object({
  /** The version the client last read; a stale one gives 409 and nothing is written. */
  version: z.number().int().min(1),
  document: chainDocumentSchema,
  message: z.string().max(500).optional(),
});

export const duplicateChainSchema = z.object({
  name: z.string().trim().min(1).max(200).optional(),
  /** Keep the copy linked to its parent for comparison. */
  asVariant: z.boolean().default(false),
  /** Duplicate this document instead of the stored one (used to keep unsaved edits). */
  document: chainDocumentSchema.optional(),
});

export const restoreRevisionSchema = z.object({ version: z.number().int().min(1) });

export const listChainsQuerySchema = z.object({
  q: z.string().max(200).optional(),
  page: z.coerce.number().int().min(0).default(0),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
  sort: z.enum(['name', 'f0Hz', 'stageCount', 'flagCount', 'updatedAt']).default('updatedAt'),
  dir: z.enum(['asc', 'desc']).default('desc'),
});

export interface ChainSummaryDto {
  id: string;
  workspaceId: string;
  name: string;
  description: string;
  f0Hz: number;
  stageCount: number;
  /**
   * Flags (warning + error) found by the analysis at the last save; null when the chain
   * could not be analysed then (unknown).
   */
  flagCount: number | null;
  version: number;
  parentId: string | null;
  /** Chains that name this one as their parent (set by the workspace's chain list only). */
  variantCount?: number;
  createdBy: string;
  updatedBy: string;
  updatedAt: string;
}
/** GET /api/chains/:id/family: the root first, then every chain whose parent is listed. */
export type ChainFamilyDto = ChainSummaryDto[];
export interface ChainListDto {
  items: ChainSummaryDto[];
  total: number;
  page: number;
  pageSize: number;
}
/** Answer of a chain import: the new chain, and stages whose data file stayed behind. */
export interface ChainImportDto {
  chain: ChainDto;
  /** Stages that referred to a data file this workspace does not hold (now detached). */
  detachedDataFiles: { stageId: string; label: string }[];
}

export interface ChainDto extends ChainSummaryDto {
  document: z.infer<typeof chainDocumentSchema>;
  /** The caller's role in the chain's workspace. */
  role: WorkspaceRole;
  createdAt: string;
}
export interface RevisionSummaryDto {
  id: string;
  /** The chain version this revision saved (1, 2, ...). */
  version: number;
  author: string;
  message: string;
  createdAt: string;
}
export interface RevisionDto extends RevisionSummaryDto {
  document: z.infer<typeof chainDocumentSchema>;
}

// ------------------------------------------------------------------ analysis
/** A mode's id as the API takes it (the chain document's mode ids are slugs). */
const modeIdField = z
  .string({ error: "mode must be the id of one of the chain's modes" })
  .min(1, "mode must be the id of one of the chain's modes")
  .max(40, "mode must be the id of one of the chain's modes (at most 40 characters)");

const FIGURES_MESSAGE = 'figures must be a whole number from 2 to 8';

/**
 * The significant figures the engine writes its messages (flag sentences, validation
 * issues) with, as the user's setting offers them: 2 to 8. `number` is `z.number` for a JSON
 * body, `z.coerce.number` for a query string.
 */
export function messageFiguresField(number: typeof z.number | typeof z.coerce.number) {
  return number({ error: FIGURES_MESSAGE })
    .int(FIGURES_MESSAGE)
    .min(2, FIGURES_MESSAGE)
    .max(8, FIGURES_MESSAGE);
}

export const analysisRequestSchema = z.object({
  document: chainDocumentSchema,
  /** Include the frequency sweep in the answer. */
  sweep: z.boolean().default(true),
  /**
   * Add the receiver plan (spurs, strong signals, outside noise, converter): true for the
   * figures, 'full' for the spur chart across the tuning range and the IF choice as well.
   */
  plan: z.union([z.boolean(), z.literal('full')]).default(false),
  /**
   * The sweep traces to send, in columns (`shared/schema/sweep-columns.ts`); default the
   * plotted ones: step-up at every node, input impedance and return loss.
   */
  traces: sweepTracesSchema.optional(),
  /**
   * How the sweep columns travel (`shared/schema/sweep-packing.ts`): `plain` arrays (the
   * default) or `differences`, a third of the size on the wire and read back to the same
   * values.
   */
  sweepPacking: sweepPackingSchema.default('plain'),
  /** Send the per-node sweep traces for these node indices only (default: every node). */
  nodes: z.array(z.number().int().min(0).max(1000)).max(200).optional(),
  /** The workspace whose data files the document's stages refer to (`dataFileId`). */
  workspaceId: z.uuid({ error: 'workspaceId must be a workspace id' }).optional(),
  /** Analyse the chain in this mode (absent: its first mode, or as written without modes). */
  mode: modeIdField.optional(),
  /** Analyse every mode: the answer is a `ModesAnalysisDto` (`mode` is then ignored). */
  allModes: z.boolean().default(false),
  /** Significant figures of the flag sentences and validation issues (default 3). */
  figures: messageFiguresField(z.number).optional(),
});

/** One mode's analysis in an every-mode answer: its result, or why it was refused. */
export type ModeAnalysisDto = {
  /** null: a chain without modes, analysed as written. */
  id: string | null;
  name: string;
  kind: 'receive' | 'transmit' | 'state';
} & ({ ok: true; result: AnalysisDto } | { ok: false; message: string; issues: unknown[] });

/** POST /api/analysis with `allModes`, GET /api/chains/:id/analysis?modes=all. */
export interface ModesAnalysisDto {
  modes: ModeAnalysisDto[];
}

// ------------------------------------------------------------------ data files
/** The kinds of data file: one-port and two-port Touchstone. */
export const DATA_FILE_KINDS = ['s1p', 's2p'] as const;
export type DataFileKind = (typeof DATA_FILE_KINDS)[number];

/** POST /api/workspaces/:wid/files: a Touchstone file as text (JSON, no multipart). */
export const uploadDataFileSchema = z.object({
  name: z
    .string()
    .trim()
    .min(1, 'give the file a name, e.g. "loop-antenna.s1p"')
    .max(200, 'the file name can have at most 200 characters'),
  content: z.string().min(1, 'the file is empty; choose a Touchstone file with data lines'),
});

/** A data file in the workspace's list (without its text). */
export interface DataFileSummaryDto {
  id: string;
  name: string;
  kind: DataFileKind;
  portCount: number;
  pointCount: number;
  fMinHz: number;
  fMaxHz: number;
  uploadedBy: string;
  createdAt: string;
}

/** One data file with its text. */
export interface DataFileDto extends DataFileSummaryDto {
  content: string;
}

// ------------------------------------------------------------------ exports
/** What a chain can be exported as: its chain file, an ngspice netlist, Touchstone 1.1. */
export const EXPORT_FORMATS = ['json', 'spice', 'touchstone'] as const;
export type ExportFormat = (typeof EXPORT_FORMATS)[number];

const exportFormat = z.enum(EXPORT_FORMATS, {
  error: 'format must be one of json, spice, touchstone',
});
const Z0_MESSAGE = 'the reference resistance z0 must be a number of ohms above 0';
/** Touchstone specification versions a chain can be exported in. */
export const TOUCHSTONE_VERSIONS = ['1.1', '2.0'] as const;
export type TouchstoneVersion = (typeof TOUCHSTONE_VERSIONS)[number];
// "2" and "1" are the short forms a query string is likely to carry.
const touchstoneVersion = z
  .enum(['1.1', '2.0', '1', '2'], {
    error: 'version must be 1.1 or 2.0 (the Touchstone specification of the file)',
  })
  .transform((v): TouchstoneVersion => (v.startsWith('2') ? '2.0' : '1.1'));

/** POST /api/export: the document as it is on screen, unsaved edits included. */
export const exportRequestSchema = z.object({
  document: chainDocumentSchema,
  format: exportFormat,
  /** Reference resistance of both Touchstone ports, ohm (default 50; other formats ignore it). */
  z0: z.number(Z0_MESSAGE).positive(Z0_MESSAGE).optional(),
  /** Touchstone version (default 1.1; 2.0 adds `[Reference]` and `[Noise Data]`). */
  version: touchstoneVersion.optional(),
  /** The workspace whose data files the document's stages refer to (`dataFileId`). */
  workspaceId: z.uuid({ error: 'workspaceId must be a workspace id' }).optional(),
  /** Export the chain in this mode (named in the file name and header; absent: first mode). */
  mode: modeIdField.optional(),
});
export type ExportRequest = z.input<typeof exportRequestSchema>;

/** GET /api/chains/:id/export?format=…&z0=…&version=…&mode=… */
export const exportQuerySchema = z.object({
  format: exportFormat,
  z0: z.coerce.number(Z0_MESSAGE).positive(Z0_MESSAGE).optional(),
  version: touchstoneVersion.optional(),
  mode: modeIdField.optional(),
});

export interface ExampleDto {
  key: string;
  name: string;
  description: string;
}
