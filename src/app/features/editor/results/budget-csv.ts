/**
 * The budget table as CSV through the shared writer: one line per numeric series, SI
 * values, so a spreadsheet can recompute from it.
 */
import { csvText, type CsvTable } from '../../../../../shared/io/csv-writer';
import { exportFileName } from '../../../../../shared/io/export-name';
import type { BudgetTable } from './budget-rows';

export function budgetCsvTable(table: BudgetTable): CsvTable {
  const columns = ['Quantity', 'Unit', ...table.columns.map((c) => `${c.title} (${c.after})`)];
  const rows: CsvTable['rows'] = [];
  for (const line of table.lines) {
    if (line.kind !== 'quantity') continue;
    for (const series of line.csv) rows.push([series.label, series.unit, ...series.values]);
  }
  return { columns, rows };
}

export function budgetCsv(table: BudgetTable): string {
  return csvText(budgetCsvTable(table));
}

/** A CSV file's name: the chain's name, the reference impedance and the table. */
export function csvFileName(chainName: string, content = 'budget', referenceOhm?: number): string {
  return exportFileName({ chainName, referenceOhm, content, extension: 'csv' });
}
