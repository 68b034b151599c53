/**
 * The fast path's pieces against the plain ones they stand for: single-frequency probes
 * against a one-point node analysis (same chain, same numbers), lossy parts as data against
 * the point formulas of the primitives, and every section's block form against its point
 * form, for the product's catalogue.
 */
import fc from 'fast-check';
import { buildChain } from '../../shared/engine/core/build';
import { createNodeAnalysis, runNodeAnalysis } from '../../shared/engine/core/nodes';
import {
  fillParts,
  part,
  PART_C_Y,
  PART_C_Z,
  PART_CONST,
  PART_L_Y,
  PART_L_Z,
  sumParts,
} from '../../shared/engine/core/parts';
import { createProbe, probeVoltage, probeZin, probeZsrc } from '../../shared/engine/core/probe';
import { STAGE_DEFINITIONS } from '../../shared/engine/stages';
import {
  capacitorY,
  capacitorZ,
  inductorY,
  inductorZ,
} from '../../shared/engine/stages/primitives';
import { benchChain } from '../../scripts/bench/bench-chain';
import { chain, TEST_CATALOGUE } from './core-fixtures';

describe('single-frequency probes', () => {
  // A chain of the product's stages with a mixer, so translated node frequencies count too.
  const superhet = buildChain(
    chain(
      [
        { type: 't-source', values: { rs: 50 } },
        { type: 't-tank', values: { l: 10e-6, c: 2.533e-9, rs: 2 } },
        { type: 't-mixer', values: { lo: 1.455e6 } },
        { type: 't-tank', values: { l: 100e-6, c: 1.01e-9, rs: 5 } },
        { type: 't-load', values: { r: 2000 } },
      ],
      { f0Hz: 1e6 },
    ),
    TEST_CATALOGUE,
  );
  const bench = buildChain(benchChain(3), STAGE_DEFINITIONS);

  it.each([
    ['a superheterodyne with a mixer', superhet],
    ['the 12-stage bench chain', bench],
  ])('%s: Zin, Zsrc and V at every node equal a one-point node analysis', (_name, built) => {
    const probe = createProbe(built);
    const one = createNodeAnalysis(built, 1);
    for (const f of [0.7e6, 1e6, 1.3e6, 7e6]) {
      runNodeAnalysis(built, [f], one);
      for (let k = 0; k < one.nodes; k++) {
        probeZin(built, probe, f, k);
        expect([probe.zinRe[k], probe.zinIm[k]]).toEqual([one.zinRe[k], one.zinIm[k]]);
        probeZsrc(built, probe, f, k);
        expect([probe.zsrcRe[k], probe.zsrcIm[k]]).toEqual([one.zsrcRe[k], one.zsrcIm[k]]);
        probeVoltage(built, probe, f, k);
        expect([probe.vRe[k], probe.vIm[k]]).toEqual([one.vRe[k], one.vIm[k]]);
        expect(probe.fNode[k]).toBe(one.fNode[k]);
      }
    }
  });
});

describe('lossy parts as data', () => {
  const point = (fn: (f: number, out: Float64Array, o: number) => void, f: number) => {
    const out = new Float64Array(2);
    fn(f, out, 0);
    return Array.from(out);
  };
  const block = (parts: Float64Array, f: number) => {
    const out = new Float64Array(2);
    fillParts(parts, Float64Array.of(f), 0, 1, out, 0, 2);
    return Array.from(out);
  };
  const value = fc.double({ min: 1e-13, max: 1e-2, noNaN: true });
  const q = fc.oneof(fc.double({ min: 0.5, max: 1e6, noNaN: true }), fc.constant(Infinity));
  const freq = fc.double({ min: 1, max: 3e9, noNaN: true });

  it('each part equals the primitives’ point formula (R + jωL, ωC/Q + jωC, reciprocals)', () => {
    fc.assert(
      fc.property(value, q, freq, fc.boolean(), (v, qq, f, esr) => {
        const r = esr ? v * 1e3 : -1;
        expect(block(part(PART_L_Z, v, qq, r), f)).toEqual(point((x, o, i) => inductorZ(x, v, qq, o, i, r), f)); // prettier-ignore
        expect(block(part(PART_L_Y, v, qq, r), f)).toEqual(point((x, o, i) => inductorY(x, v, qq, o, i, r), f)); // prettier-ignore
        expect(block(part(PART_C_Y, v, qq), f)).toEqual(point((x, o, i) => capacitorY(x, v, qq, o, i), f)); // prettier-ignore
        expect(block(part(PART_C_Z, v, qq), f)).toEqual(point((x, o, i) => capacitorZ(x, v, qq, o, i), f)); // prettier-ignore
      }),
    );
  });

  it('a sum is the sum of its parts; an inverted list is the reciprocal of the sum', () => {
    // Series R–L–C: Z = R + jωL + 1/(jωC) by hand (lossless parts).
    const parts = sumParts([
      part(PART_CONST, 5),
      part(PART_L_Z, 10e-6, Infinity),
      part(PART_C_Z, 100e-12, Infinity),
    ]) as Float64Array;
    const f = 3e6;
    const w = 2 * Math.PI * f;
    const [re, im] = block(parts, f);
    expect(re).toBeCloseTo(5, 12);
    expect(im / (w * 10e-6 - 1 / (w * 100e-12))).toBeCloseTo(1, 12);
    const inv = Float64Array.from(parts);
    inv[0] = 1;
    const [yr, yi] = block(inv, f);
    const d = re * re + im * im;
    expect(yr / (re / d)).toBeCloseTo(1, 12);
    expect(yi / (-im / d)).toBeCloseTo(1, 12);
  });
});

describe('block forms', () => {
  // Every stage of the catalogue at its defaults: the section's block form (what the node
  // analysis runs) gives exactly what its point form gives.
  it.each(STAGE_DEFINITIONS.filter((d) => d.role === 'two-port').map((d) => [d.type, d] as const))(
    '%s: fill equals abcd point by point',
    (_t, d) => {
      const values = Object.fromEntries(d.params.map((p) => [p.key, p.default]));
      const model = d.build(values, { f0Hz: 7e6, temperatureK: 290 });
      if (!('sections' in model)) throw new Error('a two-port without sections');
      const f = Float64Array.from([1e5, 3.3e6, 7e6, 7.01e6, 2.9e7, 1.5e8]);
      for (const s of model.sections) {
        if (!s.fill) continue;
        const blockOut = new Float64Array(8 * f.length);
        s.fill(f, 0, f.length, blockOut, 0);
        const pointOut = new Float64Array(8 * f.length);
        f.forEach((x, i) => s.abcd(x, pointOut, 8 * i));
        expect(Array.from(blockOut)).toEqual(Array.from(pointOut));
      }
    },
  );
});
