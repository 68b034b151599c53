/**
 * Study results as CSV tables (for the shared writer): a Monte Carlo run's figures, its
 * trials and what drives its losses; band tracking per dial position; the optimiser's
 * values and goals before and after. Numbers as the study computed them (SI, dB, ratios).
 */
import type { BandResult } from '../engine/studies/band';
import type { OptimiserResult } from '../engine/studies/optimiser';
import type { MonteCarloResult } from '../engine/studies/yield';
import type { CsvTable } from './csv-writer';

const withUnit = (label: string, unit: string) => (unit ? `${label} (${unit})` : label);

/** One line per figure: nominal value and the spread over the trials. */
export function monteCarloFiguresCsv(r: MonteCarloResult): CsvTable {
  return {
    columns: ['Figure', 'Unit', 'Nominal', 'Trials with a value', 'Mean', 'Standard deviation', 'Min', 'Max'], // prettier-ignore
    rows: r.figures.map((f) => [
      f.label,
      f.unit,
      f.nominal,
      f.summary.n,
      f.summary.mean,
      f.summary.sd,
      f.summary.min,
      f.summary.max,
    ]),
  };
}

/** One line per trial: each value's relative draw, each figure, and the verdict. */
export function monteCarloTrialsCsv(r: MonteCarloResult): CsvTable {
  return {
    columns: [
      'Trial',
      ...r.sensitivity.map((s) => `${s.label} draw (fraction)`),
      ...r.figures.map((f) => withUnit(f.label, f.unit)),
      'Meets every target',
    ],
    rows: r.rows.map((t, i) => [i + 1, ...t.draws, ...t.metrics, t.pass]),
  };
}

/** What drives the losses: yield with small and wide draws of each value. */
export function monteCarloSensitivityCsv(r: MonteCarloResult): CsvTable {
  return {
    columns: ['Value', 'Tolerance (%)', 'Yield, small draws', 'Yield, wide draws', 'Drop', ...r.figures.map((f) => `Correlation with ${f.label}`)], // prettier-ignore
    rows: r.sensitivity.map((s) => [
      s.label,
      s.tolerancePct,
      s.yieldInner,
      s.yieldOuter,
      s.yieldDrop,
      ...s.correlations,
    ]),
  };
}

/** One line per dial position, with every circuit's resonance, error, Q and bandwidth. */
export function bandCsv(r: BandResult): CsvTable {
  const perCircuit = ['resonance (Hz)', 'tracking error (Hz)', 'loaded Q', 'bandwidth (Hz)', 'mistracked']; // prettier-ignore
  return {
    columns: [
      'Dial (0-1)',
      'Dial frequency (Hz)',
      'LO (Hz)',
      ...r.circuits.flatMap((c) => perCircuit.map((what) => `${c.label} ${what}`)),
      'Gain (dB)',
      'Noise figure (dB)',
      'Image rejection (dB)',
    ],
    rows: r.positions.map((p) => [
      p.dial,
      p.dialHz,
      p.loHz,
      ...r.circuits.flatMap((_, i) => [
        p.resonanceHz[i],
        p.trackingErrorHz[i],
        p.loadedQ[i],
        p.bandwidthHz[i],
        p.mistracked[i],
      ]),
      p.gainDb,
      p.noiseFigureDb,
      p.imageRejectionDb,
    ]),
  };
}

/** The optimised values, the goals and the cost, before and after. */
export function optimiserCsv(r: OptimiserResult): CsvTable {
  return {
    columns: ['Item', 'Before', 'After', 'Lowest allowed', 'Highest allowed'],
    rows: [
      ...r.variables.map((v) => [`${v.stageId} ${v.key}`, v.before, v.after, v.min, v.max]),
      ...r.after.goals.map((g, i) => [g.label, r.before.goals[i]?.value ?? null, g.value]),
      ['Cost (sum of squared goal misses)', r.before.cost, r.after.cost],
    ],
  };
}
