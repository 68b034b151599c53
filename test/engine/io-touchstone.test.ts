import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { abcdToS } from '../../shared/engine/core/abcd';
import { reflectionToImpedance, toMeasuredNetwork } from '../../shared/io/network-data';
import { readTouchstone, TouchstoneError } from '../../shared/io/touchstone';
import {
  abcdSweepToNetwork,
  writeTouchstone,
  type TouchstoneFormat,
  type TouchstoneUnit,
} from '../../shared/io/touchstone-writer';

const FIXTURES = join(__dirname, '..', 'fixtures', 'touchstone');
const readFixture = (name: string) =>
  readTouchstone(readFileSync(join(FIXTURES, name), 'utf8'), name);

/** S value k (row-major S11 S12 S21 S22) at point i. */
function sAt(file: { s: Float64Array; ports: 1 | 2 }, i: number, k = 0): [number, number] {
  const o = (file.ports === 1 ? 2 : 8) * i + 2 * k;
  return [file.s[o], file.s[o + 1]];
}

function messageOf(fn: () => unknown): string {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(TouchstoneError);
    return (e as Error).message;
  }
  throw new Error('expected a TouchstoneError');
}

describe('Touchstone reader: TS-1 (Touchstone File Format Specification Rev 1.1, EIA/IBIS)', () => {
  it('should read a bare "#" option line as GHz, S, MA, R 50', () => {
    // TS-1: "Option line # with no fields means GHz, S, MA, R 50" (spec Rev 1.1 defaults).
    const file = readFixture('defaults-only.s1p');
    expect(Array.from(file.freqsHz)).toEqual([1e9, 2e9]);
    expect(file.z0).toBe(50);
    expect(file.sourceParameter).toBe('S');
    expect(sAt(file, 0)[0]).toBeCloseTo(0.5, 12);
    // MA with the angle in degrees: 0.5∠90° = j0.5.
    expect(sAt(file, 1)[0]).toBeCloseTo(0, 12);
    expect(sAt(file, 1)[1]).toBeCloseTo(0.5, 12);
  });

  it('should read "# MHz S DB R 50" as MHz and dB = 20·log10|S| with degrees, in any case', () => {
    // TS-1 conversions (±1e-6): DB −3, 45° → 0.500593 + j0.500593; DB −20, −90° → −j0.1.
    const file = readFixture('mhz-db.s2p');
    expect(Array.from(file.freqsHz)).toEqual([10e6, 20e6]);
    const [s11re, s11im] = sAt(file, 0, 0);
    expect(Math.abs(s11re - 0.500593)).toBeLessThan(1e-6);
    expect(Math.abs(s11im - 0.500593)).toBeLessThan(1e-6);
    // TS-1: 2-port data order is N11 N21 N12 N22, so the second pair is S21.
    const [s21re, s21im] = sAt(file, 0, 2);
    expect(Math.abs(s21re)).toBeLessThan(1e-6);
    expect(Math.abs(s21im + 0.1)).toBeLessThan(1e-6);
    const [s12re] = sAt(file, 0, 1);
    expect(Math.abs(s12re - 0.01)).toBeLessThan(1e-9);
    // TS-1: MA 0.5∠30° ↔ −6.0206 dB → 0.433013 + j0.25.
    const [s22re, s22im] = sAt(file, 0, 3);
    expect(Math.abs(s22re - 0.433013)).toBeLessThan(1e-6);
    expect(Math.abs(s22im - 0.25)).toBeLessThan(1e-6);
  });

  it('should read MA 0.5∠30° as 0.433013 + j0.25', () => {
    // TS-1 conversion (±1e-6).
    const file = readTouchstone('# mhz s ma r 50\n1 0.5 30\n', 'ma.s1p');
    const [re, im] = sAt(file, 0);
    expect(Math.abs(re - 0.433013)).toBeLessThan(1e-6);
    expect(Math.abs(im - 0.25)).toBeLessThan(1e-6);
  });

  it('should give Z = 150 Ω for S11 = 0.5 and 30 + j40 Ω for S11 = j0.5 at R 50', () => {
    // TS-1: "S11 = 0.5 → Z = 150 Ω; S11 = j0.5 → Z = 30 + j40 Ω (R 50)".
    const file = readTouchstone('# MHz S RI R 50\n1 0.5 0\n2 0 0.5\n', 'z.s1p');
    const z1 = reflectionToImpedance(...sAt(file, 0), file.z0);
    const z2 = reflectionToImpedance(...sAt(file, 1), file.z0);
    expect(z1[0]).toBeCloseTo(150, 9);
    expect(z1[1]).toBeCloseTo(0, 9);
    expect(z2[0]).toBeCloseTo(30, 9);
    expect(z2[1]).toBeCloseTo(40, 9);
  });

  it('should skip "!" comments, whole-line and trailing, and keep their text', () => {
    // TS-1: comments start with "!".
    const file = readFixture('mhz-db.s2p');
    expect(file.freqsHz.length).toBe(2);
    expect(file.comments).toContain('point at 10 MHz');
  });

  it('should read kHz and a 75 Ω reference', () => {
    // Spec Rev 1.1 units; impedances COMPUTED: j0.5 at 75 Ω → 45 + j60 Ω, 0.5 → 225 Ω.
    const file = readFixture('ri-75.s1p');
    expect(Array.from(file.freqsHz)).toEqual([100e3, 200e3]);
    expect(file.z0).toBe(75);
    const z = reflectionToImpedance(...sAt(file, 0), 75);
    expect(z[0]).toBeCloseTo(45, 9);
    expect(z[1]).toBeCloseTo(60, 9);
    expect(reflectionToImpedance(...sAt(file, 1), 75)[0]).toBeCloseTo(225, 9);
  });
});

describe('Touchstone reader: other parameters and versions', () => {
  it('should convert normalised 1.x Z and Y one-port data to S', () => {
    // Spec Rev 1.1: Y and Z are normalised to R. z = 3 and y = 1/3 are both S = 0.5.
    const z = readTouchstone('# MHz Z RI R 50\n1 3 0\n', 'z.s1p');
    const y = readTouchstone('# MHz Y RI R 50\n1 0.333333333333333 0\n', 'y.s1p');
    expect(z.sourceParameter).toBe('Z');
    expect(sAt(z, 0)[0]).toBeCloseTo(0.5, 12);
    expect(sAt(y, 0)[0]).toBeCloseTo(0.5, 12);
  });

  it('should convert two-port Z data to the same S as the ABCD of the same T network', () => {
    // Two independent standard conversions must agree: Z-parameters of a T (Za, Zb, Zc)
    // and its ABCD A = 1 + Za/Zc, B = Za + Zb + Za·Zb/Zc, C = 1/Zc, D = 1 + Zb/Zc.
    const [za, zb, zc] = [20, 35, -60]; // real for simplicity, in ohm
    const r = 50;
    const text = `# Hz Z RI R ${r}\n1 ${(za + zc) / r} 0 ${zc / r} 0 ${zc / r} 0 ${(zb + zc) / r} 0\n`;
    const file = readTouchstone(text, 't.s2p');
    const abcd = Float64Array.from([
      1 + za / zc,
      0,
      za + zb + (za * zb) / zc,
      0,
      1 / zc,
      0,
      1 + zb / zc,
      0,
    ]);
    const s = abcdToS(abcd, r);
    for (let k = 0; k < 8; k++) expect(file.s[k]).toBeCloseTo(s[k], 12);
  });

  it('should convert two-port Y data (the inverse of the same Z matrix) to the same S', () => {
    // y = z⁻¹ for a two-port, so normalised Y and Z files of one network give one S.
    const z = [1.2, 0.4, 0.3, 0.2]; // normalised z11 z12 z21 z22, real
    const det = z[0] * z[3] - z[1] * z[2];
    const y = [z[3] / det, -z[1] / det, -z[2] / det, z[0] / det];
    const line = (m: number[]) => `1 ${m[0]} 0 ${m[2]} 0 ${m[1]} 0 ${m[3]} 0`;
    const fromZ = readTouchstone(`# Hz Z RI R 50\n${line(z)}\n`, 'z.s2p');
    const fromY = readTouchstone(`# Hz Y RI R 50\n${line(y)}\n`, 'y.s2p');
    for (let k = 0; k < 8; k++) expect(fromY.s[k]).toBeCloseTo(fromZ.s[k], 12);
  });

  it('should read a 2.0 file with [Two-Port Data Order] 12_21 as N11 N12 N21 N22, across wrapped lines', () => {
    // 12_21 puts N12 before N21; 21_12 is the 1.x order. Touchstone File Format Specification
    // Version 2.0 (IBIS Open Forum, 2009), [Two-Port Data Order]: its two-port example labels
    // the columns "freq magH11 angH11 magH21 angH21 magH12 angH12 magH22 angH22" under 21_12.
    const file = readFixture('v2-order-12_21.s2p');
    expect(file.version).toBe('2.0');
    expect(sAt(file, 0, 1)[0]).toBeCloseTo(0.2, 12); // S12
    expect(sAt(file, 0, 2)[0]).toBeCloseTo(0.3, 12); // S21
    expect(sAt(file, 1, 3)).toEqual([0.4, 0.04]);
  });

  it('should read [Two-Port Data Order] 21_12 as the 1.x order', () => {
    const text =
      '[Version] 2.0\n# Hz S RI R 50\n[Number of Ports] 2\n[Two-Port Data Order] 21_12\n' +
      '[Number of Frequencies] 1\n[Network Data]\n1 0.1 0 0.2 0 0.3 0 0.4 0\n[End]\n';
    const file = readTouchstone(text, 'order.s2p');
    expect(sAt(file, 0, 2)[0]).toBeCloseTo(0.2, 12); // S21 second in the file
    expect(sAt(file, 0, 1)[0]).toBeCloseTo(0.3, 12);
  });

  it('should read 1.x noise parameters that start where the frequency stops increasing', () => {
    // Spec Rev 1.1: noise data follow the S data; Rn is normalised to R.
    const file = readFixture('noise-v1.s2p');
    expect(file.freqsHz.length).toBe(2);
    expect(file.noise).toHaveLength(2);
    expect(file.noise[0].fHz).toBe(1e9);
    expect(file.noise[0].nfMinDb).toBe(1.2);
    expect(file.noise[0].rnOhm).toBeCloseTo(15, 12);
    expect(file.noise[0].gammaOpt.re).toBeCloseTo(0.4 * Math.SQRT1_2, 12);
  });

  it('should give the contract form with s12/s21 named as the matrix entries', () => {
    const measured = toMeasuredNetwork(readFixture('v2-order-12_21.s2p'));
    expect(measured.ports).toBe(2);
    expect(measured.points[0].s12?.re).toBeCloseTo(0.2, 12);
    expect(measured.points[0].s21?.re).toBeCloseTo(0.3, 12);
    expect(measured.points[0].z0).toBe(50);
  });
});

describe('Touchstone reader: malformed files', () => {
  it('should name the file, line and the accepted options for a bad option line', () => {
    const msg = messageOf(() => readFixture('bad-option.s1p'));
    expect(msg).toContain('bad-option.s1p, line 1');
    expect(msg).toContain('"XY" is not an option');
    expect(msg).toContain('DB, MA, RI');
  });

  it('should name the line and the expected count for a wrong column count', () => {
    const msg = messageOf(() => readFixture('bad-columns.s2p'));
    expect(msg).toContain('bad-columns.s2p, line 3');
    expect(msg).toContain('7 numbers');
    expect(msg).toContain('needs 9');
  });

  it('should name the line for frequencies that do not increase', () => {
    const msg = messageOf(() => readFixture('non-monotonic.s1p'));
    expect(msg).toContain('non-monotonic.s1p, line 4');
    expect(msg).toContain('frequencies must increase, but 2 comes after 3');
  });

  it.each([
    ['data first', '1 0.5 0\n', 'x.s1p', 'data before the option line'],
    ['no data', '# MHz S MA R 50\n! nothing\n', 'x.s1p', 'no data points found'],
    ['non-number', '# MHz S MA R 50\n1 0.5 abc\n', 'x.s1p', '"abc" is not a number'],
    ['bad R', '# MHz S MA R -5\n1 0.5 0\n', 'x.s1p', 'R must be followed by a resistance'],
    ['H parameters', '# MHz H MA R 50\n', 'x.s2p', 'H-parameters are not read'],
    ['three ports', '# MHz S MA R 50\n', 'x.s3p', 'only 1- and 2-port files'],
    ['unclear ports', '# MHz S MA R 50\n1 2 3 4 5\n', 'x.txt', 'name the file .s1p or .s2p'],
    [
      'count mismatch',
      '[Version] 2.0\n# Hz S RI R 50\n[Number of Ports] 1\n[Number of Frequencies] 3\n[Network Data]\n1 0 0\n',
      'x.s1p',
      '[Number of Frequencies] says 3',
    ],
    [
      'v2 two-port without order',
      '[Version] 2.0\n# Hz S RI R 50\n[Number of Ports] 2\n[Network Data]\n',
      'x.s2p',
      'needs [Two-Port Data Order]',
    ],
    [
      'too few references',
      '[Version] 2.0\n# Hz S RI R 50\n[Number of Ports] 2\n[Reference] 50\n[Network Data]\n',
      'x.s2p',
      '[Reference] gives fewer values',
    ],
    [
      'too many references',
      '[Version] 2.0\n# Hz S RI R 50\n[Number of Ports] 1\n[Reference] 50 75\n',
      'x.s1p',
      '[Reference] gives 2 values for 1 port',
    ],
  ])('should refuse %s with a message that says what to fix', (_what, text, name, expected) => {
    const msg = messageOf(() => readTouchstone(text, name));
    expect(msg.startsWith(name)).toBe(true);
    expect(msg).toContain(expected);
  });
});

describe('Touchstone writer', () => {
  const complexArb = fc.double({ min: -2, max: 2, noNaN: true }).filter((v) => Math.abs(v) > 1e-6);

  it('should round-trip two-port data write → read in every format and unit', () => {
    fc.assert(
      fc.property(
        fc.array(fc.array(complexArb, { minLength: 8, maxLength: 8 }), {
          minLength: 1,
          maxLength: 6,
        }),
        fc.constantFrom<TouchstoneFormat>('RI', 'MA', 'DB'),
        fc.constantFrom<TouchstoneUnit>('Hz', 'kHz', 'MHz', 'GHz'),
        fc.constantFrom(50, 75, 300),
        (points, format, unit, z0) => {
          const freqsHz = Float64Array.from(points, (_, i) => 1e6 * (i + 1) + 0.25);
          const data = { ports: 2 as const, freqsHz, s: Float64Array.from(points.flat()), z0 };
          const text = writeTouchstone(data, { format, unit, comments: ['round trip'] });
          const back = readTouchstone(text, 'rt.s2p');
          expect(back.z0).toBe(z0);
          for (let i = 0; i < freqsHz.length; i++) {
            expect(Math.abs(back.freqsHz[i] - freqsHz[i]) / freqsHz[i]).toBeLessThan(1e-11);
          }
          for (let k = 0; k < data.s.length; k++) {
            expect(Math.abs(back.s[k] - data.s[k])).toBeLessThan(1e-9);
          }
        },
      ),
      { numRuns: 60 },
    );
  });

  it('should round-trip a one-port', () => {
    const data = {
      ports: 1 as const,
      freqsHz: Float64Array.from([1e3, 2e3]),
      s: Float64Array.from([0.1, -0.2, 0.3, 0.4]),
      z0: 50,
    };
    const back = readTouchstone(writeTouchstone(data, { format: 'MA', unit: 'kHz' }), 'one.s1p');
    expect(Array.from(back.freqsHz)).toEqual([1e3, 2e3]);
    back.s.forEach((v, k) => expect(v).toBeCloseTo(data.s[k], 10));
  });

  it('should write a 50 Ω series resistor as S11 = 1/3, S21 = 2/3 (Z0 = 50 Ω)', () => {
    // COMPUTED from the standard ABCD→S conversion: series R, S11 = R/(R + 2Z0), S21 = 2Z0/(R + 2Z0).
    const abcd = Float64Array.from([1, 0, 50, 0, 0, 0, 1, 0, 1, 0, 50, 0, 0, 0, 1, 0]);
    const net = abcdSweepToNetwork([1e6, 2e6], abcd, 50);
    const text = writeTouchstone(net, { comments: ['series 50 ohm'] });
    expect(text.split('\n')[1]).toBe('# HZ S RI R 50');
    const back = readTouchstone(text, 'r.s2p');
    expect(back.s[0]).toBeCloseTo(1 / 3, 11); // S11
    expect(back.s[4]).toBeCloseTo(2 / 3, 11); // S21
    expect(back.s[2]).toBeCloseTo(2 / 3, 11); // S12 (reciprocal)
  });

  it('should refuse arrays that do not match the port count', () => {
    expect(() => abcdSweepToNetwork([1, 2], new Float64Array(8), 50)).toThrow(/need 16 ABCD slots/);
    expect(() =>
      writeTouchstone({
        ports: 2,
        freqsHz: Float64Array.from([1]),
        s: new Float64Array(2),
        z0: 50,
      }),
    ).toThrow(/need 8 S values/);
  });
});
