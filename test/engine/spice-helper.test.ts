/**
 * Proves the ngspice helper on hand-written netlists of reference cases whose answers are
 * published or closed-form (cases PI-1, T-1, TC-1, CI-1, LQ-3, each with its source below), before the helper
 * is trusted to check the engine. The simulator: ngspice (Debian package ngspice), run in
 * the test.
 */
import { parseWrdata } from '../../shared/engine/spice/output';
import { acControl, INSTALL_HINT, runAc, runNgspice, vectorAt } from './helpers/ngspice';

const TWO_PI = 2 * Math.PI;

/** Impedance seen by a 1 V source `V1` (ngspice's i(V1) flows into the + terminal). */
function zFromSource(v: [number, number], i: [number, number]): [number, number] {
  // Z = V / (−I)
  const [ire, iim] = [-i[0], -i[1]];
  const den = ire * ire + iim * iim;
  return [(v[0] * ire + v[1] * iim) / den, (v[1] * ire - v[0] * iim) / den];
}

describe('ngspice helper on published and closed-form cases', () => {
  it('should give Zin = 1000 + j0 Ω for the PI-1 low-pass π at 10 MHz', () => {
    // PI-1 (decomposition after analog.intgckts.com "Pi matching",
    // Rv = RH/(Q²+1) from memory): XC1 = 100 Ω, XL = 118.94 Ω, XC2 = 24.845 Ω, ±0.1 %.
    const f = 10e6;
    const w = TWO_PI * f;
    const rv = 1000 / (10 * 10 + 1);
    const q2 = Math.sqrt(50 / rv - 1);
    const c1 = 1 / (w * (1000 / 10));
    const l = (10 * rv + q2 * rv) / w;
    const c2 = 1 / (w * (50 / q2));
    expect(c1).toBeCloseTo(159.15e-12, 14);
    const netlist = [
      'PI-1 low-pass pi, 1000 ohm to 50 ohm',
      'V1 n1 0 AC 1',
      `C1 n1 0 ${c1}`,
      `L1 n1 n2 ${l}`,
      `C2 n2 0 ${c2}`,
      'RL n2 0 50',
      ...acControl(`ac lin 1 ${f} ${f}`, ['v(n1)', 'i(V1)']),
      '.end',
    ].join('\n');
    const table = runAc(netlist);
    const [re, im] = zFromSource(vectorAt(table, 'v(n1)', 0), vectorAt(table, 'i(V1)', 0));
    expect(Math.abs(re - 1000) / 1000).toBeLessThan(1e-3);
    expect(Math.abs(im) / 1000).toBeLessThan(1e-3);
  });

  it('should give Zin = 10 + j0 Ω for the T-1 low-pass T at 100 MHz', () => {
    // T-1 (analog.intgckts.com "T-matching", Rv = Rs(Q²+1) from memory):
    // XL1 = 50 Ω, shunt 36.883 Ω, XL2 = 102.47 Ω, ±0.1 %.
    const f = 100e6;
    const w = TWO_PI * f;
    const rv = 10 * (5 * 5 + 1);
    const q2 = Math.sqrt(rv / 50 - 1);
    const xShunt = 1 / (1 / (rv / 5) + 1 / (rv / q2));
    expect(xShunt).toBeCloseTo(36.883, 3);
    const netlist = [
      'T-1 low-pass T, 10 ohm to 50 ohm',
      'V1 n1 0 AC 1',
      `L1 n1 n2 ${(5 * 10) / w}`,
      `C1 n2 0 ${1 / (w * xShunt)}`,
      `L2 n2 n3 ${(q2 * 50) / w}`,
      'RL n3 0 50',
      ...acControl(`ac lin 1 ${f} ${f}`, ['v(n1)', 'i(V1)']),
      '.end',
    ].join('\n');
    const table = runAc(netlist);
    const [re, im] = zFromSource(vectorAt(table, 'v(n1)', 0), vectorAt(table, 'i(V1)', 0));
    expect(Math.abs(re - 10) / 10).toBeLessThan(1e-3);
    expect(Math.abs(im) / 10).toBeLessThan(1e-3);
  });

  it('should give Rp = 5506.6 Ω ∥ Cp = 90.92 pF at the top of the TC-1 tapped capacitor', () => {
    // TC-1 (exact values COMPUTED from Y = 1/[1/(jωC1) + (RL ∥ 1/(jωC2))]), ±0.1 %.
    const f = 10e6;
    const netlist = [
      'TC-1 tapped capacitor 100p over 900p, 50 ohm at the tap',
      'V1 top 0 AC 1',
      'C1 top tap 100p',
      'C2 tap 0 900p',
      'RL tap 0 50',
      ...acControl(`ac lin 1 ${f} ${f}`, ['v(top)', 'i(V1)']),
      '.end',
    ].join('\n');
    const table = runAc(netlist);
    const [re, im] = zFromSource(vectorAt(table, 'v(top)', 0), vectorAt(table, 'i(V1)', 0));
    const den = re * re + im * im;
    const [g, b] = [re / den, -im / den];
    expect(Math.abs(1 / g - 5506.6) / 5506.6).toBeLessThan(1e-3);
    expect(Math.abs(b / (TWO_PI * f) - 90.92e-12) / 90.92e-12).toBeLessThan(1e-3);
  });

  it('should give |I1| = 0.18189 A and |I2| = 0.045473 A for the CI-1 coupled coils', () => {
    // CI-1: "Coupled Inductors" Example 1, PUBLISHED |I2| = 0.045473 A;
    // |I1| and Zin = j5.498 Ω COMPUTED; ±0.01 %. M = k·sqrt(L1·L2) (electronicsteacher.com).
    const k = 0.5e-3 / Math.sqrt(1e-3 * 2e-3);
    const netlist = [
      'CI-1 coupled coils, secondary shorted through a 0 V sense source',
      'V1 p 0 AC 1',
      'L1 p 0 1m',
      'L2 s 0 2m',
      `K1 L1 L2 ${k}`,
      'VS s 0 AC 0',
      ...acControl('ac lin 1 1000 1000', ['v(p)', 'i(V1)', 'i(VS)']),
      '.end',
    ].join('\n');
    const table = runAc(netlist);
    const i1 = Math.hypot(...vectorAt(table, 'i(V1)', 0));
    const i2 = Math.hypot(...vectorAt(table, 'i(VS)', 0));
    expect(Math.abs(i1 - 0.18189) / 0.18189).toBeLessThan(1e-4);
    expect(Math.abs(i2 - 0.045473) / 0.045473).toBeLessThan(1e-4);
    const z = zFromSource(vectorAt(table, 'v(p)', 0), vectorAt(table, 'i(V1)', 0));
    expect(Math.abs(z[0])).toBeLessThan(1e-6);
    expect(Math.abs(z[1] - 5.498) / 5.498).toBeLessThan(1e-4);
  });

  it('should give the LQ-3 loaded tank: peak 23.668 kΩ, edges 9.8029 and 10.2011 MHz, QL 25.11', () => {
    // LQ-3: coil inputs PUBLISHED in FOSSEE/Scilab-TBC-Uploads 2210/CH5/EX5.20;
    // loading chosen; results COMPUTED, ±0.1 % (±0.2 % on the band edges).
    const netlist = [
      'LQ-3 tank: 15 uH with 2 ohm, 16.887 pF, 50k source and 50k load',
      'I1 0 t AC 1',
      'RS t 0 50k',
      'RL t 0 50k',
      'C1 t 0 16.887p',
      'L1 t x 15u',
      'R1 x 0 2',
      ...acControl('ac lin 8001 9.6e6 10.4e6', ['v(t)']),
      '.end',
    ].join('\n');
    const table = runAc(netlist);
    const mag = Array.from(table.freqsHz, (_, i) => Math.hypot(...vectorAt(table, 'v(t)', i)));
    const peak = Math.max(...mag);
    const iPeak = mag.indexOf(peak);
    const edge = (from: number, step: 1 | -1) => {
      let i = from;
      while (mag[i] > peak / Math.SQRT2) i += step;
      const t = (peak / Math.SQRT2 - mag[i]) / (mag[i - step] - mag[i]);
      return table.freqsHz[i] + t * (table.freqsHz[i - step] - table.freqsHz[i]);
    };
    const [flo, fhi] = [edge(iPeak, -1), edge(iPeak, 1)];
    expect(Math.abs(peak - 23668) / 23668).toBeLessThan(1e-3);
    expect(Math.abs(flo - 9.8029e6) / 9.8029e6).toBeLessThan(2e-3);
    expect(Math.abs(fhi - 10.2011e6) / 10.2011e6).toBeLessThan(2e-3);
    expect(Math.abs(table.freqsHz[iPeak] / (fhi - flo) - 25.11) / 25.11).toBeLessThan(1e-3);
  });

  it('should say how to install ngspice when it is missing', () => {
    const run = () => runNgspice('title\n.end\n', [], { command: 'ngspice-absent-for-this-test' });
    expect(run).toThrow(`ngspice was not found on PATH: ${INSTALL_HINT}`);
    expect(INSTALL_HINT).toBe("install Debian's ngspice: apt-get install -y ngspice");
  });

  it('should show ngspice messages and the netlist when no table is written', () => {
    expect(() => runNgspice('broken\nR1 a\n.end\n', ['ac.txt'])).toThrow(
      /ngspice wrote no ac\.txt[\s\S]*--- netlist ---\nbroken/,
    );
  });

  it('should refuse a table that is not a wrdata AC table, saying why', () => {
    expect(() => parseWrdata('')).toThrow(/empty/);
    expect(() => parseWrdata('time v(a)\n0 1\n')).toThrow(/wr_singlescale/);
    expect(() => parseWrdata('frequency v(a) v(a)\n1 2\n')).toThrow(/row 2/);
  });
});
