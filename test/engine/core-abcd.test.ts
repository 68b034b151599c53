/**
 * ABCD cascade and converters: closed-form checks, and fast-check properties (reciprocity,
 * identity, S ↔ ABCD round trips with real and complex reference impedances).
 */
import fc from 'fast-check';
import {
  abcdToS,
  abcdToY,
  abcdToZ,
  cascade,
  cascadeAll,
  db20,
  identityAbcd,
  phaseDeg,
  sToAbcd,
  type RefImpedance,
} from '../../shared/engine/core/abcd';
import { cdiv, cinv, cmul, csqrt } from '../../shared/engine/core/complex';

const series = (zr: number, zi: number) => Float64Array.of(1, 0, zr, zi, 0, 0, 1, 0);
const shunt = (yr: number, yi: number) => Float64Array.of(1, 0, 0, 0, yr, yi, 1, 0);
const close = (a: number, b: number, tol: number) =>
  expect(Math.abs(a - b)).toBeLessThanOrEqual(tol * Math.max(1, Math.abs(b)));

describe('complex helpers', () => {
  it('multiply, divide, invert and square root', () => {
    const out = new Float64Array(2);
    cmul(1, 2, 3, -1, out, 0);
    expect(Array.from(out)).toEqual([5, 5]);
    cdiv(5, 5, 3, -1, out, 0);
    close(out[0], 1, 1e-15);
    close(out[1], 2, 1e-15);
    cinv(0, 2, out, 0);
    expect(Array.from(out)).toEqual([0, -0.5]);
    cinv(Infinity, 0, out, 0); // 1/∞ = 0: an open side adds no admittance
    expect(Array.from(out)).toEqual([0, 0]);
    csqrt(-4, 0, out, 0);
    expect(Array.from(out)).toEqual([0, 2]);
  });
});

describe('cascade', () => {
  it('multiplies series and shunt elements into the textbook L-section matrix', () => {
    // [[1, Z], [0, 1]]·[[1, 0], [Y, 1]] = [[1 + ZY, Z], [Y, 1]] (common practice)
    const out = new Float64Array(8);
    cascade(series(10, 20), 0, shunt(0.01, -0.02), 0, out, 0);
    // ZY = (10 + j20)(0.01 − j0.02) = 0.1 + 0.4 + j(0.2 − 0.2) = 0.5
    expect(Array.from(out)).toEqual([1.5, 0, 10, 20, 0.01, -0.02, 1, 0]);
  });

  it('cascadeAll of an empty list is the identity, and it refuses mismatched grids', () => {
    expect(Array.from(cascadeAll([], 2))).toEqual(Array.from(identityAbcd(2)));
    expect(() => cascadeAll([identityAbcd(2), identityAbcd(3)])).toThrow(/same frequency grid/);
  });

  const elem = fc.record({
    kind: fc.constantFrom('series', 'shunt'),
    re: fc.double({ min: 0, max: 1e3, noNaN: true }),
    im: fc.double({ min: -1e3, max: 1e3, noNaN: true }),
  });
  const toAbcd = (e: { kind: string; re: number; im: number }) =>
    e.kind === 'series' ? series(e.re, e.im) : shunt(e.re / 1e3, e.im / 1e3);

  it('property: a reciprocal passive ladder has AD − BC = 1', () => {
    fc.assert(
      fc.property(fc.array(elem, { minLength: 1, maxLength: 8 }), (elems) => {
        const m = cascadeAll(elems.map(toAbcd));
        const [ar, ai, br, bi, cr, ci, dr, di] = m;
        const scale = Math.max(1, ...Array.from(m, Math.abs)) ** 2;
        close((ar * dr - ai * di - (br * cr - bi * ci)) / scale, 1 / scale, 1e-9);
        expect(Math.abs(ar * di + ai * dr - (br * ci + bi * cr)) / scale).toBeLessThan(1e-9);
      }),
    );
  });

  it('property: cascading an identity on either side changes nothing', () => {
    fc.assert(
      fc.property(fc.array(elem, { minLength: 1, maxLength: 5 }), (elems) => {
        const m = cascadeAll(elems.map(toAbcd));
        const left = new Float64Array(8);
        const right = new Float64Array(8);
        cascade(identityAbcd(1), 0, m, 0, left, 0);
        cascade(m, 0, identityAbcd(1), 0, right, 0);
        expect(Array.from(left)).toEqual(Array.from(m));
        expect(Array.from(right)).toEqual(Array.from(m));
      }),
    );
  });
});

describe('S, Z and Y conversions', () => {
  it('a 50 Ω series resistor in 50 Ω has S11 = 1/3, S21 = 2/3 (common practice)', () => {
    const s = abcdToS(series(50, 0), 50);
    close(s[0], 1 / 3, 1e-15);
    close(s[4], 2 / 3, 1e-15);
    close(s[2], 2 / 3, 1e-15);
    close(s[6], 1 / 3, 1e-15);
    close(db20(s[4], s[5]), 20 * Math.log10(2 / 3), 1e-12);
  });

  it('S11 with complex references equals the power-wave reflection (Zin − Z01*)/(Zin + Z01)', () => {
    // Kurokawa power waves; port 2 terminated in its reference Z02.
    const m = new Float64Array(8);
    cascade(series(12, 30), 0, shunt(0.004, 0.01), 0, m, 0);
    const z1 = { re: 30, im: 20 };
    const z2 = { re: 75, im: -15 };
    const s = abcdToS(m, z1, z2);
    const t = new Float64Array(4);
    // Zin = (A·Z02 + B)/(C·Z02 + D)
    cmul(m[0], m[1], z2.re, z2.im, t, 0);
    cmul(m[4], m[5], z2.re, z2.im, t, 2);
    cdiv(t[0] + m[2], t[1] + m[3], t[2] + m[6], t[3] + m[7], t, 0);
    cdiv(t[0] - z1.re, t[1] + z1.im, t[0] + z1.re, t[1] + z1.im, t, 2);
    close(s[0], t[2], 1e-12);
    close(s[1], t[3], 1e-12);
  });

  it('Z and Y of a tee agree with the node equations (common practice)', () => {
    // T of series 10, shunt 1/200 S, series 20: z11 = 210, z22 = 220, z12 = z21 = 200
    const m = cascadeAll([series(10, 0), shunt(1 / 200, 0), series(20, 0)]);
    const z = abcdToZ(m);
    [210, 0, 200, 0, 200, 0, 220, 0].forEach((v, k) => close(z[k], v, 1e-12));
    const y = abcdToY(m);
    // Y = Z⁻¹: det = 210·220 − 200² = 6200
    [220 / 6200, 0, -200 / 6200, 0, -200 / 6200, 0, 210 / 6200, 0].forEach((v, k) =>
      close(y[k], v, 1e-12),
    );
    close(phaseDeg(0, 1), 90, 1e-15);
  });

  const refs: [RefImpedance, RefImpedance][] = [
    [50, 50],
    [75, 75],
    [50, 300],
    [
      { re: 30, im: 20 },
      { re: 30, im: 20 },
    ],
    [
      { re: 10, im: -40 },
      { re: 100, im: 60 },
    ],
  ];
  const part = fc.double({ min: -0.9, max: 0.9, noNaN: true });

  it.each(refs)('property: S → ABCD → S round trip (z01 = %p, z02 = %p)', (z1, z2) => {
    fc.assert(
      fc.property(fc.array(part, { minLength: 8, maxLength: 8 }), (p) => {
        const s = Float64Array.from(p);
        fc.pre(Math.hypot(s[4], s[5]) > 0.05); // ABCD needs S21 ≠ 0
        const back = abcdToS(sToAbcd(s, z1, z2), z1, z2);
        for (let k = 0; k < 8; k++) expect(Math.abs(back[k] - s[k])).toBeLessThan(1e-9);
      }),
    );
  });

  it.each(refs)('property: ABCD → S → ABCD round trip (z01 = %p, z02 = %p)', (z1, z2) => {
    const elem = fc.tuple(fc.boolean(), fc.double({ min: 1, max: 500, noNaN: true }), fc.double({ min: -500, max: 500, noNaN: true })); // prettier-ignore
    fc.assert(
      fc.property(fc.array(elem, { minLength: 1, maxLength: 5 }), (elems) => {
        const m = cascadeAll(
          elems.map(([s, r, x]) => (s ? series(r, x) : shunt(r / 1e4, x / 1e4))),
        );
        const back = sToAbcd(abcdToS(m, z1, z2), z1, z2);
        const scale = Math.max(1, ...Array.from(m, Math.abs));
        for (let k = 0; k < 8; k++) expect(Math.abs(back[k] - m[k]) / scale).toBeLessThan(1e-9);
      }),
    );
  });

  it('refuses a reference impedance without a positive real part, naming it', () => {
    expect(() => abcdToS(identityAbcd(1), 0)).toThrow(
      /reference impedance must have a real part above 0/,
    );
  });
});
