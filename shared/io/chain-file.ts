/**
 * Reader of an exported chain file (`<name>.chain.json`): the chain document as JSON, format
 * "chainwright-chain". Every refusal is a `ChainFileError` that says where (line and column
 * for text that is not JSON, a JSON path such as `$.stages[2].values.l` for a field the
 * schema refuses) and what to fix. Pure: no framework, no I/O.
 */
import {
  CHAIN_FORMAT,
  CHAIN_FORMAT_VERSION,
  chainDocumentSchema,
  type ChainDocument,
} from '../schema/chain';
import { jsonPath } from '../schema/parse-chain';
import { jsonErrorOffset } from './json-position';

/** Largest chain file read, characters (an ordinary chain is a few kilobytes). */
export const CHAIN_FILE_MAX_CHARS = 512 * 1024;

export type ChainFileErrorKind =
  'too-large' | 'not-json' | 'not-a-chain' | 'unknown-version' | 'invalid';

/** A chain file that cannot be imported as written. */
export class ChainFileError extends Error {
  constructor(
    readonly kind: ChainFileErrorKind,
    message: string,
    /** Where: line and column (1-based) in the text, or a JSON path into the document. */
    readonly where: { line?: number; column?: number; path?: string } = {},
  ) {
    super(message);
    this.name = 'ChainFileError';
  }
}

/**
 * Reads and checks a chain file's text.
 * @param text the file's content
 * @param fileName used in messages only
 * @throws ChainFileError naming the line/column or JSON path and what to change
 */
export function readChainFile(text: string, fileName = 'the chain file'): ChainDocument {
  if (text.length > CHAIN_FILE_MAX_CHARS) {
    throw new ChainFileError(
      'too-large',
      `${fileName} is ${Math.ceil(text.length / 1024)} KiB; a chain file may be at most ` +
        `${CHAIN_FILE_MAX_CHARS / 1024} KiB`,
    );
  }
  const json = parseJson(text.replace(/^\uFEFF/, ''), fileName);
  if (typeof json !== 'object' || json === null || Array.isArray(json)) {
    throw new ChainFileError(
      'not-a-chain',
      `${fileName}: $ holds ${describe(json)}, not a chain; export the chain again from its editor`,
      { path: '$' },
    );
  }
  const obj = json as Record<string, unknown>;
  if (obj.format !== CHAIN_FORMAT) {
    throw new ChainFileError(
      'not-a-chain',
      `${fileName} is not a chain file: $.format is ${describe(obj.format)}, not "${CHAIN_FORMAT}"`,
      { path: '$.format' },
    );
  }
  // A missing version is the schema's default (hand-written files); any other is refused.
  if (obj.formatVersion !== undefined && obj.formatVersion !== CHAIN_FORMAT_VERSION) {
    throw new ChainFileError(
      'unknown-version',
      `${fileName}: $.formatVersion is ${describe(obj.formatVersion)}: format version ${describe(obj.formatVersion)} is not known; this server reads version ` +
        `${CHAIN_FORMAT_VERSION} only (a newer Chainwright may have written it)`,
      { path: '$.formatVersion' },
    );
  }
  const parsed = chainDocumentSchema.safeParse(obj);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const path = jsonPath(issue.path);
    const more = parsed.error.issues.length - 1;
    throw new ChainFileError(
      'invalid',
      `${fileName}: ${path}: ${issue.message}` + (more > 0 ? ` (and ${more} more)` : ''),
      { path },
    );
  }
  return parsed.data;
}

export { jsonPath };

function parseJson(text: string, fileName: string): unknown {
  try {
    return JSON.parse(text);
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    const found = jsonErrorOffset(text);
    const offset = found >= 0 ? found : text.length;
    const { line, column } = lineColumn(text, offset);
    const reason = message
      .replace(/\s*in JSON at position \d+.*$/s, '')
      .replace(/,\s*(\.\.\.)?".*$/s, '');
    throw new ChainFileError(
      'not-json',
      `${fileName}, line ${line}, column ${column}: not valid JSON (${reason}); ` +
        'a chain file is the JSON a chain export wrote',
      { line, column },
    );
  }
}

/** 1-based line and column of a character offset. */
export function lineColumn(text: string, offset: number): { line: number; column: number } {
  let line = 1;
  let start = 0;
  const end = Math.min(offset, text.length);
  for (let i = 0; i < end; i++) {
    if (text.charCodeAt(i) === 10) {
      line++;
      start = i + 1;
    }
  }
  return { line, column: end - start + 1 };
}

function describe(v: unknown): string {
  if (v === undefined) return 'missing';
  if (v === null) return 'null';
  if (Array.isArray(v)) return 'a list';
  if (typeof v === 'string') return JSON.stringify(v.length > 40 ? v.slice(0, 40) + '…' : v);
  if (typeof v === 'object') return 'an object';
  return String(v);
}
