/**
 * Receiver planning figures against their closed forms: ITU-R P.372 outside noise, the
 * converter's noise and headroom, reciprocal mixing, off-channel intermodulation of a
 * two-stage chain worked by hand, and blocking.
 */
import { analyzeChain } from '../../shared/engine';
import {
  blockedGainDb,
  externalNoise,
  galacticNoiseFigureDb,
  manMadeNoiseFigureDb,
  noiseTemperatureOfFa,
  phaseNoiseAt,
  reciprocalMixingDbm,
} from '../../shared/engine/planning';
import type { ChainDocument } from '../../shared/schema/chain';
import { parseChainDocument } from '../../shared/schema/parse-chain';

const db10 = (x: number) => 10 * Math.log10(x);
const kT0dBmHz = db10(1.380649e-23 * 290 * 1e3); // −173.975 dBm/Hz (kT0 at 290 K, k exact in the 2019 SI)

describe('ITU-R P.372 outside noise', () => {
  // Rec. ITU-R P.372, Table 2 (median man-made noise, Fam = c − d·log10 f_MHz):
  // business 76.8/27.7, residential 72.5/27.7, rural 67.2/27.7, quiet rural 53.6/28.6;
  // galactic 52.0/23.0. At 1, 10 and 100 MHz the line reads c, c − d and c − 2d.
  const table = [
    ['business', 76.8, 27.7],
    ['residential', 72.5, 27.7],
    ['rural', 67.2, 27.7],
    ['quiet-rural', 53.6, 28.6],
  ] as const;
  it.each(table)('%s: Fam at 1, 10 and 100 MHz', (env, c, d) => {
    expect(manMadeNoiseFigureDb(env, 1e6)).toBeCloseTo(c, 9);
    expect(manMadeNoiseFigureDb(env, 10e6)).toBeCloseTo(c - d, 9);
    expect(manMadeNoiseFigureDb(env, 100e6)).toBeCloseTo(c - 2 * d, 9);
  });

  it('galactic noise and the Fa → Ta relation (P.372: Fa = 10·log10(Ta/T0))', () => {
    expect(galacticNoiseFigureDb(100e6)).toBeCloseTo(52 - 46, 9);
    expect(noiseTemperatureOfFa(0)).toBeCloseTo(290, 9);
    expect(noiseTemperatureOfFa(10)).toBeCloseTo(2900, 9);
  });

  it('adds the sources as powers and leaves galactic noise out below its range', () => {
    const at3 = externalNoise(3.5e6, { environment: 'residential', galactic: true, atmosphericFaDb: 40 }); // prettier-ignore
    expect(at3.galacticFaDb).toBeNull(); // below the ionosphere's cut-off
    const mm = 72.5 - 27.7 * Math.log10(3.5);
    expect(at3.antennaTempK).toBeCloseTo(290 * (10 ** (mm / 10) + 10 ** (40 / 10)), 6);
    expect(externalNoise(100e6, { environment: 'none', galactic: true, atmosphericFaDb: null }).galacticFaDb).toBeCloseTo(6, 9); // prettier-ignore
  });

  it('states how much of the noise the receiver itself adds', () => {
    const res = analyzeChain(flat50({ environment: 'residential' }, 3.5e6), { sweep: false, plan: true }); // prettier-ignore
    const ext = res.plan!.externalNoise;
    const nf = res.levels.noiseFigureDb;
    const te = 290 * (10 ** (nf / 10) - 1);
    const ta = 290 * 10 ** ((72.5 - 27.7 * Math.log10(3.5)) / 10);
    expect(ext.receiverTempK).toBeCloseTo(te, 6);
    expect(ext.externalAboveReceiverDb!).toBeCloseTo(db10(ta / te), 6);
    const worse = 290 * (10 * 10 ** (nf / 10) - 1);
    expect(ext.costOfTenDbWorseNfDb).toBeCloseTo(db10((ta + worse) / (ta + te)), 9);
    expect(ext.statement).toMatch(/^At 3\.5 MHz in a residential area the outside noise is \d+\.\d dB above what this receiver adds/); // prettier-ignore
    const quiet = analyzeChain(flat50({ environment: 'quiet-rural' }, 3.5e6), { sweep: false, plan: true }); // prettier-ignore
    expect(quiet.plan!.externalNoise.statement).toMatch(/quiet rural area/);
    expect(quiet.plan!.externalNoise.externalAboveReceiverDb!).toBeLessThan(ext.externalAboveReceiverDb!); // prettier-ignore
  });
});

/** 50 Ω generator → 50 Ω amplifier (20 dB, NF 3 dB) → ADC (50 Ω) at f0. */
function flat50(planning: Record<string, unknown>, f0 = 10e6, adc: Record<string, unknown> = {}): ChainDocument {
  return parseChainDocument({
    name: 'flat 50 ohm',
    settings: { f0Hz: f0, sweep: { startHz: f0 * 0.5, stopHz: f0 * 1.5, points: 11, scale: 'lin' }, channelBandwidthHz: 10e3, planning }, // prettier-ignore
    stages: [
      { id: 'src', type: 'resistive-generator', values: { r: 50, level: 'power', powerDbm: -100 } },
      { id: 'amp', type: 'unilateral-amplifier', values: { rin: 50, cin: 0, rout: 50, cout: 0, gainMode: 'stated', gainDb: 20, noiseMode: 'figure', nfDb: 3, iip3Dbm: 10, p1dbDbm: 0 } }, // prettier-ignore
      { id: 'adc', type: 'adc-input', values: { r: 50, c: 0, ...adc } },
    ],
  });
} // prettier-ignore

describe('the converter at the end', () => {
  it('refers its noise to the antenna: SNR = 6.02·ENOB + 1.76 dB with processing gain', () => {
    // Common practice (ideal quantiser, full-scale sine): SNR = 6.02·N + 1.76 dB over fs/2;
    // filtering to B adds 10·log10(fs/(2B)).
    const res = analyzeChain(flat50({}, 10e6, { fullScaleAs: 'dbm', fullScaleDbm: 4, noiseAs: 'enob', enob: 8, sampleRateHz: 80e6, processingBandwidthHz: 10e3 }), { sweep: false, plan: true }); // prettier-ignore
    const c = res.plan!.converter!;
    const snr = 6.02 * 8 + 1.76;
    const pg = db10(80e6 / (2 * 10e3));
    expect(c.noiseAtInputDbm).toBeCloseTo(4 - snr - pg, 9);
    // 50 Ω to 50 Ω to 50 Ω: the transducer gain to the converter is the amplifier's 20 dB.
    expect(c.noiseAtAntennaDbm).toBeCloseTo(4 - snr - pg - 20, 6);
    const frontEnd = kT0dBmHz + db10(10e3) + 3;
    expect(c.frontEndNoiseAtAntennaDbm).toBeCloseTo(frontEnd, 6);
    expect(c.converterSetsFloor).toBe(c.noiseAtAntennaDbm > frontEnd);
    expect(c.converterSetsFloor).toBe(true); // an 8-bit converter behind 20 dB is the floor
    expect(res.flags.some((f) => f.code === 'converter-floor' && f.stageId === 'adc')).toBe(true);
  });

  it('gives the headroom for the strongest signal and flags clipping', () => {
    const adc = { fullScaleAs: 'volts', fullScaleVpp: 1, noiseAs: 'snr', snrDb: 70, sampleRateHz: 100e6 }; // prettier-ignore
    const fsDbm = db10((1 / 2) ** 2 / (2 * 50) / 1e-3); // 1 Vpp sine into 50 Ω
    const ok = analyzeChain(flat50({ strongestSignalDbm: -40 }, 10e6, adc), { sweep: false, plan: true }); // prettier-ignore
    expect(ok.plan!.converter!.fullScaleDbm).toBeCloseTo(fsDbm, 9);
    expect(ok.plan!.converter!.headroomDb).toBeCloseTo(fsDbm - (-40 + 20), 6);
    expect(ok.flags.some((f) => f.code === 'converter-clips')).toBe(false);
    const hot = analyzeChain(flat50({ strongestSignalDbm: -10 }, 10e6, adc), { sweep: false, plan: true }); // prettier-ignore
    expect(hot.plan!.converter!.clips).toBe(true);
    expect(hot.flags.find((f) => f.code === 'converter-clips')!.severity).toBe('error');
  });
});

describe('reciprocal mixing', () => {
  it('interpolates the phase-noise profile piecewise log-linearly', () => {
    const profile = [
      { offsetHz: 1e3, dbcHz: -80 },
      { offsetHz: 100e3, dbcHz: -120 },
    ];
    expect(phaseNoiseAt(profile, 10e3)).toBeCloseTo(-100, 9);
    expect(phaseNoiseAt(profile, 500)).toBe(-80); // held flat beyond the ends
    expect(phaseNoiseAt([], 10e3)).toBeNull();
  });

  it('matches N = P_block + L(Δf) + 10·log10(B) with no selectivity ahead of the mixer', () => {
    // Reciprocal mixing (common practice): N_rm = P_block + L(Δf) + 10·log10(B).
    const doc: ChainDocument = parseChainDocument({
      name: 'mixer first',
      settings: {
        f0Hz: 10e6,
        sweep: { startHz: 9e6, stopHz: 11e6, points: 11, scale: 'lin' },
        channelBandwidthHz: 3e3,
        planning: { blockerOffsetHz: 20e3, blockerLevelDbm: -20, loPhaseNoise: [{ offsetHz: 1e3, dbcHz: -90 }, { offsetHz: 100e3, dbcHz: -130 }] }, // prettier-ignore
      },
      stages: [
        { id: 'src', type: 'resistive-generator', values: { r: 50 } },
        {
          id: 'mix',
          type: 'mixer',
          values: { conversionGainDb: 0, rin: 50, rout: 50, ifHz: 455e3 },
        },
        { id: 'load', type: 'rc-load', values: { r: 50, c: 0 } },
      ],
    });
    const rm = analyzeChain(doc, { sweep: false, plan: true }).plan!.reciprocalMixing!;
    const l = -90 + ((Math.log10(20e3) - 3) / 2) * -40;
    expect(rm.phaseNoiseDbcHz).toBeCloseTo(l, 9);
    expect(rm.noiseAtAntennaDbm).toBeCloseTo(-20 + l + db10(3e3), 6);
    expect(reciprocalMixingDbm(-20, l, 3e3)).toBeCloseTo(-20 + l + db10(3e3), 12);
  });
});

describe('off-channel intermodulation, worked by hand for two stages', () => {
  // 50 Ω generator → amplifier 1 (20 dB, IIP3 +5 dBm, 50 Ω in and out) → lossless series LC
  // resonant at f0 → amplifier 2 (10 dB, IIP3 −5 dBm, 50 Ω in and out) → 50 Ω load.
  const f0 = 10e6;
  const l = 2e-6;
  const c = 1 / ((2 * Math.PI * f0) ** 2 * l);
  const amp = (id: string, g: number, iip3: number) => ({ id, type: 'unilateral-amplifier', values: { rin: 50, cin: 0, rout: 50, cout: 0, gainMode: 'stated', gainDb: g, noiseMode: 'figure', nfDb: 3, iip3Dbm: iip3, p1dbDbm: iip3 - 10 } }); // prettier-ignore
  const doc = (spacingHz: number): ChainDocument =>
    parseChainDocument({
      name: 'two stages, series LC between',
      settings: { f0Hz: f0, sweep: { startHz: 9e6, stopHz: 11e6, points: 11, scale: 'lin' }, planning: { toneSpacingHz: spacingHz } }, // prettier-ignore
      stages: [
        { id: 'src', type: 'resistive-generator', values: { r: 50 } },
        amp('a1', 20, 5),
        { id: 'lc', type: 'series-lc', values: { l, ql: 1e9, c, qc: 1e9 } },
        amp('a2', 10, -5),
        { id: 'load', type: 'rc-load', values: { r: 50, c: 0 } },
      ],
    });
  // Power into amplifier 2 from amplifier 1's 50 Ω output through jX: |2·50/(100 + jX)|²·P_av.
  const toA2Db = (f: number) => {
    const w = 2 * Math.PI * f;
    const x = w * l - 1 / (w * c);
    return 20 + db10((100 * 100) / (100 * 100 + x * x));
  };
  const handIip3 = (spacing: number) => {
    // Products for 0 dBm tones at the antenna, referred to the antenna, added as amplitudes:
    // stage 1 sees the tones at 0 dBm: P_IM = −2·IIP3₁; stage 2: 2·P(f1) + P(f2) − 2·IIP3₂ − G(f0).
    const a1 = 10 ** ((-2 * 5) / 20);
    const a2 = 10 ** ((2 * toA2Db(f0 + spacing) + toA2Db(f0 + 2 * spacing) - 2 * -5 - toA2Db(f0)) / 20); // prettier-ignore
    // Two-tone relation for 0 dBm tones: IIP3 = (3·0 − P_IM)/2 with P_IM = 20·log10(a1 + a2).
    return -(20 * Math.log10(a1 + a2)) / 2;
  };

  it.each([10e3, 100e3, 1e6])('spacing %d Hz', (spacing) => {
    const res = analyzeChain(doc(spacing), { sweep: false, plan: true });
    expect(res.plan!.intermod.effectiveIip3Dbm!).toBeCloseTo(handIip3(spacing), 6);
  });

  it('reduces to the in-band cascade 1/IIP3 = 1/IIP3₁ + G₁/IIP3₂ for close tones', () => {
    // In band (no selectivity): 1/IIP3 = 1/3.162 mW + 100/0.3162 mW (the usual cascade formula, common practice).
    const inBand = -db10(1 / 10 ** (5 / 10) + 100 / 10 ** (-5 / 10));
    const res = analyzeChain(doc(1), { sweep: false, plan: true });
    expect(res.plan!.intermod.effectiveIip3Dbm!).toBeCloseTo(inBand, 4);
    expect(res.levels.iip3Dbm!).toBeCloseTo(inBand, 4);
  });

  it('rises as the tones move out of the series LC’s pass-band', () => {
    const by = analyzeChain(doc(10e3), { sweep: false, plan: true }).plan!.intermod.bySpacing;
    const iip3 = by.map((b) => b.iip3Dbm!);
    expect(iip3).toEqual([...iip3].sort((a, b) => a - b));
  });
});

describe('blocking', () => {
  it('finds the first stage that compresses and the gain the wanted signal loses', () => {
    const res = analyzeChain(flat50({ blockerOffsetHz: 1e6, blockerLevelDbm: -8 }), { sweep: false, plan: true }); // prettier-ignore
    const b = res.plan!.blocking;
    // Flat 50 Ω chain: the blocker reaches the amplifier at −8 dBm, below its P1dB (0 dBm) less
    // the 3 dB back-off, so it does not compress; its gain drops by the cubic model's
    // factor 1 − 2·Pb/P_IIP3.
    expect(b.stages[0].inputDbm).toBeCloseTo(-8, 6);
    expect(b.stages[0].headroomDb!).toBeCloseTo(0 - 3 - -8, 6);
    expect(b.firstCompressing).toBeNull();
    expect(b.stages[0].gainLossDb!).toBeCloseTo(-20 * Math.log10(1 - 2 * 10 ** ((-8 - 10) / 10)), 9); // prettier-ignore
    expect(blockedGainDb(-8, 10)).toBeCloseTo(-b.stages[0].gainLossDb!, 12);
    const hard = analyzeChain(flat50({ blockerOffsetHz: 1e6, blockerLevelDbm: 2 }), { sweep: false, plan: true }); // prettier-ignore
    expect(hard.plan!.blocking.firstCompressing).toBe('amp');
    expect(hard.flags.some((f) => f.code === 'blocking' && f.stageId === 'amp')).toBe(true);
  });
});
