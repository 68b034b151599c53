/**
 * The fast path's pieces against the plain ones they stand for: lossy parts as data against
 * the point formulas of the primitives, every section's block form against its point form
 * for the product's catalogue, and the bench chain's node analysis point by point against
 * the same analysis in blocks.
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
import { STAGE_DEFINITIONS } from '../../shared/engine/stages';
import {
  capacitorY,
  capacitorZ,
  inductorY,
  inductorZ,
} from '../../shared/engine/stages/primitives';
import { benchChain } from '../../scripts/bench/bench-chain';
import { parseChainDocument } from '../../shared/schema/parse-chain';

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

describe('blocks of points', () => {
  // The product's bench chain (every stage with a block form): 600 points run in blocks give
  // exactly what each point gives alone.
  it('the bench chain in blocks equals the bench chain point by point', () => {
    const built = buildChain(parseChainDocument(benchChain(600)), STAGE_DEFINITIONS);
    const f = Float64Array.from({ length: 600 }, (_, i) => 5e6 + i * 6.7e3);
    const all = runNodeAnalysis(built, f);
    const one = createNodeAnalysis(built, 1);
    for (const i of [0, 255, 256, 511, 599]) {
      runNodeAnalysis(built, [f[i]], one);
      for (let k = 0; k < one.nodes; k++) {
        const at = k * all.points + i;
        expect([one.zinRe[k], one.zinIm[k], one.zsrcRe[k], one.vRe[k], one.vIm[k]]).toEqual([
          all.zinRe[at],
          all.zinIm[at],
          all.zsrcRe[at],
          all.vRe[at],
          all.vIm[at],
        ]);
      }
    }
  });
});
