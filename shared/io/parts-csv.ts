/**
 * Reader of a team's parts list: a CSV of inductors and capacitors (value, Q at a
 * frequency, tolerance, part number, notes) with whatever header names the team uses.
 * The columns are mapped to fields by a guess from the header names, or by a mapping the
 * user chose in the upload preview. Parsed with papaparse (RFC 4180 quoting); the
 * delimiter (comma, semicolon or tab) is read from the header line. Every refusal is a
 * `PartsCsvError` starting "line N:" and saying what to fix.
 */
import Papa from 'papaparse';
import { parseQuantity } from '../units/parse';

/** Largest parts list read, characters. */
export const PARTS_CSV_MAX_CHARS = 512 * 1024;
/** Most parts in one list. */
export const PARTS_CSV_MAX_ROWS = 5000;

export const PART_FIELDS = [
  'partNumber',
  'kind',
  'value',
  'q',
  'qFreq',
  'tolerance',
  'notes',
] as const;
export type PartField = (typeof PART_FIELDS)[number];
/** Column index (0-based, in header order) per field; an absent field is not in the file. */
export type ColumnMapping = Partial<Record<PartField, number>>;
export type PartKind = 'inductor' | 'capacitor';

/** One part as read. */
export interface PartRow {
  partNumber: string;
  kind: PartKind;
  /** Henry or farad. */
  value: number;
  /** Unloaded Q, and the frequency it was stated at (Hz), when given. */
  q?: number;
  qFreqHz?: number;
  /** ± percent. */
  tolerancePct?: number;
  notes: string;
  /** Line of the file the part starts on. */
  line: number;
}

export interface PartsCsv {
  headers: string[];
  mapping: ColumnMapping;
  parts: PartRow[];
}

/** A parts list that cannot be read as written. */
export class PartsCsvError extends Error {
  constructor(
    readonly line: number,
    detail: string,
    readonly kind: 'too-large' | 'invalid' = 'invalid',
  ) {
    super(`line ${line}: ${detail}`);
    this.name = 'PartsCsvError';
  }
}

/** Header spellings per field (lower-case, without spaces, dots, underscores or dashes). */
const SYNONYMS: Record<PartField, string[]> = {
  partNumber: ['partnumber', 'part', 'partno', 'pn', 'mpn', 'sku', 'ordercode', 'item'],
  kind: ['kind', 'type', 'component', 'lc', 'element', 'category'],
  value: ['value', 'val', 'inductance', 'capacitance', 'nominal', 'lc value'],
  q: ['q', 'qmin', 'qfactor', 'quality', 'qualityfactor', 'unloadedq', 'qu'],
  qFreq: ['qat', 'qfreq', 'qfrequency', 'testfrequency', 'testfreq', 'freq', 'frequency', 'fq'],
  tolerance: ['tolerance', 'tol', 'tolpct', 'tolerancepct', 'tolerance%', 'tol%'],
  notes: ['notes', 'note', 'comment', 'comments', 'description', 'desc', 'remarks'],
};

const squash = (h: string) => h.toLowerCase().replace(/[\s._\-()]+/g, '');

/** The mapping the header names suggest; each column is used once. */
export function guessMapping(headers: readonly string[]): ColumnMapping {
  const mapping: ColumnMapping = {};
  const used = new Set<number>();
  for (const field of PART_FIELDS) {
    const names = SYNONYMS[field].map(squash);
    const i = headers.findIndex((h, k) => !used.has(k) && names.includes(squash(h)));
    if (i >= 0) {
      mapping[field] = i;
      used.add(i);
    }
  }
  return mapping;
}

/**
 * Reads a parts list.
 * @param text the CSV's content; its first non-empty line names the columns
 * @param mapping the column of each field; guessed from the header names when absent
 * @throws PartsCsvError "line N: …" saying what to change
 */
export function readPartsCsv(text: string, mapping?: ColumnMapping): PartsCsv {
  if (text.length > PARTS_CSV_MAX_CHARS) {
    throw new PartsCsvError(
      1,
      `the list is ${Math.ceil(text.length / 1024)} KiB; at most ${PARTS_CSV_MAX_CHARS / 1024} KiB is read`,
      'too-large',
    );
  }
  const rows = splitRows(text.replace(/^\uFEFF/, ''));
  if (rows.length === 0) {
    throw new PartsCsvError(1, 'the list is empty; its first line names the columns, e.g. "Part number,Value,Q,Tolerance"'); // prettier-ignore
  }
  const headers = rows[0].cells.map((h) => h.trim());
  const map = mapping ?? guessMapping(headers);
  checkMapping(map, headers, rows[0].line);
  if (rows.length - 1 > PARTS_CSV_MAX_ROWS) {
    throw new PartsCsvError(
      rows[PARTS_CSV_MAX_ROWS + 1].line,
      `a list may hold at most ${PARTS_CSV_MAX_ROWS} parts; split it`,
      'too-large',
    );
  }
  const parts = rows.slice(1).map((row) => readRow(row.cells, row.line, map, headers));
  return { headers, mapping: map, parts };
}

/**
 * The header line alone and the mapping it suggests, so a preview can offer the columns
 * even when a row further down cannot be read yet.
 * @throws PartsCsvError when the text has no readable header line
 */
export function readPartsHeaders(text: string): { headers: string[]; mapping: ColumnMapping } {
  const head = text.replace(/^\uFEFF/, '').slice(0, 64 * 1024);
  const firstRows = splitRows(head.split(/\r\n|\r|\n/).find((l) => l.trim() !== '') ?? '');
  if (firstRows.length === 0) throw new PartsCsvError(1, 'the list is empty; its first line names the columns'); // prettier-ignore
  const headers = firstRows[0].cells.map((h) => h.trim());
  return { headers, mapping: guessMapping(headers) };
}

function checkMapping(map: ColumnMapping, headers: string[], line: number): void {
  for (const [field, col] of Object.entries(map)) {
    if (col === undefined) continue;
    if (!Number.isInteger(col) || col < 0 || col >= headers.length) {
      throw new PartsCsvError(line, `the ${field} column ${col} is not one of the ${headers.length} columns`); // prettier-ignore
    }
  }
  if (map.value === undefined) {
    throw new PartsCsvError(
      line,
      `no column holds the value; name one "Value" or choose it in the preview (columns: ${headers.join(', ').slice(0, 200)})`,
    );
  }
}

/** Rows of cells with the line each starts on (quoted fields may span lines). */
function splitRows(text: string): { cells: string[]; line: number }[] {
  const firstLine = text.split(/\r\n|\r|\n/).find((l) => l.trim() !== '') ?? '';
  const counts = [',', ';', '\t'].map((d) => [d, firstLine.split(d).length] as const);
  const delimiter = counts.reduce((a, b) => (b[1] > a[1] ? b : a))[0];
  const lineStarts = [0];
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (c === '\n' || (c === '\r' && text[i + 1] !== '\n')) lineStarts.push(i + 1);
  }
  const lineAt = (offset: number) => {
    let lo = 0;
    let hi = lineStarts.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (lineStarts[mid] <= offset) lo = mid;
      else hi = mid - 1;
    }
    return lo + 1;
  };
  const blank = /[^\S\r\n]*(?:\r\n|\r|\n)/y;
  const rows: { cells: string[]; line: number }[] = [];
  let cursor = 0;
  let fault: PartsCsvError | undefined;
  Papa.parse<string[]>(text, {
    delimiter,
    skipEmptyLines: 'greedy',
    step(result, parser) {
      // The row starts after the blank lines that follow the previous row's end.
      let start = cursor;
      blank.lastIndex = start;
      while (blank.test(text)) start = blank.lastIndex;
      const line = lineAt(start);
      cursor = Math.max(result.meta.cursor, start);
      if (result.errors.length > 0) {
        fault = new PartsCsvError(line, `${result.errors[0].message}; close every quoted field with a "`); // prettier-ignore
        parser.abort();
        return;
      }
      rows.push({ cells: result.data, line });
    },
  });
  if (fault) throw fault;
  return rows;
}

function readRow(cells: string[], line: number, map: ColumnMapping, headers: string[]): PartRow {
  const cell = (f: PartField) => (map[f] === undefined ? '' : (cells[map[f]!] ?? '').trim());
  const name = (f: PartField) => `"${headers[map[f]!] ?? f}"`;
  const valueText = cell('value');
  if (valueText === '') throw new PartsCsvError(line, `the value (${name('value')}) is empty`);
  const kind = kindOf(cell('kind'), valueText, line);
  const value =
    quickQuantity(valueText, kind === 'inductor' ? 'H' : 'F') ??
    parseQuantity(valueText, kind === 'inductor' ? 'henry' : 'farad');
  if (!value.ok) throw new PartsCsvError(line, `${name('value')} "${clip(valueText)}": ${value.message}`); // prettier-ignore
  if (!(value.value > 0)) throw new PartsCsvError(line, `${name('value')} must be above 0`);
  const part: PartRow = {
    partNumber: cell('partNumber').slice(0, 100),
    kind,
    value: value.value,
    notes: cell('notes').slice(0, 500),
    line,
  };
  const qText = cell('q');
  if (qText !== '') {
    const q = Number(qText);
    if (!(q > 0) || !Number.isFinite(q)) {
      throw new PartsCsvError(line, `${name('q')} "${clip(qText)}" is not a Q above 0`);
    }
    part.q = q;
  }
  const fText = cell('qFreq');
  if (fText !== '') {
    const f = /^[+-]?[\d.]+(e[+-]?\d+)?$/i.test(fText) ? Number(fText) : parseHertz(fText);
    if (!(f > 0) || !Number.isFinite(f)) {
      throw new PartsCsvError(line, `${name('qFreq')} "${clip(fText)}" is not a frequency above 0, e.g. "7 MHz"`); // prettier-ignore
    }
    part.qFreqHz = f;
  }
  const tText = cell('tolerance').replace(/^±\s*/, '').replace(/\s*%$/, '');
  if (tText !== '') {
    const t = Number(tText);
    if (!(t >= 0 && t <= 100)) {
      throw new PartsCsvError(line, `${name('tolerance')} "${clip(cell('tolerance'))}" is not a percentage from 0 to 100`); // prettier-ignore
    }
    part.tolerancePct = t;
  }
  return part;
}

function parseHertz(text: string): number {
  const quick = quickQuantity(text, 'Hz');
  if (quick) return quick.ok ? quick.value : NaN;
  const r = parseQuantity(text, 'hertz');
  return r.ok ? r.value : NaN;
}

const PREFIX: Record<string, number> = { p: 1e-12, n: 1e-9, u: 1e-6, µ: 1e-6, m: 1e-3, k: 1e3, M: 1e6, G: 1e9 }; // prettier-ignore

/**
 * The everyday spellings ("22 uH", "4.7u", "100pF", "7 MHz") read directly; anything else
 * goes to the full quantity parser (expressions, "4p7").
 */
function quickQuantity(
  text: string,
  unit: 'H' | 'F' | 'Hz',
): { ok: true; value: number } | undefined {
  const m = new RegExp(`^(\\d+(?:\\.\\d*)?(?:[eE][+-]?\\d+)?)\\s*([pnuµmkMG]?)(?:${unit})?$`, 'i').exec(text); // prettier-ignore
  if (!m) return undefined;
  // "m" is milli and "M" mega; for hertz nobody means millihertz, so "mhz" is MHz.
  const p = unit === 'Hz' && m[2] === 'm' ? 'M' : m[2];
  const scale = p === '' ? 1 : (PREFIX[p] ?? PREFIX[p.toLowerCase()]);
  const value = Number(m[1]) * scale;
  return Number.isFinite(value) ? { ok: true, value } : undefined;
}

function kindOf(kindText: string, valueText: string, line: number): PartKind {
  const k = kindText.toLowerCase();
  if (/^(l|ind|inductor|inductance|coil|choke)s?$/.test(k)) return 'inductor';
  if (/^(c|cap|capacitor|capacitance|condenser)s?$/.test(k)) return 'capacitor';
  if (k !== '') {
    throw new PartsCsvError(line, `kind "${clip(kindText)}" is neither an inductor (L) nor a capacitor (C)`); // prettier-ignore
  }
  if (/h$/i.test(valueText.trim())) return 'inductor';
  if (/f$/i.test(valueText.trim())) return 'capacitor';
  throw new PartsCsvError(
    line,
    `say whether "${clip(valueText)}" is an inductor or a capacitor: a Kind column (L or C) or a unit (22 uH, 100 pF)`,
  );
}

const clip = (s: string) => (s.length > 40 ? s.slice(0, 40) + '…' : s);
