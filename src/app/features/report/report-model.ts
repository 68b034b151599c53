/**
 * Everything the printable report shows, built from the chain, its analysis and the stage
 * catalogue (when the reader may see it): the strip, the budget split into column groups
 * that fit a page's width, resonators, selectivity, flags, headline figures and cautions.
 * Pure, so it is tested without a browser.
 */
import type {
  AnalysisResult,
  Caution,
  StageCategory,
  StageTypeInfo,
} from '../../../../shared/engine/types';
import type { ChainDocument } from '../../../../shared/schema/chain';
import { chainReferenceOhm } from '../../../../shared/io/export-name';
import { nominal, nominalEngineering } from '../editor/results/format-quantity';
import { type BudgetColumn, type BudgetLine, budgetTable } from '../editor/results/budget-rows';
import {
  type FlagItem,
  type ResonatorRow,
  type SelectivityRow,
  type SummaryItem,
  flagItems,
  offsetHeadings,
  resonatorRows,
  selectivityRows,
  summaryItems,
} from '../editor/results/detail-rows';
import { valueOf, visibleParams } from '../editor/state/stage-factory';
import { CAUTION_DEFER, CAUTION_WORDING, cautionsOf } from '../editor/cautions/caution-words';
import { reportTransmit, type ReportTransmit } from './report-transmit';

/** Node columns per budget table: what fits across A4 or Letter portrait in the report's type. */
export const NODES_PER_PAGE_WIDTH = 5;

export interface StripCell {
  id: string;
  index: number;
  label: string;
  typeLabel: string;
  category: StageCategory;
  values: string[];
  /** Worst flag on the stage, for its mark. */
  worst: 'error' | 'warning' | 'info' | null;
}

export interface BudgetPart {
  columns: BudgetColumn[];
  /** Each line with only this part's cells. */
  lines: {
    key: string;
    kind: 'quantity' | 'group';
    label: string;
    note?: string;
    cells: string[];
  }[];
}

export interface ReportCaution {
  key: string;
  text: string;
}

export interface ReportModel {
  f0: string;
  referenceOhm: number;
  /** The reference impedance as the page writes it, e.g. "50 Ω". */
  reference: string;
  mode: string | null;
  strip: StripCell[];
  budget: BudgetPart[];
  resonators: ResonatorRow[];
  selectivity: SelectivityRow[];
  offsetHeadings: string[];
  flags: FlagItem[];
  summary: SummaryItem[];
  /** A transmit mode's figures (null otherwise). */
  transmit: ReportTransmit | null;
  cautions: ReportCaution[];
}

/** Said on every report, whatever the chain holds. */
export const GENERAL_CAUTION =
  'Before building anything that transmits, carries high voltage or exposes people to RF, check it against local codes and licensed practice.';

const SEVERITY_RANK = { error: 0, warning: 1, info: 2 } as const;

/** Most values a strip cell lists: the card's defining ones, as paper has no tooltips. */
const VALUES_PER_CELL = 5;

/** A stage's defining values with their full names ("Inductance 2.2 mH"). */
export function stageValues(stage: ChainDocument['stages'][number], type: StageTypeInfo): string[] {
  return visibleParams(stage, type)
    .filter((p) => p.kind === 'number' || p.kind === 'enum')
    .slice(0, VALUES_PER_CELL)
    .map((p) => {
      const v = valueOf(stage, p);
      const text =
        typeof v === 'number'
          ? nominalEngineering(v, p.unit) // the user's values: rounded, not padded
          : (p.options?.find((o) => o.value === v)?.label ?? String(v));
      return `${p.label} ${text}`;
    });
}

/** Values of a stage when the catalogue is not at hand (a signed-out reader): as typed. */
function rawValues(doc: ChainDocument, index: number): string[] {
  const stage = doc.stages[index];
  return Object.entries(stage.values)
    .slice(0, VALUES_PER_CELL)
    .map(([key, value]) => {
      const typed = stage.entered?.[key];
      return `${key} ${typed ?? (typeof value === 'number' ? nominal(value) : String(value))}`; // prettier-ignore
    });
}

export function stripCells(
  doc: ChainDocument,
  result: AnalysisResult | null,
  types: ReadonlyMap<string, StageTypeInfo>,
): StripCell[] {
  return doc.stages.map((stage, i) => {
    const type = types.get(stage.type);
    let worst: StripCell['worst'] = null;
    for (const f of result?.flags ?? []) {
      if (f.stageId !== stage.id) continue;
      if (worst === null || SEVERITY_RANK[f.severity] < SEVERITY_RANK[worst]) worst = f.severity;
    }
    return {
      id: stage.id,
      index: i + 1,
      label: stage.label.trim() || type?.label || stage.type,
      typeLabel: type?.label ?? stage.type,
      category: type?.category ?? guessCategory(i, doc.stages.length),
      values: type ? stageValues(stage, type) : rawValues(doc, i),
      worst,
    };
  });
}

/** Without the catalogue: the first stage is a source, the last a load, the rest elements. */
function guessCategory(index: number, count: number): StageCategory {
  if (index === 0) return 'source';
  if (index === count - 1) return 'load';
  return 'element';
}

/** The budget in parts of at most `perPart` node columns, each with every line. */
export function budgetParts(
  columns: BudgetColumn[],
  lines: BudgetLine[],
  perPart = NODES_PER_PAGE_WIDTH,
): BudgetPart[] {
  const parts: BudgetPart[] = [];
  for (let start = 0; start < columns.length; start += perPart) {
    const end = Math.min(start + perPart, columns.length);
    parts.push({
      columns: columns.slice(start, end),
      lines: lines.map((line) =>
        line.kind === 'quantity'
          ? { key: line.key, kind: 'quantity', label: line.label, note: line.note, cells: line.cells.slice(start, end) } // prettier-ignore
          : { key: line.key, kind: 'group', label: line.label, cells: [] },
      ),
    });
  }
  return parts;
}

/**
 * The cautions: the stage types' and a transmit mode's (in the analysis's own words when it
 * gives them), then the general one and the deferral to local codes.
 */
export function reportCautions(
  doc: ChainDocument,
  result: AnalysisResult | null,
  types: ReadonlyMap<string, StageTypeInfo>,
  transmitMode = (doc.modes ?? []).some((m) => m.kind === 'transmit'),
): ReportCaution[] {
  const stageTypes = doc.stages.flatMap((s) => types.get(s.type) ?? []);
  const stated = result?.cautions ?? [];
  const keys = new Set<Caution>([...cautionsOf(stageTypes, transmitMode), ...stated.map((a) => a.caution)]); // prettier-ignore
  const out: ReportCaution[] = cautionsOf(
    [...keys].map((c) => ({ cautions: [c] })),
    false,
  ).map((c) => ({ key: c, text: stated.find((a) => a.caution === c)?.message ?? CAUTION_WORDING[c] })); // prettier-ignore
  out.push({ key: 'general', text: `${GENERAL_CAUTION} ${CAUTION_DEFER}` });
  return out;
}

/**
 * The report of `doc` as the results read it (for a mode: its stages, values and order).
 * `transmitMode` says whether the whole chain has a transmit mode, which a mode's own
 * document no longer shows; its caution then applies in every mode.
 */
export function reportModel(
  doc: ChainDocument,
  result: AnalysisResult | null,
  types: ReadonlyMap<string, StageTypeInfo>,
  transmitMode?: boolean,
): ReportModel {
  const budget = result ? budgetTable(result, doc) : null;
  return {
    // The design frequency and the reference are the user's: "50 Ω", not "50.00 Ω".
    f0: nominalEngineering(doc.settings.f0Hz, 'hertz'),
    referenceOhm: chainReferenceOhm(doc.settings),
    reference: nominalEngineering(chainReferenceOhm(doc.settings), 'ohm'),
    mode: result?.mode?.name ?? null,
    strip: stripCells(doc, result, types),
    budget: budget ? budgetParts(budget.columns, budget.lines) : [],
    resonators: result ? resonatorRows(result, doc) : [],
    selectivity: result ? selectivityRows(result) : [],
    offsetHeadings: offsetHeadings(doc),
    flags: result ? flagItems(result, doc) : [],
    summary: result ? summaryItems(result, doc) : [],
    transmit: reportTransmit(result, doc),
    cautions: reportCautions(doc, result, types, transmitMode),
  };
}
