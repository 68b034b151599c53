/** The API's parts bin: a workspace's inductors and capacitors (re-exported by api.ts). */
import { z } from 'zod';

const partFieldKeys = ['partNumber', 'kind', 'value', 'q', 'qFreq', 'tolerance', 'notes'] as const;

/** Column index per part field, chosen in the upload preview. */
export const partsMappingSchema = z.partialRecord(
  z.enum(partFieldKeys),
  z.number().int().min(0).max(200),
);

/**
 * Body of POST /api/workspaces/:wid/parts/preview and …/parts/import: the CSV's text and,
 * optionally, which column holds which field (absent: guessed from the header names).
 */
export const partsUploadSchema = z.object({
  text: z.string({ error: 'send the CSV\'s content as "text"' }),
  mapping: partsMappingSchema.optional(),
  /** Import only: replace the workspace's whole bin instead of adding to it. */
  replace: z.boolean().optional(),
});
export type PartsUploadBody = z.infer<typeof partsUploadSchema>;

/** One part in a workspace's bin. */
export interface PartDto {
  id: string;
  partNumber: string;
  kind: 'inductor' | 'capacitor';
  /** Henry or farad. */
  value: number;
  q: number | null;
  qFreqHz: number | null;
  tolerancePct: number | null;
  notes: string;
}

/** The upload preview: the columns, the mapping used, and the parts as they would be read. */
export interface PartsPreviewDto {
  headers: string[];
  mapping: Partial<Record<(typeof partFieldKeys)[number], number>>;
  parts: (Omit<PartDto, 'id'> & { line: number })[];
  /** The first line that cannot be read with this mapping (then `parts` is empty). */
  problem?: { line: number; message: string };
}

/** Answer of an import: how many parts were added and the bin now. */
export interface PartsImportDto {
  added: number;
  parts: PartDto[];
}
