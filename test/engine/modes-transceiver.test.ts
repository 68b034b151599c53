/**
 * The 433.92 MHz transceiver example (examples/ism-433-transceiver-shared-antenna): one
 * antenna, a receive and a transmit mode. Each mode is checked against an ngspice netlist
 * written here by hand from closed-form part values, independent of the engine's own SPICE
 * emitters:
 * - lumped quarter-wave pi: every reactance equals Z0 at f0 (common practice; e.g. the
 *   lumped λ/4 equivalent in Bowick, "RF Circuit Design");
 * - L-match: Q = √(Rhigh/Rlow − 1), series X = Q·Rlow, shunt X = Rhigh/Q (Bowick, ch. 4);
 * - the power amplifier's load line R = V²peak/(2P) (Class-A/B load line; common practice);
 * - constant-Q losses as behavioural resistors of `hertz`, as the engine models them.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { analyzeChain, type AnalysisResult } from '../../shared/engine';
import { parseChainDocument } from '../../shared/schema/parse-chain';
import { acControl, runAc, vectorAt } from './helpers/ngspice';

const doc = parseChainDocument(
  JSON.parse(readFileSync(path.join(__dirname, '../../examples/ism-433-transceiver-shared-antenna.chain.json'), 'utf8')), // prettier-ignore
);
const F0 = 433.92e6;
const W = 2 * Math.PI * F0;
const QL = 100;
const QC = 1000;
/** Quarter-wave pi parts: X = 50 Ω. */
const CQ = 1 / (W * 50);
const LQ = 50 / W;
/** PA load line: 3 V peak, 100 mW. */
const R_PA = 3 ** 2 / (2 * 0.1);

/** Constant-Q inductor and capacitor lines (as the engine models part loss). */
let n = 0;
const ind = (a: string, b: string, l: number) => {
  n += 1;
  return [`L${n} ${a} m${n} ${l}`, `RL${n} m${n} ${b} r={2*pi*hertz*${l}/${QL}}`];
};
const cap = (a: string, b: string, c: number) => {
  n += 1;
  return [`C${n} ${a} ${b} ${c}`, `RC${n} ${a} ${b} r={${QC}/(2*pi*hertz*${c})}`];
};
/** Lumped quarter wave from node a to node b. */
const quarterWave = (a: string, b: string) => [...cap(a, '0', CQ), ...ind(a, b, LQ), ...cap(b, '0', CQ)]; // prettier-ignore

const dbm = (w: number) => 10 * Math.log10(w / 1e-3);
const mag2 = ([re, im]: [number, number]) => re * re + im * im;

function analyse(mode: string): AnalysisResult {
  return analyzeChain(doc, { mode, sweep: false });
}

describe('433.92 MHz transceiver, receive mode', () => {
  const r = analyse('receive');
  // L-match 50 → 200 Ω, series L then shunt C: Q = √3.
  const q = Math.sqrt(200 / 50 - 1);
  const netlist = [
    '* receive path, by hand',
    'V1 e 0 DC 0 AC 1',
    'R1 e ant 50',
    // the idle transmit side: a quarter wave shorted by its closed switch (1 Ω)
    'Vmeas ant tx0 0',
    ...quarterWave('tx0', 'tx1'),
    'Ron tx1 0 1',
    // the receive quarter wave, the open receiver-input switch (0.3 pF), the LNA match
    ...quarterWave('ant', 'rx1'),
    'Coff rx1 0 0.3p',
    ...ind('rx1', 'lna', (q * 50) / W),
    ...cap('lna', '0', q / (200 * W)),
    'Rlna lna 0 200',
    ...acControl(`ac lin 1 ${F0} ${F0}`, ['v(ant)', 'vmeas#branch', 'v(lna)']),
    '.end',
  ].join('\n');
  const t = runAc(netlist);

  it('the idle transmit side presents at least ten times the LNA side at f0 (ngspice agrees)', () => {
    const trap = r.traps?.find((x) => x.stageId === 'tx-idle');
    const zb = Math.hypot(trap?.zBranch.re ?? 0, trap?.zBranch.im ?? 0);
    // ngspice: the branch's impedance is V(ant) / I(branch).
    const v = vectorAt(t, 'v(ant)', 0);
    const i = vectorAt(t, 'vmeas#branch', 0);
    const spiceZ = Math.sqrt(mag2(v) / mag2(i));
    expect(zb / spiceZ).toBeCloseTo(1, 3);
    // The LNA side at that node: 50 Ω through its quarter wave and match.
    const lnaSide = Math.hypot(r.nodes[1].zIn.re, r.nodes[1].zIn.im);
    expect(lnaSide).toBeGreaterThan(45);
    expect(lnaSide).toBeLessThan(55);
    expect(zb).toBeGreaterThanOrEqual(10 * lnaSide);
    expect(trap?.ok).toBe(true);
    // Judged as a block, not reported as a tank.
    expect(r.flags.filter((f) => f.code.startsWith('tank-'))).toEqual([]);
    expect(r.flags.filter((f) => f.code === 'trap-missed')).toEqual([]);
  });

  it('the LNA sees the antenna through its match (ngspice: the same power at its input)', () => {
    const lnaNode = r.nodes.findIndex((x) => x.after.startsWith('LNA match'));
    const node = r.nodes[lnaNode];
    expect(node.matchReturnLossDb).toBeGreaterThan(20);
    expect(node.zSrc.re).toBeGreaterThan(180);
    // Power into the 200 Ω input, from the same EMF: the engine's source is -100 dBm available.
    const emfScale = (2 * Math.sqrt(2 * 50 * 1e-3 * 10 ** (-100 / 10))) ** 2; // |E|² for -100 dBm
    const spiceW = (mag2(vectorAt(t, 'v(lna)', 0)) * emfScale) / (2 * 200);
    expect(node.deliveredDbm).toBeCloseTo(dbm(spiceW), 3);
    expect(node.deliveredDbm).toBeGreaterThan(-100.5);
  });

  it('carries the transmit caution although this mode does not transmit', () => {
    expect(r.mode?.kind).toBe('receive');
    expect(r.cautions?.map((c) => c.caution)).toContain('transmit');
    expect(r.transmit).toBeUndefined();
  });
});

describe('433.92 MHz transceiver, transmit mode', () => {
  const r = analyse('transmit');
  // L-match 45 → 50 Ω, series L on the 45 Ω side then shunt C.
  const q = Math.sqrt(50 / R_PA - 1);
  const netlist = [
    '* transmit path, by hand',
    `V1 e 0 DC 0 AC ${2 * 3}`,
    `R1 e pa ${R_PA}`,
    ...ind('pa', 'a', (q * R_PA) / W),
    ...cap('a', '0', q / (50 * W)),
    'Coff a 0 0.3p',
    ...quarterWave('a', 'ant'),
    // the receive side: its quarter wave, the closed switch and the receiver's 50 Ω
    ...quarterWave('ant', 'rx'),
    'Ron rx 0 1',
    'Rrx rx 0 50',
    'Rant ant 0 50',
    ...acControl(`ac lin 3 ${F0} ${3 * F0}`, ['v(ant)', 'v(rx)', 'v(pa)', 'v(a)']),
    '.end',
  ].join('\n');
  const t = runAc(netlist);
  const pAnt = (i: number) => mag2(vectorAt(t, 'v(ant)', i)) / (2 * 50);

  it('the amplifier wants 45 Ω and gets about 45 Ω through the L-match', () => {
    expect(R_PA).toBeCloseTo(45, 12);
    expect(r.nodes[0].zSrc.re).toBeCloseTo(R_PA, 9);
    expect(r.nodes[0].zIn.re).toBeGreaterThan(42);
    expect(r.nodes[0].zIn.re).toBeLessThan(48);
    expect(r.transmit?.availableW).toBeCloseTo(0.1, 12);
  });

  it('delivers close to 100 mW into the antenna, as ngspice finds', () => {
    const tx = r.transmit;
    expect(tx?.deliveredW).toBeCloseTo(pAnt(0), 6);
    expect(tx?.deliveredDbm).toBeGreaterThan(19.5);
    expect(tx?.deliveredDbm).toBeLessThan(20);
  });

  it('states the harmonic attenuation at 2f0 and 3f0 as ngspice computes it, and flags the limit', () => {
    const h = r.transmit?.harmonics ?? [];
    expect(h.map((x) => x.n)).toEqual([2, 3]);
    expect(h[0].attenuationDb).toBeCloseTo(10 * Math.log10(pAnt(0) / pAnt(1)), 4);
    expect(h[1].attenuationDb).toBeCloseTo(10 * Math.log10(pAnt(0) / pAnt(2)), 4);
    // The example states a 20 dB limit; the 2nd harmonic misses it.
    expect(h[0].ok).toBe(h[0].attenuationDb >= 20);
    const flagged = r.flags.filter((f) => f.code === 'harmonics-high').map((f) => f.data?.n);
    expect(flagged).toEqual(h.filter((x) => x.attenuationDb < 20).map((x) => x.n));
    expect(flagged.length).toBeGreaterThan(0);
  });

  it('states the power reaching the receiver input (isolation) as ngspice computes it', () => {
    const rx = r.transmit?.receiverInput;
    const spiceRx = mag2(vectorAt(t, 'v(rx)', 0)) / (2 * 50);
    expect(rx?.dbm).toBeCloseTo(dbm(spiceRx), 3);
    expect(rx?.isolationDb).toBeCloseTo(10 * Math.log10(pAnt(0) / spiceRx), 3);
    expect(rx?.isolationDb).toBeGreaterThan(20);
  });

  it('gives every part its voltage and current at the transmit power, judged against ratings', () => {
    const parts = r.transmit?.parts ?? [];
    // The antenna's load: V = √(2·P·R).
    const ant = parts.find((p) => p.stageId === 'antenna-load');
    expect(ant?.vPeak).toBeCloseTo(Math.sqrt(2 * pAnt(0) * 50), 4);
    // The quarter wave's series coil (with its loss): V(a) − V(ant) across it.
    const coil = parts.find((p) => p.stageId === 'tx-pi' && p.label.includes('series'));
    const [ar, ai] = vectorAt(t, 'v(a)', 0);
    const [br, bi] = vectorAt(t, 'v(ant)', 0);
    expect(coil?.vPeak).toBeCloseTo(Math.hypot(ar - br, ai - bi), 4);
    expect(parts.filter((p) => p.stageId === 'tx-pi').every((p) => p.ok === true)).toBe(true);
    // The swing at the amplifier equals ngspice's V(pa).
    expect(r.transmit?.sourceSwingPeakV).toBeCloseTo(Math.sqrt(mag2(vectorAt(t, 'v(pa)', 0))), 4);
    expect(r.cautions?.map((c) => c.caution)).toEqual(['transmit', 'rf-exposure']);
  });
});
