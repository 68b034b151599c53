/**
 * Match here: L-sections for complex terminations, pi/T/two-section/tapped-C/coupled-coil
 * candidates, each inserted into the chain and re-analysed there. Worked cases are named
 * by id beside their checks.
 */
import { complexLSections, matchHere, type LadderPart } from '../../shared/engine/design';
import type { ChainDocument } from '../../shared/schema/chain';
import { parseChainDocument } from '../../shared/schema/parse-chain';
import { rel } from './stages-support';

const W = (f: number) => 2 * Math.PI * f;
const reactance = (p: LadderPart, f: number) =>
  p.part === 'L' ? W(f) * p.value : -1 / (W(f) * p.value);
const susceptance = (p: LadderPart, f: number) =>
  p.part === 'C' ? W(f) * p.value : -1 / (W(f) * p.value);

describe('L-sections between complex terminations', () => {
  it('LN-1: 75 Ω to 1 kΩ gives j263.4 with −j284.7 (KF5OBS 2013) and its high-pass twin', () => {
    const list = complexLSections({ re: 75, im: 0 }, { re: 1000, im: 0 }, 1e6);
    expect(list).toHaveLength(2);
    const low = list.find((d) => d.parts[0].part === 'L')!;
    expect(Math.abs(reactance(low.parts[0], 1e6) - 263.4)).toBeLessThan(0.5);
    expect(Math.abs(-1 / susceptance(low.parts[1], 1e6) - -284.7)).toBeLessThan(1);
    expect(low.q).toBeCloseTo(3.512, 3);
    const high = list.find((d) => d.parts[0].part === 'C')!;
    expect(Math.abs(reactance(high.parts[0], 1e6) + 263.4)).toBeLessThan(0.5);
    expect(high.parts[1]).toMatchObject({ place: 'shunt', part: 'L' });
  });

  it('LN-4: 50 Ω to 500 Ω ∥ 42 pF at 100 MHz: series 10.61 pF, shunt 49.14 nH (FOSSEE 5_22)', () => {
    const f = 100e6;
    // 500 Ω in parallel with 42 pF, as an impedance.
    const y = { re: 1 / 500, im: W(f) * 42e-12 };
    const m = y.re ** 2 + y.im ** 2;
    const list = complexLSections({ re: 50, im: 0 }, { re: y.re / m, im: -y.im / m }, f);
    const high = list.find((d) => d.parts[0].part === 'C' && d.parts[1]?.part === 'L')!;
    expect(rel(high.parts[0].value, 10.61e-12)).toBeLessThan(5e-4);
    expect(rel(high.parts[1].value, 49.14e-9)).toBeLessThan(5e-4);
  });

  it('complex load 200 − j100 Ω from 100 Ω at 500 MHz: both textbook solutions', () => {
    // The worked L-section example of Pozar, Microwave Engineering, ch. 5 (from memory):
    // B = 0.0029 S, X = 122 Ω (C 0.92 pF, L 38.8 nH) or B = −0.0069 S, X = −122 Ω
    // (L 46.1 nH, C 2.61 pF). Recomputed: B = (XL ± √(RL/Z0)·√(RL² + XL² − Z0·RL))/(RL² + XL²).
    const f = 500e6;
    const list = complexLSections({ re: 100, im: 0 }, { re: 200, im: -100 }, f);
    const shuntAtLoad = list.filter((d) => d.parts[1]?.place === 'shunt');
    expect(shuntAtLoad).toHaveLength(2);
    const b = shuntAtLoad.map((d) => susceptance(d.parts[1], f)).sort((a, c) => a - c);
    const root = Math.sqrt(2) * Math.sqrt(200 ** 2 + 100 ** 2 - 100 * 200);
    expect(rel(b[1], (-100 + root) / 50000)).toBeLessThan(1e-9);
    expect(rel(b[0], (-100 - root) / 50000)).toBeLessThan(1e-9);
    const one = shuntAtLoad.find((d) => d.parts[1].part === 'C')!;
    expect(one.parts[0].part).toBe('L');
    // The book rounds X to 122 Ω (exact 122.47 Ω): part values within 1 %.
    expect(rel(one.parts[1].value, 0.92e-12)).toBeLessThan(0.01);
    expect(rel(one.parts[0].value, 38.8e-9)).toBeLessThan(0.01);
    const two = shuntAtLoad.find((d) => d.parts[1].part === 'L')!;
    expect(rel(two.parts[1].value, 46.1e-9)).toBeLessThan(0.01);
    expect(rel(two.parts[0].value, 2.61e-12)).toBeLessThan(0.01);
  });
});

/** A short antenna (10 Ω with −j2.35 kΩ at 1 MHz) driving a 1 kΩ node. */
function antennaChain(): ChainDocument {
  const cAnt = 1 / (W(1e6) * 2350);
  return parseChainDocument({
    name: 'short antenna into 1 kΩ',
    settings: { f0Hz: 1e6, sweep: { startHz: 0.8e6, stopHz: 1.25e6, points: 901, scale: 'lin' } },
    stages: [
      { id: 'ant', type: 'resistive-generator', values: { r: 10, level: 'emf', emf: 0.01 } },
      {
        id: 'ant-c',
        type: 'lumped-element',
        label: 'Antenna capacitance',
        values: { position: 'series', element: 'capacitor', c: cAnt, qc: 1e12 },
      },
      {
        id: 'node-r',
        type: 'lumped-element',
        label: '1 kΩ node',
        values: { position: 'shunt', element: 'resistor', r: 1000 },
      },
      { id: 'det', type: 'envelope-detector', values: { rLoad: 1e9, c: 1e-15 } },
    ],
  });
}

describe('match here, in the chain', () => {
  const lossless = { ql: 1e12, qc: 1e12 };

  it('matches the short antenna into 1 kΩ: every candidate re-analysed, return loss > 30 dB', () => {
    const r = matchHere(antennaChain(), { afterStageId: 'ant-c', q: 30, partsQ: lossless });
    expect(r.zSource.re).toBeCloseTo(10, 6);
    expect(r.zSource.im).toBeCloseTo(-2350, 4);
    expect(r.zLoad.re).toBeCloseTo(1000, 1);
    expect(r.before.returnLossDb).toBeLessThan(1);
    const kinds = new Set(r.candidates.map((c) => c.topology));
    for (const k of ['l-section', 'pi', 't', 'double-l', 'tapped-c', 'coupled-coils']) {
      expect(kinds.has(k as never)).toBe(true);
    }
    expect(r.candidates.filter((c) => c.topology === 'l-section')).toHaveLength(4);
    for (const c of r.candidates) {
      expect(c.error).toBeUndefined();
      expect(c.figures!.returnLossDb).toBeGreaterThan(30);
      expect(c.figures!.mismatchLossDb).toBeLessThan(0.01);
      expect(c.figures!.response.freqsHz.length).toBeGreaterThan(10);
    }
    // Unmatched, almost nothing of the available power reaches the node; matched by lossless
    // parts, all of it does.
    expect(r.candidates[0].figures!.totalGainDb).toBeGreaterThan(r.before.totalGainDb + 20);
  });

  it('refuses a pi below its minimum Q, stating the minimum', () => {
    const r = matchHere(antennaChain(), { afterStageId: 'ant-c', q: 10, partsQ: lossless });
    const pi = r.refused.find((x) => x.topology === 'pi');
    // Minimum Q = √(Rhigh/Rlow − 1) with Rhigh the antenna's parallel resistance
    // (10² + 2350²)/10 = 552.26 kΩ and Rlow = 1 kΩ: 23.48.
    expect(pi?.reason).toMatch(/above 23\.48/);
  });

  it('PI-1 and T-1 values from typed impedances (worked cases, ±0.1 %)', () => {
    const doc = antennaChain();
    const r = matchHere(doc, {
      afterStageId: 'ant-c',
      fHz: 10e6,
      zSource: { re: 1000, im: 0 },
      zLoad: { re: 50, im: 0 },
      q: 10,
    });
    const pi = r.candidates.find((c) => c.topology === 'pi')!;
    expect(pi.stages[0].type).toBe('pi-match');
    expect(rel(pi.parts[0].value, 159.15e-12)).toBeLessThan(1e-3);
    expect(rel(pi.parts[1].value, 1.8929e-6)).toBeLessThan(1e-3);
    expect(rel(pi.parts[2].value, 640.59e-12)).toBeLessThan(1e-3);
    const t = matchHere(doc, {
      afterStageId: 'ant-c',
      fHz: 100e6,
      zSource: { re: 10, im: 0 },
      zLoad: { re: 50, im: 0 },
      q: 5,
    }).candidates.find((c) => c.topology === 't')!;
    expect(t.stages[0].type).toBe('t-match');
    expect(rel(t.parts[0].value, 79.58e-9)).toBeLessThan(1e-3);
    expect(rel(t.parts[1].value, 43.15e-12)).toBeLessThan(1e-3);
    expect(rel(t.parts[2].value, 163.09e-9)).toBeLessThan(1e-3);
  });

  it('absorbs a stated device capacitance into the design', () => {
    const plain = matchHere(antennaChain(), { afterStageId: 'ant-c', partsQ: lossless });
    const withC = matchHere(antennaChain(), {
      afterStageId: 'ant-c',
      parasiticC: 20e-12,
      partsQ: lossless,
    });
    const shuntC = (r: typeof plain) =>
      r.candidates.find((c) => c.title.startsWith('L-section: series L, shunt C'))!.parts[1].value;
    expect(shuntC(plain) - shuntC(withC)).toBeCloseTo(20e-12, 16);
  });

  it('names the stage when there is no node after it', () => {
    expect(() => matchHere(antennaChain(), { afterStageId: 'det' })).toThrow(
      /afterStageId|not a stage/,
    );
  });
});

describe('match here with lossy parts: the figures are the lossy chain’s', () => {
  /** LN-1's terminations in a chain: a 75 Ω generator into a 1 kΩ load at 1 MHz. */
  const resistive = (): ChainDocument =>
    parseChainDocument({
      name: '75 Ω into 1 kΩ',
      settings: { f0Hz: 1e6, sweep: { startHz: 0.8e6, stopHz: 1.25e6, points: 201, scale: 'lin' } },
      stages: [
        { id: 'src', type: 'resistive-generator', values: { r: 75, level: 'emf', emf: 0.01 } },
        { id: 'load', type: 'rc-load', values: { r: 1000, c: 0 } },
      ],
    });

  it('a coil of Q 100 in the low-pass L-section costs 10·log10(1 + QL/Qu) ≈ 0.150 dB of gain', () => {
    const lowPass = (r: ReturnType<typeof matchHere>) =>
      r.candidates.find((c) => c.topology === 'l-section' && c.parts[0].part === 'L')!;
    const ideal = lowPass(matchHere(resistive(), { afterStageId: 'src', partsQ: { ql: 1e12, qc: 1e12 } })); // prettier-ignore
    const lossy = lowPass(matchHere(resistive(), { afterStageId: 'src', partsQ: { ql: 100, qc: 1e12 } })); // prettier-ignore
    // Synthesis is lossless either way (same parts, LN-1's Q of 3.512)…
    expect(lossy.parts).toEqual(ideal.parts);
    expect(lossy.loadedQ).toBeCloseTo(3.512, 3);
    // …but the lossy candidate was inserted with its coil's Q and the chain analysed again:
    // the series coil's loss resistance X/Qu takes 1/(1 + QL/Qu) of the power (common
    // practice for one lossy element in an L-network; mismatch from it adds ~0.001 dB).
    const expected = 10 * Math.log10(1 + 3.512 / 100);
    const drop = ideal.figures!.totalGainDb - lossy.figures!.totalGainDb;
    expect(Math.abs(drop - expected)).toBeLessThan(0.01);
    expect(lossy.stages.some((s) => s.values.ql === 100)).toBe(true);
    expect(ideal.figures!.returnLossDb).toBeGreaterThan(30);
  });
});
