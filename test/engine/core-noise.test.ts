/**
 * Noise and linearity cascades against published cases NF-2, NF-4 (+NF-4b), IP3-1, KT-1
 * and MDS-1 (each source named at its check), and the chain-level cascade with available gains at the real impedances.
 */
import { analyzeChain } from '../../shared/engine/analyze';
import { cascadeIip3, cascadeP1db } from '../../shared/engine/core/linearity';
import {
  BOLTZMANN,
  cascadeNoiseFigure,
  emfForAvailableDbm,
  noiseFloorDbm,
  sensitivityDbm,
  sfdrDb,
  stageNoiseFactor,
} from '../../shared/engine/core/noise';
import { chain, TEST_CATALOGUE } from './core-fixtures';

const near = (a: number, b: number, tol: number) => expect(Math.abs(a - b)).toBeLessThanOrEqual(tol); // prettier-ignore

describe('cascade formulas on published cases', () => {
  it('NF-2: gains [11, −3, 7] dB, NF [25, 3, 5] dB, IIP3 [19, ∞, 3] dBm', () => {
    // Source: MathWorks "rfchain.cumnoisefig" / "rfchain.cumiip3" documentation examples (NF-2)
    const nf = cascadeNoiseFigure([11, -3, 7], [25, 3, 5]);
    [25.0, 25.0011, 25.0058].forEach((v, k) => near(nf[k], v, 1e-4));
    const ip3 = cascadeIip3([11, -3, 7], [19, Infinity, 3]);
    [19.0, 19.0, -5.0173].forEach((v, k) => near(ip3[k], v, 1e-4));
    near(ip3[2] + 15, 9.983, 1e-3); // OIP3 = IIP3 + total gain
  });

  it('NF-4: two 15 dB amplifiers, NF 3 and 5 dB, OIP3 15 and 20 dBm', () => {
    // Source: Electronics-Lab forum thread "3rd order intercept point" (NF-4)
    near(cascadeNoiseFigure([15, 15], [3, 5])[1], 3.146, 1e-3);
    // IIP3 of each stage = OIP3 − G; cascade OIP3 = cascade IIP3 + 30 dB
    const iip3 = cascadeIip3([15, 15], [15 - 15, 20 - 15]);
    near(iip3[1] + 30, 19.586, 1e-3);
    near(iip3[1], -10.414, 1e-3);
  });

  it('NF-4b: NF 3 and 6 dB after 10 dB gain → F = 2.2934 (3.605 dB)', () => {
    // Source: 365electric.com amplifier noise article (NF-4b)
    const nf = cascadeNoiseFigure([10, 0], [3, 6])[1];
    near(Math.pow(10, nf / 10), 2.2934, 1e-4);
    near(nf, 3.605, 0.02);
  });

  it('IP3-1: LNA 20 dB / 0 dBm, filter −3 dB, mixer +15 dBm → −4.1 dBm', () => {
    // Source: RF Essentials knowledge base, required IP3 per stage (IP3-1)
    const ip3 = cascadeIip3([20, -3, -6], [0, null, 15]);
    near(ip3[2], -4.124, 0.05);
    near(ip3[2] + 11, 6.88, 0.05);
    expect(cascadeP1db([20, -3], [null, null])).toEqual([Infinity, Infinity]);
  });

  it('KT-1: kT at 290 K = −173.975 dBm/Hz; −143.975 dBm in 1 kHz', () => {
    // Source: "Minimum detectable signal" text (KT-1); k exact since the 2019 SI
    expect(BOLTZMANN).toBe(1.380649e-23);
    near(noiseFloorDbm(290, 1, 0), -173.975, 1e-3);
    near(10 * Math.log10(BOLTZMANN), -228.599, 1e-3);
    near(noiseFloorDbm(290, 1e3, 0), -144, 0.5);
    near(noiseFloorDbm(290, 1e3, 0), -143.975, 1e-3);
  });

  it('MDS-1: 100 MHz bandwidth, NF 1.5 dB, SNR 10 dB → floor −92.5, MDS −82.5 dBm', () => {
    // Source: Wikipedia "Minimum detectable signal" numerical example (MDS-1)
    const floor = noiseFloorDbm(290, 100e6, 1.5);
    near(floor, -92.475, 0.05);
    near(sensitivityDbm(floor, 10), -82.475, 0.05);
    near(sfdrDb(10, floor), (2 / 3) * (10 + 92.475), 0.05);
  });

  it('noise parameters: F = Fmin at Yopt and grows with |Ys − Yopt|²', () => {
    const decl = { kind: 'parameters' as const, fminDb: 1, rn: 20, yoptRe: 0.02, yoptIm: -0.01 };
    near(stageNoiseFactor(decl, 10, 0.02, -0.01), Math.pow(10, 0.1), 1e-12);
    // Ys = 0.01 S: F = Fmin + (20/0.01)·(0.01² + 0.01²)
    near(stageNoiseFactor(decl, 10, 0.01, 0), Math.pow(10, 0.1) + 0.4, 1e-12);
    // passive: F = 1/GA, never below 1
    expect(stageNoiseFactor({ kind: 'passive' }, 0.5, 0.02, 0)).toBe(2);
    expect(stageNoiseFactor(undefined, 3, 0.02, 0)).toBe(1);
  });

  it('−107 dBm available from 50 Ω is 1 µV rms across a matched load, a 2 µV rms EMF (common practice)', () => {
    near(emfForAvailableDbm(-107, 50) / Math.SQRT2, 2e-6, 0.01e-6);
    // P = Es²/(8·Rs) for a PEAK EMF: 1 mW behind 50 Ω needs 0.6325 V peak
    near(emfForAvailableDbm(0, 50), Math.sqrt(0.4), 1e-12);
  });
});

describe('noise and linearity through a built chain', () => {
  // 50 Ω source → 50 Ω series pad → amplifier (rin 100 Ω) → 50 Ω load
  const doc = chain(
    [
      { type: 't-source', values: { rs: 50, emf: 2e-3 } },
      { type: 't-series', label: 'Pad', values: { r: 50 } },
      { type: 't-amp', label: 'Amp', values: { rin: 100, rout: 50, gm: 0.2, nf: 2, iip3: 5, p1db: -5 } }, // prettier-ignore
      { type: 't-load', values: { r: 50 } },
    ],
    { f0Hz: 1e6, channelBandwidthHz: 3e3, requiredSnrDb: 10 },
  );
  const res = analyzeChain(doc, { catalogue: TEST_CATALOGUE, sweep: false });

  it('a resistive pad has F = 1/GA with GA at the impedances it sees', () => {
    // Pav at the pad output: Thevenin 1·100/(150+100)… behind (50+50)∥100; computed by hand:
    // source side of node 1 is 100 Ω with Vth = Es, so GA = (Es²/800)/(Es²/400) = 0.5
    near(res.stages[0].availableGainDb, -3.0103, 1e-4);
    near(res.stages[0].noiseFigureDb, 3.0103, 1e-4);
  });

  it('the chain NF and IIP3 agree with the plain-array cascades of the same stage gains', () => {
    const g = res.stages.map((s) => s.availableGainDb);
    const nf = res.stages.map((s) => s.noiseFigureDb);
    near(res.stages[1].noiseFigureDb, 2, 1e-12);
    const cum = cascadeNoiseFigure(g, nf);
    near(res.stages[1].cumulativeNoiseFigureDb, cum[1], 1e-9);
    near(res.levels.noiseFigureDb, cum[1], 1e-9);
    const ip3 = cascadeIip3(g, [null, 5]);
    near(res.stages[1].cumulativeIip3Dbm as number, ip3[1], 1e-9);
    near(res.stages[1].cumulativeIip3Dbm as number, 5 + 3.0103, 1e-4); // pad loss adds to IIP3
    expect(res.stages[0].cumulativeIip3Dbm).toBeNull(); // nothing limits yet
  });

  it('levels: floor, sensitivity, SFDR and the input available power', () => {
    const floor = 10 * Math.log10((BOLTZMANN * 290 * 3e3) / 1e-3) + res.levels.noiseFigureDb;
    near(res.levels.noiseFloorDbm, floor, 1e-9);
    near(res.levels.sensitivityDbm, floor + 10, 1e-9);
    near(res.levels.sfdrDb as number, (2 / 3) * ((res.levels.iip3Dbm as number) - floor), 1e-9);
    // (2 mV peak)²/(8·50 Ω) = 1e-8 W = −50 dBm
    near(res.levels.inputAvailableDbm, -50, 1e-9);
    near(res.stages[1].inputLevelDbm, -53.0103, 1e-4);
    near(res.levels.sensitivityEmfRms, emfForAvailableDbm(floor + 10, 50) / Math.SQRT2, 1e-15);
  });

  it('a load with its own noise figure ends the cascade', () => {
    const base = [{ type: 't-source' }, { type: 't-amp', values: { rin: 50, rout: 50, gm: 0.2, nf: 2 } }]; // prettier-ignore
    const quiet = analyzeChain(chain([...base, { type: 't-detector-load', values: { nf: 0 } }], { f0Hz: 1e6 }), { catalogue: TEST_CATALOGUE, sweep: false }); // prettier-ignore
    const noisy = analyzeChain(chain([...base, { type: 't-detector-load', values: { nf: 20 } }], { f0Hz: 1e6 }), { catalogue: TEST_CATALOGUE, sweep: false }); // prettier-ignore
    near(quiet.levels.noiseFigureDb, 2, 1e-9);
    const g = noisy.levels.totalGainDb;
    near(noisy.levels.noiseFigureDb, cascadeNoiseFigure([g, 0], [2, 20])[1], 1e-9);
    near(noisy.levels.correlationNoiseFigureDb as number, noisy.levels.noiseFigureDb, 1e-9);
  });
});
