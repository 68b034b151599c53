/**
 * The noise parameters of a cascade (Fmin, Γopt, Rn) read from its correlation matrix
 * (Hillbrand and Russer, 1976), against a stage's own parameters and against the noise
 * figure F = Fmin + (Rn/Gs)·|Ys − Yopt|² (the standard two-port noise equation, e.g.
 * Pozar, Microwave Engineering, 4th ed., eq. 12.59) at the source the chain really has.
 */
import fc from 'fast-check';
import { buildChain } from '../../shared/engine/core/build';
import {
  cascadeNoiseParameters,
  correlationNoiseFigureDb,
} from '../../shared/engine/core/noise-correlation';
import { chain, TEST_CATALOGUE, type StageInput } from './core-fixtures';

const built = (stages: StageInput[]) => buildChain(chain(stages, { f0Hz: 1e6 }), TEST_CATALOGUE);

/** Y of a source reflection Γ against z0: (1 − Γ)/(z0·(1 + Γ)). */
function admittance(g: { re: number; im: number }, z0: number): { re: number; im: number } {
  const nr = 1 - g.re;
  const ni = -g.im;
  const dr = z0 * (1 + g.re);
  const di = z0 * g.im;
  const d = dr * dr + di * di;
  return { re: (nr * dr + ni * di) / d, im: (ni * dr - nr * di) / d };
}

describe('cascadeNoiseParameters', () => {
  it("gives back a lone stage's own Fmin, Rn and Yopt, with Γopt against the reference", () => {
    const p = cascadeNoiseParameters(built([{ type: 't-source' }, { type: 't-fet' }, { type: 't-load' }]), 50); // prettier-ignore
    expect(p).not.toBeNull();
    expect(p!.fHz).toBe(1e6);
    expect(p!.nfMinDb).toBeCloseTo(0.8, 9);
    expect(p!.rnOhm).toBeCloseTo(15, 9);
    const y = admittance(p!.gammaOpt, 50);
    expect(y.re).toBeCloseTo(0.015, 9);
    expect(y.im).toBeCloseTo(-0.005, 9);
    // The same Yopt against 75 Ω is another Γ, so the reference matters.
    const at75 = cascadeNoiseParameters(built([{ type: 't-source' }, { type: 't-fet' }, { type: 't-load' }]), 75); // prettier-ignore
    expect(at75!.gammaOpt.re).not.toBeCloseTo(p!.gammaOpt.re, 3);
    expect(admittance(at75!.gammaOpt, 75).re).toBeCloseTo(0.015, 9);
  });

  it('a lossless chain has no noise parameters to state', () => {
    const lossless = built([{ type: 't-source' }, { type: 't-series', values: { r: 0, l: 1e-6 } }, { type: 't-load' }]); // prettier-ignore
    expect(cascadeNoiseParameters(lossless, 50)).toBeNull();
  });

  it('property: the parameters give the chain\u2019s own noise figure at its own source', () => {
    const stage = fc.oneof(
      fc.record({ type: fc.constant('t-series'), values: fc.record({ r: fc.double({ min: 1, max: 500, noNaN: true }), l: fc.double({ min: 1e-9, max: 50e-6, noNaN: true }) }) }), // prettier-ignore
      fc.record({ type: fc.constant('t-shunt-r'), values: fc.record({ r: fc.double({ min: 10, max: 1e5, noNaN: true }) }) }), // prettier-ignore
      fc.record({ type: fc.constant('t-fet'), values: fc.record({ rn: fc.double({ min: 1, max: 50, noNaN: true }) }) }), // prettier-ignore
    );
    let compared = 0;
    fc.assert(
      fc.property(
        fc.array(stage, { minLength: 1, maxLength: 5 }),
        fc.double({ min: 5, max: 500, noNaN: true }),
        fc.double({ min: -200, max: 200, noNaN: true }),
        (stages, rs, xs) => {
          const b = built([{ type: 't-source', values: { rs, xs } }, ...stages, { type: 't-load' }]); // prettier-ignore
          const p = cascadeNoiseParameters(b, 50);
          if (p === null) return; // no optimum to compare (e.g. a pure series resistor)
          compared++;
          const yopt = admittance(p.gammaOpt, 50);
          const d = rs * rs + xs * xs;
          const ys = { re: rs / d, im: -xs / d };
          const f =
            Math.pow(10, p.nfMinDb / 10) +
            (p.rnOhm / ys.re) * ((ys.re - yopt.re) ** 2 + (ys.im - yopt.im) ** 2);
          const exact = Math.pow(10, correlationNoiseFigureDb(b) / 10);
          expect(Math.abs(f - exact)).toBeLessThan(1e-6 * exact);
        },
      ),
      { numRuns: 120 },
    );
    // Most random chains have an optimum: the property was not checked on a few alone.
    expect(compared).toBeGreaterThan(60);
  });
});
