/**
 * Filters read out where they really are: a coupled pair pulled off tune by what hangs
 * across it, a matching network losing more than the chain allows in its parts' finite Q,
 * band edges that do not depend on the sweep's grid, and a −60 dB width stated only where
 * the response goes on falling through −60 dB.
 *
 * References computed here: ngspice (Debian package ngspice) on a netlist written in this
 * file; closed forms of a pi network's transfer and of a parallel tank's band edges
 * (|V(f0)/V(f)| = sqrt(1 + Q²ρ²), ρ = f/f0 − f0/f, common practice).
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { analyzeChain } from '../../shared/engine';
import { designMatch } from '../../shared/engine/design';
import type { ChainDocument } from '../../shared/schema/chain';
import { chain, TEST_CATALOGUE } from './core-fixtures';
import { acControl, runAc } from './helpers/ngspice';
import { parseChainDocument } from '../../shared/schema/parse-chain';

const TWO_PI = 2 * Math.PI;
const rel = (a: number | null | undefined, b: number) => Math.abs((a as number) / b - 1);

describe('a coupled pair with 5 pF across its second tank', () => {
  // Mutual-coupled pair for 145 MHz between 1.5125 kΩ terminations (50 Ω through 1 : 5.5).
  const pairDoc = (extraC: number): ChainDocument =>
    parseChainDocument({
      name: 'coupled pair',
      settings: { f0Hz: 145e6, sweep: { startHz: 100e6, stopHz: 190e6, points: 18001, scale: 'lin' } }, // prettier-ignore
      stages: [
        { id: 'g', type: 'resistive-generator', values: { r: 50, level: 'power', powerDbm: -100 } },
        { id: 'tin', type: 'ideal-transformer', values: { n: 1 / 5.5 } },
        { id: 'bp', type: 'coupled-bandpass', label: 'Pair', values: { coupling: 'mutual', l: 82e-9, c: 14.69e-12, ql: 200, qc: 1000, k: 0.0554 } }, // prettier-ignore
        { id: 'cx', type: 'lumped-element', values: { position: 'shunt', element: 'capacitor', c: extraC, qc: 1000 } }, // prettier-ignore
        { id: 'tout', type: 'ideal-transformer', values: { n: 5.5 } },
        { id: 'ld', type: 'rc-load', values: { r: 50, c: 0 } },
      ],
    });

  it('reports where the pair peaks (ngspice, 1e-4) and flags it as detuned from f0', () => {
    const res = analyzeChain(pairDoc(5e-12), { sweep: false });
    // ngspice: the same pair between its reflected terminations, losses at 125 MHz.
    const w = TWO_PI * 125e6;
    const rt = 50 * 5.5 * 5.5;
    const netlist = [
      '* coupled pair with 5 pF across the second tank',
      'V1 a 0 AC 1',
      `R1 a n1 ${rt}`,
      'L1 n1 x1 82n',
      `RL1 x1 0 ${(w * 82e-9) / 200}`,
      'C1 n1 0 14.69p',
      `RC1 n1 0 ${1000 / (w * 14.69e-12)}`,
      'L2 n2 x2 82n',
      `RL2 x2 0 ${(w * 82e-9) / 200}`,
      'K1 L1 L2 0.0554',
      'C2 n2 0 14.69p',
      `RC2 n2 0 ${1000 / (w * 14.69e-12)}`,
      'CX n2 0 5p',
      `RCX n2 0 ${1000 / (w * 5e-12)}`,
      `R2 n2 0 ${rt}`,
      ...acControl('ac lin 40001 115meg 135meg', ['v(n2)']),
      '.end',
    ].join('\n');
    const t = runAc(netlist);
    const v = t.vectors.get('v(n2)')!;
    let k = 0;
    for (let i = 0; i < v.re.length; i++) {
      if (Math.hypot(v.re[i], v.im[i]) > Math.hypot(v.re[k], v.im[k])) k = i;
    }
    const pair = res.resonators.filter((r) => r.stageId === 'bp');
    expect(pair).toHaveLength(2);
    for (const r of pair) expect(rel(r.pairPeakHz, t.freqsHz[k])).toBeLessThan(1e-4);
    const flags = res.flags.filter((f) => f.stageId === 'bp' && f.code === 'tank-detuned');
    expect(flags).toHaveLength(1);
    expect(flags[0].message).toMatch(/^Coupled pair "Pair" peaks at 125 MHz, 19\.9 MHz below the design frequency 145 MHz/); // prettier-ignore
  });

  it('without the 5 pF the pair peaks near f0 and is not flagged', () => {
    const res = analyzeChain(pairDoc(1e-16), { sweep: false });
    const [first] = res.resonators.filter((r) => r.stageId === 'bp');
    expect(rel(first.pairPeakHz, 145e6)).toBeLessThan(0.01);
    expect(res.flags.filter((f) => f.code === 'tank-detuned')).toEqual([]);
  });
});

describe('q-budget: a pi match 50 → 1000 Ω designed for Q 10 and built with coils of Q 12', () => {
  const f0 = 315e6;
  const doc = (ql: number): ChainDocument =>
    parseChainDocument({
      name: 'pi match',
      settings: { f0Hz: f0, sweep: { startHz: 200e6, stopHz: 400e6, points: 101, scale: 'lin' } },
      stages: [
        { id: 'g', type: 'resistive-generator', values: { r: 50, level: 'power', powerDbm: -60 } },
        { id: 'm', type: 'pi-match', values: { mode: 'design', r1: 50, r2: 1000, q: 10, ql, qc: 1000 } }, // prettier-ignore
        { id: 'ld', type: 'rc-load', values: { r: 1000, c: 0 } },
      ],
    });
  const { c1, l, c2 } = designMatch('pi', { r1: 50, r2: 1000, f0, q: 10, parasiticC: 0 }).values;

  /** Power into 1000 Ω from a 1 V EMF behind 50 Ω, closed form (complex arithmetic here). */
  const powerOut = (ql: number, qc: number) => {
    const w = TWO_PI * f0;
    type C = [number, number];
    const add = (a: C, b: C): C => [a[0] + b[0], a[1] + b[1]];
    const inv = (a: C): C => [a[0] / (a[0] ** 2 + a[1] ** 2), -a[1] / (a[0] ** 2 + a[1] ** 2)];
    const mul = (a: C, b: C): C => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
    const yc = (c: number): C => [(w * c) / qc, w * c];
    const zOut = inv(add(yc(c2), [1 / 1000, 0])); // C2 ∥ load
    const zMid = add([(w * l) / ql, w * l], zOut); // series L
    const zIn = inv(add(yc(c1), inv(zMid))); // C1 ∥ rest
    const vIn = mul([1, 0], mul(zIn, inv(add(zIn, [50, 0]))));
    const vOut = mul(vIn, mul(zOut, inv(zMid)));
    return (vOut[0] ** 2 + vOut[1] ** 2) / (2 * 1000);
  };
  const lossDb = (ql: number, qc: number) => 10 * Math.log10(powerOut(1e12, 1e12) / powerOut(ql, qc)); // prettier-ignore

  it('flags the loss (closed form: about 3.6 dB) and the part Q that brings it under 1 dB', () => {
    const expected = lossDb(12, 1000);
    expect(expected).toBeGreaterThan(3.4);
    expect(expected).toBeLessThan(3.8);
    const res = analyzeChain(doc(12), { sweep: false });
    const [flag] = res.flags.filter((f) => f.code === 'q-budget');
    expect(flag.stageId).toBe('m');
    expect(Math.abs((flag.data!.lossDb as number) - expected)).toBeLessThan(1e-6);
    const needed = flag.data!.neededQ as number;
    // Every part at the needed Q: at most 1 dB; 2 % less: more than 1 dB.
    expect(lossDb(Math.max(12, needed), Math.max(1000, needed))).toBeLessThanOrEqual(1);
    expect(lossDb(needed / 1.02, 1000)).toBeGreaterThan(1);
    expect(flag.message).toMatch(/^"Pi match" loses 3\.\d+ dB at 315 MHz in its parts' finite Q, more than the chain's 1 dB limit; parts of Q \d+(\.\d)? or better \(now 12\) would bring it under\.$/); // prettier-ignore
  });

  it('is quiet with coils of Q 200 (closed form well under 1 dB)', () => {
    expect(lossDb(200, 1000)).toBeLessThan(1);
    const res = analyzeChain(doc(200), { sweep: false });
    expect(res.flags.filter((f) => f.code === 'q-budget')).toEqual([]);
  });
});

describe('band edges off the grid', () => {
  const f0 = 1e6;
  const q = 100;
  const tank = (points: number) =>
    chain(
      [{ type: 't-source', values: { rs: 1e15 } }, { type: 't-tank', values: { l: 1e-4, c: 1 / ((TWO_PI * f0) ** 2 * 1e-4), rp: q * TWO_PI * f0 * 1e-4 } }, { type: 't-load', values: { mode: 'open' } }], // prettier-ignore
      { f0Hz: f0, sweep: { startHz: 0.9e6, stopHz: 1.1e6, points, scale: 'lin' } },
    );

  it.each([41, 401, 4001])(
    'a parallel tank over %i points: edges to 1e-9 (closed form)',
    (points) => {
      const s = analyzeChain(tank(points), { catalogue: TEST_CATALOGUE, sweep: false })
        .selectivity[1];
      const c = Math.sqrt(1 + 1 / (4 * q * q));
      expect(rel(s.bw3dbLowHz, f0 * (c - 1 / (2 * q)))).toBeLessThan(1e-9);
      expect(rel(s.bw3dbHighHz, f0 * (c + 1 / (2 * q)))).toBeLessThan(1e-9);
      expect(rel(s.peakHz, f0)).toBeLessThan(1e-7);
    },
  );

  const example = (points: number, rejectionDb?: number) => {
    const file = path.join(__dirname, '..', '..', 'examples', 'shortwave-superhet-single-tank.chain.json'); // prettier-ignore
    const doc = parseChainDocument(JSON.parse(readFileSync(file, 'utf8')));
    doc.settings.sweep.points = points;
    if (rejectionDb !== undefined) {
      doc.stages.find((st) => st.id === 'if-filter')!.values.ultimateRejectionDb = rejectionDb;
    }
    return analyzeChain(doc, { sweep: false }).selectivity.at(-1)!;
  };

  it('the shortwave example reports its IF −3 dB width as 5,999.7 Hz at 6,000 and 60,001 points', () => {
    const shipped = example(6000);
    const dense = example(60001);
    expect(Math.floor(shipped.bw3dbHz as number)).toBe(5999);
    expect(rel(shipped.bw3dbHz, dense.bw3dbHz as number)).toBeLessThan(1e-6);
  });

  it('a 60 dB filter floor gives no −60 dB width but its depth; an 80 dB one gives the width', () => {
    const floor = example(6000, 60);
    expect(floor.bw60dbHz).toBeNull();
    expect(floor.shapeFactor).toBeNull();
    expect(floor.depthDb as number).toBeGreaterThan(60);
    expect(floor.depthDb as number).toBeLessThan(60.5);
    const deep = example(6000, 80);
    expect(deep.bw60dbHz as number).toBeGreaterThan(15e3);
    expect(deep.depthDb).toBeNull();
  });
});
