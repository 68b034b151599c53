/**
 * Strong signals away from the channel, through the chain's real selectivity: blocking
 * (which stage compresses first, and how much the wanted signal loses), off-channel
 * two-tone intermodulation (an effective IIP3 for a tone spacing), and reciprocal mixing
 * of the LO's phase noise with a blocker (the usual receiver-planning budgets, common practice).
 *
 * Levels at the antenna are AVAILABLE power, dBm. A level "at a stage input" is the power
 * the stage's input really takes, P[node] = |V|²·Re(1/Zin)/2: what drives a stage into
 * distortion is the voltage across its input, and a lossless preselector rejects a signal by
 * mismatch, which the available power would not show. The gain to a stage's input at
 * frequency f is therefore the transducer gain P[node]/Pav[source] from the node analysis
 * at f, carrying the real selectivity and impedances ahead of the stage.
 */
import type { BuiltChain } from '../core/build';
import { runNodeAnalysis, type NodeAnalysis } from '../core/nodes';
import { availablePower, deliveredPower } from '../core/quantities';

const { log10, pow } = Math;
const db10 = (r: number) => 10 * log10(r);
const lin = (db: number) => pow(10, db / 10);

/**
 * A third-order stage's IIP3 estimated from its 1 dB compression point:
 * IIP3 ≈ P1dB + 9.6 dB (the cubic model's ratio; common practice).
 */
export const IIP3_OVER_P1DB_DB = 9.64;

/** Transducer gain (dB) from the source to user node `node` at point i of a node analysis. */
export function gainToNodeDb(built: BuiltChain, na: NodeAnalysis, node: number, i: number): number {
  return db10(deliveredPower(na, built.userNodeFlat[node], i) / availablePower(na, 0, i));
}

/** Piecewise log-linear phase-noise profile, dBc/Hz at offsets (held flat beyond its ends). */
export function phaseNoiseAt(profile: readonly { offsetHz: number; dbcHz: number }[], offsetHz: number): number | null {
  const pts = [...profile].filter((p) => p.offsetHz > 0).sort((a, b) => a.offsetHz - b.offsetHz);
  if (pts.length === 0 || !(offsetHz > 0)) return null;
  if (offsetHz <= pts[0].offsetHz) return pts[0].dbcHz;
  for (let k = 1; k < pts.length; k++) {
    if (offsetHz <= pts[k].offsetHz) {
      const a = pts[k - 1];
      const b = pts[k];
      const t = (log10(offsetHz) - log10(a.offsetHz)) / (log10(b.offsetHz) - log10(a.offsetHz));
      return a.dbcHz + t * (b.dbcHz - a.dbcHz);
    }
  }
  return pts[pts.length - 1].dbcHz;
} // prettier-ignore

/**
 * Reciprocal mixing: the blocker's power times the LO's phase noise at the blocker's offset,
 * integrated over the channel: N = P_block + L(Δf) + 10·log10(B) (dBm, where P_block is).
 */
export function reciprocalMixingDbm(blockerDbm: number, phaseNoiseDbcHz: number, bandwidthHz: number): number {
  return blockerDbm + phaseNoiseDbcHz + db10(bandwidthHz);
} // prettier-ignore

/**
 * Gain (dB, ≤ 0) a weak signal keeps through a third-order stage while a blocker of
 * `blockerDbm` drives it (both at the stage input): with y = a1·x + a3·x³ the small-signal
 * gain becomes a1·(1 − 2·Pb/P_IIP3) (the standard desensitisation result of a cubic
 * nonlinearity); −Infinity when the blocker drives it past that model (fully blocked).
 */
export function blockedGainDb(blockerDbm: number, iip3Dbm: number): number {
  const factor = 1 - 2 * lin(blockerDbm - iip3Dbm);
  return factor > 0 ? 20 * log10(factor) : -Infinity;
}

export interface StageLimits {
  stageId: string;
  label: string;
  /** User node at the stage's input. */
  node: number;
  iip3Dbm: number | null;
  p1dbDbm: number | null;
}

/** The stages of a chain with a stated IIP3 or P1dB. */
export function stageLimits(built: BuiltChain): StageLimits[] {
  return built.twoPorts.flatMap((s, k) => {
    const lin = s.model.linearity;
    const iip3 = lin?.iip3Dbm ?? null;
    const p1db = lin?.p1dbDbm ?? null;
    return iip3 === null && p1db === null ? [] : [{ stageId: s.id, label: s.label, node: k, iip3Dbm: iip3, p1dbDbm: p1db }]; // prettier-ignore
  });
}

export interface BlockingStage {
  stageId: string;
  label: string;
  /** The blocker's level at the stage's input, dBm available. */
  inputDbm: number;
  p1dbDbm: number | null;
  /** P1dB less the back-off minus the input level, dB (negative: compressing). */
  headroomDb: number | null;
  compresses: boolean;
  /** Gain the wanted signal loses in this stage, dB (≥ 0); null when the stage is blocked. */
  gainLossDb: number | null;
  /** Driven past the cubic model's reach: the wanted signal is lost. */
  blocked: boolean;
}

export interface BlockingReport {
  offsetHz: number;
  levelDbm: number;
  stages: BlockingStage[];
  /** The first stage whose input passes its P1dB less the back-off; null: none. */
  firstCompressing: string | null;
  /** Gain the wanted signal loses through the whole chain, dB; null when a stage is blocked. */
  gainLossDb: number | null;
  blocked: boolean;
}

/** A blocker at f0 + offset with `levelDbm` available at the antenna, stage by stage. */
export function blocking(
  built: BuiltChain,
  offsetHz: number,
  levelDbm: number,
  backoffDb: number,
): BlockingReport {
  const fb = built.settings.f0Hz + offsetHz;
  const na = runNodeAnalysis(built, [fb > 0 ? fb : built.settings.f0Hz]);
  const stages = stageLimits(built).map((s): BlockingStage => {
    const inputDbm = levelDbm + gainToNodeDb(built, na, s.node, 0);
    const headroomDb = s.p1dbDbm === null ? null : s.p1dbDbm - backoffDb - inputDbm;
    const iip3 = s.iip3Dbm ?? (s.p1dbDbm === null ? null : s.p1dbDbm + IIP3_OVER_P1DB_DB);
    const kept = iip3 === null || !Number.isFinite(inputDbm) ? 0 : blockedGainDb(inputDbm, iip3);
    const blocked = !Number.isFinite(kept);
    return { stageId: s.stageId, label: s.label, inputDbm, p1dbDbm: s.p1dbDbm, headroomDb, compresses: headroomDb !== null && headroomDb < 0, gainLossDb: blocked ? null : -kept, blocked }; // prettier-ignore
  });
  const blocked = stages.some((s) => s.blocked);
  return {
    offsetHz,
    levelDbm,
    stages,
    firstCompressing: stages.find((s) => s.compresses)?.stageId ?? null,
    gainLossDb: blocked ? null : stages.reduce((a, s) => a + (s.gainLossDb ?? 0), 0),
    blocked,
  };
}

export interface IntermodStage {
  stageId: string;
  label: string;
  iip3Dbm: number;
  /** Tone levels at the stage input for tones of 0 dBm at the antenna, dBm. */
  tone1Dbm: number;
  tone2Dbm: number;
  /** Share of the input-referred product amplitude this stage makes (0…1). */
  share: number;
}

export interface IntermodReport {
  spacingHz: number;
  /** Tones at f0 + spacing and f0 + 2·spacing: 2·f1 − f2 lands on f0. */
  tone1Hz: number;
  tone2Hz: number;
  /** Input intercept for that tone pair, referred to the antenna, dBm. */
  effectiveIip3Dbm: number | null;
  stages: IntermodStage[];
}

/**
 * Effective IIP3 for two tones at f0 + Δ and f0 + 2Δ. At each stage with an intercept the
 * third-order product 2·f1 − f2 (on f0) is 2·P1 + P2 − 2·IIP3 at its input (tone levels
 * after the selectivity ahead of it); referred to the antenna through the gain at f0 and
 * added as amplitudes in phase (the worst case, the same assumption as the usual
 * 1/IIP3 = Σ G/IIP3 cascade, to which this reduces when the tones see the gain of f0).
 */
export function offChannelIntermod(built: BuiltChain, spacingHz: number): IntermodReport {
  const f0 = built.settings.f0Hz;
  const f1 = f0 + spacingHz;
  const f2 = f0 + 2 * spacingHz;
  const na = runNodeAnalysis(built, [f0, f1, f2]);
  const parts = stageLimits(built).flatMap((s) => {
    const iip3 = s.iip3Dbm ?? (s.p1dbDbm === null ? null : s.p1dbDbm + IIP3_OVER_P1DB_DB);
    if (iip3 === null) return [];
    const g0 = gainToNodeDb(built, na, s.node, 0);
    const t1 = gainToNodeDb(built, na, s.node, 1);
    const t2 = gainToNodeDb(built, na, s.node, 2);
    // Product at the antenna for 0 dBm tones, as an amplitude (√mW).
    const amp = pow(10, (2 * t1 + t2 - 2 * iip3 - g0) / 20);
    return [{ stage: { stageId: s.stageId, label: s.label, iip3Dbm: iip3, tone1Dbm: t1, tone2Dbm: t2, share: 0 }, amp }]; // prettier-ignore
  });
  const total = parts.reduce((a, p) => a + (Number.isFinite(p.amp) ? p.amp : 0), 0);
  for (const p of parts) p.stage.share = total > 0 && Number.isFinite(p.amp) ? p.amp / total : 0;
  // For tones of 0 dBm the product is 20·log10(total) dBm; IIP3 = (3·0 − P_IM)/2.
  const effectiveIip3Dbm = total > 0 ? -10 * log10(total) : null;
  return {
    spacingHz,
    tone1Hz: f1,
    tone2Hz: f2,
    effectiveIip3Dbm,
    stages: parts.map((p) => p.stage),
  };
}

export interface ReciprocalMixingReport {
  offsetHz: number;
  phaseNoiseDbcHz: number;
  /** The blocker's level at the mixer's input, dBm. */
  blockerAtMixerDbm: number;
  /** Reciprocal-mixing noise in the channel, referred to the antenna, dBm. */
  noiseAtAntennaDbm: number;
  /** The blocker level at the antenna at which that noise equals the receiver's noise floor, dBm. */
  blockerForFloorDbm: number;
}

/**
 * Reciprocal mixing at the first mixer: the blocker reaches the mixer through the
 * selectivity ahead of it, mixes the LO's phase noise at its offset into the channel, and
 * that noise is referred back to the antenna through the gain at f0.
 */
export function reciprocalMixing(
  built: BuiltChain,
  mixerNode: number,
  offsetHz: number,
  blockerDbm: number,
  phaseNoiseDbcHz: number,
  bandwidthHz: number,
  noiseFloorDbm: number,
): ReciprocalMixingReport {
  const f0 = built.settings.f0Hz;
  const na = runNodeAnalysis(built, [f0, f0 + offsetHz]);
  const g0 = gainToNodeDb(built, na, mixerNode, 0);
  const gb = gainToNodeDb(built, na, mixerNode, 1);
  const blockerAtMixerDbm = blockerDbm + gb;
  const noiseAtAntennaDbm =
    reciprocalMixingDbm(blockerAtMixerDbm, phaseNoiseDbcHz, bandwidthHz) - g0;
  return {
    offsetHz,
    phaseNoiseDbcHz,
    blockerAtMixerDbm,
    noiseAtAntennaDbm,
    blockerForFloorDbm: blockerDbm + (noiseFloorDbm - noiseAtAntennaDbm),
  };
}
