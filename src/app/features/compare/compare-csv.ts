/**
 * The comparison tables as CSV: the key figures (numbers, SI or dB, as compared) and the
 * stages that differ (as the table words them), one column per variant.
 */
import type { CsvTable } from '../../../../shared/io/csv-writer';
import type { CompareRow, CompareVariant } from './compare-rows';
import type { StageDiffRow } from './stage-diff';

const BETTER_TEXT = { higher: 'higher is better', lower: 'lower is better', none: '' } as const;

export function compareFiguresCsv(variants: CompareVariant[], rows: CompareRow[]): CsvTable {
  return {
    columns: ['Quantity', 'Reading', ...variants.map((v) => v.name)],
    rows: rows.map((row) => [row.label, BETTER_TEXT[row.better], ...row.cells.map((c) => c.value)]),
  };
}

export function stageDiffCsv(variants: CompareVariant[], rows: StageDiffRow[]): CsvTable {
  return {
    columns: ['Stage', ...variants.map((v) => v.name)],
    rows: rows.map((row) => [row.label, ...row.cells.map((c) => c.text)]),
  };
}
