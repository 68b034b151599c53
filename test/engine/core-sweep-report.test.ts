/**
 * The sweep report computes its traces when they are read: what they hold must be what the
 * node analysis gave (the closed formulas at each point), stay this analysis's after the
 * next analysis reuses the workspace, and be seen by every reader (JSON, structured clone,
 * spreading) as ordinary data.
 */
import { analyzeChain, type BuiltChain, type NodeAnalysis } from '../../shared/engine';
import { lazySweepReport, sweepNanShares } from '../../shared/engine/core/sweep-report';
import { nodeTraceValues, sweepColumns, traceValues } from '../../shared/engine/core/sweep-readers';
import fc from 'fast-check';
import { chain, TEST_CATALOGUE } from './core-fixtures';

const opts = { catalogue: TEST_CATALOGUE, sweep: true };

/** A source into a series R–L–C into a load: the step-up and phase have closed forms. */
function seriesRlc(rLoad: number, referenceOhm?: number) {
  return chain(
    [
      { type: 't-source', label: 'Source', values: { rs: 50, emf: 1 } },
      { type: 't-series', label: 'Series RLC', values: { r: 5, l: 10e-6, c: 100e-12 } },
      { type: 't-load', label: 'Load', values: { r: rLoad } },
    ],
    {
      f0Hz: 5e6,
      sweep: { startHz: 3e6, stopHz: 8e6, points: 101, scale: 'lin' },
      ...(referenceOhm === undefined ? {} : { referenceOhm }),
    },
  );
}

/** The series branch's impedance at f. */
const branch = (f: number) => {
  const w = 2 * Math.PI * f;
  return { re: 5, im: w * 10e-6 - 1 / (w * 100e-12) };
};

describe('the sweep report', () => {
  it('holds the closed-form step-up, phase, input impedance and return loss', () => {
    const sweep = analyzeChain(seriesRlc(200, 50), opts).sweep!;
    expect(sweep.freqsHz).toHaveLength(101);
    const load = sweep.nodes[1];
    for (const i of [0, 37, 100]) {
      const f = sweep.freqsHz[i];
      const z = branch(f);
      // V(load) = E·RL/(Rs + Z + RL)
      const dr = 50 + z.re + 200;
      const di = z.im;
      const vr = (200 * dr) / (dr * dr + di * di);
      const vi = (-200 * di) / (dr * dr + di * di);
      expect(load.stepUpDb[i]).toBeCloseTo(20 * Math.log10(Math.hypot(vr, vi)), 10);
      expect(load.phaseDeg[i]).toBeCloseTo((Math.atan2(vi, vr) * 180) / Math.PI, 8);
      expect(sweep.zIn.re[i]).toBeCloseTo(z.re + 200, 8);
      expect(sweep.zIn.im[i]).toBeCloseTo(z.im, 8);
      const g = Math.hypot(z.re + 200 - 50, z.im) / Math.hypot(z.re + 200 + 50, z.im);
      expect(sweep.returnLossDb[i]).toBeCloseTo(-20 * Math.log10(g), 10);
    }
  });

  it('judges the return loss against the source impedance when no reference is chosen', () => {
    const sweep = analyzeChain(seriesRlc(200), opts).sweep!;
    const f = sweep.freqsHz[10];
    const z = branch(f);
    const g = Math.hypot(z.re + 200 - 50, z.im) / Math.hypot(z.re + 200 + 50, z.im);
    expect(sweep.returnLossDb[10]).toBeCloseTo(-20 * Math.log10(g), 10);
  });

  it('keeps its own traces when a later analysis reuses the workspace', () => {
    const first = analyzeChain(seriesRlc(200, 50), opts);
    const expected = analyzeChain(seriesRlc(200, 50), opts).sweep!.nodes[1].stepUpDb;
    const later = analyzeChain(seriesRlc(10, 50), opts); // read before the first is read
    expect(later.sweep!.nodes[1].stepUpDb[50]).not.toBeCloseTo(expected[50], 3);
    expect(first.sweep!.nodes[1].stepUpDb).toEqual(expected);
    expect(first.sweep!.zIn.re[50]).toBeCloseTo(branch(first.sweep!.freqsHz[50]).re + 200, 8);
  });

  it('computes no trace until one is read', () => {
    const sweep = analyzeChain(seriesRlc(200, 50), opts).sweep!;
    for (const node of sweep.nodes) {
      expect(Object.getOwnPropertyDescriptor(node, 'stepUpDb')?.get).toBeInstanceOf(Function);
      expect(Object.getOwnPropertyDescriptor(node, 'phaseDeg')?.get).toBeInstanceOf(Function);
    }
    expect(Object.getOwnPropertyDescriptor(sweep, 'returnLossDb')?.get).toBeInstanceOf(Function);
  });

  it('reads as plain data through JSON, structured clone and spreading', () => {
    const sweep = analyzeChain(seriesRlc(200, 50), opts).sweep!;
    const json = JSON.parse(JSON.stringify(sweep));
    expect(Object.keys(json)).toEqual(['freqsHz', 'nodes', 'zIn', 'returnLossDb']);
    expect(Object.keys(json.nodes[0])).toEqual(['index', 'stepUpDb', 'phaseDeg']);
    expect(json.nodes[0].phaseDeg).toHaveLength(101);
    const cloned = structuredClone(sweep);
    expect(cloned.nodes[1].stepUpDb).toEqual(sweep.nodes[1].stepUpDb);
    expect({ ...sweep.nodes[0] }.phaseDeg).toEqual(sweep.nodes[0].phaseDeg);
    // Once read it is a data property, and it can be replaced like one.
    expect(Object.getOwnPropertyDescriptor(sweep.nodes[1], 'stepUpDb')).toHaveProperty('value');
    sweep.nodes[0].phaseDeg = [1, 2];
    expect(sweep.nodes[0].phaseDeg).toEqual([1, 2]);
  });
});

describe('a long sweep', () => {
  it('is read in place from its one-off workspace and stays its own after later analyses', () => {
    // Two nodes × 7 arrays × 320,000 points: above the 4 Mi doubles kept between analyses.
    const long = (rLoad: number) => {
      const doc = seriesRlc(rLoad, 50);
      return { ...doc, settings: { ...doc.settings, sweep: { ...doc.settings.sweep, points: 320_000 } } }; // prettier-ignore
    };
    const first = analyzeChain(long(200), opts).sweep!;
    const later = analyzeChain(long(10), opts).sweep!;
    const i = 223_456;
    const f = first.freqsHz[i];
    expect(first.zIn.re[i]).toBeCloseTo(branch(f).re + 200, 8);
    expect(later.zIn.re[i]).toBeCloseTo(branch(f).re + 10, 8);
    expect(first.nodes[1].stepUpDb[i]).not.toBeCloseTo(later.nodes[1].stepUpDb[i], 3);
  });
});

describe('sweepColumns', () => {
  it('gives the traces’ own numbers a block at a time, for the engine’s report and a plain one', () => {
    const sweep = analyzeChain(seriesRlc(200, 50), opts).sweep!;
    for (const report of [sweep, JSON.parse(JSON.stringify(sweep)) as typeof sweep]) {
      const cols = sweepColumns(report);
      const block = new Float64Array(30);
      cols.stepUpDb(1, 40, 30, block);
      expect(Array.from(block)).toEqual(sweep.nodes[1].stepUpDb.slice(40, 70));
      expect(Array.from(cols.freqs)).toEqual(sweep.freqsHz);
      expect(Array.from(cols.zinRe)).toEqual(sweep.zIn.re);
      expect(Array.from(cols.zinIm)).toEqual(sweep.zIn.im);
    }
  });
});

describe('traceValues and nodeTraceValues', () => {
  /** Each trace's values as an array of doubles (Object.is equality: -0 and NaN kept). */
  const read = (sweep: ReturnType<typeof lazy>) => ({
    freqsHz: Array.from(traceValues(sweep, 'freqsHz')),
    zInRe: Array.from(traceValues(sweep, 'zInRe')),
    zInIm: Array.from(traceValues(sweep, 'zInIm')),
    returnLossDb: Array.from(traceValues(sweep, 'returnLossDb')),
    stepUpDb: sweep.nodes.map((n) => Array.from(nodeTraceValues(sweep, n, 'stepUpDb'))),
    phaseDeg: sweep.nodes.map((n) => Array.from(nodeTraceValues(sweep, n, 'phaseDeg'))),
  });
  const settled = (sweep: ReturnType<typeof lazy>) => ({
    freqsHz: sweep.freqsHz,
    zInRe: sweep.zIn.re,
    zInIm: sweep.zIn.im,
    returnLossDb: sweep.returnLossDb,
    stepUpDb: sweep.nodes.map((n) => n.stepUpDb),
    phaseDeg: sweep.nodes.map((n) => n.phaseDeg),
  });
  const lazy = (rLoad: number, reference?: number) =>
    analyzeChain(seriesRlc(rLoad, reference), opts).sweep!;

  it.each([
    ['a reference resistance', 50],
    ['the source’s own impedance', undefined],
  ])('gives the traces’ own numbers without settling them, against %s', (_, reference) => {
    const sweep = lazy(200, reference);
    const values = read(sweep);
    // Nothing was settled: every trace is still an accessor.
    const accessor = (o: object, k: string) => Object.getOwnPropertyDescriptor(o, k)?.get;
    for (const k of ['freqsHz', 'zIn', 'returnLossDb']) expect(accessor(sweep, k)).toBeDefined();
    for (const n of sweep.nodes) expect(accessor(n, 'stepUpDb')).toBeDefined();
    expect(values).toEqual(settled(sweep));
    // Settled now: the same numbers again, read from the traces themselves.
    expect(read(sweep)).toEqual(values);
  });

  it('gives an assigned trace, and a plain report’s arrays, as they are', () => {
    const sweep = lazy(200, 50);
    const fresh = settled(lazy(200, 50));
    sweep.returnLossDb = [1, 2, 3];
    sweep.nodes[1].stepUpDb = [4, 5];
    sweep.zIn = { re: [6], im: [7] };
    const values = read(sweep);
    expect(values.returnLossDb).toEqual([1, 2, 3]);
    expect(values.stepUpDb).toEqual([fresh.stepUpDb[0], [4, 5]]);
    expect([values.zInRe, values.zInIm]).toEqual([[6], [7]]);
    expect(values.freqsHz).toEqual(fresh.freqsHz);
    const plain = JSON.parse(JSON.stringify(lazy(10, 50))) as ReturnType<typeof lazy>;
    expect(read(plain)).toEqual(settled(plain));
  });

  it('keeps each report’s numbers when read after later analyses', () => {
    const first = lazy(200, 50);
    const later = lazy(10, 50);
    const a = Array.from(nodeTraceValues(first, first.nodes[1], 'stepUpDb'));
    const b = Array.from(nodeTraceValues(later, later.nodes[1], 'stepUpDb'));
    expect(a).toEqual(first.nodes[1].stepUpDb);
    expect(b).toEqual(later.nodes[1].stepUpDb);
    expect(a).not.toEqual(b);
  });
});

describe('a sweep report read in place (sweepInPlace)', () => {
  it('holds the copied report’s numbers until the next analysis, and refuses reads after it', () => {
    const copied = analyzeChain(seriesRlc(200), opts).sweep!;
    const expected = JSON.parse(JSON.stringify(copied));
    const inPlace = analyzeChain(seriesRlc(200), { ...opts, sweepInPlace: true }).sweep!;
    // One trace read (and so settled) before the next analysis, the rest left lazy.
    const settledStepUp = inPlace.nodes[1].stepUpDb;
    expect(Array.from(nodeTraceValues(inPlace, inPlace.nodes[0], 'stepUpDb'))).toEqual(
      expected.nodes[0].stepUpDb,
    );
    expect(Array.from(traceValues(inPlace, 'returnLossDb'))).toEqual(expected.returnLossDb);
    expect(sweepNanShares(inPlace).zIn).toBe(0);
    // The copied report is its own: the in-place analysis did not touch it.
    expect(JSON.parse(JSON.stringify(copied))).toEqual(expected);
    analyzeChain(seriesRlc(10), opts);
    expect(settledStepUp).toEqual(expected.nodes[1].stepUpDb);
    expect(inPlace.nodes[1].stepUpDb).toBe(settledStepUp);
    expect(() => inPlace.returnLossDb).toThrow(/after a later analysis reused its workspace/);
    expect(() => inPlace.nodes[0].phaseDeg).toThrow(/reused its workspace/);
    expect(() => traceValues(inPlace, 'zInRe')).toThrow(/reused its workspace/);
    expect(() => nodeTraceValues(inPlace, inPlace.nodes[0], 'stepUpDb')).toThrow(/reused/);
    expect(() => sweepNanShares(inPlace)).toThrow(/reused its workspace/);
    expect(() => JSON.stringify(inPlace)).toThrow(/reused its workspace/);
    // A copied report made before the same later analysis is still whole.
    expect(JSON.parse(JSON.stringify(copied))).toEqual(expected);
  });
});

describe('sweepNanShares', () => {
  it('counts the points a trace loses without computing it, as the computed trace shows them', () => {
    // Two user nodes over 6 points: voltages, EMFs and impedances with NaN, ∞ and 0 mixed in.
    const P = 6;
    const vRe = Float64Array.of(1, NaN, Infinity, 0, 1e-320, 2, /* node 1 */ NaN, Infinity, 0, 0, 3, NaN); // prettier-ignore
    const vIm = Float64Array.of(0, 1, NaN, 0, 0, -Infinity, /* node 1 */ NaN, 1, 0, 1, 4, 0); // prettier-ignore
    const emf = Float64Array.of(1, 1, 1, 0, 1, Infinity);
    const zin = Float64Array.of(NaN, 50, NaN, NaN, Infinity, 1, 0, 0, 0, 0, 0, 0);
    const na = {
      points: P,
      nodes: 2,
      freqs: Float64Array.of(1, 2, 3, 4, 5, 6),
      emf,
      vRe,
      vIm,
      zinRe: zin,
      zinIm: new Float64Array(2 * P),
      zsrcRe: new Float64Array(2 * P).fill(50),
      zsrcIm: new Float64Array(2 * P),
    } as unknown as NodeAnalysis;
    const built = { userNodeFlat: Int32Array.of(0, 1), settings: {} } as unknown as BuiltChain;
    const shares = sweepNanShares(lazySweepReport(built, na, 50));
    const computed = lazySweepReport(built, na, 50);
    const nanShare = (a: number[]) => a.filter(Number.isNaN).length / a.length;
    expect(shares.stepUp).toEqual(computed.nodes.map((n) => nanShare(n.stepUpDb)));
    expect(shares.stepUp.some((s) => s > 0)).toBe(true);
    expect(shares.zIn).toBe(Math.max(nanShare(computed.zIn.re), nanShare(computed.zIn.im)));
    expect(shares.zIn).toBe(0.5);
    // A report that is not the engine's own (read back from columns) is counted from its arrays.
    const plain = JSON.parse(JSON.stringify(computed));
    expect(sweepNanShares(plain).zIn).toBe(0);
  });

  it('finds a single lost value wherever it lies, for any number of points (property)', () => {
    // The copy tests finiteness in four interleaved sums and a tail: one non-finite value in
    // any slot (or none) must show, in either part of a voltage or of the input impedance.
    const lost = fc.constantFrom(NaN, Infinity, -Infinity);
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 13 }),
        fc.nat(),
        lost,
        fc.constantFrom('vRe', 'vIm', 'zinRe', 'zinIm', 'none'),
        (P, at, bad, where) => {
          const rows = {
            vRe: Float64Array.from({ length: P }, (_, i) => 1 + i),
            vIm: Float64Array.from({ length: P }, (_, i) => -i),
            zinRe: new Float64Array(P).fill(50),
            zinIm: new Float64Array(P).fill(5),
          };
          if (where !== 'none') rows[where][at % P] = bad;
          const na = {
            points: P,
            nodes: 1,
            freqs: Float64Array.from({ length: P }, (_, i) => 1e6 + i),
            emf: new Float64Array(P).fill(1),
            ...rows,
            zsrcRe: new Float64Array(P).fill(50),
            zsrcIm: new Float64Array(P),
          } as unknown as NodeAnalysis;
          const built = { userNodeFlat: Int32Array.of(0), settings: {} } as unknown as BuiltChain;
          const shares = sweepNanShares(lazySweepReport(built, na, 50));
          const computed = lazySweepReport(built, na, 50);
          const nanShare = (a: number[]) => a.filter(Number.isNaN).length / a.length;
          expect(shares.stepUp).toEqual([nanShare(computed.nodes[0].stepUpDb)]);
          expect(shares.zIn).toBe(Math.max(nanShare(computed.zIn.re), nanShare(computed.zIn.im)));
          // An infinite part of Zin is no lost point; a NaN one is.
          const zinLost = (where === 'zinRe' || where === 'zinIm') && Number.isNaN(bad);
          expect(shares.zIn).toBe(zinLost ? 1 / P : 0);
        },
      ),
      { numRuns: 500 },
    );
  });
});
