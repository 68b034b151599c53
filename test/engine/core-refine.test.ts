/**
 * Locating what a grid brackets: zeros (Illinois), maxima (golden section and Brent's
 * method), checked against closed forms, and the grid scan in power that brackets a
 * response's edges checked against the same scan in dB.
 */
import fc from 'fast-check';
import { buildChain, frequencyGrid, runNodeAnalysis } from '../../shared/engine';
import { createProbe } from '../../shared/engine/core/probe';
import { maximise, maximiseSmooth, solveBracketed } from '../../shared/engine/core/refine';
import {
  dbAt,
  gridDb,
  locateEdge,
  mayFall,
  mayFallScanned,
  powerMax,
  scanStepUpPower,
  stepUpPower,
  type PowerScan,
} from '../../shared/engine/core/response-shape';
import type { NodeAnalysis } from '../../shared/engine/core/nodes';
import { chain, TEST_CATALOGUE } from './core-fixtures';

/** A single tuned circuit's response in dB: peak at f0 with loaded Q, 1 dB above 0 there. */
const tuned = (f0: number, q: number) => (f: number) => {
  const x = q * (f / f0 - f0 / f);
  return 1 - 10 * Math.log10(1 + x * x);
};

function counted(h: (f: number) => number): { h: (f: number) => number; calls: () => number } {
  let n = 0;
  return {
    h: (f) => {
      n++;
      return h(f);
    },
    calls: () => n,
  };
}

describe('maximiseSmooth (Brent)', () => {
  it('finds a tuned circuit peak to 1e-9 in fewer evaluations than golden section', () => {
    const f0 = 7.1e6;
    const brent = counted(tuned(f0, 80));
    const golden = counted(tuned(f0, 80));
    const step = 2e3;
    const [fb, hb] = maximiseSmooth(brent.h, f0 - 1.3 * step, f0 + 0.7 * step, f0 - 0.3 * step);
    const [fg] = maximise(golden.h, f0 - 1.3 * step, f0 + 0.7 * step);
    expect(Math.abs(fb / f0 - 1)).toBeLessThan(1e-8);
    expect(Math.abs(fg / f0 - 1)).toBeLessThan(1e-8);
    expect(hb).toBeCloseTo(1, 12);
    expect(brent.calls()).toBeLessThan(golden.calls() / 2);
  });

  it('locates the maximum of any smooth unimodal peak inside its bracket (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e3, max: 1e9, noNaN: true }),
        fc.double({ min: 2, max: 2000, noNaN: true }),
        fc.double({ min: 0.05, max: 0.95, noNaN: true }),
        fc.double({ min: 0.05, max: 0.95, noNaN: true }),
        (f0, q, where, from) => {
          // A bracket of about a tenth of the bandwidth, the peak somewhere inside it.
          const width = f0 / q / 10;
          const lo = f0 - where * width;
          const hi = lo + width;
          const [f, level] = maximiseSmooth(tuned(f0, q), lo, hi, lo + from * width);
          return Math.abs(f / f0 - 1) < 1e-7 && Math.abs(level - 1) < 1e-9;
        },
      ),
    );
  });

  it('seeded with three grid points, finds the same peak in fewer evaluations on the whole', () => {
    // Tuned circuits of Q 5 … 2000, grid points a tenth of the bandwidth apart, the highest
    // (k) anywhere in the middle of its bracket.
    let plainCalls = 0;
    let seededCalls = 0;
    for (let t = 0; t < 300; t++) {
      const f0 = 10 ** (3 + (6 * t) / 300);
      const q = 5 * 400 ** (((t * 7) % 300) / 300);
      const fk = f0 * (1 + (((t * 13) % 300) / 300 - 0.5) * (0.4 / q / 10));
      const step = f0 / q / 10;
      const h = tuned(f0, q);
      const plain = counted(h);
      const seeded = counted(h);
      const [fp] = maximiseSmooth(plain.h, fk - step, fk + step, fk);
      const known = { hLo: h(fk - step), hStart: h(fk), hHi: h(fk + step) };
      const [fs, level] = maximiseSmooth(seeded.h, fk - step, fk + step, fk, undefined, known);
      expect(Math.abs(fs / f0 - 1)).toBeLessThan(1e-7);
      expect(Math.abs(fs / fp - 1)).toBeLessThan(1e-7);
      expect(level).toBeCloseTo(1, 9);
      plainCalls += plain.calls();
      seededCalls += seeded.calls();
    }
    expect(seededCalls).toBeLessThan(0.85 * plainCalls);
  });

  it('stays at the end of the bracket where the function keeps rising', () => {
    const [f, level] = maximiseSmooth((x) => x, 1, 2, 1.5);
    expect(f).toBeGreaterThan(2 - 1e-8);
    expect(level).toBeCloseTo(f, 15);
  });
});

describe('solveBracketed (Illinois)', () => {
  it('finds the half-power edge of a tuned circuit to 1e-10 relative', () => {
    const f0 = 1e6;
    const q = 50;
    const h = tuned(f0, q);
    const level = 1 - 10 * Math.log10(2);
    const fHz = solveBracketed((f) => h(f) - level, f0, f0 * 1.05);
    // Upper half-power frequency: f0·(√(1 + 1/(4Q²)) + 1/(2Q)).
    const exact = f0 * (Math.sqrt(1 + 1 / (4 * q * q)) + 1 / (2 * q));
    expect(Math.abs(fHz / exact - 1)).toBeLessThan(1e-10);
  });
});

describe('the grid scan in power', () => {
  // A 50 Ω source into a 1 MHz tank into 5 kΩ: a peak, −3 dB and −10 dB edges on the grid.
  const doc = chain(
    [
      { type: 't-source', label: 'Source', values: { rs: 50, emf: 1 } },
      { type: 't-series', label: 'Feed', values: { r: 2000 } },
      { type: 't-tank', label: 'Tank', values: { l: 10e-6, c: 1 / ((2 * Math.PI * 1e6) ** 2 * 10e-6), rs: 0.5 } }, // prettier-ignore
      { type: 't-load', label: 'Load', values: { r: 5000 } },
    ],
    { f0Hz: 1e6, sweep: { startHz: 0.9e6, stopHz: 1.1e6, points: 401, scale: 'lin' } },
  );
  const built = buildChain(doc, TEST_CATALOGUE);
  const na = runNodeAnalysis(built, frequencyGrid(built.settings.sweep));
  const flat = built.userNodeFlat[2];
  const probe = createProbe(built);

  /** The edge by the dB scan the power scan replaced. */
  function dbScanEdge(p: number, level: number, dir: -1 | 1): number | null {
    const f = na.freqs;
    for (let k = p; k + dir >= 0 && k + dir < na.points; k += dir) {
      const next = k + dir;
      const dn = gridDb(na, flat, next);
      if (!(dn < level)) continue;
      const dk = gridDb(na, flat, k);
      const g = (x: number) => dbAt(probe, flat, x) - level;
      return dir < 0
        ? solveBracketed(g, f[next], f[k], undefined, dn - level, dk - level)
        : solveBracketed(g, f[k], f[next], undefined, dk - level, dn - level);
    }
    return null;
  }

  it('brackets and locates the same edges as a scan in dB', () => {
    const power = new Float64Array(na.points);
    stepUpPower(na, flat, power);
    const k = powerMax(power, na.points);
    const db = Array.from({ length: na.points }, (_, i) => gridDb(na, flat, i));
    expect(k).toBe(db.indexOf(Math.max(...db)));
    for (const down of [3, 10]) {
      for (const dir of [-1, 1] as const) {
        const level = db[k] - down;
        const edge = locateEdge(probe, flat, na, power, k, level, dir);
        expect(edge).not.toBeNull();
        expect(edge!.fHz).toBe(dbScanEdge(k, level, dir));
      }
    }
    // A level the response never falls below has no edge.
    expect(locateEdge(probe, flat, na, power, k, db[k] - 200, 1)).toBeNull();
  });

  it('rules out a side only where the edge search finds no edge', () => {
    const power = new Float64Array(na.points);
    stepUpPower(na, flat, power);
    const k = powerMax(power, na.points);
    const peakDb = gridDb(na, flat, k);
    const ruledOut: (object | null)[] = [];
    let found = 0;
    for (let down = 0.5; down < 120; down *= 1.3) {
      for (const dir of [-1, 1] as const) {
        const level = peakDb - down;
        const edge = locateEdge(probe, flat, na, power, k, level, dir);
        if (!mayFall(power, k, level, dir)) ruledOut.push(edge);
        if (edge) found++;
      }
    }
    // Levels both ways: some sides ruled out (and none of them has an edge), edges elsewhere.
    expect(ruledOut.length).toBeGreaterThan(0);
    expect(ruledOut.every((edge) => edge === null)).toBe(true);
    expect(found).toBeGreaterThan(0);
  });
});

describe('the one-pass scan of a node (scanStepUpPower)', () => {
  // Voltages and EMFs with zeros, NaN and ∞ mixed in, so the peak and the sides' lowest
  // values are found among points the peak search must pass over.
  const special = fc.constantFrom(0, NaN, Infinity, -Infinity, 1e-300, 1e300);
  const value = fc.oneof(
    { weight: 6, arbitrary: fc.double({ min: -1e3, max: 1e3, noNaN: true }) },
    { weight: 1, arbitrary: special },
  );

  it('gives the powers, the peak and mayFall’s answers of the separate passes (property)', () => {
    fc.assert(
      fc.property(
        fc
          .integer({ min: 1, max: 40 })
          .chain((P) =>
            fc.tuple(
              fc.array(value, { minLength: 2 * P, maxLength: 2 * P }),
              fc.array(value, { minLength: 2 * P, maxLength: 2 * P }),
              fc.array(value, { minLength: P, maxLength: P }),
            ),
          ),
        fc.constantFrom(0, 1),
        fc.array(fc.double({ min: -400, max: 400, noNaN: true }), { minLength: 1, maxLength: 6 }),
        ([re, im, emf], flat, levels) => {
          const P = emf.length;
          const na = {
            points: P,
            vRe: Float64Array.from(re),
            vIm: Float64Array.from(im),
            emf: Float64Array.from(emf),
          } as unknown as NodeAnalysis;
          const apart = new Float64Array(P);
          stepUpPower(na, flat, apart);
          const k = powerMax(apart, P);
          const together = new Float64Array(P);
          const scan: PowerScan = { k: -2, minBelow: NaN, minAbove: NaN };
          scanStepUpPower(na, flat, together, scan);
          expect(Array.from(together)).toEqual(Array.from(apart));
          expect(scan.k).toBe(k);
          if (k < 0) return;
          // Levels at and either side of the grid's own values, as well as arbitrary ones.
          const grid = Array.from(apart, (p) => 10 * Math.log10(p)).filter(Number.isFinite);
          for (const level of [...levels, ...grid, ...grid.map((l) => l + 1e-12)]) {
            for (const dir of [-1, 1] as const) {
              expect(mayFallScanned(scan, level, dir)).toBe(mayFall(apart, k, level, dir));
            }
          }
        },
      ),
      { numRuns: 500 },
    );
  });

  it('finds the first of equal highest points, and a side with nothing in it never falls', () => {
    const na = {
      points: 5,
      vRe: Float64Array.of(1, 3, 2, 3, 1),
      vIm: new Float64Array(5),
      emf: new Float64Array(5).fill(1),
    } as unknown as NodeAnalysis;
    const power = new Float64Array(5);
    const scan: PowerScan = { k: -1, minBelow: 0, minAbove: 0 };
    scanStepUpPower(na, 0, power, scan);
    expect(scan).toEqual({ k: 1, minBelow: 1, minAbove: 1 });
    const edge = { ...na, vRe: Float64Array.of(3, 2, 1, 0.5, 0.25) } as unknown as NodeAnalysis;
    scanStepUpPower(edge, 0, power, scan);
    expect(scan).toEqual({ k: 0, minBelow: Infinity, minAbove: 0.0625 });
    expect(mayFallScanned(scan, 100, -1)).toBe(false);
    expect(mayFallScanned(scan, 10 * Math.log10(0.0625), 1)).toBe(true);
  });
});
