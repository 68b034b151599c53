/**
 * Cumulative selectivity at each user-level node from the step-up |V[n]|/|Es| over the
 * sweep: peak, −3 dB and −60 dB bandwidths, shape factor, attenuation at stated offsets and
 * at the image frequency of a chain with a mixer.
 */
import type { SelectivityReport } from '../types';
import type { BuiltChain } from './build';
import { runNodeAnalysis, type NodeAnalysis } from './nodes';
import { stepUp } from './quantities';

// Globals read once: a global lookup inside a hot loop is slow in some hosts (test VMs).
const { abs, log10 } = Math;
const isFiniteNumber = Number.isFinite;

/** The first frequency-translating section of a chain and its local oscillator. */
export interface MixerInfo {
  /** Flat index of the mixer section. */
  section: number;
  stageId: string;
  loHz: number;
  /** 'difference': output |f − fLO|; 'sum': output f + fLO. */
  product: 'difference' | 'sum';
  /** Frequency at the mixer's input when the chain input is at f0. */
  fInHz: number;
  /** Intermediate frequency at f0. */
  ifHz: number;
}

/**
 * Finds the first mixer. Its LO frequency comes from the model's `mixer` declaration when
 * given; otherwise it is derived from `translate`: with output fIF at input f, a rising
 * output (slope +1) below f means fLO = f − fIF, a falling one (slope −1) fLO = f + fIF, and a
 * rising output above f is a sum product with fLO = fIF − f.
 */
export function findMixer(built: BuiltChain): MixerInfo | null {
  for (let j = 0; j < built.sections.length; j++) {
    const tr = built.sections[j].translate;
    if (!tr) continue;
    const stage = built.twoPorts[built.sectionStage[j]];
    const fIn = built.f0AtFlatNode[j];
    const fIf = tr(fIn);
    const declared = stage.model.mixer;
    if (declared) {
      return { section: j, stageId: stage.id, loHz: declared.loHz, product: declared.product, fInHz: fIn, ifHz: fIf }; // prettier-ignore
    }
    const h = fIn * 1e-6;
    const slope = (tr(fIn + h) - tr(fIn - h)) / (2 * h);
    if (slope > 0 && fIf < fIn) {
      return { section: j, stageId: stage.id, loHz: fIn - fIf, product: 'difference', fInHz: fIn, ifHz: fIf }; // prettier-ignore
    }
    if (slope < 0) {
      return { section: j, stageId: stage.id, loHz: fIn + fIf, product: 'difference', fInHz: fIn, ifHz: fIf }; // prettier-ignore
    }
    return { section: j, stageId: stage.id, loHz: fIf - fIn, product: 'sum', fInHz: fIn, ifHz: fIf }; // prettier-ignore
  }
  return null;
}

/**
 * Image frequency at the chain's input: the other input frequency the first mixer turns
 * into the same IF, 2·fLO − f (both for LO above and below the signal). Null for a sum
 * product, for a mixer behind another frequency change, or when the image would be ≤ 0 Hz.
 */
export function imageFrequency(built: BuiltChain, mixer: MixerInfo | null): number | null {
  if (!mixer || mixer.product !== 'difference') return null;
  if (mixer.fInHz !== built.settings.f0Hz) return null;
  const img = 2 * mixer.loHz - mixer.fInHz;
  return img > 0 && abs(img - mixer.fInHz) > 1e-9 * mixer.fInHz ? img : null;
}

/** Frequency where the dB curve crosses `level` between points k and k+1 (linear in dB). */
function crossAt(f: ArrayLike<number>, db: Float64Array, k: number, level: number): number {
  const a = db[k];
  const b = db[k + 1];
  return a === b ? f[k] : f[k] + ((f[k + 1] - f[k]) * (level - a)) / (b - a);
}

/** Band edges at `drop` dB below the peak around index p, or null when the curve stays above. */
function edgesAt(
  f: ArrayLike<number>,
  db: Float64Array,
  p: number,
  peakDb: number,
  drop: number,
): [number, number] | null {
  const level = peakDb - drop;
  let lo: number | null = null;
  for (let k = p; k > 0; k--) {
    if (db[k - 1] < level) {
      lo = crossAt(f, db, k - 1, level);
      break;
    }
  }
  let hi: number | null = null;
  for (let k = p; k + 1 < db.length; k++) {
    if (db[k + 1] < level) {
      hi = crossAt(f, db, k, level);
      break;
    }
  }
  return lo !== null && hi !== null ? [lo, hi] : null;
}

/** Peak index with a parabolic refinement of its dB level and frequency (3-point fit). */
function peakOf(
  f: ArrayLike<number>,
  db: Float64Array,
): { k: number; fHz: number; db: number } | null {
  let k = -1;
  for (let i = 0; i < db.length; i++) if (isFiniteNumber(db[i]) && (k < 0 || db[i] > db[k])) k = i;
  if (k < 0) return null;
  if (k === 0 || k === db.length - 1) return { k, fHz: f[k], db: db[k] };
  const a = db[k - 1];
  const b = db[k];
  const c = db[k + 1];
  const den = a - 2 * b + c;
  if (!(den < 0)) return { k, fHz: f[k], db: b };
  const x = (0.5 * (a - c)) / den; // in (−½, ½) of a step
  const fHz = x >= 0 ? f[k] + x * (f[k + 1] - f[k]) : f[k] + x * (f[k] - f[k - 1]);
  return { k, fHz, db: b - 0.25 * (a - c) * x };
}

const toDb = (r: number) => 20 * log10(r);
/** The "−3 dB" points are the half-power points, 10·log10(2) = 3.0103 dB down (common practice). */
const HALF_POWER_DB = 10 * log10(2);

/**
 * Selectivity report of every user-level node.
 * @param sweepNa node analysis over the sweep grid
 * @param imageHz image frequency at the input (null without a mixer)
 */
export function analyzeSelectivity(
  built: BuiltChain,
  sweepNa: NodeAnalysis,
  imageHz: number | null,
): SelectivityReport[] {
  const { f0Hz, offsetsHz } = built.settings;
  // Exact points: f0, each offset below and above, and the image.
  const exact: number[] = [f0Hz];
  for (const off of offsetsHz) exact.push(f0Hz - off > 0 ? f0Hz - off : f0Hz, f0Hz + off);
  if (imageHz !== null) exact.push(imageHz);
  const ex = runNodeAnalysis(built, exact);
  const P = sweepNa.points;
  const db = new Float64Array(P);
  const reports: SelectivityReport[] = [];
  for (let n = 0; n < built.userNodeFlat.length; n++) {
    const flat = built.userNodeFlat[n];
    for (let i = 0; i < P; i++) db[i] = toDb(stepUp(sweepNa, flat, i));
    const peak = P > 0 ? peakOf(sweepNa.freqs, db) : null;
    const e3 = peak && P > 2 ? edgesAt(sweepNa.freqs, db, peak.k, peak.db, HALF_POWER_DB) : null;
    const e60 = peak && P > 2 ? edgesAt(sweepNa.freqs, db, peak.k, peak.db, 60) : null;
    const bw3 = e3 ? e3[1] - e3[0] : null;
    const bw60 = e60 ? e60[1] - e60[0] : null;
    const ref = peak ? peak.db : toDb(stepUp(ex, flat, 0));
    const offsets = offsetsHz.map((offsetHz, q) => ({
      offsetHz,
      belowDb: f0Hz - offsetHz > 0 ? ref - toDb(stepUp(ex, flat, 1 + 2 * q)) : null,
      aboveDb: ref - toDb(stepUp(ex, flat, 2 + 2 * q)),
    }));
    const imageRejectionDb =
      imageHz !== null
        ? toDb(stepUp(ex, flat, 0)) - toDb(stepUp(ex, flat, exact.length - 1))
        : null;
    reports.push({
      node: n,
      peakHz: peak ? peak.fHz : null,
      peakStepUpDb: peak ? peak.db : null,
      bw3dbHz: bw3,
      bw3dbLowHz: e3 ? e3[0] : null,
      bw3dbHighHz: e3 ? e3[1] : null,
      bw60dbHz: bw60,
      shapeFactor: bw3 && bw60 ? bw60 / bw3 : null,
      offsets,
      imageHz,
      imageRejectionDb: isFiniteNumber(imageRejectionDb ?? 0) ? imageRejectionDb : null,
    });
  }
  return reports;
}
