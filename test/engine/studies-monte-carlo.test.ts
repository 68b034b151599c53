/**
 * Monte Carlo against closed forms. A lossless tank resonates at f = 1/(2π√(LC)), so a
 * capacitance C0·(1 + δ) gives f/f0 = (1 + δ)^(−1/2) ≈ 1 − δ/2: ±5 % of C is ±2.5 % of f0 to
 * first order (textbook resonance formula, common practice).
 */
import { monteCarloSpecSchema, type MonteCarloSpec } from '../../shared/schema/studies';
import {
  mulberry32,
  monteCarloResult,
  planMonteCarlo,
  runTrials,
  summarise,
} from '../../shared/engine/studies';
import { singleTank } from './helpers/study-chains';

const L = 10e-6;
const C = 100e-12;
const F0 = 1 / (2 * Math.PI * Math.sqrt(L * C));
// Each trial is a full analysis: these runs take tens of seconds on a loaded machine.
jest.setTimeout(180_000);

const spec = (s: Partial<MonteCarloSpec>): MonteCarloSpec =>
  monteCarloSpecSchema.parse({ kind: 'monte-carlo', trials: 2000, seed: 7, ...s });

function resonances(distribution: 'uniform' | 'normal', trials: number) {
  const inputs = { doc: singleTank({ l: L, c: C, tolerances: { c: 5 }, points: 201 }) };
  const plan = planMonteCarlo(inputs, spec({ distribution, trials }));
  const all = runTrials(inputs, plan, 0, trials);
  const j = plan.metrics.findIndex((m) => m.key === 'fr:0');
  return { all, ratios: all.map((t) => (t.metrics[j] as number) / F0) };
}

describe('Monte Carlo: one tank, C ± 5 %', () => {
  it('each trial resonates where the closed form puts it, and never beyond ±2.5 % to first order', () => {
    const { all, ratios } = resonances('uniform', 60);
    all.forEach((t, i) => {
      const delta = (0.05 * t.draws[0]) as number;
      expect(ratios[i]).toBeCloseTo(1 / Math.sqrt(1 + delta), 8);
      // |f/f0 − 1| ≤ 2.5 % plus the second-order term (3/8)·δ² ≈ 0.1 %.
      expect(Math.abs(ratios[i] - 1)).toBeLessThanOrEqual(0.025 + 0.375 * 0.05 ** 2 + 1e-6);
    });
  });

  it('uniform: mean and σ of f/f0 match the exact integrals within sampling error', () => {
    const n = 500;
    const { ratios } = resonances('uniform', n);
    const a = 0.05;
    // E[(1+aU)^(−1/2)] and E[(1+aU)^(−1)] for U uniform on [−1, 1], integrated by hand.
    const m1 = (Math.sqrt(1 + a) - Math.sqrt(1 - a)) / a;
    const m2 = Math.log((1 + a) / (1 - a)) / (2 * a);
    const sd = Math.sqrt(m2 - m1 * m1);
    expect(sd).toBeCloseTo(0.025 / Math.sqrt(3), 4); // first order: 2.5 %/√3
    const s = summarise(ratios);
    expect(Math.abs(s.mean! - m1)).toBeLessThan((4 * sd) / Math.sqrt(n));
    // σ of a sample σ ≈ σ·√(1/(2(n−1))) for a near-normal; the uniform's is smaller still.
    expect(Math.abs(s.sd! - sd)).toBeLessThan(4 * sd * Math.sqrt(1 / (2 * (n - 1))));
  });

  it('normal with ±5 % as 3σ: σ of f/f0 is 2.5 %/3 and the mean sits at 1 + (3/8)σC²', () => {
    const n = 500;
    const { ratios } = resonances('normal', n);
    const sigmaC = 0.05 / 3;
    const sd = sigmaC / 2; // first order
    const mean = 1 + 0.375 * sigmaC ** 2; // second-order Taylor term of (1+δ)^(−1/2)
    const s = summarise(ratios);
    expect(Math.abs(s.mean! - mean)).toBeLessThan((4 * sd) / Math.sqrt(n));
    expect(Math.abs(s.sd! - sd)).toBeLessThan(4 * sd * Math.sqrt(1 / (2 * (n - 1))) + 1e-5);
  });

  it('is repeatable from its seed, and chunks give the same trials as one run', () => {
    const inputs = { doc: singleTank({ l: L, c: C, tolerances: { c: 5 }, points: 51 }) };
    const plan = planMonteCarlo(inputs, spec({ trials: 20 }));
    const whole = runTrials(inputs, plan, 0, 20);
    const chunks = [...runTrials(inputs, plan, 0, 7), ...runTrials(inputs, plan, 7, 20)];
    expect(chunks).toEqual(whole);
    const other = planMonteCarlo(inputs, spec({ trials: 20, seed: 8 }));
    expect(runTrials(inputs, other, 0, 20)[0].draws).not.toEqual(whole[0].draws);
  });

  it('the generator is uniform: its mean and variance are 1/2 and 1/12 within sampling error', () => {
    const u = mulberry32(12345);
    const xs = Array.from({ length: 20000 }, () => u());
    const s = summarise(xs);
    expect(Math.abs(s.mean! - 0.5)).toBeLessThan(4 * Math.sqrt(1 / 12 / 20000));
    expect(s.sd! ** 2).toBeCloseTo(1 / 12, 3);
  });
});

describe('Monte Carlo yield', () => {
  it('matches a yield worked from the draws and from the uniform distribution', () => {
    const a = 0.015; // centre window ±1.5 % of f0
    const doc = singleTank({
      l: L,
      c: C,
      tolerances: { c: 5 },
      points: 2001,
      span: 0.05,
      targets: { centreMinHz: F0 * (1 - a), centreMaxHz: F0 * (1 + a) },
    });
    const n = 500;
    const plan = planMonteCarlo({ doc }, spec({ distribution: 'uniform', trials: n, node: 1 }));
    const trials = runTrials({ doc }, plan, 0, n);
    const result = monteCarloResult(plan, trials, doc.settings.targets);
    // A trial passes when C/C0 = 1 + 0.05·draw lies in [1/(1+a)², 1/(1−a)²].
    const cLo = 1 / (1 + a) ** 2;
    const cHi = 1 / (1 - a) ** 2;
    const expectedPasses = trials.filter((t) => {
      const r = 1 + 0.05 * t.draws[0];
      return r >= cLo && r <= cHi;
    }).length;
    // Only a trial within a grid step's refinement error of an edge may differ.
    expect(Math.abs(result.yield!.passed - expectedPasses)).toBeLessThanOrEqual(2);
    const p = (Math.min(1.05, cHi) - Math.max(0.95, cLo)) / 0.1;
    expect(Math.abs(result.yield!.fraction - p)).toBeLessThan(4 * Math.sqrt((p * (1 - p)) / n));
    expect(result.yield!.targets[0]).toMatchObject({
      key: 'centre',
      failures: n - result.yield!.passed,
    });
  });

  it('ranks the wide tolerance first in the sensitivity table', () => {
    const doc = singleTank({
      l: L,
      c: C,
      tolerances: { c: 5, l: 0.5 },
      points: 401,
      span: 0.05,
      targets: { centreMinHz: F0 * 0.985, centreMaxHz: F0 * 1.015 },
    });
    const plan = planMonteCarlo({ doc }, spec({ distribution: 'normal', trials: 200, node: 1 }));
    const result = monteCarloResult(plan, runTrials({ doc }, plan, 0, 200), doc.settings.targets);
    expect(result.sensitivity.map((s) => s.key)).toEqual(['c', 'l']);
    expect(result.sensitivity[0].yieldDrop!).toBeGreaterThan(result.sensitivity[1].yieldDrop!);
    const fr = result.figures.findIndex((f) => f.key === 'fr:0');
    // Resonance falls as C rises: a strong negative correlation.
    expect(result.sensitivity[0].correlations[fr]!).toBeLessThan(-0.95);
    expect(result.figures[fr].histogram.counts.reduce((x, y) => x + y, 0)).toBe(200);
  });

  it('says what to fix when no value has a tolerance', () => {
    expect(() => planMonteCarlo({ doc: singleTank({ l: L, c: C }) }, spec({ trials: 10 }))).toThrow(
      /no stage value has a tolerance/,
    );
  });
});
