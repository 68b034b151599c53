/**
 * The parts bin's rules: reading an uploaded list (the shared CSV reader, its refusals as
 * 413/422 naming the line) and the list form of a part.
 */
import type { PartDto, PartsPreviewDto, PartsUploadBody } from '../../shared/schema/api';
import {
  PartsCsvError,
  readPartsCsv,
  readPartsHeaders,
  type PartRow,
} from '../../shared/io/parts-csv';
import { HttpError } from '../common/errors';
import type { Part } from './part.entity';

/** A parts list refused: 413 over the size limits, else 422 with the line. */
export class PartsListRefusedError extends HttpError {
  constructor(err: PartsCsvError) {
    super(err.kind === 'too-large' ? 413 : 422, 'invalid-parts-list', err.message, {
      line: err.line,
    });
  }
}

/** Reads an uploaded list, turning the reader's refusal into an HTTP error. */
export function readUpload(body: PartsUploadBody): PartsPreviewDto & { rows: PartRow[] } {
  try {
    const csv = readPartsCsv(body.text, body.mapping);
    return {
      headers: csv.headers,
      mapping: csv.mapping,
      rows: csv.parts,
      parts: csv.parts.map((r) => ({ ...withoutLine(r), line: r.line })),
    };
  } catch (err) {
    if (err instanceof PartsCsvError) throw new PartsListRefusedError(err);
    throw err;
  }
}

/**
 * The preview: as an import would read it, or, when a row cannot be read with this mapping,
 * the columns and the problem (200), so the user can choose other columns. A list whose
 * header cannot be read, or one over the limits, is refused as on import.
 */
export function previewUpload(body: PartsUploadBody): PartsPreviewDto {
  try {
    const { rows: _rows, ...preview } = readUpload(body);
    return preview;
  } catch (err) {
    if (!(err instanceof PartsListRefusedError) || err.status === 413) throw err;
    let head: ReturnType<typeof readPartsHeaders>;
    try {
      head = readPartsHeaders(body.text);
    } catch {
      throw err;
    }
    const line = (err.details as { line: number }).line;
    return {
      headers: head.headers,
      mapping: body.mapping ?? head.mapping,
      parts: [],
      problem: { line, message: err.message },
    };
  }
}

function withoutLine(r: PartRow): Omit<PartDto, 'id'> {
  return {
    partNumber: r.partNumber,
    kind: r.kind,
    value: r.value,
    q: r.q ?? null,
    qFreqHz: r.qFreqHz ?? null,
    tolerancePct: r.tolerancePct ?? null,
    notes: r.notes,
  };
}

/** The list form of a stored part. */
export function toPartDto(part: Part): PartDto {
  return {
    id: part.id,
    partNumber: part.partNumber,
    kind: part.kind,
    value: part.value,
    q: part.q ?? null,
    qFreqHz: part.qFreqHz ?? null,
    tolerancePct: part.tolerancePct ?? null,
    notes: part.notes,
  };
}
