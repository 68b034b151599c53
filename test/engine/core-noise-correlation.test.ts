/**
 * The correlation-matrix noise figure (Hillbrand and Russer, 1976) against closed forms and
 * against the Friis cascade with available gains, which is exact for these chains too.
 */
import fc from 'fast-check';
import { analyzeChain } from '../../shared/engine/analyze';
import { buildChain } from '../../shared/engine/core/build';
import { BOLTZMANN } from '../../shared/engine/core/noise';
import {
  correlationNoiseFigureDb,
  passiveCorrelation,
} from '../../shared/engine/core/noise-correlation';
import { runNodeAnalysis } from '../../shared/engine/core/nodes';
import { chain, TEST_CATALOGUE, type StageInput } from './core-fixtures';
import { builtExample, exampleKeys } from './helpers/kept-rows';

const nfBoth = (stages: StageInput[], f0 = 1e6) => {
  const doc = chain(stages, { f0Hz: f0 });
  return {
    exact: correlationNoiseFigureDb(buildChain(doc, TEST_CATALOGUE)),
    friis: analyzeChain(doc, { catalogue: TEST_CATALOGUE, sweep: false }).levels.noiseFigureDb,
  };
};

describe('correlation matrices', () => {
  it('a series resistor is a noise voltage 2kTR; a shunt conductance a noise current 2kTG', () => {
    const kt2 = 2 * BOLTZMANN * 290;
    const series = passiveCorrelation(Float64Array.of(1, 0, 100, 0, 0, 0, 1, 0), 290);
    expect(series[0] / kt2).toBeCloseTo(100, 9);
    expect(Math.abs(series[2]) + Math.abs(series[6])).toBeLessThan(1e-30);
    const shunt = passiveCorrelation(Float64Array.of(1, 0, 0, 0, 0.01, 0, 1, 0), 290);
    expect(shunt[6] / kt2).toBeCloseTo(0.01, 12);
    expect(Math.abs(shunt[0]) + Math.abs(shunt[2])).toBeLessThan(1e-30);
    // lossless: a reactance makes no noise
    const reactive = passiveCorrelation(Float64Array.of(1, 0, 0, 50, 0, 0, 1, 0), 290);
    expect(Math.max(...Array.from(reactive, Math.abs))).toBeLessThan(1e-30);
  });

  it('a series 50 Ω pad from 50 Ω has F = 1 + R/Rs = 2 (3.01 dB), as Friis says', () => {
    const { exact, friis } = nfBoth([{ type: 't-source' }, { type: 't-series', values: { r: 50 } }, { type: 't-load' }]); // prettier-ignore
    expect(exact).toBeCloseTo(10 * Math.log10(2), 9);
    expect(friis).toBeCloseTo(exact, 9);
  });

  it('noise parameters give F = Fmin + (Rn/Gs)|Ys − Yopt|² at the source the stage sees', () => {
    const { exact, friis } = nfBoth([{ type: 't-source', values: { rs: 40, xs: 15 } }, { type: 't-fet' }, { type: 't-load' }]); // prettier-ignore
    const ys = { re: 40 / (40 ** 2 + 15 ** 2), im: -15 / (40 ** 2 + 15 ** 2) };
    const f = Math.pow(10, 0.08) + (15 / ys.re) * ((ys.re - 0.015) ** 2 + (ys.im + 0.005) ** 2);
    expect(exact).toBeCloseTo(10 * Math.log10(f), 9);
    expect(friis).toBeCloseTo(exact, 9);
  });

  it('full sections through the Z form and, without a shunt part, the Y form agree with Friis', () => {
    for (const values of [
      { r: 50, x: 20, g: 0.003, b: 0.004, n: 2 },
      { r: 50, x: 20, g: 0, b: 0, n: 3 },
    ]) {
      const { exact, friis } = nfBoth([{ type: 't-source' }, { type: 't-general', values }, { type: 't-load' }]); // prettier-ignore
      expect(exact).toBeGreaterThan(0.5);
      expect(exact).toBeCloseTo(friis, 9);
    }
  });

  it('property: agrees with the Friis cascade on random passive and active chains', () => {
    const stage = fc.oneof(
      fc.record({ type: fc.constant('t-series'), values: fc.record({ r: fc.double({ min: 0, max: 500, noNaN: true }), l: fc.oneof(fc.constant(0), fc.double({ min: 1e-9, max: 50e-6, noNaN: true })) }) }), // prettier-ignore
      fc.record({ type: fc.constant('t-tank'), values: fc.record({ l: fc.double({ min: 1e-6, max: 100e-6, noNaN: true }), c: fc.double({ min: 50e-12, max: 1e-9, noNaN: true }), rs: fc.double({ min: 0.1, max: 20, noNaN: true }) }) }), // prettier-ignore
      fc.record({ type: fc.constant('t-shunt-r'), values: fc.record({ r: fc.double({ min: 10, max: 1e5, noNaN: true }) }) }), // prettier-ignore
      fc.record({ type: fc.constant('t-amp'), values: fc.record({ nf: fc.double({ min: 0.5, max: 12, noNaN: true }), rin: fc.double({ min: 20, max: 2000, noNaN: true }) }) }), // prettier-ignore
      fc.record({ type: fc.constant('t-general'), values: fc.record({ r: fc.double({ min: 0.1, max: 200, noNaN: true }), x: fc.double({ min: -300, max: 300, noNaN: true }), g: fc.constantFrom(0, 1e-4, 0.003, 0.05), b: fc.double({ min: -0.02, max: 0.02, noNaN: true }), n: fc.double({ min: 0.2, max: 5, noNaN: true }) }) }), // prettier-ignore
      fc.record({ type: fc.constant('t-fet'), values: fc.record({ rn: fc.double({ min: 1, max: 50, noNaN: true }) }) }), // prettier-ignore
    );
    fc.assert(
      fc.property(fc.array(stage, { minLength: 1, maxLength: 6 }), (stages) => {
        const { exact, friis } = nfBoth([{ type: 't-source' }, ...stages, { type: 't-load' }]);
        expect(Math.abs(exact - friis)).toBeLessThan(1e-6 * Math.max(1, Math.abs(friis)));
      }),
      { numRuns: 80 },
    );
  });
});

describe("the correlation noise figure from the analysis's own run at f0", () => {
  it.each(exampleKeys)('%s: the same bits as with a run of its own', (key) => {
    const built = builtExample(key);
    const own = correlationNoiseFigureDb(built);
    const f0 = built.settings.f0Hz;
    expect(Object.is(correlationNoiseFigureDb(built, runNodeAnalysis(built, [f0])), own)).toBe(true); // prettier-ignore
    // A run that is not the one-point run at f0 is not read (the figure's own is made).
    const other = runNodeAnalysis(built, [f0 * 1.5, f0]);
    expect(Object.is(correlationNoiseFigureDb(built, other), own)).toBe(true);
  });
});
