/**
 * Matching and coupler stages as built two-ports: each designed network, terminated in R2
 * on port 2, must present R1 at port 1 at f0 (Zin from the stage's own ABCD).
 */
import { findStageDefinition } from '../../shared/engine/stages';
import type { StageDefinition } from '../../shared/engine/types';
import { abs, build, c, div, parallel, rel, stageAbcd, zIn } from './stages-support';

function def(type: string): StageDefinition {
  const d = findStageDefinition(type);
  if (!d) throw new Error(`no stage type ${type}`);
  return d;
}

const lossless = { ql: 1e12, qc: 1e12 };

describe('designed matching stages present R1 at f0', () => {
  it('LN-1: l-match 75 Ω → 1 kΩ at 1 MHz (series L, shunt C; KF5OBS 2013)', () => {
    const m = build(
      def('l-match'),
      { mode: 'design', orientation: 'series-l-shunt-c', r1: 75, r2: 1000, f0: 1e6, ...lossless },
      1e6,
    );
    const z = zIn(stageAbcd(m, 1e6), c(1000));
    expect(rel(z.re, 75)).toBeLessThan(1e-9);
    expect(Math.abs(z.im)).toBeLessThan(1e-7);
    expect(m.designedMatch).toEqual({ r1: 75, r2: 1000 });
    expect(m.qBudget?.required).toBeCloseTo(3.512, 3);
  });

  it('LN-4: high-pass l-match 50 Ω → 500 Ω ∥ 42 pF at 100 MHz gives 50.00 + j0 Ω (FOSSEE 5_22)', () => {
    const m = build(
      def('l-match'),
      {
        mode: 'design',
        orientation: 'series-c-shunt-l',
        r1: 50,
        r2: 500,
        f0: 100e6,
        parasiticC: 42e-12,
        ...lossless,
      },
      100e6,
    );
    const load = parallel(c(500), div(c(1), c(0, 2 * Math.PI * 100e6 * 42e-12)));
    const z = zIn(stageAbcd(m, 100e6), load);
    expect(Math.abs(z.re - 50)).toBeLessThan(0.025); // ±0.05 %
    expect(Math.abs(z.im)).toBeLessThan(0.025);
  });

  it('the chain design frequency is used when f0 is 0, and the step-down orientations work', () => {
    for (const orientation of ['shunt-c-series-l', 'shunt-l-series-c']) {
      const m = build(
        def('l-match'),
        { mode: 'design', orientation, r1: 1000, r2: 75, f0: 0, ...lossless },
        7e6,
      );
      const z = zIn(stageAbcd(m, 7e6), c(75));
      expect(rel(z.re, 1000)).toBeLessThan(1e-9);
      expect(Math.abs(z.im)).toBeLessThan(1e-6);
    }
  });

  it('refuses an orientation that puts the shunt element on the low side, saying which to use', () => {
    expect(() =>
      build(
        def('l-match'),
        { mode: 'design', orientation: 'shunt-c-series-l', r1: 75, r2: 1000 },
        1e6,
      ),
    ).toThrow(/choose a series-first orientation/);
  });

  it('PI-1: pi-match 1000 Ω → 50 Ω, Q 10 at 10 MHz presents 1000 + j0 Ω (±0.1 %)', () => {
    const m = build(
      def('pi-match'),
      { mode: 'design', r1: 1000, r2: 50, q: 10, f0: 10e6, ...lossless },
      10e6,
    );
    const z = zIn(stageAbcd(m, 10e6), c(50));
    expect(rel(z.re, 1000)).toBeLessThan(1e-3);
    expect(Math.abs(z.im)).toBeLessThan(1);
    expect(m.qBudget).toEqual({ required: 10, componentQ: 1e12 });
  });

  it('T-1: t-match 10 Ω → 50 Ω, Q 5 at 100 MHz presents 10 + j0 Ω (±0.1 %)', () => {
    const m = build(
      def('t-match'),
      { mode: 'design', r1: 10, r2: 50, q: 5, f0: 100e6, ...lossless },
      100e6,
    );
    const z = zIn(stageAbcd(m, 100e6), c(50));
    expect(rel(z.re, 10)).toBeLessThan(1e-3);
    expect(Math.abs(z.im)).toBeLessThan(0.01);
  });

  it('double-l-match in both directions, and a wider band than one L-section', () => {
    const up = build(
      def('double-l-match'),
      { mode: 'design', form: 'step-up', r1: 50, r2: 1250, f0: 1e6, ...lossless },
      1e6,
    );
    expect(rel(zIn(stageAbcd(up, 1e6), c(1250)).re, 50)).toBeLessThan(1e-9);
    const down = build(
      def('double-l-match'),
      { mode: 'design', form: 'step-down', r1: 1250, r2: 50, f0: 1e6, ...lossless },
      1e6,
    );
    expect(rel(zIn(stageAbcd(down, 1e6), c(50)).re, 1250)).toBeLessThan(1e-9);
    const single = build(
      def('l-match'),
      { mode: 'design', orientation: 'series-l-shunt-c', r1: 50, r2: 1250, f0: 1e6, ...lossless },
      1e6,
    );
    const mismatch = (m: typeof up, f: number) => {
      const z = zIn(stageAbcd(m, f), c(1250));
      return abs(div(c(z.re - 50, z.im), c(z.re + 50, z.im)));
    };
    expect(mismatch(up, 1.2e6)).toBeLessThan(mismatch(single, 1.2e6));
    expect(() =>
      build(def('double-l-match'), { mode: 'design', form: 'step-down', r1: 50, r2: 1250 }, 1e6),
    ).toThrow(/step-up form/);
  });

  it('tapped-c-match 5 kΩ → 50 Ω presents 5 kΩ and declares its tank', () => {
    const m = build(
      def('tapped-c-match'),
      { mode: 'design', r1: 5000, r2: 50, q: 10, f0: 10e6, ...lossless },
      10e6,
    );
    const z = zIn(stageAbcd(m, 10e6), c(50));
    expect(rel(z.re, 5000)).toBeLessThan(1e-9);
    expect(Math.abs(z.im)).toBeLessThan(1e-5);
    expect(m.resonators?.[0]).toMatchObject({ kind: 'shunt', node: 1 });
  });

  it('absorbs a parasitic at port 2 in the pi and the tapped-C designs', () => {
    const w = 2 * Math.PI * 10e6;
    const load = parallel(c(50), div(c(1), c(0, w * 100e-12)));
    for (const [type, r1, q] of [
      ['pi-match', 1000, 10],
      ['tapped-c-match', 5000, 10],
    ] as const) {
      const m = build(
        def(type),
        { mode: 'design', r1, r2: 50, q, f0: 10e6, parasiticC: 100e-12, ...lossless },
        10e6,
      );
      const z = zIn(stageAbcd(m, 10e6), load);
      expect(rel(z.re, r1)).toBeLessThan(1e-9);
      expect(Math.abs(z.im)).toBeLessThan(1e-6 * r1);
    }
  });

  it('values mode builds the same network as the design it was given', () => {
    const design = build(
      def('pi-match'),
      { mode: 'design', r1: 1000, r2: 50, q: 10, f0: 10e6 },
      10e6,
    );
    const values = build(
      def('pi-match'),
      { mode: 'values', c1: 159.15e-12, l: 1.8929e-6, c2: 640.59e-12 },
      10e6,
    );
    const a = zIn(stageAbcd(design, 10e6), c(50));
    const b = zIn(stageAbcd(values, 10e6), c(50));
    expect(rel(b.re, a.re)).toBeLessThan(2e-3);
    expect(values.designedMatch).toBeUndefined();
  });
});

describe('couplers', () => {
  it('CI-1: coupled coils 1 mH / 2 mH, M 0.5 mH, secondary shorted, 1 V at 1 kHz (DesignSoft worked example)', () => {
    const k = 0.5e-3 / Math.sqrt(1e-3 * 2e-3);
    const m = build(def('coupled-coils'), { l1: 1e-3, l2: 2e-3, k, q1: 1e12, q2: 1e12 }, 1e3);
    const abcd = stageAbcd(m, 1e3);
    // Shorted port 2: Zin = B/D; I1 = V/Zin; I1 = D·I2.
    const zin = div(abcd.b, abcd.d);
    expect(Math.abs(zin.re)).toBeLessThan(1e-9);
    expect(rel(zin.im, 5.498)).toBeLessThan(1e-4);
    const i1 = div(c(1), zin);
    const i2 = div(i1, abcd.d);
    expect(rel(abs(i1), 0.18189)).toBeLessThan(1e-4);
    expect(rel(abs(i2), 0.045473)).toBeLessThan(1e-4); // published: 0.045473 A
  });

  it('an ideal transformer multiplies the load by n² (ENGINE two-ports)', () => {
    const m = build(def('ideal-transformer'), { n: 3 }, 1e6);
    expect(zIn(stageAbcd(m, 1e6), c(50, 10))).toEqual({ re: 450, im: 90 });
  });

  it('a tightly coupled lossless tapped coil transforms by 1/t² (autotransformer)', () => {
    const d = def('tapped-coil');
    const down = build(d, { l: 10e-6, tap: 0.25, k: 1, q: 1e12, direction: 'step-down' }, 1e6);
    // Load 1 Ω at the tap → 16 Ω at the top, in parallel with the coil's own reactance.
    const xl = c(0, 2 * Math.PI * 1e6 * 10e-6);
    const expected = parallel(c(16), xl);
    const z = zIn(stageAbcd(down, 1e6), c(1));
    expect(rel(z.re, expected.re)).toBeLessThan(1e-9);
    expect(rel(z.im, expected.im)).toBeLessThan(1e-9);
    const up = build(d, { l: 10e-6, tap: 0.25, k: 1, q: 1e12, direction: 'step-up' }, 1e6);
    expect(
      rel(zIn(stageAbcd(up, 1e6), c(1e9)).im, parallel(c(1e9 / 16), c(0, xl.im / 16)).im),
    ).toBeLessThan(1e-6);
  });

  it('TC-1 through the capacitive-tap stage: 100 pF / 900 pF into 50 Ω gives Rp = 5506.6 Ω', () => {
    const m = build(
      def('capacitive-tap'),
      { c1: 100e-12, c2: 900e-12, qc: 1e12, direction: 'step-down' },
      10e6,
    );
    const y = div(c(1), zIn(stageAbcd(m, 10e6), c(50)));
    expect(rel(1 / y.re, 5506.6)).toBeLessThan(1e-3);
    expect(rel(y.im / (2 * Math.PI * 10e6), 90.92e-12)).toBeLessThan(1e-3);
  });
});
