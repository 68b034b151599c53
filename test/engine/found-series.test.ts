/**
 * Series resonators found in a through path (no stage declares them), and the unloaded Q of
 * found resonances. Checked against the series RLC closed form (Q = X/R, f0 = 1/2π√LC,
 * common practice) and an ngspice netlist written here (its −3 dB width of the load current).
 */
import { analyzeChain } from '../../shared/engine';
import { acControl, runAc } from './helpers/ngspice';
import { parseChainDocument } from '../../shared/schema/parse-chain';

const L = 10e-6;
const C = 253.3e-12;
const ESR = 5;
const RS = 50;
const W0 = 1 / Math.sqrt(L * C);
const X = W0 * L; // reactance of L (and of C) at resonance

/** 50 Ω generator → series C (practically lossless) → series L with 5 Ω → load, as two stages. */
const loop = (rl: number) =>
  parseChainDocument({
    name: 'series loop',
    settings: { f0Hz: 3.16e6, sweep: { startHz: 1e6, stopHz: 10e6, points: 401, scale: 'log' as const } }, // prettier-ignore
    stages: [
      { id: 'g', type: 'resistive-generator', values: { r: RS } },
      { id: 'cs', type: 'lumped-element', label: 'Cs', values: { position: 'series', element: 'capacitor', c: C, qc: 1e12 } }, // prettier-ignore
      { id: 'ls', type: 'lumped-element', label: 'Ls', values: { position: 'series', element: 'inductor', l: L, esr: ESR } }, // prettier-ignore
      { id: 'load', type: 'rc-load', label: 'Load', values: { r: rl } },
    ],
  });

const rel = (a: number | null | undefined, b: number) => Math.abs((a ?? NaN) / b - 1);

describe('a series LC in the through path', () => {
  const res = analyzeChain(loop(50), { sweep: false });
  const found = res.resonators.filter((r) => r.kind === 'series' && r.origin === 'found');

  it('is found once, made of both stages', () => {
    expect(found).toHaveLength(1);
    expect(found[0]).toMatchObject({ stageId: 'cs', partOf: ['cs', 'ls'], node: null });
    expect(res.resonators).toHaveLength(1); // no second view of the same mode
  });

  it('matches the closed form: fr = 1/2π√LC, Q = X/R loaded, detached and unloaded', () => {
    const [r] = found;
    expect(rel(r.resonanceHz, W0 / (2 * Math.PI))).toBeLessThan(1e-9);
    // Loaded: the whole loop 50 + 5 + 50 Ω. Detached: the load shorted, 50 + 5 Ω.
    // Unloaded: the source's resistance removed too, the coil's 5 Ω alone.
    expect(rel(r.loadedQ, X / (RS + ESR + 50))).toBeLessThan(1e-8);
    expect(rel(r.detachedQ, X / (RS + ESR))).toBeLessThan(1e-8);
    expect(rel(r.unloadedQ, X / ESR)).toBeLessThan(1e-8);
    expect(rel(r.loadingRatio, (RS + ESR) / (RS + ESR + 50))).toBeLessThan(1e-8);
    expect(rel(r.downstreamShare, 50 / (RS + ESR + 50))).toBeLessThan(1e-8);
  });

  it('has the −3 dB width ngspice gives for the same circuit (netlist written here)', () => {
    const netlist = [
      'series loop found in the through path',
      'V1 in 0 AC 1',
      `RS in a ${RS}`,
      `C1 a b ${C}`,
      `L1 b c ${L}`,
      `RL1 c d ${ESR}`,
      'RLOAD d 0 50',
      ...acControl('ac lin 40001 1meg 9meg', ['v(d)']),
      '.end',
    ].join('\n');
    const t = runAc(netlist);
    const v = t.vectors.get('v(d)')!;
    const mag = Array.from(v.re, (re, i) => Math.hypot(re, v.im[i]));
    const k = mag.indexOf(Math.max(...mag));
    const half = mag[k] / Math.SQRT2;
    const edge = (dir: 1 | -1) => {
      let i = k;
      while (mag[i + dir] > half) i += dir;
      const j = i + dir; // mag[i] above, mag[j] below: interpolate linearly
      return t.freqsHz[i] + ((t.freqsHz[j] - t.freqsHz[i]) * (mag[i] - half)) / (mag[i] - mag[j]);
    };
    const bw = edge(1) - edge(-1);
    // A series RLC's half-power width is R/(2πL) exactly, so fr/Q is compared directly.
    expect(rel(found[0].bandwidthHz, bw)).toBeLessThan(1e-3);
    expect(rel(found[0].resonanceHz, t.freqsHz[k])).toBeLessThan(1e-3);
  });

  it('raises the loading flag when a 500 Ω load takes most of the damping', () => {
    const heavy = analyzeChain(loop(500), { sweep: false });
    const [r] = heavy.resonators.filter((x) => x.kind === 'series');
    expect(rel(r.loadingRatio, (RS + ESR) / (RS + ESR + 500))).toBeLessThan(1e-8);
    const flags = heavy.flags.filter((f) => f.code === 'tank-overloaded');
    expect(flags).toHaveLength(1);
    expect(flags[0]).toMatchObject({ stageId: 'cs', severity: 'error' });
    expect(flags[0].message).toMatch(/^Series tuned circuit in the through path \("Cs" with "Ls"\) at 3\.16 MHz: Q falls from 3\.61 to 0\.358 \(ratio 0\.1\) when "Load" is attached/); // prettier-ignore
  });

  it('a series LC that a stage declares is reported once, as declared', () => {
    const doc = loop(50);
    doc.stages.splice(1, 2, {
      id: 'slc',
      type: 'series-lc',
      label: 'Series LC',
      values: { l: L, c: C },
    });
    const r = analyzeChain(doc, { sweep: false }).resonators;
    expect(r).toHaveLength(1);
    expect(r[0]).toMatchObject({ stageId: 'slc', kind: 'series', origin: 'declared' });
  });
});

describe('unloaded Q of a found parallel resonance', () => {
  it("is the coil's own Q: ωL/R of the coil (high-Q closed form, common practice)", () => {
    // 5 kΩ generator → shunt L (100 µH, 1 Ω) → shunt C (253.3 pF, practically lossless) → 20 kΩ.
    const doc = parseChainDocument({
      name: 'found tank',
      settings: { f0Hz: 1e6, sweep: { startHz: 0.5e6, stopHz: 2e6, points: 401, scale: 'log' as const } }, // prettier-ignore
      stages: [
        { id: 'g', type: 'resistive-generator', values: { r: 5000 } },
        { id: 'l', type: 'lumped-element', label: 'L', values: { position: 'shunt', element: 'inductor', l: 100e-6, esr: 1 } }, // prettier-ignore
        { id: 'c', type: 'lumped-element', label: 'C', values: { position: 'shunt', element: 'capacitor', c: 253.3e-12, qc: 1e12 } }, // prettier-ignore
        { id: 'd', type: 'rc-load', values: { r: 20e3 } },
      ],
    });
    const [r] = analyzeChain(doc, { sweep: false }).resonators;
    expect(r).toMatchObject({ kind: 'shunt', origin: 'found' });
    const w = 2 * Math.PI * r.resonanceHz!;
    // Q of the coil alone, ωL/R ≈ 628; the tank's own Q differs from it by O(1/Q²).
    expect(rel(r.unloadedQ, (w * 100e-6) / 1)).toBeLessThan(1e-4);
    expect(r.unloadedQ!).toBeGreaterThan(r.detachedQ!);
  });
});
