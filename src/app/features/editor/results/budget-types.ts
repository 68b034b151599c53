/**
 * The shapes of the budget table: its node columns, its quantity lines (display text and
 * the SI series the CSV export carries), and the row specifications they are built from.
 */
import type { NodeReport, StageReport } from '../../../../../shared/engine/types';

export interface BudgetColumn {
  /** Column id for the Material table, e.g. "n2". */
  id: string;
  node: number;
  title: string;
  /** Label of the stage that ends at this node (the source's label at node 0). */
  after: string;
  /** Stage whose output is this node (the source for node 0), for selection. */
  stageId: string | null;
  /** Frequency at this node at f0 (translated after a mixer), Hz. */
  frequencyHz: number;
}

/** One numeric series of the CSV export; values in the stated SI unit, null when unknown. */
export interface CsvSeries {
  label: string;
  unit: string;
  values: (number | null)[];
}

export interface BudgetRow {
  kind: 'quantity';
  key: string;
  label: string;
  /** Short qualifier shown under the label, e.g. "rms" or "stage ending here". */
  note?: string;
  cells: string[];
  csv: CsvSeries[];
}

export interface BudgetGroup {
  kind: 'group';
  key: string;
  label: string;
}

export type BudgetLine = BudgetRow | BudgetGroup;

export interface BudgetTable {
  columns: BudgetColumn[];
  lines: BudgetLine[];
}

export interface Point {
  node: NodeReport;
  /** The two-port that ends at this node; absent at node 0. */
  stage: StageReport | undefined;
}

export interface SeriesSpec {
  label: string;
  unit: string;
  value: (p: Point) => number | null | undefined;
}

export interface RowSpec {
  key: string;
  label: string;
  note?: string;
  display: (p: Point) => string;
  csv: SeriesSpec[];
}
