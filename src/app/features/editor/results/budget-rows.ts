/**
 * The budget table as data: one column per node (a stage boundary, left to right as in
 * the chain strip) and one line per quantity. Stage quantities (gain, noise figure,
 * intercept) sit in the column of the node the stage ends at, so reading down a column
 * gives everything known at that point of the chain.
 */
import type { ChainDocument } from '../../../../../shared/schema/chain';
import type { AnalysisResult } from '../../../../../shared/engine/types';
import { BUDGET_GROUPS } from './budget-row-specs';
import type { BudgetColumn, BudgetLine, BudgetRow, BudgetTable, Point } from './budget-types';
import { engineering } from './format-quantity';

export type {
  BudgetColumn,
  BudgetGroup,
  BudgetLine,
  BudgetRow,
  BudgetTable,
  CsvSeries,
} from './budget-types';

/**
 * Node a stage's selection highlights: its output node for a two-port, node 0 for the
 * source and the last node for the load. Null when the stage is not in the result.
 */
export function nodeOfStage(
  stageId: string | null,
  result: AnalysisResult,
  document: ChainDocument,
): number | null {
  if (stageId === null) return null;
  const report = result.stages.find((s) => s.id === stageId);
  if (report) return report.toNode;
  const position = document.stages.findIndex((s) => s.id === stageId);
  if (position < 0) return null;
  if (position === 0) return 0;
  if (position === document.stages.length - 1) return result.nodes.length - 1;
  return null;
}

export function budgetColumns(result: AnalysisResult, document: ChainDocument): BudgetColumn[] {
  return result.nodes.map((node) => {
    const stage = result.stages.find((s) => s.toNode === node.index);
    const stageId = stage?.id ?? (node.index === 0 ? (document.stages[0]?.id ?? null) : null);
    return {
      id: `n${node.index}`,
      node: node.index,
      title: `Node ${node.index}`,
      after: stage?.label ?? node.after,
      stageId,
      frequencyHz: stage?.fOutHz ?? result.f0Hz,
    };
  });
}

export function budgetTable(result: AnalysisResult, document: ChainDocument): BudgetTable {
  const columns = budgetColumns(result, document);
  const points: Point[] = result.nodes.map((node) => ({
    node,
    stage: result.stages.find((s) => s.toNode === node.index),
  }));
  const frequencyRow: BudgetRow = {
    kind: 'quantity',
    key: 'frequency',
    label: 'Frequency at node',
    note: 'at f0, after any mixer',
    cells: columns.map((c) => engineering(c.frequencyHz, 'hertz')),
    csv: [{ label: 'Frequency at node', unit: 'Hz', values: columns.map((c) => c.frequencyHz) }],
  };
  const lines: BudgetLine[] = [frequencyRow];
  for (const group of BUDGET_GROUPS) {
    lines.push({ kind: 'group', key: `group-${group.key}`, label: group.label });
    for (const spec of group.rows) {
      lines.push({
        kind: 'quantity',
        key: spec.key,
        label: spec.label,
        note: spec.note,
        cells: points.map(spec.display),
        csv: spec.csv.map((series) => ({
          label: series.label,
          unit: series.unit,
          values: points.map((p) => series.value(p) ?? null),
        })),
      });
    }
  }
  return { columns, lines };
}
