/**
 * An element's own resonance and Q (own-resonance.ts): the closed form of a series RLC, the
 * same answer by the point form and the block form, and searches that reuse one workspace
 * giving each its own answer whatever ran before.
 */
import {
  bisectRising,
  ownResonance,
  type OwnResonanceMemo,
} from '../../shared/engine/core/own-resonance';
import type { ComplexFn } from '../../shared/engine/types';

/**
 * A series RLC's impedance R + j(ωL − 1/ωC), with a block form when `block`; `calls` counts
 * the points evaluated by either form.
 */
function seriesRlc(r: number, l: number, c: number, block: boolean): ComplexFn & { calls: number } {
  const fn = ((f: number, out: Float64Array, o: number) => {
    fn.calls++;
    const w = 2 * Math.PI * f;
    out[o] = r;
    out[o + 1] = w * l - 1 / (w * c);
  }) as ComplexFn & { calls: number };
  fn.calls = 0;
  if (block) {
    fn.fill = (f, fo, n, out, oo, stride) => {
      fn.calls += n;
      for (let k = 0; k < n; k++) {
        const w = 2 * Math.PI * f[fo + k];
        out[oo + stride * k] = r;
        out[oo + stride * k + 1] = w * l - 1 / (w * c);
      }
    };
  }
  return fn;
}

const rel = (a: number, b: number) => Math.abs(a / b - 1);

/** `fn` with the frequencies its block form is given recorded into `seen`. */
function recordingGrid(fn: ComplexFn, seen: number[]): ComplexFn {
  const recording: ComplexFn = (f, out, o) => fn(f, out, o);
  recording.fill = (f, fo, n, out, oo, stride) => {
    for (let k = 0; k < n; k++) seen.push(f[fo + k]);
    fn.fill!(f, fo, n, out, oo, stride);
  };
  return recording;
}

describe('ownResonance', () => {
  // 10 µH, 2.533 nF, 2 Ω: f0 ≈ 1 MHz, Q = ω0·L/R ≈ 31.4.
  const L = 10e-6;
  const C = 2.533e-9;
  const R = 2;
  const f0 = 1 / (2 * Math.PI * Math.sqrt(L * C));
  const q0 = (2 * Math.PI * f0 * L) / R;

  it.each([false, true])('gives the closed-form Q of a series RLC (block form %s)', (block) => {
    const q = ownResonance(seriesRlc(R, L, C, block), f0 * 1.3);
    expect(q).not.toBeNull();
    expect(rel(q!, q0)).toBeLessThan(1e-7);
  });

  it('refines to the Q that the zero bisected to machine precision gives', () => {
    const fn = seriesRlc(R, L, C, false);
    const im = (f: number) => {
      const out = new Float64Array(2);
      fn(f, out, 0);
      return out[1];
    };
    const fr = bisectRising(im, f0 * 0.9, f0 * 1.1);
    expect(rel(fr, f0)).toBeLessThan(1e-13);
    const h = fr * 1e-6;
    const slope = (im(fr + h) - im(fr - h)) / (2 * Math.PI * 2 * h);
    const qBisected = ((2 * Math.PI * fr) / (2 * R)) * slope;
    expect(rel(ownResonance(fn, f0 * 0.8)!, qBisected)).toBeLessThan(1e-9);
  });

  it('answers each search afresh though the workspace is reused (interleaved elements)', () => {
    const a = seriesRlc(R, L, C, true);
    const b = seriesRlc(0.5, 3 * L, C / 7, true); // another resonance, another Q
    const c = seriesRlc(R, L, C, false);
    const first = [ownResonance(a, f0), ownResonance(b, f0 * 0.7), ownResonance(c, f0 * 1.2)];
    // Near targets whose grids share chunk and point numbers with those before.
    const again = [ownResonance(b, f0 * 0.7), ownResonance(a, f0), ownResonance(c, f0 * 1.2)];
    expect(again).toEqual([first[1], first[0], first[2]]);
    // Targets whose grids grow by ratios that differ in rounding (the grid's ends rounded
    // apart), so the growth factors kept from one search are not the other's.
    const ratio = (near: number) => Math.log((near * 3) / (near / 3)) / 4000;
    const targets = Array.from({ length: 200 }, (_, i) => f0 * (0.9 + i * 0.001));
    const other = targets.find((t) => ratio(t) !== ratio(f0))!;
    expect(ratio(other)).not.toBe(ratio(f0));
    // The scan evaluates the element at its own grid's points exactly, though the searches
    // before (at f0) grew their grids by another ratio.
    const seen: number[] = [];
    const recording = recordingGrid(a, seen);
    expect(ownResonance(recording, other)).not.toBeNull();
    const start = other / 3;
    const r = ratio(other);
    const onGrid = seen.map((f) => {
      const i = Math.round(Math.log(f / start) / r);
      return i === 0 || i === 4000 ? f : start * Math.exp(r * i);
    });
    expect(seen.length).toBeGreaterThan(100);
    expect(seen).toEqual(onGrid);
    const fb = 1 / (2 * Math.PI * Math.sqrt(3 * L * (C / 7)));
    expect(rel(first[1]!, (2 * Math.PI * fb * 3 * L) / 0.5)).toBeLessThan(1e-7);
  });

  it('finds nothing where the element has no rising zero within a factor 3', () => {
    expect(ownResonance(seriesRlc(R, L, C, true), f0 * 20)).toBeNull();
    expect(ownResonance(seriesRlc(R, L, C, false), f0 / 20)).toBeNull();
  });

  it('with a memo, answers a repeated search of one element near one target without searching', () => {
    const memo: OwnResonanceMemo = new Map();
    const a = seriesRlc(R, L, C, true);
    const b = seriesRlc(R, L, C, true); // the same values, another element
    const q = ownResonance(a, f0, memo);
    const searched = a.calls;
    expect(searched).toBeGreaterThan(0);
    expect(ownResonance(a, f0, memo)).toBe(q);
    expect(a.calls).toBe(searched);
    // Another target or another element is searched afresh, and remembered beside the first.
    const elsewhere = ownResonance(a, f0 * 1.01, memo);
    expect(a.calls).toBeGreaterThan(searched);
    expect(rel(elsewhere!, q!)).toBeLessThan(1e-7);
    expect(ownResonance(b, f0, memo)).toBe(q);
    expect(b.calls).toBeGreaterThan(0);
    expect(memo.get(a)!.map((k) => k.near)).toEqual([f0, f0 * 1.01]);
    // A search that finds nothing is remembered too.
    const none = a.calls;
    expect(ownResonance(a, f0 * 20, memo)).toBeNull();
    const afterNone = a.calls;
    expect(afterNone).toBeGreaterThan(none);
    expect(ownResonance(a, f0 * 20, memo)).toBeNull();
    expect(a.calls).toBe(afterNone);
  });
});
