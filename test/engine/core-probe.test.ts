/**
 * The single-frequency probe against the node analysis it stands in for: the same impedances
 * and step-up at every node, behind amplifiers and a mixer too (it must agree to rounding, as
 * it is the same formulas evaluated for one point).
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { buildChain } from '../../shared/engine/core/build';
import { runNodeAnalysis } from '../../shared/engine/core/nodes';
import { createProbe, probeOf } from '../../shared/engine/core/probe';
import { stepUp } from '../../shared/engine/core/quantities';
import { STAGE_DEFINITIONS } from '../../shared/engine/stages';
import type { ComplexFn, RealFn } from '../../shared/engine/types';
import { chainDocumentSchema } from '../../shared/schema/chain';

const file = path.join(__dirname, '..', '..', 'examples', 'shortwave-superhet-single-tank.chain.json'); // prettier-ignore
const built = buildChain(
  chainDocumentSchema.parse(JSON.parse(readFileSync(file, 'utf8'))),
  STAGE_DEFINITIONS,
);
const close = (a: number, b: number) => Math.abs(a - b) <= 1e-12 * Math.max(Math.abs(a), Math.abs(b), 1e-300); // prettier-ignore

/** |z1 − z2| / |z2|. */
const sameZ = (ar: number, ai: number, br: number, bi: number) =>
  Math.hypot(ar - br, ai - bi) / Math.hypot(br, bi);

describe('probe', () => {
  const probe = createProbe(built);
  it.each([6.1e6, 7.2e6, 7.2031e6, 8.11e6])('agrees with the node analysis at %d Hz', (f) => {
    const na = runNodeAnalysis(built, [f]);
    for (let n = 0; n < na.nodes; n++) {
      expect(close(probe.at(f, n, true), stepUp(na, n, 0))).toBe(true);
      probe.at(f, n); // a voltage needs no forward pass: Zsrc comes without one
      expect(sameZ(probe.zsrcRe[n], probe.zsrcIm[n], na.zsrcRe[n], na.zsrcIm[n])).toBeLessThan(1e-12); // prettier-ignore
      // Before an amplifier the probe starts from an open circuit, which gives the same
      // impedance as the load would up to the rounding of A·D − B·C = 0.
      expect(sameZ(probe.zinRe[n], probe.zinIm[n], na.zinRe[n], na.zinIm[n])).toBeLessThan(1e-9); // prettier-ignore
      expect(probe.fNode[n]).toBe(na.fNode[n]);
    }
  });

  it('cut open at the node itself leaves only the source side', () => {
    const out = new Float64Array(2);
    probe.at(7.2e6, 2);
    probe.cutAdmittance(2, 2, out);
    const d = probe.zsrcRe[2] ** 2 + probe.zsrcIm[2] ** 2;
    expect(close(out[0], probe.zsrcRe[2] / d)).toBe(true);
    expect(close(out[1], -probe.zsrcIm[2] / d)).toBe(true);
  });
});

describe('probe terminations with and without block forms', () => {
  // The probe reads the source's EMF and impedance and the load's impedance through their
  // block forms when they have them (nothing boxed), else through their point forms: both
  // ways must give the very same numbers.
  const { source, load } = built;
  const pointC =
    (fn: ComplexFn): ComplexFn =>
    (f, out, o) =>
      fn(f, out, o);
  const pointR =
    (fn: RealFn): RealFn =>
    (f) =>
      fn(f);
  const blockC = (fn: ComplexFn): ComplexFn =>
    Object.assign(pointC(fn), {
      fill: (
        f: Float64Array,
        fo: number,
        n: number,
        out: Float64Array,
        oo: number,
        stride: number,
      ) => {
        for (let k = 0; k < n; k++) fn(f[fo + k], out, oo + stride * k);
      },
    });
  const blockR = (fn: RealFn): RealFn =>
    Object.assign(pointR(fn), {
      fill: (f: Float64Array, fo: number, n: number, out: Float64Array, oo: number) => {
        for (let k = 0; k < n; k++) out[oo + k] = fn(f[fo + k]);
      },
    });
  const withTerminations = (c: (fn: ComplexFn) => ComplexFn, r: (fn: RealFn) => RealFn) => ({
    ...built,
    source: { ...source, model: { ...source.model, impedance: c(source.model.impedance!), emf: r(source.model.emf!) } }, // prettier-ignore
    load: { ...load, model: { ...load.model, impedance: c(load.model.impedance!) } },
  });
  const pointOnly = createProbe(withTerminations(pointC, pointR));
  const blocks = createProbe(withTerminations(blockC, blockR));

  it('the wrappers are what they claim to be', () => {
    const b = withTerminations(blockC, blockR);
    const p = withTerminations(pointC, pointR);
    expect(typeof b.source.model.emf!.fill).toBe('function');
    expect(typeof b.load.model.impedance!.fill).toBe('function');
    expect(p.source.model.emf!.fill).toBeUndefined();
    expect(p.source.model.impedance!.fill).toBeUndefined();
  });

  it.each([6.1e6, 7.2031e6, 8.11e6])('the same step-up and impedances at %d Hz', (f) => {
    for (let n = 0; n < built.sections.length + 1; n++) {
      const a = pointOnly.at(f, n, true);
      const b = blocks.at(f, n, true);
      expect(Number.isFinite(a)).toBe(true);
      expect(b).toBe(a);
      pointOnly.at(f, n);
      blocks.at(f, n);
      expect([blocks.zsrcRe[n], blocks.zsrcIm[n], blocks.zinRe[n], blocks.zinIm[n]]).toEqual([
        pointOnly.zsrcRe[n],
        pointOnly.zsrcIm[n],
        pointOnly.zinRe[n],
        pointOnly.zinIm[n],
      ]);
    }
  });
});

describe("a built chain's kept probe (probeOf)", () => {
  it('is one probe per built chain, and answers as a fresh probe does after any other call', () => {
    const kept = probeOf(built);
    expect(probeOf(built)).toBe(kept);
    const again = buildChain(chainDocumentSchema.parse(JSON.parse(readFileSync(file, 'utf8'))), STAGE_DEFINITIONS); // prettier-ignore
    expect(probeOf(again)).not.toBe(kept);
    const fresh = createProbe(built);
    const last = built.sections.length;
    // Whatever the kept probe evaluated before, a call gives the fresh probe's very numbers.
    kept.at(9.3e6, last, true);
    kept.at(5.5e6, 1);
    for (const [f, node, voltage] of [
      [7.2e6, last, true],
      [6.05e6, 2, false],
    ] as const) {
      const a = kept.at(f, node, voltage);
      const b = fresh.at(f, node, voltage);
      expect(Object.is(a, b)).toBe(true);
      for (let n = voltage ? 0 : node; n <= node; n++) {
        expect(Object.is(kept.zinRe[n], fresh.zinRe[n]) && Object.is(kept.zinIm[n], fresh.zinIm[n])).toBe(true); // prettier-ignore
      }
    }
  });
});
