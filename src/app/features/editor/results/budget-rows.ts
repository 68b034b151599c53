/**
 * The budget table as data: one column per node (a stage boundary, left to right as in
 * the chain strip) and one line per quantity. Stage quantities (gain, noise figure,
 * intercept) sit in the column of the node the stage ends at, so reading down a column
 * gives everything known at that point of the chain.
 */
import type { ChainDocument } from '../../../../../shared/schema/chain';
import type { AnalysisResult, NodeReport, StageReport } from '../../../../../shared/engine/types';
import {
  NO_VALUE,
  decibels,
  degrees,
  engineering,
  impedancePolar,
  impedanceRect,
  plain,
  times,
} from './format-quantity';

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

interface Point {
  node: NodeReport;
  /** The two-port that ends at this node; absent at node 0. */
  stage: StageReport | undefined;
}

interface SeriesSpec {
  label: string;
  unit: string;
  value: (p: Point) => number | null | undefined;
}

interface RowSpec {
  key: string;
  label: string;
  note?: string;
  display: (p: Point) => string;
  csv: SeriesSpec[];
}

/** Shown where VSWR and return loss need a reference the user has not chosen. */
const NO_REFERENCE = 'no reference set';

/** A noise temperature, K, to three significant figures. */
const kelvin = (k: number | null | undefined) =>
  k === null || k === undefined || !Number.isFinite(k) ? NO_VALUE : `${plain(k, 1)} K`;

const ofStage =
  (pick: (s: StageReport) => number | null) =>
  (p: Point): number | null =>
    p.stage ? pick(p.stage) : null;

const IMPEDANCE: RowSpec[] = [
  {
    key: 'zin-rect',
    label: 'Z looking in',
    note: 'toward the load, R + jX',
    display: (p) => impedanceRect(p.node.zIn),
    csv: [
      { label: 'Z looking in, R', unit: 'ohm', value: (p) => p.node.zIn.re },
      { label: 'Z looking in, X', unit: 'ohm', value: (p) => p.node.zIn.im },
    ],
  },
  {
    key: 'zin-polar',
    label: 'Z looking in',
    note: '|Z| ∠ phase',
    display: (p) => impedancePolar(p.node.zIn),
    csv: [],
  },
  {
    key: 'zsrc-rect',
    label: 'Z looking back',
    note: 'toward the source, R + jX',
    display: (p) => impedanceRect(p.node.zSrc),
    csv: [
      { label: 'Z looking back, R', unit: 'ohm', value: (p) => p.node.zSrc.re },
      { label: 'Z looking back, X', unit: 'ohm', value: (p) => p.node.zSrc.im },
    ],
  },
  {
    key: 'zsrc-polar',
    label: 'Z looking back',
    note: '|Z| ∠ phase',
    display: (p) => impedancePolar(p.node.zSrc),
    csv: [],
  },
];

const VOLTAGE: RowSpec[] = [
  {
    key: 'stepup',
    label: 'Voltage step-up',
    note: '|V| / EMF',
    display: (p) => `${times(p.node.stepUp)}  (${decibels(p.node.stepUpDb)})`,
    csv: [
      { label: 'Voltage step-up', unit: 'V/V', value: (p) => p.node.stepUp },
      { label: 'Voltage step-up', unit: 'dB', value: (p) => p.node.stepUpDb },
    ],
  },
  {
    key: 'v-rms',
    label: 'Node voltage',
    note: 'rms, at the input level',
    display: (p) => `${engineering(p.node.vRms, 'volt')} rms`,
    csv: [{ label: 'Node voltage, rms', unit: 'V', value: (p) => p.node.vRms }],
  },
  {
    key: 'v-peak',
    label: 'Node voltage',
    note: 'peak (engine phasor)',
    display: (p) => `${engineering(p.node.vPeak, 'volt')} pk ∠${degrees(p.node.phaseDeg)}`,
    csv: [
      { label: 'Node voltage, peak', unit: 'V', value: (p) => p.node.vPeak },
      { label: 'Node voltage, phase', unit: 'deg', value: (p) => p.node.phaseDeg },
    ],
  },
];

const GAIN: RowSpec[] = [
  {
    key: 'gain-stage-v',
    label: 'Stage voltage gain',
    note: 'stage ending here',
    display: (p) => (p.stage ? decibels(p.stage.voltageGainDb) : NO_VALUE),
    csv: [{ label: 'Stage voltage gain', unit: 'dB', value: ofStage((s) => s.voltageGainDb) }],
  },
  {
    key: 'gain-cum-v',
    label: 'Cumulative voltage gain',
    note: 'from the first node',
    display: (p) => (p.stage ? decibels(p.stage.cumulativeVoltageGainDb) : NO_VALUE),
    csv: [
      {
        label: 'Cumulative voltage gain',
        unit: 'dB',
        value: ofStage((s) => s.cumulativeVoltageGainDb),
      },
    ],
  },
  {
    key: 'gain-stage-a',
    label: 'Stage available gain',
    note: 'at the impedances it sees',
    display: (p) => (p.stage ? decibels(p.stage.availableGainDb) : NO_VALUE),
    csv: [{ label: 'Stage available gain', unit: 'dB', value: ofStage((s) => s.availableGainDb) }],
  },
  {
    key: 'gain-stage-t',
    label: 'Stage transducer gain',
    display: (p) => (p.stage ? decibels(p.stage.transducerGainDb) : NO_VALUE),
    csv: [
      { label: 'Stage transducer gain', unit: 'dB', value: ofStage((s) => s.transducerGainDb) },
    ],
  },
  {
    key: 'gain-cum-a',
    label: 'Cumulative available gain',
    display: (p) => (p.stage ? decibels(p.stage.cumulativeGainDb) : NO_VALUE),
    csv: [
      { label: 'Cumulative available gain', unit: 'dB', value: ofStage((s) => s.cumulativeGainDb) },
    ],
  },
  {
    key: 'gain-cum-t',
    label: 'Transducer gain',
    note: 'source to this node',
    display: (p) => decibels(p.node.transducerGainDb),
    csv: [
      {
        label: 'Transducer gain, source to node',
        unit: 'dB',
        value: (p) => p.node.transducerGainDb,
      },
    ],
  },
];

const NOISE: RowSpec[] = [
  {
    key: 'nf-stage',
    label: 'Stage noise figure',
    display: (p) => (p.stage ? decibels(p.stage.noiseFigureDb) : NO_VALUE),
    csv: [{ label: 'Stage noise figure', unit: 'dB', value: ofStage((s) => s.noiseFigureDb) }],
  },
  {
    key: 'nf-cum',
    label: 'Cumulative noise figure',
    note: 'Friis, to this node',
    display: (p) => (p.stage ? decibels(p.stage.cumulativeNoiseFigureDb) : NO_VALUE),
    csv: [
      {
        label: 'Cumulative noise figure',
        unit: 'dB',
        value: ofStage((s) => s.cumulativeNoiseFigureDb),
      },
    ],
  },
  {
    key: 'te-stage',
    label: 'Stage noise temperature',
    note: 'Te = T0·(F − 1), input',
    display: (p) => (p.stage ? kelvin(p.stage.noiseTemperatureK) : NO_VALUE),
    csv: [{ label: 'Stage noise temperature', unit: 'K', value: ofStage((s) => s.noiseTemperatureK) }], // prettier-ignore
  },
  {
    key: 'te-cum',
    label: 'Cumulative noise temperature',
    note: 'input-referred, to this node',
    display: (p) => (p.stage ? kelvin(p.stage.cumulativeNoiseTemperatureK) : NO_VALUE),
    csv: [
      {
        label: 'Cumulative noise temperature',
        unit: 'K',
        value: ofStage((s) => s.cumulativeNoiseTemperatureK),
      },
    ],
  },
  {
    key: 'te-out',
    label: 'Output noise temperature',
    note: 'G·(T source + Te) at this node',
    display: (p) => (p.stage ? kelvin(p.stage.outputNoiseTemperatureK) : NO_VALUE),
    csv: [
      {
        label: 'Output noise temperature',
        unit: 'K',
        value: ofStage((s) => s.outputNoiseTemperatureK),
      },
    ],
  },
  {
    key: 'iip3-stage',
    label: 'Stage IIP3',
    display: (p) => decibels(p.stage?.iip3Dbm, 'dBm'),
    csv: [{ label: 'Stage IIP3', unit: 'dBm', value: ofStage((s) => s.iip3Dbm) }],
  },
  {
    key: 'iip3-cum',
    label: 'Cumulative IIP3',
    note: 'referred to the chain input',
    display: (p) => decibels(p.stage?.cumulativeIip3Dbm, 'dBm'),
    csv: [{ label: 'Cumulative IIP3', unit: 'dBm', value: ofStage((s) => s.cumulativeIip3Dbm) }],
  },
  {
    key: 'p1db-stage',
    label: 'Stage input P1dB',
    display: (p) => decibels(p.stage?.p1dbDbm, 'dBm'),
    csv: [{ label: 'Stage input P1dB', unit: 'dBm', value: ofStage((s) => s.p1dbDbm) }],
  },
  {
    key: 'p1db-cum',
    label: 'Cumulative input P1dB',
    display: (p) => decibels(p.stage?.cumulativeP1dbDbm, 'dBm'),
    csv: [
      { label: 'Cumulative input P1dB', unit: 'dBm', value: ofStage((s) => s.cumulativeP1dbDbm) },
    ],
  },
];

const LEVEL: RowSpec[] = [
  {
    key: 'level-delivered',
    label: 'Signal level',
    note: 'delivered into the node',
    display: (p) => decibels(p.node.deliveredDbm, 'dBm'),
    csv: [{ label: 'Signal level, delivered', unit: 'dBm', value: (p) => p.node.deliveredDbm }],
  },
  {
    key: 'level-available',
    label: 'Signal level',
    note: 'available at the node',
    display: (p) => decibels(p.node.availableDbm, 'dBm'),
    csv: [{ label: 'Signal level, available', unit: 'dBm', value: (p) => p.node.availableDbm }],
  },
  {
    key: 'level-volts',
    label: 'Signal level',
    note: 'rms volts at the node',
    display: (p) => `${engineering(p.node.vRms, 'volt')} rms`,
    csv: [{ label: 'Signal level, rms volts', unit: 'V', value: (p) => p.node.vRms }],
  },
  {
    key: 'level-reference',
    label: 'Signal level',
    note: 'dBm-equivalent across the chosen reference',
    display: (p) =>
      p.node.referenceOhm === null
        ? NO_REFERENCE
        : `${decibels(p.node.referenceLevelDbm, 'dBm')} in ${engineering(p.node.referenceOhm, 'ohm')}`,
    csv: [
      {
        label: 'Signal level across the reference',
        unit: 'dBm',
        value: (p) => p.node.referenceLevelDbm,
      },
    ],
  },
];

const MATCH: RowSpec[] = [
  {
    key: 'mismatch',
    label: 'Mismatch loss',
    display: (p) => decibels(p.node.mismatchLossDb, 'dB', 2),
    csv: [{ label: 'Mismatch loss', unit: 'dB', value: (p) => p.node.mismatchLossDb }],
  },
  {
    key: 'return-loss',
    label: 'Return loss',
    note: 'against the chosen reference',
    display: (p) =>
      p.node.referenceOhm === null
        ? NO_REFERENCE
        : `${decibels(p.node.returnLossDb)} re ${engineering(p.node.referenceOhm, 'ohm')}`,
    csv: [{ label: 'Return loss against the reference', unit: 'dB', value: (p) => p.node.returnLossDb }], // prettier-ignore
  },
  {
    key: 'vswr',
    label: 'VSWR',
    note: 'against the chosen reference',
    display: (p) =>
      p.node.referenceOhm === null
        ? NO_REFERENCE
        : Number.isFinite(p.node.vswr)
          ? `${plain(p.node.vswr as number)} : 1`
          : '∞',
    csv: [{ label: 'VSWR against the reference', unit: 'ratio', value: (p) => p.node.vswr }],
  },
];

const GROUPS: { key: string; label: string; rows: RowSpec[] }[] = [
  { key: 'impedance', label: 'Impedance', rows: IMPEDANCE },
  { key: 'voltage', label: 'Voltage', rows: VOLTAGE },
  { key: 'gain', label: 'Gain', rows: GAIN },
  { key: 'noise', label: 'Noise and linearity', rows: NOISE },
  { key: 'level', label: 'Level plan', rows: LEVEL },
  { key: 'match', label: 'Match', rows: MATCH },
];

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
  for (const group of GROUPS) {
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
