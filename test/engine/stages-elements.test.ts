/**
 * Element, filter, source, load, amplifier and mixer stages against closed forms.
 */
import { StageParameterError } from '../../shared/engine/errors';
import {
  findStageDefinition,
  measuredTwoPort,
  mixerLoFrequency,
  shortMonopole,
} from '../../shared/engine/stages';
import { sToAbcdAt } from '../../shared/engine/core/abcd';
import type { StageDefinition } from '../../shared/engine/types';
import {
  abs,
  build,
  c,
  div,
  fromSlots,
  impedanceAt,
  rel,
  stageAbcd,
  transducerGain,
  zIn,
} from './stages-support';

function def(type: string): StageDefinition {
  const d = findStageDefinition(type);
  if (!d) throw new Error(`no stage type ${type}`);
  return d;
}
const db = (g: number) => 10 * Math.log10(g);

describe('attenuator pad', () => {
  it.each([
    ['pi', 3],
    ['pi', 20],
    ['t', 6],
    ['t', 40],
  ])('%s, %p dB: exact loss between Z0 terminations and matched at both ports', (form, loss) => {
    const m = build(def('attenuator-pad'), { db: loss, z0: 75, form }, 1e6);
    const a = stageAbcd(m, 1e6);
    expect(db(transducerGain(a, c(75), c(75)))).toBeCloseTo(-loss, 10);
    const z = zIn(a, c(75));
    expect(z.re).toBeCloseTo(75, 9);
    expect(z.im).toBeCloseTo(0, 12);
  });
});

describe('transmission line', () => {
  it('a λ/4 line inverts an impedance: Zin = Z0²/ZL (common practice)', () => {
    const f = 10e6;
    const vf = 0.66;
    const length = (vf * 299_792_458) / (4 * f);
    const m = build(def('transmission-line'), { z0: 50, length, vf, lossDbPerM: 0, refHz: 1e8 }, f);
    const zl = c(100, 30);
    const z = zIn(stageAbcd(m, f), zl);
    const want = div(c(2500), zl);
    expect(z.re).toBeCloseTo(want.re, 7);
    expect(z.im).toBeCloseTo(want.im, 7);
  });

  it('loss scales with √f: 1 dB/m at 100 MHz is 20 dB over 10 m at 400 MHz', () => {
    const m = build(
      def('transmission-line'),
      { z0: 50, length: 10, vf: 0.8, lossDbPerM: 1, refHz: 100e6 },
      1e8,
    );
    expect(db(transducerGain(stageAbcd(m, 400e6), c(50), c(50)))).toBeCloseTo(-20, 9);
    expect(m.spice).toBeUndefined(); // only the lossless line is SPICE-exact
  });
});

describe('T/R switch', () => {
  it('has its insertion loss receiving and its isolation transmitting', () => {
    const rx = build(
      def('tr-switch'),
      { insertionLossDb: 0.4, isolationDb: 35, state: 'receive', z0: 50 },
      1e6,
    );
    const tx = build(
      def('tr-switch'),
      { insertionLossDb: 0.4, isolationDb: 35, state: 'transmit', z0: 50 },
      1e6,
    );
    expect(db(transducerGain(stageAbcd(rx, 1e6), c(50), c(50)))).toBeCloseTo(-0.4, 10);
    expect(db(transducerGain(stageAbcd(tx, 1e6), c(50), c(50)))).toBeCloseTo(-35, 10);
  });
});

describe('amplifiers', () => {
  const amps = ['unilateral-amplifier', 'triode-amplifier'].map(def);
  const cases = amps.flatMap((d) =>
    (d.presets ?? []).map((p) => [`${d.type}/${p.key}`, d, p.values] as const),
  );

  it.each(cases)(
    '%s gives gm²·Rin·Rout/4 between Rin and Rout (our stated-gain definition)',
    (_k, d, values) => {
      const m = build(d, values, 1e6);
      const { gm, rin, rout } = values as Record<string, number>;
      // At 10 Hz the input and output capacitances are negligible (ωCR < 2e-4).
      const g = transducerGain(stageAbcd(m, 10), c(rin), c(rout));
      expect(db(g)).toBeCloseTo(db((gm * gm * rin * rout) / 4), 6);
      expect(m.sections[0].unilateral).toBe(true);
    },
  );

  it('a stated gain of 17 dB is reached when matched, whatever the port resistances', () => {
    for (const [rin, rout] of [
      [50, 50],
      [1000, 10e3],
    ]) {
      const m = build(
        def('unilateral-amplifier'),
        { gainMode: 'stated', gainDb: 17, rin, rout, cin: 0, cout: 0 },
        1e6,
      );
      expect(db(transducerGain(stageAbcd(m, 1e6), c(rin), c(rout)))).toBeCloseTo(17, 9);
    }
  });

  it('hands on noise parameters with Yopt = 1/Zopt', () => {
    const m = build(
      def('unilateral-amplifier'),
      { noiseMode: 'parameters', fminDb: 1, rn: 10, ropt: 40, xopt: 30 },
      1e6,
    );
    expect(m.noise).toEqual({
      kind: 'parameters',
      fminDb: 1,
      rn: 10,
      yoptRe: 40 / 2500,
      yoptIm: -30 / 2500,
    });
  });
});

describe('mixer', () => {
  const mixer = def('mixer');
  const translateOf = (values: Record<string, string | number>, f0: number) => {
    const t = build(mixer, values, f0).sections[0].translate;
    if (!t) throw new Error('mixer without translate');
    return t;
  };

  it('high-side LO: f0 → IF and the image f0 + 2·IF → IF', () => {
    const t = translateOf(
      { loSource: 'from-if', side: 'high', ifHz: 455e3, conversion: 'down' },
      1e6,
    );
    expect(t(1e6)).toBeCloseTo(455e3, 6);
    expect(t(1.91e6)).toBeCloseTo(455e3, 6); // IMG-1: image at 1910 kHz
  });

  it('low-side LO: f0 → IF and the image f0 − 2·IF → IF', () => {
    const t = translateOf(
      { loSource: 'from-if', side: 'low', ifHz: 10.7e6, conversion: 'down' },
      100e6,
    );
    expect(t(100e6)).toBeCloseTo(10.7e6, 3);
    expect(t(78.6e6)).toBeCloseTo(10.7e6, 3);
  });

  it('up-conversion adds the LO; a stated LO is used as given', () => {
    expect(translateOf({ loSource: 'frequency', loHz: 50e6, conversion: 'up' }, 10e6)(10e6)).toBe(
      60e6,
    );
    expect(
      mixerLoFrequency(10e6, {
        loSource: 'from-if',
        conversion: 'up',
        side: 'high',
        ifHz: 45e6,
        loHz: 0,
      }),
    ).toBe(35e6);
    expect(() => build(mixer, { loSource: 'from-if', side: 'low', ifHz: 2e6 }, 1e6)).toThrow(
      /high-side LO/,
    );
  });

  it('has the stated conversion gain between its port resistances', () => {
    const m = build(
      mixer,
      { conversionGainDb: -6, rin: 50, rout: 50, loSource: 'frequency', loHz: 9e6 },
      10e6,
    );
    expect(db(transducerGain(stageAbcd(m, 10e6), c(50), c(50)))).toBeCloseTo(-6, 9);
    expect(m.spice).toBeUndefined();
  });
});

describe('sources', () => {
  it('ANT-2: short monopole radiation resistance 40π²(h/λ)² (derived from ANT-1 by image; ±0.1 %)', () => {
    const cLight = 299_792_458;
    expect(rel(shortMonopole(0.05, 1e-3).radiationResistance(cLight), 0.987)).toBeLessThan(1e-3); // h = 0.05 λ at λ = 1 m
    expect(rel(shortMonopole(1, 1e-3).radiationResistance(3e6), 0.03953)).toBeLessThan(1e-3);
    expect(rel(shortMonopole(2, 1e-3).radiationResistance(1e6), 0.01757)).toBeLessThan(1e-3);
  });

  it('short monopole capacitance agrees with the handbook form 17·l/(ln(24l/D) − 1) pF, feet and inches (from memory)', () => {
    const h = 2;
    const d = 3e-3;
    const lFt = h / 0.3048;
    const dIn = d / 0.0254;
    const handbook = (17 * lFt) / (Math.log((24 * lFt) / dIn) - 1);
    expect(rel(shortMonopole(h, d).capacitance * 1e12, handbook)).toBeLessThan(5e-3);
  });

  it('the whip stage: EMF = E·h/2 (peak from rms), Z = Rrad + Rloss − j/(ωC)', () => {
    const m = build(
      def('short-monopole'),
      { height: 1, diameter: 2e-3, lossR: 5, fieldRms: 1e-6 },
      1e6,
    );
    expect(m.emf?.(1e6)).toBeCloseTo(Math.SQRT2 * 0.5e-6, 15);
    const z = impedanceAt(m, 3e6);
    expect(z.re).toBeCloseTo(5 + 0.03953, 4);
    expect(z.im).toBeCloseTo(-1 / (2 * Math.PI * 3e6 * shortMonopole(1, 2e-3).capacitance), 6);
  });

  it('resistive generator: −100 dBm available from 50 Ω is an EMF of √(8·R·P) peak', () => {
    const m = build(def('resistive-generator'), { r: 50, level: 'power', powerDbm: -100 }, 1e6);
    expect(m.emf?.(1e6)).toBeCloseTo(Math.sqrt(8 * 50 * 1e-13), 15);
  });

  it('measured antenna: linear in f between points, ends held, clear errors for a bad table', () => {
    const d = def('measured-antenna');
    const m = build(d, { table: '2e6 30 -100; 1e6 10 -300' }, 1e6);
    expect(impedanceAt(m, 1.5e6)).toEqual({ re: 20, im: -200 });
    expect(impedanceAt(m, 5e6)).toEqual({ re: 30, im: -100 });
    expect(() => build(d, { table: '1e6 10' }, 1e6)).toThrow(
      /point 1 \("1e6 10"\) must be 3 numbers/,
    );
    expect(() => build(d, { table: ' ; ' }, 1e6)).toThrow(StageParameterError);
  });

  it('measured antenna from a one-port data file: S11 = 0.5 is 150 Ω, j0.5 is 30 + j40 Ω (TS-1)', () => {
    const m = def('measured-antenna').build(
      {},
      {
        f0Hz: 1e6,
        temperatureK: 290,
        dataFile: {
          ports: 1,
          points: [
            { f: 1e6, z0: 50, s11: { re: 0.5, im: 0 } },
            { f: 2e6, z0: 50, s11: { re: 0, im: 0.5 } },
          ],
        },
      },
    );
    expect(impedanceAt(m, 1e6).re).toBeCloseTo(150, 10);
    const twoPort = { ports: 2 as const, points: [{ f: 1e6, z0: 50, s11: c(0) }] };
    expect(() =>
      def('measured-antenna').build({}, { f0Hz: 1e6, temperatureK: 290, dataFile: twoPort }),
    ).toThrow(/one-port data file/);
    const z = impedanceAt(m, 2e6);
    expect(z.re).toBeCloseTo(30, 10);
    expect(z.im).toBeCloseTo(40, 10);
  });
});

describe('filters', () => {
  it('IF filter: stated insertion loss at centre, exactly −3 dB more at the band edges, floor far off', () => {
    const f0 = 10.7e6;
    const bw = 280e3;
    const m = build(
      def('if-filter'),
      {
        centreHz: f0,
        bandwidthHz: bw,
        insertionLossDb: 6,
        ultimateRejectionDb: 60,
        order: 4,
        z0: 330,
      },
      f0,
    );
    const g = (f: number) => db(transducerGain(stageAbcd(m, f), c(330), c(330)));
    expect(g(f0)).toBeCloseTo(-6, 9);
    // Geometric edges: f1·f2 = f0², f2 − f1 = B.
    const mid = Math.sqrt(f0 * f0 + (bw / 2) ** 2);
    expect(g(mid - bw / 2) - g(f0)).toBeCloseTo(-10 * Math.log10(2), 9);
    expect(g(mid + bw / 2) - g(f0)).toBeCloseTo(-10 * Math.log10(2), 9);
    expect(g(1e6)).toBeCloseTo(-66, 2);
    expect(g(1e9)).toBeCloseTo(-66, 2);
    expect(abs(zIn(stageAbcd(m, 11e6), c(330)))).toBeCloseTo(330, 9);
  });

  it('IF filter refuses a fractional order', () => {
    expect(() => build(def('if-filter'), { order: 2.5 }, 1e6)).toThrow(/whole number/);
  });

  it('measured two-port: the default table is a matched 6 dB pad; data files interpolate', () => {
    const m = build(def('measured-two-port'), {}, 1e7);
    const a = stageAbcd(m, 1e7);
    expect(db(transducerGain(a, c(50), c(50)))).toBeCloseTo(-6.0206, 4);
    expect(zIn(a, c(50)).re).toBeCloseTo(50, 9);
    const fn = measuredTwoPort({
      ports: 2,
      points: [
        { f: 1e6, z0: 50, s11: c(0), s21: c(1), s12: c(1), s22: c(0) },
        { f: 3e6, z0: 50, s11: c(0), s21: c(0.5), s12: c(0.5), s22: c(0) },
      ],
    });
    const s = new Float64Array(8);
    fn(2e6, s, 0);
    // S21 = 0.75 at the midpoint.
    expect(transducerGain(fromSlots(s), c(50), c(50))).toBeCloseTo(0.5625, 12);
    expect(() => build(def('measured-two-port'), { table: '1e6 0 0 0 0 0 0 0 0' }, 1e6)).toThrow(
      /S21 is 0/,
    );
  });

  it('S → ABCD inverts the textbook ABCD → S conversion, reciprocal or not (Pozar, Table 4.2; from memory)', () => {
    const z0 = 75;
    const cases = [
      { a: c(1), b: c(25), c: c(0), d: c(1) }, // series 25 Ω
      { a: c(0.2, 0.1), b: c(-3, 40), c: c(0.001, -0.02), d: c(1.5, -0.3) }, // arbitrary, non-reciprocal
    ];
    for (const m of cases) {
      const bz = div(m.b, c(z0));
      const cz = { re: m.c.re * z0, im: m.c.im * z0 };
      const delta = { re: m.a.re + bz.re + cz.re + m.d.re, im: m.a.im + bz.im + cz.im + m.d.im };
      const adbc = {
        re: m.a.re * m.d.re - m.a.im * m.d.im - (m.b.re * m.c.re - m.b.im * m.c.im),
        im: m.a.re * m.d.im + m.a.im * m.d.re - (m.b.re * m.c.im + m.b.im * m.c.re),
      };
      const s11 = div(
        { re: m.a.re + bz.re - cz.re - m.d.re, im: m.a.im + bz.im - cz.im - m.d.im },
        delta,
      );
      const s21 = div(c(2), delta);
      const s12 = div({ re: 2 * adbc.re, im: 2 * adbc.im }, delta);
      const s22 = div(
        { re: -m.a.re + bz.re - cz.re + m.d.re, im: -m.a.im + bz.im - cz.im + m.d.im },
        delta,
      );
      const s = Float64Array.from([s11.re, s11.im, s12.re, s12.im, s21.re, s21.im, s22.re, s22.im]);
      const out = new Float64Array(8);
      sToAbcdAt(s, 0, z0, z0, out, 0);
      const back = fromSlots(out);
      for (const k of ['a', 'b', 'c', 'd'] as const) {
        expect(back[k].re).toBeCloseTo(m[k].re, 9);
        expect(back[k].im).toBeCloseTo(m[k].im, 9);
      }
    }
  });

  it('shunt LC tank declares its resonator at node 1, resonating at 1/(2π√LC)', () => {
    const m = build(def('shunt-lc-tank'), { l: 1e-6, c: 253.3e-12, ql: 100, qc: 1000 }, 10e6);
    const r = m.resonators?.[0];
    expect(r).toMatchObject({ kind: 'shunt', node: 1 });
    if (r?.kind !== 'shunt') throw new Error('expected a shunt tank');
    const y = new Float64Array(2);
    const fr = 1 / (2 * Math.PI * Math.sqrt(1e-6 * 253.3e-12));
    r.ownAdmittance(fr * 0.99, y, 0);
    expect(y[1]).toBeLessThan(0);
    r.ownAdmittance(fr * 1.01, y, 0);
    expect(y[1]).toBeGreaterThan(0);
  });

  it('coupled bandpass declares both tanks, for both couplings', () => {
    for (const coupling of ['top-c', 'mutual']) {
      const m = build(def('coupled-bandpass'), { coupling }, 10e6);
      expect(m.sections).toHaveLength(3);
      expect(m.resonators?.map((r) => (r.kind === 'shunt' ? r.node : -1))).toEqual([1, 3]);
    }
  });

  it('series LC passes its resonance with only its loss resistance', () => {
    const m = build(def('series-lc'), { l: 1e-6, c: 253.3e-12, ql: 100, qc: 1e12 }, 10e6);
    const fr = 1 / (2 * Math.PI * Math.sqrt(1e-6 * 253.3e-12));
    const a = stageAbcd(m, fr);
    expect(a.b.re).toBeCloseTo((2 * Math.PI * fr * 1e-6) / 100, 9);
    expect(Math.abs(a.b.im)).toBeLessThan(1e-9);
  });
});

describe('loads', () => {
  it('envelope detector presents half its load resistance and its working level', () => {
    const m = build(def('envelope-detector'), { rLoad: 10e3, c: 0, minInputPeakV: 0.2 }, 1e6);
    expect(impedanceAt(m, 1e6)).toEqual({ re: 5000, im: -0 });
    expect(m.detector).toEqual({ minInputPeakV: 0.2 });
  });

  it('headphone is R + jωL; ADC input is R ∥ C', () => {
    expect(impedanceAt(build(def('headphone-low-z'), { r: 32, l: 1e-4 }, 1e3), 1e3).im).toBeCloseTo(
      2 * Math.PI * 0.1,
      12,
    );
    const z = impedanceAt(build(def('adc-input'), { r: 1000, c: 1e-9 }, 1e6), 1e6);
    const want = div(c(1), c(1e-3, 2 * Math.PI * 1e6 * 1e-9));
    expect(z.re).toBeCloseTo(want.re, 9);
    expect(z.im).toBeCloseTo(want.im, 9);
  });
});
