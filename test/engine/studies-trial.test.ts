/**
 * A Monte Carlo trial follows the nominal chain's resonators instead of searching the whole
 * chain again (studies/trial.ts), and so does each position of a band study after the first.
 * Their figures must be the ones a full analysis of the same chain gives: every trial row here
 * is compared with `readMetrics(analyzeChain(drawn))`, every band position with a full
 * analysis at its dial frequency.
 * The full analysis reports the −60 dB width and unloaded Q the trial skips; the metric row
 * holds neither.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { chainDocumentSchema, type ChainDocument } from '../../shared/schema/chain';
import { bandSpecSchema, monteCarloSpecSchema } from '../../shared/schema/studies';
import { analyzeChain } from '../../shared/engine';
import {
  cloneForEdit,
  drawDeviation,
  mulberry32,
  planMonteCarlo,
  readMetrics,
  runBandStudy,
  runTrial,
  trialSeed,
} from '../../shared/engine/studies';
import { benchChain } from '../../scripts/bench/bench-chain';

jest.setTimeout(120_000);

const example = (name: string): ChainDocument =>
  chainDocumentSchema.parse(
    JSON.parse(readFileSync(path.join(__dirname, '../../examples', `${name}.chain.json`), 'utf8')),
  );

/** The bench chain with every reactive value of its tuned parts at ±5 %. */
function benchWithTolerances(points: number): ChainDocument {
  const doc = chainDocumentSchema.parse(benchChain(points));
  for (const s of doc.stages) {
    const keys = Object.keys(s.values).filter((k) => ['l', 'c', 'l1', 'l2', 'cc'].includes(k));
    if (keys.length) s.tolerances = Object.fromEntries(keys.map((k) => [k, 5]));
  }
  return doc;
}

/** The drawn chain of trial `index`, as runTrial draws it. */
function drawn(doc: ChainDocument, plan: ReturnType<typeof planMonteCarlo>, index: number) {
  const u = mulberry32(trialSeed(plan.spec.seed, index));
  const d = cloneForEdit(doc);
  if (plan.spec.points !== undefined) d.settings.sweep.points = plan.spec.points;
  for (const t of plan.tolerances) {
    const z = drawDeviation(u, plan.spec.distribution);
    const stage = d.stages.find((s) => s.id === t.stageId)!;
    stage.values[t.key] = t.nominal * (1 + (z * t.tolerancePct) / 100);
  }
  return d;
}

/** |a − b| within 1e-7 relative (refinement stops at 1e-10; Q is a difference quotient). */
function expectSame(trial: (number | null)[], full: (number | null)[], label: string) {
  expect(trial.length).toBe(full.length);
  trial.forEach((v, j) => {
    const w = full[j];
    if (w === null || v === null) {
      expect({ label, j, v }).toEqual({ label, j, v: w });
      return;
    }
    const scale = Math.max(Math.abs(w), 1e-12);
    expect({ label, j, rel: Math.abs(v - w) / scale < 1e-7 }).toEqual({ label, j, rel: true });
  });
}

/**
 * A series LC in the through path that no stage declares (the analysis finds it: its loop
 * impedance), at ±5 % on L and C, between a 50 Ω generator and a 50 Ω load.
 */
function foundSeriesLoop(): ChainDocument {
  return chainDocumentSchema.parse({
    name: 'found series loop',
    settings: { f0Hz: 3.16e6, sweep: { startHz: 1e6, stopHz: 10e6, points: 401, scale: 'log' } },
    stages: [
      { id: 'g', type: 'resistive-generator', values: { r: 50 } },
      { id: 'cs', type: 'lumped-element', label: 'Cs', values: { position: 'series', element: 'capacitor', c: 253.3e-12, qc: 1e12 }, tolerances: { c: 5 } }, // prettier-ignore
      { id: 'ls', type: 'lumped-element', label: 'Ls', values: { position: 'series', element: 'inductor', l: 10e-6, esr: 5 }, tolerances: { l: 5 } }, // prettier-ignore
      { id: 'load', type: 'rc-load', label: 'Load', values: { r: 50 } },
    ],
  });
}

const cases: [string, () => ChainDocument, number | undefined][] = [
  ['bench chain, 12 two-ports (coupled pair, found tanks, a trap)', () => benchWithTolerances(201), undefined], // prettier-ignore
  ['shortwave superhet with a coupled preselector (a mixer ahead of the judged node)', () => example('shortwave-superhet-coupled-pair'), 401], // prettier-ignore
  ['two-metre coupled preselector', () => example('two-metre-coupled-preselector'), 401],
  ['AM broadcast TRF with a triode between two tanks', () => example('am-broadcast-triode-trf'), 401], // prettier-ignore
  ['a series resonator found in the through path (no stage declares it)', foundSeriesLoop, undefined], // prettier-ignore
];

describe('a Monte Carlo trial gives what a full analysis of the drawn chain gives', () => {
  it.each(cases)('%s', (_label, make, points) => {
    const doc = make();
    const spec = monteCarloSpecSchema.parse({ kind: 'monte-carlo', trials: 12, seed: 3, points });
    const inputs = { doc };
    const plan = planMonteCarlo(inputs, spec);
    expect(plan.resonatorCount).toBeGreaterThan(0);
    for (let i = 0; i < 12; i++) {
      const trial = runTrial(inputs, plan, i);
      expect(trial.error).toBeUndefined();
      const full = readMetrics(
        analyzeChain(drawn(doc, plan, i), { sweep: false }),
        plan.node,
        plan.resonatorCount,
      );
      expectSame(trial.metrics, full, `trial ${i}`);
    }
  });

  it('follows a found series resonator by its loop impedance (no full analysis per trial)', () => {
    const spec = monteCarloSpecSchema.parse({ kind: 'monte-carlo', trials: 2, seed: 1 });
    const plan = planMonteCarlo({ doc: foundSeriesLoop() }, spec);
    expect(plan.tracker.follow.map((f) => f.how)).toEqual(['loop']);
    expect(plan.drawn).not.toBeNull();
  });

  it('a drawn value outside its stage range is a trial error that names it, not a crash', () => {
    const doc = benchWithTolerances(51);
    const tank = doc.stages.find((s) => s.id === 'tank')!;
    // Wider than the editor accepts (100 %), to force drawn values below zero.
    tank.tolerances = { ...tank.tolerances, c: 300 };
    const spec = monteCarloSpecSchema.parse({ kind: 'monte-carlo', trials: 40, seed: 5 });
    const plan = planMonteCarlo({ doc }, spec);
    const errors = Array.from({ length: 40 }, (_, i) => runTrial({ doc }, plan, i).error).filter(
      (e): e is string => e !== undefined,
    );
    expect(errors.length).toBeGreaterThan(0);
    expect(errors[0]).toMatch(/tank/i);
  });
});

describe('a band position followed from the one before gives what a full analysis at its dial gives', () => {
  const bandCases: [
    string,
    string,
    { stageId: string; key: string; min: number; max: number }[],
  ][] = [
    ['shortwave superhet, one tank', 'shortwave-superhet-single-tank', [{ stageId: 'preselector', key: 'c', min: 150e-12, max: 330e-12 }]], // prettier-ignore
    ['shortwave superhet, coupled pair ganged', 'shortwave-superhet-coupled-pair', [{ stageId: 'preselector', key: 'c', min: 150e-12, max: 330e-12 }]], // prettier-ignore
  ];
  it.each(bandCases)('%s', (_label, name, gang) => {
    const doc = example(name);
    const spec = bandSpecSchema.parse({ kind: 'band', gang, positions: 9, points: 401 });
    const result = runBandStudy({ doc }, spec);
    expect(result.circuits.length).toBeGreaterThan(0);
    result.positions.forEach((p, k) => {
      const d = cloneForEdit(doc);
      for (const m of gang) {
        d.stages.find((s) => s.id === m.stageId)!.values[m.key] = m.min + p.dial * (m.max - m.min);
      }
      d.settings.f0Hz = p.dialHz;
      d.settings.sweep = { startHz: p.dialHz / 1.25, stopHz: p.dialHz * 1.25, points: 401, scale: 'lin' }; // prettier-ignore
      const full = analyzeChain(d, { sweep: false });
      const last = full.selectivity[full.selectivity.length - 1];
      const perStage = new Map<string, number>();
      const circuitFigures = result.circuits.flatMap((c) => {
        const n = perStage.get(c.stageId) ?? 0;
        perStage.set(c.stageId, n + 1);
        const r = full.resonators.filter((x) => x.stageId === c.stageId)[n];
        return [r?.resonanceHz ?? null, r?.loadedQ ?? null];
      });
      const followed = result.circuits.flatMap((_, i) => [p.resonanceHz[i], p.loadedQ[i]]);
      expectSame(
        [...followed, p.gainDb, p.noiseFigureDb, p.imageRejectionDb, p.bandwidth3dbHz],
        [...circuitFigures, full.levels.totalGainDb, full.levels.noiseFigureDb, last.imageRejectionDb, last.bw3dbHz], // prettier-ignore
        `position ${k}`,
      );
    });
  });
});
