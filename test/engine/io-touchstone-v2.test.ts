/**
 * Touchstone Version 2.0 in full (IBIS Open Forum, 2009) and two-port noise parameters:
 * reader, writer, round trips, per-port references, and the noise figure a measured
 * amplifier gives at the source impedance it really sees.
 */
import { readTouchstone, TouchstoneError } from '../../shared/io/touchstone';
import { toMeasuredNetwork, type NetworkData } from '../../shared/io/network-data';
import { writeTouchstone } from '../../shared/io/touchstone-writer';
import { noiseParametersAt } from '../../shared/engine/stages/measured-two-port';
import { stageNoiseFactor } from '../../shared/engine/core/noise';
import { analyzeChain } from '../../shared/engine';
import { parseChainDocument } from '../../shared/schema/parse-chain';

/** S value k (row-major S11 S12 S21 S22) at point i of a two-port. */
const sAt = (file: { s: Float64Array }, i: number, k: number): [number, number] => [
  file.s[8 * i + 2 * k],
  file.s[8 * i + 2 * k + 1],
];

type C = [number, number];
const add = (a: C, b: C): C => [a[0] + b[0], a[1] + b[1]];
const mul = (a: C, b: C): C => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
const div = (a: C, b: C): C => {
  const d = b[0] * b[0] + b[1] * b[1];
  return [(a[0] * b[0] + a[1] * b[1]) / d, (a[1] * b[0] - a[0] * b[1]) / d];
};
const abs2 = (a: C) => a[0] * a[0] + a[1] * a[1];

/**
 * The two-port noise formula in reflection form (Pozar, "Microwave Engineering", 4th ed.,
 * §12.3 / §10.3 in earlier editions, "noise figure of a two-port"):
 * F = Fmin + 4·rn·|Γs − Γopt|² / ((1 − |Γs|²)·|1 + Γopt|²), rn = Rn/Z0.
 */
function pozarNoiseFactor(fminDb: number, rn: number, gOpt: C, gS: C): number {
  const diff: C = [gS[0] - gOpt[0], gS[1] - gOpt[1]];
  return 10 ** (fminDb / 10) + (4 * rn * abs2(diff)) / ((1 - abs2(gS)) * abs2(add([1, 0], gOpt)));
}

const V1_WITH_NOISE =
  '! amplifier, 1.x file with its noise block\n' +
  '# MHz S MA R 50\n' +
  '100 0.60 -60 8.0 110 0.05 40 0.50 -30\n' +
  '200 0.55 -90 6.5 90 0.06 35 0.45 -45\n' +
  '100 1.10 0.35 60 0.40\n' +
  '200 1.30 0.30 80 0.44\n';

const V2_WITH_NOISE =
  '! the same amplifier as a 2.0 file\n' +
  '[Version] 2.0\n' +
  '# MHz S MA R 50\n' +
  '[Number of Ports] 2\n' +
  '[Two-Port Data Order] 12_21\n' +
  '[Number of Frequencies] 2\n' +
  '[Number of Noise Frequencies] 2\n' +
  '[Reference] 50 50\n' +
  '[Network Data]\n' +
  '100 0.60 -60 0.05 40 8.0 110 0.50 -30\n' +
  '200 0.55 -90 0.06 35 6.5 90 0.45 -45\n' +
  '[Noise Data]\n' +
  '100 1.10 0.35 60 20\n' +
  '200 1.30 0.30 80 22\n' +
  '[End]\n';

describe('Touchstone 2.0 reader (Touchstone File Format Specification Version 2.0)', () => {
  it('reads the 1.x noise block (Rn/R) and the 2.0 [Noise Data] (Rn in ohms) as the same device', () => {
    // Version 2.0 gives Rn in ohms and 1.x normalised to R: its two noise examples describe one
    // device with Rn 0.38 / 0.40 (1.0 file) and 19 / 20 (2.0 file) at 50 ohm.
    const v1 = readTouchstone(V1_WITH_NOISE, 'amp.s2p');
    const v2 = readTouchstone(V2_WITH_NOISE, 'amp.ts');
    expect(v2.version).toBe('2.0');
    expect(v1.noise).toHaveLength(2);
    for (let i = 0; i < 2; i++) {
      expect(v2.noise[i].rnOhm).toBeCloseTo(v1.noise[i].rnOhm, 12);
      expect(v2.noise[i].nfMinDb).toBe(v1.noise[i].nfMinDb);
      expect(v2.noise[i].gammaOpt.re).toBeCloseTo(v1.noise[i].gammaOpt.re, 12);
    }
    expect(v1.noise[0].rnOhm).toBeCloseTo(20, 12);
    // 12_21 (N12 before N21) and the 1.x order give the same matrix.
    for (let k = 0; k < 8; k++) expect(v2.s[k]).toBeCloseTo(v1.s[k], 12);
    expect(sAt(v2, 0, 2)[0]).toBeCloseTo(8 * Math.cos((110 * Math.PI) / 180), 12); // S21
  });

  it('refuses a noise count that disagrees with [Number of Noise Frequencies], naming the keyword', () => {
    const text = V2_WITH_NOISE.replace(
      '[Number of Noise Frequencies] 2',
      '[Number of Noise Frequencies] 3',
    );
    expect(() => readTouchstone(text, 'amp.ts')).toThrow(/\[Number of Noise Frequencies\] says 3/);
  });

  it('refuses a noise line of the wrong length with its line number', () => {
    const text = V2_WITH_NOISE.replace('200 1.30 0.30 80 22', '200 1.30 0.30 80');
    expect(() => readTouchstone(text, 'amp.ts')).toThrow(
      /amp\.ts, line 14: 4 numbers on a noise line/,
    );
  });

  it('renormalises per-port references ([Reference] 50 25) to port 1, matching a series impedance', () => {
    // A series impedance Z between real references R1, R2 (power waves, Kurokawa 1965):
    // S11 = (Z + R2 − R1)/D, S22 = (Z + R1 − R2)/D, S21 = S12 = 2√(R1R2)/D, D = Z + R1 + R2.
    const z: C = [30, 40];
    const s = (r1: number, r2: number) => {
      const d = add(z, [r1 + r2, 0]);
      return {
        s11: div(add(z, [r2 - r1, 0]), d),
        s22: div(add(z, [r1 - r2, 0]), d),
        s21: div([2 * Math.sqrt(r1 * r2), 0], d),
      };
    };
    const given = s(50, 25);
    const ri = (c: C) => `${c[0]} ${c[1]}`;
    // [Reference] values on the lines after the keyword, as 2.0 allows.
    const text =
      '[Version] 2.0\n# Hz S RI R 50\n[Number of Ports] 2\n[Two-Port Data Order] 12_21\n' +
      '[Reference]\n 50 ! port 1\n 25 ! port 2\n[Network Data]\n' +
      `1e6 ${ri(given.s11)} ${ri(given.s21)} ${ri(given.s21)} ${ri(given.s22)}\n[End]\n`;
    const file = readTouchstone(text, 'series.ts');
    expect(file.z0).toBe(50);
    const want = s(50, 50);
    const check = (got: C, w: C) => {
      expect(got[0]).toBeCloseTo(w[0], 12);
      expect(got[1]).toBeCloseTo(w[1], 12);
    };
    check(sAt(file, 0, 0), want.s11);
    check(sAt(file, 0, 1), want.s21);
    check(sAt(file, 0, 2), want.s21);
    check(sAt(file, 0, 3), want.s22);
    // Γ = (Z − 50)/(Z + 50) for S11 at 50/50 with port 2 matched: Z + 50 seen, (Z+50−50)/(Z+100).
    check(sAt(file, 0, 0), div(z, add(z, [100, 0])));
  });

  it('reads a 1.1-style per-port option line "R 50 25" the same as [Reference] 50 25', () => {
    const line = '1e6 0.2 0.1 0.5 0.3 0.5 0.3 0.1 -0.2';
    const a = readTouchstone(`# Hz S RI R 50 25\n${line}\n`, 'a.s2p');
    const b = readTouchstone(
      `[Version] 2.0\n# Hz S RI R 50\n[Number of Ports] 2\n[Two-Port Data Order] 21_12\n[Reference] 50 25\n[Network Data]\n${line}\n[End]\n`,
      'b.ts',
    );
    for (let k = 0; k < 8; k++) expect(a.s[k]).toBeCloseTo(b.s[k], 14);
    expect(a.s[0]).not.toBeCloseTo(0.2, 3); // renormalised, not taken as is
  });

  it('refuses [Reference] before [Number of Ports] with the line to move', () => {
    const err = (() => {
      try {
        readTouchstone('[Version] 2.0\n# Hz S RI R 50\n[Reference] 50 50\n', 'x.ts');
      } catch (e) {
        return e as TouchstoneError;
      }
      throw new Error('expected a refusal');
    })();
    expect(err).toBeInstanceOf(TouchstoneError);
    expect(err.line).toBe(3);
    expect(err.message).toContain('after [Number of Ports]');
  });
});

describe('Touchstone writer: 2.0 and noise, round trips', () => {
  const data: NetworkData = {
    ports: 2,
    freqsHz: Float64Array.of(1e8, 2e8, 3e8),
    s: Float64Array.from({ length: 24 }, (_, i) => Math.sin(i + 1) * 0.7),
    z0: 50,
    noise: [
      { fHz: 0.5e8, nfMinDb: 0.9, gammaOpt: { re: 0.2, im: 0.3 }, rnOhm: 12 },
      { fHz: 2.5e8, nfMinDb: 1.4, gammaOpt: { re: -0.1, im: 0.25 }, rnOhm: 15 },
    ],
  };

  it.each([
    ['1.1', undefined],
    ['2.0', '12_21'],
    ['2.0', '21_12'],
  ] as const)('version %s (%s) writes and reads back the same S and noise', (version, order) => {
    const text = writeTouchstone(data, { version, twoPortOrder: order, unit: 'MHz' });
    if (version === '2.0') {
      expect(text).toContain(`[Two-Port Data Order] ${order}`);
      expect(text).toContain('[Noise Data]');
      expect(text.trimEnd().endsWith('[End]')).toBe(true);
    }
    const back = readTouchstone(text, version === '2.0' ? 'rt.ts' : 'rt.s2p');
    expect(back.version).toBe(version);
    for (let k = 0; k < data.s.length; k++) expect(back.s[k]).toBeCloseTo(data.s[k], 10);
    expect(back.noise).toHaveLength(2);
    back.noise.forEach((n, i) => {
      const want = data.noise![i];
      expect(n.fHz).toBeCloseTo(want.fHz, 3);
      expect(n.nfMinDb).toBeCloseTo(want.nfMinDb, 10);
      expect(n.gammaOpt.re).toBeCloseTo(want.gammaOpt.re, 10);
      expect(n.gammaOpt.im).toBeCloseTo(want.gammaOpt.im, 10);
      expect(n.rnOhm).toBeCloseTo(want.rnOhm, 10);
    });
  });

  it('12_21 puts S12 in the second column and 21_12 puts S21 there', () => {
    const second = (order: '12_21' | '21_12') => {
      const text = writeTouchstone(data, { version: '2.0', twoPortOrder: order });
      const line = text.split('\n')[text.split('\n').indexOf('[Network Data]') + 1];
      return Number(line.split(' ')[3]);
    };
    expect(second('12_21')).toBeCloseTo(data.s[2], 10); // S12 re
    expect(second('21_12')).toBeCloseTo(data.s[4], 10); // S21 re
  });

  it('refuses a 1.1 file whose noise starts above the last network frequency (no way to mark it)', () => {
    const high = { ...data, noise: [{ ...data.noise![0], fHz: 5e8 }] };
    expect(() => writeTouchstone(high)).toThrow(/write version 2\.0/);
    expect(() => writeTouchstone(high, { version: '2.0' })).not.toThrow();
  });
});

describe('measured amplifier noise at the source it really sees', () => {
  const file = readTouchstone(V2_WITH_NOISE, 'amp.ts');
  const measured = toMeasuredNetwork(file);

  it('carries the noise block into the engine form with its reference', () => {
    expect(measured.noise).toHaveLength(2);
    expect(measured.noise![1]).toMatchObject({ fHz: 200e6, rnOhm: 22, z0: 50 });
  });

  it.each([
    ['50 ohm', [50, 0]],
    ['the optimum', null],
    ['20 − j15 ohm', [20, -15]],
    ['200 + j80 ohm', [200, 80]],
  ] as const)('F at a source of %s equals Pozar’s reflection form', (_name, zs) => {
    const f = 150e6; // halfway: NFmin 1.2 dB, |Γopt| 0.325∠70° (re/im halfway), Rn 21 ohm
    const decl = noiseParametersAt(measured.noise!, f);
    expect(decl.kind).toBe('parameters');
    if (decl.kind !== 'parameters') return;
    expect(decl.fminDb).toBeCloseTo(1.2, 12);
    expect(decl.rn).toBeCloseTo(21, 12);
    const g1 = file.noise[0].gammaOpt;
    const g2 = file.noise[1].gammaOpt;
    const gOpt: C = [(g1.re + g2.re) / 2, (g1.im + g2.im) / 2];
    const z: C = zs
      ? [zs[0], zs[1]]
      : mul([50, 0], div(add([1, 0], gOpt), [1 - gOpt[0], -gOpt[1]]));
    const gS = div([z[0] - 50, z[1]], [z[0] + 50, z[1]]);
    const ys = div([1, 0], z);
    const got = stageNoiseFactor(decl, 10, ys[0], ys[1]);
    const want = pozarNoiseFactor(1.2, 21 / 50, gOpt, gS);
    expect(got).toBeCloseTo(want, 10);
    if (!zs)
      expect(got).toBeCloseTo(10 ** 0.12, 10); // Fmin at the optimum source
    else expect(got).toBeGreaterThan(10 ** 0.12);
  });

  it('gives a chain the amplifier noise figure at the source it really sees (75 + j25 ohm)', () => {
    // A 75 + j25 Ω generator straight into the file's amplifier at 150 MHz.
    const doc = parseChainDocument({
      name: 'noise at the real source',
      settings: {
        f0Hz: 150e6,
        sweep: { startHz: 100e6, stopHz: 200e6, points: 11, scale: 'lin' as const },
      },
      stages: [
        { id: 'src', type: 'resistive-generator', values: { r: 75 } },
        {
          id: 'x',
          type: 'lumped-element',
          values: {
            position: 'series',
            element: 'inductor',
            l: 25 / (2 * Math.PI * 150e6),
            ql: 1e12,
          },
        },
        { id: 'amp', type: 'measured-two-port', values: { noise: 'file' }, dataFileId: 'amp' },
        { id: 'load', type: 'rc-load', values: {} },
      ],
    });
    const result = analyzeChain(doc, { dataFiles: { amp: measured } });
    const stage = result.stages.find((s) => s.id === 'amp')!;
    const g1 = file.noise[0].gammaOpt;
    const g2 = file.noise[1].gammaOpt;
    const gOpt: C = [(g1.re + g2.re) / 2, (g1.im + g2.im) / 2];
    const gS = div([75 - 50, 25], [75 + 50, 25]);
    const want = 10 * Math.log10(pozarNoiseFactor(1.2, 21 / 50, gOpt, gS));
    expect(stage.noiseFigureDb).toBeCloseTo(want, 3);
    // Without the file's noise block the same stage is refused by name, not guessed.
    const bare = toMeasuredNetwork({ ...file, noise: [] });
    expect(() => analyzeChain(doc, { dataFiles: { amp: bare } })).toThrow(/no noise parameters/);
  });
});
