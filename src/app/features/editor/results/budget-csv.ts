/**
 * The budget table as CSV (RFC 4180: comma-separated, CRLF line ends, fields with a
 * comma, quote or line break quoted and inner quotes doubled). One line per numeric
 * series, SI values at full useful precision, so a spreadsheet can recompute from it.
 */
import type { BudgetTable } from './budget-rows';

const LINE_END = '\r\n';

export function csvField(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** Nine significant figures: past the engine's accuracy, short of float noise. */
export function csvNumber(value: number | null): string {
  if (value === null || Number.isNaN(value)) return '';
  if (!Number.isFinite(value)) return value > 0 ? 'Infinity' : '-Infinity';
  return String(Number(value.toPrecision(9)));
}

export function budgetCsv(table: BudgetTable): string {
  const header = ['Quantity', 'Unit', ...table.columns.map((c) => `${c.title} (${c.after})`)];
  const lines = [header.map(csvField).join(',')];
  for (const line of table.lines) {
    if (line.kind !== 'quantity') continue;
    for (const series of line.csv) {
      const fields = [csvField(series.label), csvField(series.unit)];
      fields.push(...series.values.map(csvNumber));
      lines.push(fields.join(','));
    }
  }
  return lines.join(LINE_END) + LINE_END;
}

/** A file name from the chain's name: letters, digits and dashes only. */
export function csvFileName(chainName: string): string {
  const stem = chainName
    .normalize('NFKD')
    .replace(/[^A-Za-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .toLowerCase();
  return `${stem || 'chain'}-budget.csv`;
}
