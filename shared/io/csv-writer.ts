/**
 * The one CSV writer for every table the product exports (budget, resonators, flags,
 * plan, compare, study results). RFC 4180: comma-separated, CRLF line ends, a field with a
 * comma, quote or line break quoted and its quotes doubled (papaparse's `unparse`).
 * Numbers keep nine significant figures, past the engine's accuracy and short of float
 * noise, so a spreadsheet can recompute from them. Text that a spreadsheet would run as a
 * formula (starting with = + - @ or a tab) gets a leading apostrophe, as OWASP's advice
 * on CSV injection has it; numbers are written as numbers and never escaped.
 */
import Papa from 'papaparse';

/** One cell: text, a number (SI unless the heading says otherwise), or empty. */
export type CsvCell = string | number | boolean | null | undefined;

/** A table to write: its headings, then its rows (each as long as the headings). */
export interface CsvTable {
  columns: string[];
  rows: CsvCell[][];
}

const FORMULA_START = /^[=+\-@\t\r]/;

/** A number as it goes into a CSV cell: 9 significant figures; NaN as empty. */
export function csvNumber(value: number | null | undefined): number | string {
  if (value === null || value === undefined || Number.isNaN(value)) return '';
  if (!Number.isFinite(value)) return value > 0 ? 'Infinity' : '-Infinity';
  return Number(value.toPrecision(9));
}

function cell(value: CsvCell): string | number {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return csvNumber(value);
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  return value;
}

/**
 * Several tables as one CSV text: each table's headings then its rows, a blank line
 * between tables. Rows shorter than the headings are padded so every line of a table has
 * the same number of fields.
 */
export function csvText(...tables: CsvTable[]): string {
  const parts = tables.map((table) => {
    const width = table.columns.length;
    const rows = table.rows.map((row) => {
      const out = row.slice(0, Math.max(width, row.length)).map(cell);
      while (out.length < width) out.push('');
      return out;
    });
    return Papa.unparse(
      { fields: table.columns, data: rows },
      { newline: '\r\n', escapeFormulae: FORMULA_START, quotes: false },
    );
  });
  return parts.join('\r\n\r\n') + '\r\n';
}

/** Rows of text whose first row is the headings (the form the CLI's tables come in). */
export function csvFromRows(rows: string[][]): CsvTable {
  const [columns = [], ...rest] = rows;
  return { columns, rows: rest };
}
