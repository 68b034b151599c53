/**
 * Selectivity: image frequency and rejection (published examples IMG-1, IMG-3, each named at its check), −3 dB and −60 dB
 * bandwidths and shape factor of a single tank in closed form, offsets, a one-point sweep.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { analyzeChain } from '../../shared/engine/analyze';
import { buildChain } from '../../shared/engine/core/build';
import { settleLoadLevel } from '../../shared/engine/core/load-level';
import { runNodeAnalysis } from '../../shared/engine/core/nodes';
import { analyzeResonators } from '../../shared/engine/core/resonators';
import type { ShapeMemo } from '../../shared/engine/core/response-shape';
import {
  analyzeSelectivity,
  findMixer,
  imageFrequency,
} from '../../shared/engine/core/selectivity';
import { frequencyGrid } from '../../shared/engine/core/sweep';
import { STAGE_DEFINITIONS } from '../../shared/engine/stages';
import { parseChainDocument } from '../../shared/schema/parse-chain';
import { chain, TEST_CATALOGUE } from './core-fixtures';

const rel = (a: number | null | undefined, b: number, tol: number) => {
  expect(a ?? null).not.toBeNull();
  expect(Math.abs((a as number) / b - 1)).toBeLessThanOrEqual(tol);
};

/** A tank of loaded Q `q` at f0 driven from a resistive source, then a mixer and an IF load. */
function superhet(f0: number, lo: number, q: number, declare: boolean, points = 2001) {
  const l = 100e-6;
  const w0 = 2 * Math.PI * f0;
  return chain(
    [
      { type: 't-source', values: { rs: q * w0 * l } }, // loaded Q = Rs/(ω0·L) (LQ-1 formula)
      { type: 't-tank', label: 'Preselector', values: { l, c: 1 / (w0 * w0 * l) } },
      { type: 't-mixer', values: { lo, declare } }, // open input: does not load the tank
      { type: 't-load', values: { r: 1000 } },
    ],
    { f0Hz: f0, sweep: { startHz: f0 / 4, stopHz: f0 * 4, points, scale: 'log' } },
  );
}

describe('image frequency and rejection', () => {
  it('IMG-1: 1000 kHz, IF 455 kHz, Q = 100 → image 1910 kHz, α = 138.6 (42.84 dB)', () => {
    // Source: mindstudy.in image-frequency rejection example (IMG-1)
    const res = analyzeChain(superhet(1000e3, 1455e3, 100, false), { catalogue: TEST_CATALOGUE });
    for (const node of [1, 2]) {
      const s = res.selectivity[node];
      rel(s.imageHz, 1910e3, 1e-12);
      const alpha = Math.pow(10, (s.imageRejectionDb as number) / 20);
      expect(Math.abs(alpha - 138.6)).toBeLessThanOrEqual(0.1);
    }
    expect(res.stages[1].fOutHz).toBeCloseTo(455e3, 6);
  });

  it('IMG-3: 600 kHz, IF 450 kHz, Q = 100 → image 1500 kHz, α = 210.0 (LO declared by the model)', () => {
    // Source: byjus.com superheterodyne image question (IMG-3)
    const res = analyzeChain(superhet(600e3, 1050e3, 100, true), { catalogue: TEST_CATALOGUE });
    const s = res.selectivity[2];
    rel(s.imageHz, 1500e3, 1e-12);
    expect(Math.abs(Math.pow(10, (s.imageRejectionDb as number) / 20) - 210.0)).toBeLessThanOrEqual(0.1); // prettier-ignore
  });

  it('LO below the signal: image = 2·fLO − f0 below the signal', () => {
    const res = analyzeChain(superhet(10e6, 9.545e6, 50, false), { catalogue: TEST_CATALOGUE });
    rel(res.selectivity[0].imageHz, 9.09e6, 1e-12);
  });

  it('no mixer, no image', () => {
    const doc = chain([{ type: 't-source' }, { type: 't-tank' }, { type: 't-load' }], {
      f0Hz: 5e6,
    });
    const s = analyzeChain(doc, { catalogue: TEST_CATALOGUE }).selectivity[1];
    expect(s.imageHz).toBeNull();
    expect(s.imageRejectionDb).toBeNull();
  });
});

describe('bandwidths, shape factor and offsets of a single tank', () => {
  // |V(f0)/V(f)| = sqrt(1 + Q²ρ²), ρ = f/f0 − f0/f, so the band edges at attenuation A are
  // ρ = ±sqrt(A² − 1)/Q and the bandwidth is f0·sqrt(A² − 1)/Q (closed form of the LQ-1 tank).
  const f0 = 1e6;
  const q = 100;
  const doc = superhet(f0, 1.455e6, q, false, 40001);
  doc.settings.sweep = { startHz: 0.05e6, stopHz: 12e6, points: 40001, scale: 'log' };
  doc.settings.offsetsHz = [10e3, 100e3];
  const s = analyzeChain(doc, { catalogue: TEST_CATALOGUE }).selectivity[1];

  it('−3 dB (half-power) bandwidth f0/Q with edges at f0[sqrt(1 + 1/4Q²) ∓ 1/2Q]', () => {
    rel(s.bw3dbHz, f0 / q, 1e-3);
    const c = Math.sqrt(1 + 1 / (4 * q * q));
    rel(s.bw3dbLowHz, f0 * (c - 1 / (2 * q)), 1e-5);
    rel(s.bw3dbHighHz, f0 * (c + 1 / (2 * q)), 1e-5);
  });

  it('−60 dB bandwidth f0·sqrt(10⁶ − 1)/Q and shape factor sqrt(10⁶ − 1)', () => {
    rel(s.bw60dbHz, (f0 * Math.sqrt(1e6 - 1)) / q, 1e-3);
    rel(s.shapeFactor, Math.sqrt(1e6 - 1), 2e-3);
  });

  it('attenuation at ±10 kHz and ±100 kHz is evaluated exactly', () => {
    const att = (f: number) => 10 * Math.log10(1 + (q * (f / f0 - f0 / f)) ** 2);
    s.offsets.forEach((o) => {
      expect(Math.abs((o.belowDb as number) - att(f0 - o.offsetHz))).toBeLessThan(1e-4);
      expect(Math.abs((o.aboveDb as number) - att(f0 + o.offsetHz))).toBeLessThan(1e-4);
    });
  });

  it('a curve that never falls 60 dB inside the sweep gives null, not a guess', () => {
    const narrow = superhet(f0, 1.455e6, q, false);
    narrow.settings.sweep = { startHz: 0.9e6, stopHz: 1.1e6, points: 1001, scale: 'lin' };
    const n = analyzeChain(narrow, { catalogue: TEST_CATALOGUE }).selectivity[1];
    expect(n.bw60dbHz).toBeNull();
    expect(n.shapeFactor).toBeNull();
    rel(n.bw3dbHz, f0 / q, 1e-3);
  });
});

describe('a one-point sweep', () => {
  it('reports the point, no bandwidths, and still finds the resonance around f0', () => {
    const doc = superhet(1e6, 1.455e6, 20, false);
    doc.settings.sweep = { startHz: 1e6, stopHz: 1e6, points: 1, scale: 'lin' };
    const res = analyzeChain(doc, { catalogue: TEST_CATALOGUE });
    expect(res.sweep?.freqsHz).toEqual([1e6]);
    expect(res.selectivity[1]).toMatchObject({ peakHz: 1e6, bw3dbHz: null, bw60dbHz: null });
    rel(res.resonators[0].loadedQ, 20, 1e-6);
  });
});

describe('a coupled pair’s shape shared with the selectivity', () => {
  // The pair's peak and −3 dB width at its output node are the selectivity's own searches
  // there: found once on the sweep (analyzeResonators keeps the shape), read by the
  // selectivity, and the same report as searching again.
  it.each(['shortwave-superhet-coupled-pair', 'two-metre-coupled-preselector'])('%s', (key) => {
    const file = path.join(__dirname, '..', '..', 'examples', `${key}.chain.json`);
    const doc = parseChainDocument(JSON.parse(readFileSync(file, 'utf8')));
    const built = settleLoadLevel(buildChain(doc, STAGE_DEFINITIONS));
    const sweepNa = runNodeAnalysis(built, frequencyGrid(built.settings.sweep));
    const shapes: ShapeMemo = new Map();
    const findings = analyzeResonators(built, sweepNa, shapes);
    expect(findings.some((r) => r.pairPeakHz != null)).toBe(true);
    const image = imageFrequency(built, findMixer(built));
    const shared = analyzeSelectivity(built, sweepNa, image, undefined, shapes);
    const user = Array.from(built.userNodeFlat);
    // A kept shape is a user node's (a pair's output), so the selectivity did read it.
    expect([...shapes.keys()].some((flat) => user.includes(flat))).toBe(true);
    expect(shared).toEqual(analyzeSelectivity(built, sweepNa, image));
    // A pair's peak is the selectivity's peak at its output node, to the bit.
    for (const [flat, shape] of shapes) {
      const n = user.indexOf(flat);
      if (n >= 0) expect(shared[n].peakHz).toBe(shape.peak?.fHz ?? null);
    }
  });

  it('keeps no shape found on a search grid other than the sweep', () => {
    // Too few sweep points to bracket resonances: the resonators search a grid of their own.
    const file = path.join(__dirname, '..', '..', 'examples', 'shortwave-superhet-coupled-pair.chain.json'); // prettier-ignore
    const doc = parseChainDocument(JSON.parse(readFileSync(file, 'utf8')));
    doc.settings.sweep.points = 101;
    const built = settleLoadLevel(buildChain(doc, STAGE_DEFINITIONS));
    const sweepNa = runNodeAnalysis(built, frequencyGrid(built.settings.sweep));
    const shapes: ShapeMemo = new Map();
    const findings = analyzeResonators(built, sweepNa, shapes);
    expect(findings.some((r) => r.pairPeakHz != null)).toBe(true);
    expect(shapes.size).toBe(0);
  });
});
