/**
 * Resonators and loaded Q against published cases LQ-1 and LQ-3 (sources at the checks), a
 * series resonator in closed form, an exact grid hit, and "no resonance".
 */
import { analyzeChain } from '../../shared/engine/analyze';
import { buildChain } from '../../shared/engine/core/build';
import { runNodeAnalysis } from '../../shared/engine/core/nodes';
import { bisectRising, nearestRisingCrossing } from '../../shared/engine/core/resonators';
import { chain, TEST_CATALOGUE } from './core-fixtures';

const rel = (a: number | null, b: number, tol: number) => {
  expect(a).not.toBeNull();
  expect(Math.abs((a as number) / b - 1)).toBeLessThanOrEqual(tol);
};

describe('LQ-1: parallel RLC, ω0 = 1 Mrad/s, Q0 = 10, R = 5 kΩ', () => {
  // Source: "ESc201T: Introduction to Electronics, Assignment 4: Solutions", Q1 (LQ-1)
  const f0 = 1e6 / (2 * Math.PI);
  const doc = chain(
    [
      { type: 't-source', values: { rs: 1e15 } }, // a current drive: the source does not load the tank
      { type: 't-tank', values: { l: 0.5e-3, c: 2e-9, rp: 5000 } },
      { type: 't-load', values: { mode: 'open' } },
    ],
    { f0Hz: f0 },
  );
  const built = buildChain(doc, TEST_CATALOGUE);
  const zAt = (omega: number) => {
    const na = runNodeAnalysis(built, [omega / (2 * Math.PI)]);
    return { mag: Math.hypot(na.zinRe[0], na.zinIm[0]), arg: Math.atan2(na.zinIm[0], na.zinRe[0]) }; // prettier-ignore
  };
  const solve = (g: (w: number) => number, lo: number, hi: number) => {
    for (let i = 0; i < 100; i++) {
      const mid = (lo + hi) / 2;
      if (g(mid) > 0 === g(lo) > 0) lo = mid;
      else hi = mid;
    }
    return (lo + hi) / 2;
  };

  it('|Zin| = 2 kΩ above ω0 at 1.1211 Mrad/s and ∠Zin = −30° at 1.0293 Mrad/s (±0.0001)', () => {
    const wMag = solve((w) => zAt(w).mag - 2000, 1.0e6, 1.5e6);
    const wArg = solve((w) => zAt(w).arg + Math.PI / 6, 1.0e6, 1.5e6);
    expect(Math.abs(wMag / 1e6 - 1.1211)).toBeLessThanOrEqual(1e-4);
    expect(Math.abs(wArg / 1e6 - 1.0293)).toBeLessThanOrEqual(1e-4);
  });

  it('L = 0.5 mH and C = 2 nF give Q = 10 at ω0, loaded and unloaded', () => {
    const [r] = analyzeChain(doc, { catalogue: TEST_CATALOGUE }).resonators;
    rel(r.resonanceHz, f0, 1e-9);
    rel(r.loadedQ, 10, 1e-6);
    rel(r.unloadedQ, 10, 1e-6);
    rel(r.bandwidthHz, f0 / 10, 1e-6);
    expect(r.node).toBe(1);
  });
});

describe('LQ-3: 15 µH coil with 2 Ω loss, 16.887 pF, 50 kΩ source and 50 kΩ load at 10 MHz', () => {
  // Source: FOSSEE Scilab-TBC-Uploads 2210/CH5/EX5.20 inputs, loading chosen for the case; ngspice-confirmed (LQ-3)
  const doc = chain(
    [
      { type: 't-source', values: { rs: 50e3 } },
      { type: 't-tank', label: 'Tuner', values: { l: 15e-6, c: 16.887e-12, rs: 2 } },
      { type: 't-load', values: { r: 50e3 } },
    ],
    { f0Hz: 10e6, sweep: { startHz: 9e6, stopHz: 11e6, points: 4001, scale: 'lin' } },
  );
  const result = analyzeChain(doc, { catalogue: TEST_CATALOGUE });
  const [r] = result.resonators;
  const w = 2 * Math.PI * 10e6;
  const qs = (w * 15e-6) / 2;
  const rp = 2 * (1 + qs * qs);
  const lp = (15e-6 * (1 + qs * qs)) / (qs * qs);

  it('series-to-parallel step: coil Q 471.24, Rp 444.13 kΩ (checks the case arithmetic)', () => {
    expect(qs).toBeCloseTo(471.24, 2);
    expect(rp / 1e3).toBeCloseTo(444.13, 1);
  });

  it('loaded Q = 25.11 and bandwidth 398.2 kHz (±0.1 %)', () => {
    rel(r.resonanceHz, 10e6, 1e-3);
    rel(r.loadedQ, 25.11, 1e-3);
    rel(r.bandwidthHz, 398.2e3, 1e-3);
    rel(r.unloadedQ, 471.24, 2e-3);
  });

  it('−3 dB band edges 9.8029 to 10.2011 MHz (±0.2 %) and peak |Z| 23.668 kΩ (±0.1 %)', () => {
    const sel = result.selectivity[1];
    rel(sel.bw3dbHz, 398.2e3, 2e-3);
    // at the tank node V/Es = Z∥/Rs, so the peak step-up is 23.668 k / 50 k
    rel(Math.pow(10, (sel.peakStepUpDb as number) / 20), 23.668e3 / 50e3, 1e-3);
    rel(sel.bw3dbLowHz ?? null, 9.8029e6, 2e-3);
    rel(sel.bw3dbHighHz ?? null, 10.2011e6, 2e-3);
  });

  it('detached Q = (444.13 k ∥ 50 k)/(ωL); loading ratio and downstream share', () => {
    const rDet = (rp * 50e3) / (rp + 50e3);
    const qDet = rDet / (w * lp);
    rel(r.detachedQ, qDet, 2e-3);
    rel(r.detachedBandwidthHz, 10e6 / qDet, 2e-3);
    rel(r.loadingRatio, 25.11 / qDet, 2e-3);
    // G_down/G_total = (1/50 k)/(1/23.668 k)
    rel(r.downstreamShare, 23.668e3 / 50e3, 1e-3);
  });
});

describe('series resonator and edge cases', () => {
  it('series RLC between 50 Ω ends: Q = ωL/(R + 100 Ω) loaded, ωL/R unloaded (closed form)', () => {
    const l = 10e-6;
    const c = 1 / ((2 * Math.PI * 1e6) ** 2 * l);
    const doc = chain(
      [{ type: 't-source' }, { type: 't-series', values: { r: 10, l, c, resonator: true } }, { type: 't-load' }], // prettier-ignore
      { f0Hz: 1e6 },
    );
    const [r] = analyzeChain(doc, { catalogue: TEST_CATALOGUE }).resonators;
    const wl = 2 * Math.PI * 1e6 * l;
    expect(r.kind).toBe('series');
    rel(r.resonanceHz, 1e6, 1e-9);
    rel(r.loadedQ, wl / 110, 1e-6);
    rel(r.unloadedQ, wl / 10, 1e-6);
    expect(r.detachedQ).toBeNull();
  });

  it('reports no resonance when B has no zero in the search range', () => {
    const doc = chain(
      [{ type: 't-source' }, { type: 't-tank', values: { l: 1e-6, c: 1e-12 } }, { type: 't-load' }], // prettier-ignore
      { f0Hz: 1e6 }, // the tank resonates near 159 MHz, far outside 0.5–2 MHz
    );
    const res = analyzeChain(doc, { catalogue: TEST_CATALOGUE });
    expect(res.resonators[0]).toMatchObject({
      resonanceHz: null,
      loadedQ: null,
      bandwidthHz: null,
    });
    expect(res.flags.map((f) => f.code)).toContain('no-resonance');
  });

  it('a zero exactly on a grid point is found exactly', () => {
    const f = [1, 2, 3, 4];
    const v = [-2, -1, 0, 1];
    expect(nearestRisingCrossing(f, v, 3)).toBe(1);
    expect(bisectRising((x) => x - 3, 2, 3)).toBe(3);
    // falling crossings (poles of B) are not resonances
    expect(nearestRisingCrossing([1, 2], [1, -1], 1.5)).toBe(-1);
  });

  it('a resonance on a sweep point: peak at f0 and a symmetric bandwidth', () => {
    const f0 = 1e6 / (2 * Math.PI);
    const doc = chain(
      [{ type: 't-source', values: { rs: 1e15 } }, { type: 't-tank', values: { l: 0.5e-3, c: 2e-9, rp: 5000 } }, { type: 't-load', values: { mode: 'open' } }], // prettier-ignore
      { f0Hz: f0, sweep: { startHz: f0 / 2, stopHz: (3 * f0) / 2, points: 2001, scale: 'lin' } },
    );
    const res = analyzeChain(doc, { catalogue: TEST_CATALOGUE });
    expect(res.sweep?.freqsHz[1000]).toBeCloseTo(f0, 6);
    // the 3-point parabolic refinement of the peak is good to about 1e-7 of f0 here
    rel(res.selectivity[1].peakHz, f0, 1e-6);
    // −3 dB bandwidth of a parallel RLC is exactly ω0/Q (LQ-1 formula)
    rel(res.selectivity[1].bw3dbHz, f0 / 10, 1e-4);
  });
});
