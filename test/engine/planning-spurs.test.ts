/**
 * Mixer spurious responses: where they fall (the frequency arithmetic, checked against an
 * independent brute-force search of the products) and how the chain rejects them.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { analyzeChain } from '../../shared/engine';
import {
  DEFAULT_MIXER_SUPPRESSION_DB,
  spurFrequencies,
  suppressionDb,
} from '../../shared/engine/planning';
import type { ChainDocument } from '../../shared/schema/chain';
import { parseChainDocument } from '../../shared/schema/parse-chain';

describe('spurFrequencies: the AM broadcast superhet (1000 kHz, IF 455 kHz, LO high)', () => {
  const f = 1000e3;
  const ifHz = 455e3;
  const lo = f + ifHz;
  const list = spurFrequencies(f, lo, ifHz, 10e3, 5);
  const at = (kind: string) => list.filter((s) => s.kind === kind).map((s) => s.rfHz);

  it('puts the image at 1910 kHz', () => {
    // Published: image at f + 2·fIF = 1910 kHz for 1000 kHz and a 455 kHz IF (a textbook
    // exercise on image rejection in an AM superhet, worked in FOSSEE's Python companion to
    // "Analog and Digital Communication", chapter 4).
    expect(at('image')).toEqual([expect.closeTo(1910e3, 3)]);
  });

  it('puts the half-IF response half an IF above the signal, at 1227.5 kHz', () => {
    // Common practice (high-side LO): 2·fLO − 2·fRF = fIF gives fRF = f + fIF/2.
    expect(at('half-if')).toEqual([expect.closeTo(1227.5e3, 3)]);
  });

  it('lists the IF feed-through at the IF and the wanted response once', () => {
    expect(at('if-feedthrough')).toEqual([expect.closeTo(455e3, 3)]);
    expect(at('wanted')).toEqual([expect.closeTo(1000e3, 3)]);
  });

  it('finds exactly the products an independent brute-force search finds', () => {
    // Independent check: for each (m, n) with m + n ≤ 5, scan input frequencies on a 500 Hz
    // grid from 1 kHz to 5 MHz for |m·fLO ± n·fRF| within half a grid step (n·250 Hz) of the IF.
    const brute: { m: number; n: number; rf: number }[] = [];
    for (let m = 0; m <= 5; m++) {
      for (let n = 1; m + n <= 5; n++) {
        for (let rf = 1e3; rf <= 5e6; rf += 500) {
          const products = [Math.abs(m * lo - n * rf), m * lo + n * rf];
          if (products.some((p) => Math.abs(p - ifHz) <= n * 250)) brute.push({ m, n, rf });
        }
      }
    }
    const listed = list.filter((s) => s.rfHz !== null && s.rfHz <= 5e6);
    const near = (
      a: { m: number; n: number },
      b: { m: number; n: number },
      fa: number,
      fb: number,
    ) => a.m === b.m && a.n === b.n && Math.abs(fa - fb) <= 500;
    // Every grid hit lies next to a listed response, and every listed response has a hit.
    for (const b of brute) expect(listed.some((s) => near(s, b, s.rfHz!, b.rf))).toBe(true);
    for (const s of listed) expect(brute.some((b) => near(s, b, s.rfHz!, b.rf))).toBe(true);
    expect(listed.length).toBeGreaterThan(20);
  });

  it('reports an LO harmonic only when it lands in the IF passband', () => {
    // LO 910 kHz with a 455 kHz IF: no harmonic of 910 kHz is 455 kHz; LO 227.5 kHz: 2·LO is.
    expect(spurFrequencies(1000e3, 910e3, 455e3, 10e3, 5).some((s) => s.kind === 'lo-harmonic')).toBe(false); // prettier-ignore
    const birdie = spurFrequencies(1000e3, 227.5e3, 455e3, 10e3, 5).filter((s) => s.kind === 'lo-harmonic'); // prettier-ignore
    expect(birdie.map((s) => [s.m, s.n])).toEqual([[2, 0]]);
  });
});

describe('suppression table', () => {
  it('gives the wanted product 0 dB and extends beyond the table by 10 dB an order', () => {
    expect(suppressionDb(DEFAULT_MIXER_SUPPRESSION_DB, 1, 1)).toBe(0);
    expect(suppressionDb(DEFAULT_MIXER_SUPPRESSION_DB, 3, 1)).toBe(15);
    expect(suppressionDb(DEFAULT_MIXER_SUPPRESSION_DB, 7, 1)).toBe(25 + 20);
  });
});

/** A 50 Ω generator, a lossless series LC preselector, a mixer (50 Ω in) and a 50 Ω load. */
function superhet(planning?: Record<string, unknown>): ChainDocument {
  const f0 = 1000e3;
  const l = 100e-6;
  const c = 1 / ((2 * Math.PI * f0) ** 2 * l);
  return parseChainDocument({
    name: 'series-LC preselector superhet',
    settings: {
      f0Hz: f0,
      sweep: { startHz: 500e3, stopHz: 1600e3, points: 401, scale: 'lin' },
      channelBandwidthHz: 10e3,
      ...(planning ? { planning } : {}),
    },
    stages: [
      { id: 'src', type: 'resistive-generator', values: { r: 50, level: 'power', powerDbm: -60 } },
      { id: 'pre', type: 'series-lc', values: { l, ql: 1e9, c, qc: 1e9 } },
      { id: 'mix', type: 'mixer', values: { conversionGainDb: 0, rin: 50, rout: 50, ifHz: 455e3, side: 'high' } }, // prettier-ignore
      { id: 'load', type: 'rc-load', values: { r: 50, c: 0 } },
    ],
  });
}

describe('spur responses through the chain', () => {
  it('rejects the image by the series LC preselector’s closed-form attenuation', () => {
    const res = analyzeChain(superhet(), { sweep: false, plan: true });
    const image = res.plan!.spurs.find((s) => s.kind === 'image')!;
    // Closed form: 50 Ω source, series jX, 50 Ω mixer input: |V| ∝ 50/|100 + jX| against 50/100
    // at resonance, so the selectivity is 20·log10(|100 + jX(f)|/100).
    const l = 100e-6;
    const c = 1 / ((2 * Math.PI * 1000e3) ** 2 * l);
    const w = 2 * Math.PI * 1910e3;
    const x = w * l - 1 / (w * c);
    const expected = 20 * Math.log10(Math.hypot(100, x) / 100);
    expect(image.rfHz).toBeCloseTo(1910e3, 3);
    expect(image.selectivityDb).toBeCloseTo(expected, 6);
    expect(image.rejectionDb).toBeCloseTo(expected, 6); // the mixer cannot suppress its image
  });

  it('adds the mixer suppression and sorts the weakest rejection first', () => {
    const res = analyzeChain(superhet(), { sweep: false, plan: true });
    const spurs = res.plan!.spurs;
    for (const s of spurs) {
      expect(s.rejectionDb).toBeCloseTo((s.selectivityDb ?? NaN) + s.suppressionDb, 9);
    }
    const rej = spurs.map((s) => s.rejectionDb ?? Infinity);
    expect(rej).toEqual([...rej].sort((a, b) => a - b));
  });

  it('flags a response below a stated target, and not without planning settings', () => {
    const quiet = analyzeChain(superhet(), { sweep: false, plan: true });
    expect(quiet.flags.some((f) => f.code === 'spur-response')).toBe(false);
    const stated = analyzeChain(superhet({ spurTargetDb: 80 }), { sweep: false, plan: true });
    const flag = stated.flags.find((f) => f.code === 'spur-response')!;
    expect(flag.stageId).toBe('mix');
    expect(flag.message).toMatch(/under the 80 dB target/);
  });

  it('draws the spur chart across the tuning range only for the full plan', () => {
    const doc = superhet({ tuningStartHz: 530e3, tuningStopHz: 1600e3 });
    expect(analyzeChain(doc, { sweep: false, plan: true }).plan!.spurChart).toBeNull();
    const chart = analyzeChain(doc, { sweep: false, plan: 'full' }).plan!.spurChart!;
    expect(chart.dialHz[0]).toBe(530e3);
    expect(chart.dialHz.at(-1)).toBe(1600e3);
    const image = chart.lines.find((l) => l.kind === 'image')!;
    // LO above the dial: the image follows the dial at f + 2·fIF.
    chart.dialHz.forEach((f, k) => expect(image.rfHz[k]).toBeCloseTo(f + 910e3, 3));
  });

  it('ranks higher IFs first for a single-tuned preselector (image further away)', () => {
    const doc = superhet({ tuningStartHz: 530e3, tuningStopHz: 1600e3, ifCandidatesHz: [455e3, 10.7e6] }); // prettier-ignore
    const choice = analyzeChain(doc, { sweep: false, plan: 'full' }).plan!.ifChoice;
    expect(choice.map((c) => c.ifHz)).toEqual([10.7e6, 455e3]);
    expect(choice[0].worstRejectionDb!).toBeGreaterThan(choice[1].worstRejectionDb!);
  });
});

describe('spur chart tuned by the chain’s marked gang', () => {
  // The shortwave example's preselector (2.2 µH) with its capacitor marked variable from
  // 120 pF to 300 pF: Thomson's formula puts that at about 6.2 … 9.8 MHz.
  const base = parseChainDocument(
    JSON.parse(
      readFileSync(
        join(__dirname, '../../examples/shortwave-superhet-single-tank.chain.json'),
        'utf8',
      ),
    ),
  );
  const gang = { stageId: 'preselector', key: 'c', min: 120e-12, max: 300e-12 };
  const marked = { ...base, settings: { ...base.settings, variables: [gang] } };
  const MIXER_NODE = 4; // the mixer's input: after link-in, preselector, link-out and RF amplifier
  const chart = analyzeChain(marked, { sweep: false, plan: 'full' }).plan!.spurChart!;

  it('says on the chart that the gang tuned it, and covers the gang’s travel', () => {
    expect(chart.tuning).toBe('gang');
    expect(chart.note).toMatch(/tuned by the chain's gang \(preselector\.c 120 pF…300 pF\)/);
    expect(chart.dialHz).toHaveLength(21);
    const thomson = (c: number) => 1 / (2 * Math.PI * Math.sqrt(2.2e-6 * c));
    expect(chart.dialHz[0] / thomson(300e-12)).toBeCloseTo(1, 2);
    expect(chart.dialHz[20] / thomson(120e-12)).toBeCloseTo(1, 2);
    const plain = analyzeChain(base, { sweep: false, plan: 'full' }).plan!.spurChart!;
    expect(plain.tuning).toBe('constant-q');
    expect(plain.note).toMatch(/constant Q/);
  });

  it('judges each position through the chain as tuned there (image rejection re-analysed)', () => {
    const image = chart.lines.find((l) => l.kind === 'image')!;
    const sup = suppressionDb(DEFAULT_MIXER_SUPPRESSION_DB, image.m, image.n);
    for (const k of [0, 7, 14, 20]) {
      // Position k (ascending frequency) is the gang at dial 1 − k/20 (largest C first).
      const c = gang.min + (1 - k / 20) * (gang.max - gang.min);
      const f = chart.dialHz[k];
      const doc = {
        ...base,
        settings: { ...base.settings, f0Hz: f, sweep: { startHz: f / 1.5, stopHz: f * 1.5, points: 801, scale: 'log' as const } }, // prettier-ignore
        stages: base.stages.map((s) => (s.id === 'preselector' ? { ...s, values: { ...s.values, c } } : s)), // prettier-ignore
      };
      const sel = analyzeChain(doc, { sweep: false }).selectivity[MIXER_NODE];
      // The analysis's own peak search agrees with the chart's dial frequency…
      expect(Math.abs(sel.peakHz! / f - 1)).toBeLessThan(1e-6);
      // …and its image rejection at the mixer input is the chart's, less the suppression.
      expect(image.rejectionDb[k]! - sup).toBeCloseTo(sel.imageRejectionDb!, 2);
    }
  });
});
