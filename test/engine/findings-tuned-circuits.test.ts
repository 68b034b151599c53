/**
 * Tuned circuits the chain's network forms without a stage declaring them, judged as every
 * tank is: a coupled-coil secondary tuned by the next stage's capacitor, and the tank inside a
 * tapped-C transformer loaded far below its design resistance.
 *
 * Reference values are computed here, not read from the engine:
 * - ngspice (Debian package ngspice) on a netlist written in this file: the response peak at
 *   the secondary, and the node's impedance with a 1 A AC current injected into it (the source
 *   EMF set to zero), from which Y = 1/Z = G + jB gives fr (B = 0) and Q = (ωr/2G)·dB/dω, the
 *   same definition the engine states, worked from the simulator's solution;
 * - a closed form of the tapped-C tank's node admittance (complex arithmetic written here),
 *   L ∥ (C1 + (C2 ∥ R_load)) ∥ R_source, with the constant-Q part losses ωL/Q in series with
 *   each coil and ωC/Q across each capacitor (the engine's documented part model).
 */
import { analyzeChain } from '../../shared/engine';
import { designMatch } from '../../shared/engine/design';
import type { ChainDocument } from '../../shared/schema/chain';
import { acControl, runAc } from './helpers/ngspice';
import { parseChainDocument } from '../../shared/schema/parse-chain';

const TWO_PI = 2 * Math.PI;

/** Crystal-set front end of our own: short antenna, series coil, air-core coupled coils. */
function crystalSet(detectorLoad: number): ChainDocument {
  return parseChainDocument({
    name: 'coupled coils with a tuned secondary',
    settings: { f0Hz: 1e6, sweep: { startHz: 0.5e6, stopHz: 1.6e6, points: 11001, scale: 'lin' } },
    stages: [
      { id: 'ant', type: 'resistive-generator', values: { r: 10, level: 'emf', emf: 0.05 } },
      { id: 'cant', type: 'lumped-element', values: { position: 'series', element: 'capacitor', c: 1e-7, qc: 1000 } }, // prettier-ignore
      { id: 'lser', type: 'lumped-element', values: { position: 'series', element: 'inductor', l: 17e-6, ql: 200 } }, // prettier-ignore
      { id: 'cm', type: 'lumped-element', values: { position: 'shunt', element: 'capacitor', c: 200e-12, qc: 1000 } }, // prettier-ignore
      { id: 'xf', type: 'coupled-coils', label: 'Coupled coils', values: { l1: 18.4e-6, l2: 200e-6, k: 0.6, q1: 150, q2: 150 } }, // prettier-ignore
      { id: 'cs', type: 'lumped-element', label: 'Tuning capacitor', values: { position: 'shunt', element: 'capacitor', c: 165.147e-12, qc: 1000 } }, // prettier-ignore
      { id: 'det', type: 'envelope-detector', values: { rLoad: detectorLoad, c: 5e-12, minInputPeakV: 0.1 } }, // prettier-ignore
    ],
  });
}

/**
 * The same circuit for ngspice. Part losses are fixed resistors worked out at 950 kHz, where
 * the secondary resonates (the engine's constant-Q losses equal them there). The detector's
 * input is R_load/2 ∥ C (the engine's stated model of a diode detector at strong drive).
 */
function crystalSetNetlist(opts: { detector: number | null; inject: boolean }): string {
  const w = TWO_PI * 950e3;
  const rs = (l: number, q: number) => (w * l) / q;
  const rp = (c: number, q: number) => q / (w * c);
  const lines = [
    '* coupled coils with a tuned secondary',
    `V1 a 0 AC ${opts.inject ? 0 : 0.05}`,
    'R1 a b 10',
    `C1 b c 100n`,
    `RC1 b c ${rp(1e-7, 1000)}`,
    `L1 c c2 17u`,
    `RL1 c2 d ${rs(17e-6, 200)}`,
    `C2 d 0 200p`,
    `RC2 d 0 ${rp(200e-12, 1000)}`,
    `LP d p 18.4u`,
    `RLP p 0 ${rs(18.4e-6, 150)}`,
    `LS s s2 200u`,
    `RLS s2 0 ${rs(200e-6, 150)}`,
    'K1 LP LS 0.6',
    `CS s 0 165.147p`,
    `RCS s 0 ${rp(165.147e-12, 1000)}`,
  ];
  if (opts.detector !== null) lines.push(`RD s 0 ${opts.detector / 2}`, 'CD s 0 5p');
  if (opts.inject) lines.push('I1 0 s AC 1');
  lines.push(...acControl('ac lin 22001 0.5meg 1.6meg', ['v(s)']), '.end');
  return lines.join('\n');
}

/** fr and Q = (ωr/2G)·dB/dω from a node impedance table (Y = 1/Z), near `near` Hz. */
function resonanceFromImpedance(f: Float64Array, re: Float64Array, im: Float64Array, near: number) {
  const y = (i: number) => {
    const d = re[i] * re[i] + im[i] * im[i];
    return { g: re[i] / d, b: -im[i] / d };
  };
  let best: { fr: number; q: number } | null = null;
  for (let i = 1; i + 2 < f.length; i++) {
    const a = y(i).b;
    const b = y(i + 1).b;
    if (!(a < 0 && b >= 0)) continue;
    const t = -a / (b - a);
    const fr = f[i] + t * (f[i + 1] - f[i]);
    const g = y(i).g + t * (y(i + 1).g - y(i).g);
    const slope = (y(i + 2).b - y(i - 1).b) / (TWO_PI * (f[i + 2] - f[i - 1]));
    const q = ((TWO_PI * fr) / (2 * g)) * slope;
    if (!best || Math.abs(fr - near) < Math.abs(best.fr - near)) best = { fr, q };
  }
  if (!best) throw new Error('no rising zero of B in the ngspice table');
  return best;
}

describe('a coupled-coil secondary tuned by the next stage (found, not declared)', () => {
  const res = analyzeChain(crystalSet(20e3), { sweep: false });
  const tuned = res.resonators.filter((r) => r.origin === 'found');

  const peakRun = runAc(crystalSetNetlist({ detector: 20e3, inject: false }));
  const vs = peakRun.vectors.get('v(s)')!;
  let k = 0;
  for (let i = 0; i < vs.re.length; i++) {
    if (Math.hypot(vs.re[i], vs.im[i]) > Math.hypot(vs.re[k], vs.im[k])) k = i;
  }
  const peakHz = peakRun.freqsHz[k];

  it('is reported once, at the secondary, within 1 % of where ngspice finds the response peak', () => {
    expect(tuned).toHaveLength(1);
    expect(tuned[0].stageId).toBe('xf');
    expect(tuned[0].partOf).toEqual(['xf', 'cs']);
    expect(tuned[0].node).toBe(4);
    expect(Math.abs((tuned[0].resonanceHz as number) / peakHz - 1)).toBeLessThan(0.01);
  });

  it('loaded Q and fr agree with ngspice at the secondary node (current injected, 0.5 %)', () => {
    const z = runAc(crystalSetNetlist({ detector: 20e3, inject: true })).vectors.get('v(s)')!;
    const ref = resonanceFromImpedance(peakRun.freqsHz, z.re, z.im, 950e3);
    expect(Math.abs((tuned[0].resonanceHz as number) / ref.fr - 1)).toBeLessThan(1e-3);
    expect(Math.abs((tuned[0].loadedQ as number) / ref.q - 1)).toBeLessThan(5e-3);
  });

  it('detached Q removes the detector and keeps the tuning capacitor (ngspice, 1 %)', () => {
    const z = runAc(crystalSetNetlist({ detector: null, inject: true })).vectors.get('v(s)')!;
    const ref = resonanceFromImpedance(peakRun.freqsHz, z.re, z.im, 950e3);
    expect(Math.abs((tuned[0].detachedQ as number) / ref.q - 1)).toBeLessThan(1e-2);
    expect(tuned[0].loadingRatio).toBeCloseTo((tuned[0].loadedQ as number) / ref.q, 2);
  });

  it('a 1 kΩ headphone in place of a 20 kΩ earphone is flagged as overloading it', () => {
    const heavy = analyzeChain(crystalSet(1e3), { sweep: false });
    const light = analyzeChain(crystalSet(200e3), { sweep: false });
    const flagOn = (r: typeof heavy) => r.flags.filter((f) => f.code === 'tank-overloaded');
    expect(flagOn(heavy).map((f) => [f.stageId, f.severity])).toEqual([['xf', 'error']]);
    expect(flagOn(heavy)[0].message).toMatch(/^Tuned circuit at node 4 \("Coupled coils" with "Tuning capacitor"\)/); // prettier-ignore
    expect(flagOn(light)).toEqual([]);
  });
});

describe('the tank inside a tapped-C transformer, designed 400 → 50 Ω but loaded by 5 Ω', () => {
  const f0 = 315e6;
  const doc: ChainDocument = parseChainDocument({
    name: 'tapped-C transformer on a low load',
    settings: { f0Hz: f0, sweep: { startHz: 50e6, stopHz: 900e6, points: 4001, scale: 'lin' } },
    stages: [
      { id: 'g', type: 'resistive-generator', values: { r: 400, level: 'power', powerDbm: -60 } },
      { id: 'm', type: 'tapped-c-match', values: { mode: 'design', r1: 400, r2: 50, q: 5, ql: 100, qc: 500 } }, // prettier-ignore
      { id: 'ld', type: 'rc-load', values: { r: 5, c: 0 } },
    ],
  });
  const res = analyzeChain(doc, { sweep: false });
  const tank = res.resonators.find((r) => r.stageId === 'm')!;
  // Component values from the design formulas; the check below is of the analysis only.
  const { l, c1, c2 } = designMatch('tapped-c', { r1: 400, r2: 50, f0, q: 5, parasiticC: 0 }).values; // prettier-ignore

  /** Node admittance (G, B) at the tank's top, with or without the load, closed form. */
  const y = (f: number, load: boolean): [number, number] => {
    const w = TWO_PI * f;
    const inv = (re: number, im: number): [number, number] => {
      const d = re * re + im * im;
      return [re / d, -im / d];
    };
    const yl = inv((w * l) / 100, w * l); // coil with series loss ωL/Q
    const yc = (c: number): [number, number] => [(w * c) / 500, w * c]; // capacitor with ωC/Q across
    const y2 = yc(c2);
    const tap: [number, number] = load ? [y2[0] + 1 / 5, y2[1]] : y2;
    const z2 = inv(...tap);
    const z1 = inv(...yc(c1));
    const branch = inv(z1[0] + z2[0], z1[1] + z2[1]);
    return [1 / 400 + yl[0] + branch[0], yl[1] + branch[1]];
  };
  const qOf = (load: boolean) => {
    let lo = 100e6;
    let hi = 500e6;
    for (let i = 0; i < 200; i++) {
      const mid = (lo + hi) / 2;
      if (y(mid, load)[1] < 0) lo = mid;
      else hi = mid;
    }
    const h = lo * 1e-6;
    const slope = (y(lo + h, load)[1] - y(lo - h, load)[1]) / (TWO_PI * 2 * h);
    return { fr: lo, q: ((TWO_PI * lo) / (2 * y(lo, load)[0])) * slope };
  };

  it('detached Q about 8.85 and loaded Q about 4.0 (closed form, 0.1 %)', () => {
    const det = qOf(false);
    const att = qOf(true);
    expect(det.q).toBeCloseTo(8.85, 1);
    expect(att.q).toBeCloseTo(4.0, 1);
    expect(Math.abs((tank.detachedQ as number) / det.q - 1)).toBeLessThan(1e-3);
    expect(Math.abs((tank.loadedQ as number) / att.q - 1)).toBeLessThan(1e-3);
    expect(Math.abs((tank.resonanceHz as number) / att.fr - 1)).toBeLessThan(1e-6);
    expect(tank.loadingRatio as number).toBeCloseTo(att.q / det.q, 3);
  });

  it('is flagged as overloaded (ratio about 0.45), the flag stating the rule', () => {
    const [flag] = res.flags.filter((f) => f.code === 'tank-overloaded');
    expect(flag).toMatchObject({ stageId: 'm', severity: 'warning' });
    expect(flag.message).toMatch(/\(ratio 0\.45\) when "R ∥ C load" is attached/);
    expect(flag.message).toMatch(/Rule: a ratio below 0\.5 \(as shown, to two decimals\) is a warning, below 0\.2 an error; 0\.50 is a conjugate match\./); // prettier-ignore
  });
});
