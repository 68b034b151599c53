/**
 * Node analysis: voltages, impedances and powers against hand calculations, open and short
 * loads, an empty chain, the unilateral restart, frequency translation, and the conjugate
 * match property of lossless networks.
 */
import fc from 'fast-check';
import { buildChain } from '../../shared/engine/core/build';
import { runNodeAnalysis } from '../../shared/engine/core/nodes';
import * as q from '../../shared/engine/core/quantities';
import { chain, TEST_CATALOGUE, type StageInput } from './core-fixtures';

const SRC = (rs = 50, emf = 1, xs = 0) => ({ type: 't-source', values: { rs, emf, xs } });
const R_LOAD = (r: number) => ({ type: 't-load', values: { r } });
const build = (stages: StageInput[], f0 = 1e6) => buildChain(chain(stages, { f0Hz: f0 }), TEST_CATALOGUE); // prettier-ignore

describe('node analysis', () => {
  it('a chain with no stages between source and load is a divider', () => {
    const na = runNodeAnalysis(build([SRC(50, 2), R_LOAD(150)]), [1e6]);
    expect(na.nodes).toBe(1);
    expect(na.zinRe[0]).toBe(150);
    expect(na.vRe[0]).toBeCloseTo(1.5, 14); // 2·150/(50 + 150)
    // delivered |V|²/(2R) = 1.5²/300; available Es²/(8Rs) = 4/400 (PEAK phasors)
    expect(q.deliveredPower(na, 0, 0)).toBeCloseTo(0.0075, 15);
    expect(q.availablePower(na, 0, 0)).toBeCloseTo(0.01, 15);
    expect(q.mismatchFactor(na, 0, 0)).toBeCloseTo(0.75, 14); // 4·50·150/200²
    expect(q.vswr(na, 0, 0)).toBeCloseTo(3, 12);
  });

  it('series then shunt resistor: Zin, Zsrc and node voltages by hand', () => {
    const built = build([SRC(50), { type: 't-series', values: { r: 100 } }, { type: 't-shunt-r', values: { r: 300 } }, R_LOAD(300)]); // prettier-ignore
    const na = runNodeAnalysis(built, [1e6]);
    // Zin: 300∥300 = 150, + 100 = 250; Zsrc: 50 + 100 = 150, ∥300 = 100
    expect(na.zinRe[0]).toBeCloseTo(250, 12);
    expect(na.zinRe[1]).toBeCloseTo(150, 12);
    expect(na.zsrcRe[1]).toBeCloseTo(150, 12);
    expect(na.zsrcRe[2]).toBeCloseTo(100, 12);
    expect(na.vRe[0]).toBeCloseTo(250 / 300, 12);
    expect(na.vRe[1]).toBeCloseTo(0.5, 12); // (250/300)·150/250
    expect(na.vRe[2]).toBeCloseTo(0.5, 12);
    // available power at the load node: Vth = 1·300/(150 + 300) = 2/3 behind 100 Ω
    expect(q.availablePower(na, 2, 0)).toBeCloseTo((2 / 3) ** 2 / 800, 14);
  });

  it('an open load: Zin = A/C through the chain, full EMF at the open end', () => {
    const built = build([SRC(50), { type: 't-series', values: { r: 100 } }, { type: 't-load', values: { mode: 'open' } }]); // prettier-ignore
    const na = runNodeAnalysis(built, [1e6]);
    expect(Number.isFinite(na.zinRe[1])).toBe(false);
    expect(Number.isFinite(na.zinRe[0])).toBe(false); // series R into an open is open
    expect(na.vRe[1]).toBe(1);
    expect(q.deliveredPower(na, 1, 0)).toBe(0);
    expect(q.returnLossDb(na, 0, 0)).toBe(0);
  });

  it('a short load: zero voltage and a finite Zin', () => {
    const built = build([SRC(50), { type: 't-series', values: { r: 100 } }, { type: 't-load', values: { mode: 'short' } }]); // prettier-ignore
    const na = runNodeAnalysis(built, [1e6]);
    expect(na.zinRe[0]).toBe(100);
    expect(na.vRe[1]).toBe(0);
    expect(na.vRe[0]).toBeCloseTo(100 / 150, 14);
  });

  it('a unilateral stage restarts the passes: Zin = 1/y11 and Zsrc = 1/y22 whatever is around', () => {
    for (const load of [10, 1e4]) {
      const built = build([SRC(7), { type: 't-amp', values: { rin: 200, rout: 3000, gm: 0.05 } }, R_LOAD(load)]); // prettier-ignore
      const na = runNodeAnalysis(built, [1e6]);
      expect(na.zinRe[0]).toBeCloseTo(200, 9);
      expect(na.zsrcRe[1]).toBeCloseTo(3000, 6);
      // V2 = gm·V1·(rout ∥ RL) with V1 = 200/207 V
      const v1 = 200 / 207;
      expect(na.vRe[1]).toBeCloseTo(0.05 * v1 * ((3000 * load) / (3000 + load)), 9);
    }
  });

  it('evaluates sections after a mixer at the translated frequency', () => {
    const built = build([SRC(50), { type: 't-mixer', values: { lo: 1.455e6, rin: 50 } }, { type: 't-series', values: { l: 1e-6 } }, R_LOAD(50)]); // prettier-ignore
    const na = runNodeAnalysis(built, [1e6, 2e6]);
    expect(Array.from(na.fNode)).toEqual([1e6, 2e6, 455e3, 545e3, 455e3, 545e3]);
    // Zin at the mixer output node: 50 + jωL at the IF
    expect(na.zinIm[1 * 2 + 0]).toBeCloseTo(2 * Math.PI * 455e3 * 1e-6, 9);
  });

  it('property: a lossless ladder delivers all available power when conjugately matched', () => {
    const el = fc.record({
      type: fc.constantFrom('t-series', 't-tank'),
      l: fc.double({ min: 0.1e-6, max: 50e-6, noNaN: true }),
      c: fc.double({ min: 10e-12, max: 2e-9, noNaN: true }),
    });
    fc.assert(
      fc.property(fc.array(el, { minLength: 1, maxLength: 6 }), fc.double({ min: 5, max: 5000, noNaN: true }), (els, rl) => {
        const mid = els.map((e) => ({ type: e.type, values: { l: e.l, c: e.c } }));
        const probe = runNodeAnalysis(build([SRC(50), ...mid, R_LOAD(rl)]), [1e6]);
        const zr = probe.zinRe[0];
        const zi = probe.zinIm[0];
        fc.pre(Number.isFinite(zr) && zr > 1e-6 && zr < 1e9);
        const na = runNodeAnalysis(build([SRC(zr, 1, -zi), ...mid, R_LOAD(rl)]), [1e6]);
        const last = na.nodes - 1;
        const ratio = q.deliveredPower(na, last, 0) / q.availablePower(na, 0, 0);
        expect(Math.abs(ratio - 1)).toBeLessThan(1e-6);
        expect(q.mismatchFactor(na, 0, 0)).toBeCloseTo(1, 6);
      }), // prettier-ignore
    );
  });

  it('reuses a workspace of the same size', () => {
    const built = build([SRC(50), { type: 't-tank' }, R_LOAD(50)]);
    const a = runNodeAnalysis(built, [1e6, 2e6]);
    const b = runNodeAnalysis(built, [3e6, 4e6], a);
    expect(b).toBe(a);
    expect(b.freqs[1]).toBe(4e6);
  });
});
