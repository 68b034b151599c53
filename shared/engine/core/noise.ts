/**
 * Noise: the Friis cascade with each stage's available gain at the impedances it actually
 * sees, each stage's own noise factor, and the kT·B levels.
 */
import type { NoiseDecl } from '../types';

/** Boltzmann constant, J/K (exact since the 2019 SI redefinition). */
export const BOLTZMANN = 1.380649e-23;
/** IEEE standard noise reference temperature T0, K. */
export const T0_KELVIN = 290;

const fromDb = (db: number) => Math.pow(10, db / 10);
const toDb = (ratio: number) => 10 * Math.log10(ratio);

/**
 * Cumulative noise factors (linear) by the Friis formula
 * F = F1 + (F2 − 1)/G1 + (F3 − 1)/(G1·G2) + … for linear gains and noise factors.
 * Entry k is the noise factor of stages 0…k together.
 */
export function friis(gains: readonly number[], factors: readonly number[]): number[] {
  if (gains.length !== factors.length) {
    throw new RangeError(`friis: ${gains.length} gains but ${factors.length} noise factors; give one of each per stage`); // prettier-ignore
  }
  const out: number[] = [];
  let f = 1;
  let g = 1;
  for (let k = 0; k < gains.length; k++) {
    f += (factors[k] - 1) / g;
    g *= gains[k];
    out.push(f);
  }
  return out;
}

/**
 * Cumulative noise figure, dB, of a cascade given each stage's gain (dB) and noise figure
 * (dB), in order. Entry k covers stages 0…k.
 */
export function cascadeNoiseFigure(gainsDb: readonly number[], nfsDb: readonly number[]): number[] {
  return friis(gainsDb.map(fromDb), nfsDb.map(fromDb)).map(toDb);
}

/**
 * Noise factor of a two-port at the source admittance it sees.
 * - passive at the reference temperature: F = 1/GA (never below 1);
 * - a stated figure: F = 10^(NF/10);
 * - noise parameters: F = Fmin + (Rn/Gs)·|Ys − Yopt|².
 * @param availableGain the stage's available gain (linear) at the impedances it sees
 * @param ysRe, ysIm the source admittance at the stage's input, siemens
 */
export function stageNoiseFactor(
  decl: NoiseDecl | undefined,
  availableGain: number,
  ysRe: number,
  ysIm: number,
): number {
  if (!decl || decl.kind === 'passive') {
    return availableGain > 0 && availableGain < 1 ? 1 / availableGain : 1;
  }
  if (decl.kind === 'figure') return fromDb(decl.nfDb);
  const fmin = fromDb(decl.fminDb);
  if (!(ysRe > 0)) return Infinity; // a lossless source gives no defined noise figure
  const dr = ysRe - decl.yoptRe;
  const di = ysIm - decl.yoptIm;
  return fmin + (decl.rn / ysRe) * (dr * dr + di * di);
}

/**
 * Effective input noise temperature of a noise factor F: Te = T0·(F − 1), K (IEEE Std
 * 161-1975 definition of noise temperature; the relation is the standard one, e.g. Pozar,
 * "Microwave Engineering", §10.2).
 */
export function noiseTemperature(factor: number, t0 = T0_KELVIN): number {
  return t0 * (factor - 1);
}

/** Noise factor of an effective input noise temperature: F = 1 + Te/T0. */
export function factorOfTemperature(teK: number, t0 = T0_KELVIN): number {
  return 1 + teK / t0;
}

/**
 * VSWR between the rated source impedance Zr = R + jX and the source impedance Zs a stage
 * really sees: |Γ| = |Zs − Zr| / |Zs + Zr*| (zero when they are equal; the power-wave form,
 * K. Kurokawa, IEEE Trans. MTT 1965), VSWR = (1 + |Γ|)/(1 − |Γ|). For a real Zr this is
 * the ordinary |Zs − R|/|Zs + R|. Infinity for a lossless source.
 */
export function sourceVswr(ratedOhm: number, zsRe: number, zsIm: number, ratedX = 0): number {
  if (!Number.isFinite(zsRe) || !Number.isFinite(zsIm)) return Infinity;
  const g = Math.hypot(zsRe - ratedOhm, zsIm - ratedX) / Math.hypot(zsRe + ratedOhm, zsIm - ratedX);
  return g >= 1 ? Infinity : (1 + g) / (1 - g);
}

/** Thermal noise power kT·B, W. */
export function thermalNoiseW(temperatureK: number, bandwidthHz: number): number {
  return BOLTZMANN * temperatureK * bandwidthHz;
}

/** Noise floor referred to the input, dBm: 10·log10(kTB / 1 mW) + NF. */
export function noiseFloorDbm(temperatureK: number, bandwidthHz: number, nfDb: number): number {
  return toDb(thermalNoiseW(temperatureK, bandwidthHz) / 1e-3) + nfDb;
}

/** Sensitivity (minimum detectable signal) for a required SNR: floor + SNR, dBm. */
export function sensitivityDbm(floorDbm: number, requiredSnrDb: number): number {
  return floorDbm + requiredSnrDb;
}

/** Spurious-free dynamic range 2/3·(IIP3 − noise floor), dB. */
export function sfdrDb(iip3Dbm: number, floorDbm: number): number {
  return (2 / 3) * (iip3Dbm - floorDbm);
}

/**
 * EMF (PEAK volts) of a source of resistance rs that makes `dbm` available:
 * P = Es²/(8·Rs) for a peak EMF.
 */
export function emfForAvailableDbm(dbmValue: number, rs: number): number {
  return Math.sqrt(8 * rs * 1e-3 * Math.pow(10, dbmValue / 10));
}
