/**
 * Matching synthesis against worked cases, each case id and its source given beside its
 * check.
 */
import {
  designDoubleL,
  designLSection,
  designMatch,
  designPi,
  designT,
  designTappedCapacitor,
  lSectionReactances,
  tappedCapacitorEquivalent,
} from '../../shared/engine/design';
import { withMessageFigures } from '../../shared/engine/core/format';
import { StageParameterError } from '../../shared/engine/errors';
import { rel } from './stages-support';

describe('L-section', () => {
  it('LN-1: 75 Ω to 1 kΩ gives Q 3.512, j263 and −j284 (KF5OBS 2013, published reactances)', () => {
    const r = lSectionReactances(75, 1000);
    expect(r.q).toBeCloseTo(3.512, 3);
    expect(Math.abs(r.seriesX - 263.4)).toBeLessThan(0.5);
    expect(Math.abs(r.shuntX - 284.7)).toBeLessThan(1);
    expect(r.shuntAt).toBe('port2');
  });

  it('LN-1: at 1 MHz Ls = 41.92 µH and Cp = 558.9 pF (computed, ±0.1 %)', () => {
    const d = designLSection({ r1: 75, r2: 1000, f0: 1e6 }, 'lowpass');
    expect(rel(d.values.l, 41.92e-6)).toBeLessThan(1e-3);
    expect(rel(d.values.c, 558.9e-12)).toBeLessThan(1e-3);
  });

  it('LN-4: 50 Ω to 500 Ω high-pass at 100 MHz: Ca = 10.61 pF, Lp = 265.26 nH (FOSSEE 5_21)', () => {
    const d = designLSection({ r1: 50, r2: 500, f0: 100e6 }, 'highpass');
    expect(d.q).toBeCloseTo(3, 12);
    expect(rel(d.values.c, 10.61e-12)).toBeLessThan(5e-4);
    expect(rel(d.values.l, 265.26e-9)).toBeLessThan(5e-4);
  });

  it('LN-4: absorbing 42 pF gives the combined shunt L of 49.14 nH (FOSSEE 5_22)', () => {
    const d = designLSection({ r1: 50, r2: 500, f0: 100e6, parasiticC: 42e-12 }, 'highpass');
    expect(rel(d.values.l, 49.14e-9)).toBeLessThan(5e-4);
    expect(rel(d.values.c, 10.61e-12)).toBeLessThan(5e-4);
  });

  it('subtracts a parasitic from a low-pass shunt C, and refuses one larger than it', () => {
    const plain = designLSection({ r1: 75, r2: 1000, f0: 1e6 }, 'lowpass');
    const less = designLSection({ r1: 75, r2: 1000, f0: 1e6, parasiticC: 100e-12 }, 'lowpass');
    expect(plain.values.c - less.values.c).toBeCloseTo(100e-12, 18);
    expect(() =>
      designLSection({ r1: 75, r2: 1000, f0: 1e6, parasiticC: 1e-9 }, 'lowpass'),
    ).toThrow(/cannot be absorbed/);
  });

  it('refuses equal resistances, naming the parameter', () => {
    try {
      lSectionReactances(50, 50);
      throw new Error('expected a refusal');
    } catch (e) {
      expect(e).toBeInstanceOf(StageParameterError);
      expect((e as StageParameterError).param).toBe('r2');
    }
  });
});

describe('pi and T', () => {
  it('PI-1: 1000 Ω to 50 Ω, Q 10, 10 MHz: C1 159.15 pF, L 1.8929 µH, C2 640.59 pF (±0.1 %)', () => {
    const d = designPi({ r1: 1000, r2: 50, f0: 10e6, q: 10 });
    expect(rel(d.values.c1, 159.15e-12)).toBeLessThan(1e-3);
    expect(rel(d.values.l, 1.8929e-6)).toBeLessThan(1e-3);
    expect(rel(d.values.c2, 640.59e-12)).toBeLessThan(1e-3);
  });

  it('T-1: 10 Ω to 50 Ω, Q 5, 100 MHz: L1 79.58 nH, C 43.15 pF, L2 163.09 nH (±0.1 %)', () => {
    const d = designT({ r1: 10, r2: 50, f0: 100e6, q: 5 });
    expect(rel(d.values.l1, 79.58e-9)).toBeLessThan(1e-3);
    expect(rel(d.values.c, 43.15e-12)).toBeLessThan(1e-3);
    expect(rel(d.values.l2, 163.09e-9)).toBeLessThan(1e-3);
  });

  it('refuses a Q below the one the resistances set', () => {
    // √(1000/50 − 1) = 4.36
    expect(() => designPi({ r1: 1000, r2: 50, f0: 10e6, q: 4 })).toThrow(/loaded Q above 4\.359/);
    expect(() => designT({ r1: 10, r2: 50, f0: 1e6, q: 1.9 })).toThrow(StageParameterError);
  });

  it("writes the minimum Q padded and a stated parasitic rounded at the caller's figures", () => {
    const pi = () => designPi({ r1: 1000, r2: 50, f0: 10e6, q: 4 });
    expect(() => withMessageFigures(6, pi)).toThrow(/loaded Q above 4\.35890 /);
    expect(() => withMessageFigures(2, pi)).toThrow(/loaded Q above 4\.4 /);
    const absorb = () =>
      designLSection({ r1: 75, r2: 1000, f0: 1e6, parasiticC: 1.2e-9 }, 'lowpass');
    // √(1000/75 − 1)/(2π · 1 MHz · 1000 Ω) = 558.9 pF designed; the 1200 pF stated stays unpadded.
    expect(() => withMessageFigures(6, absorb)).toThrow(/parasitic 1200 pF .* shunt 558\.934 pF/);
    expect(() => absorb()).toThrow(/parasitic 1200 pF .* shunt 558\.9 pF/);
  });
});

describe('two cascaded L-sections', () => {
  it('meets at the geometric mean with equal section Q (formula of ENGINE design helpers)', () => {
    const d = designDoubleL({ r1: 50, r2: 1250, f0: 1e6 });
    // Rm = 250 Ω, Q = √(250/50 − 1) = 2 for both sections.
    expect(d.q).toBeCloseTo(2, 12);
    const w = 2 * Math.PI * 1e6;
    expect(d.values.l1 * w).toBeCloseTo(100, 9); // Q·R1
    expect(1 / (d.values.c1 * w)).toBeCloseTo(125, 9); // Rm/Q
    expect(d.values.l2 * w).toBeCloseTo(500, 9); // Q·Rm
    expect(1 / (d.values.c2 * w)).toBeCloseTo(625, 9); // R2/Q
  });
});

describe('tapped-capacitor transformer', () => {
  it('TC-1: 100 pF over 900 pF into 50 Ω at 10 MHz: Rp 5506.6 Ω, Cp 90.92 pF, L 2.786 µH (exact, ±0.1 %)', () => {
    const t = tappedCapacitorEquivalent(100e-12, 900e-12, 50, 10e6);
    expect(rel(t.rp, 5506.6)).toBeLessThan(1e-3);
    expect(rel(t.cp, 90.92e-12)).toBeLessThan(1e-3);
    expect(rel(t.lTune, 2.786e-6)).toBeLessThan(1e-3);
    // The high-Q approximation: 5000 Ω and 90 pF (tuning 2.814 µH), 10 % off here.
    expect(t.approxR).toBeCloseTo(5000, 9);
    expect(t.approxC).toBeCloseTo(90e-12, 20);
  });

  it('TC-2: 1000 pF over 9000 pF: Rp 5005.1 Ω, Cp 900.1 pF (exact, ±0.1 %)', () => {
    const t = tappedCapacitorEquivalent(1000e-12, 9000e-12, 50, 10e6);
    expect(rel(t.rp, 5005.1)).toBeLessThan(1e-3);
    expect(rel(t.cp, 900.1e-12)).toBeLessThan(1e-3);
  });

  it('the exact design reproduces R1 at the top and resonates at f0 (round trip through TC analysis)', () => {
    const spec = { r1: 5000, r2: 50, f0: 10e6, q: 10 };
    const d = designTappedCapacitor(spec);
    const t = tappedCapacitorEquivalent(d.values.c1, d.values.c2, 50, 10e6);
    expect(rel(t.rp, 5000)).toBeLessThan(1e-12);
    expect(rel(t.lTune, d.values.l)).toBeLessThan(1e-12);
    // Loaded Q with R1 ∥ R1 across the tank: (R1/2)/(ωL) = Q.
    expect(2500 / (2 * Math.PI * 10e6 * d.values.l)).toBeCloseTo(10, 9);
  });

  it('refuses a step-up and a Q too low to reach R2', () => {
    expect(() => designTappedCapacitor({ r1: 50, r2: 5000, f0: 1e6, q: 10 })).toThrow(
      /swap the ports/,
    );
    expect(() => designTappedCapacitor({ r1: 5000, r2: 50, f0: 1e6, q: 4 })).toThrow(
      /loaded Q above 4\.975/,
    );
  });
});

describe('designMatch', () => {
  it('dispatches every kind', () => {
    const spec = { r1: 1000, r2: 50, f0: 10e6, q: 10 };
    expect(designMatch('pi', spec).values).toEqual(designPi(spec).values);
    expect(designMatch('tapped-c', spec).kind).toBe('tapped-c');
    expect(designMatch('l-lowpass', spec).shuntAt).toBe('port1');
    expect(designMatch('double-l', spec).shuntAt).toBe('port1');
    expect(designMatch('t', { ...spec, q: 5 }).kind).toBe('t');
    expect(designMatch('l-highpass', { r1: 50, r2: 500, f0: 1e8 }).values.l).toBeCloseTo(
      265.26e-9,
      11,
    );
  });

  it('refuses a parasitic where port 2 ends in a series element', () => {
    expect(() => designMatch('t', { r1: 10, r2: 50, f0: 1e8, q: 5, parasiticC: 1e-12 })).toThrow(
      /absorbed only by a shunt element/,
    );
    expect(() =>
      designMatch('l-lowpass', { r1: 1000, r2: 75, f0: 1e6, parasiticC: 1e-12 }),
    ).toThrow(StageParameterError);
  });
});
