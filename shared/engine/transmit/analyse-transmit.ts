/**
 * The transmit analysis of a transmit mode: the power the antenna (the path's load) takes,
 * how much the output network attenuates the 2nd and 3rd harmonics, the transmit power that
 * reaches the receiver's input (a part marked as the receiver's input in a branch to
 * ground), and the voltage across and current through every part at that power, each
 * against the limits the user states (settings.transmit). Voltages are PEAK, currents rms
 * where ratings are rms (peak/√2).
 */
import type { BuiltChain } from '../core/build';
import { runNodeAnalysis, type NodeAnalysis } from '../core/nodes';
import { deliveredPower } from '../core/quantities';
import type { Flag, PartStress } from '../types';

/** Harmonic attenuation of the output network. */
export interface HarmonicReport {
  n: number;
  fHz: number;
  /** Power into the load at n·f0 relative to f0, for the same source EMF, dB (positive). */
  attenuationDb: number;
  limitDb: number | null;
  ok: boolean | null;
}

/** Stress of one part at the transmit power. */
export interface PartStressReport extends PartStress {
  stageId: string;
  iRms: number;
  ratedPeakVolts: number | null;
  ratedRmsAmps: number | null;
  ok: boolean | null;
}

export interface TransmitReport {
  f0Hz: number;
  /** What the source offers into its design load (the power amplifier's target), W. */
  availableW: number;
  deliveredW: number;
  deliveredDbm: number;
  /** Loss between the amplifier and the antenna (mismatch included), dB. */
  networkLossDb: number;
  /** Peak voltage at the amplifier's output terminals. */
  sourceSwingPeakV: number;
  harmonics: HarmonicReport[];
  /** Power reaching the receiver's input, when a part is marked as the receiver's input. */
  receiverInput: { stageId: string; part: string; powerW: number; dbm: number; isolationDb: number; limitDbm: number | null; ok: boolean | null } | null; // prettier-ignore
  parts: PartStressReport[];
}

const dbm = (w: number) => 10 * Math.log10(w / 1e-3);
const hyp = Math.hypot;

function impedanceAt(na: NodeAnalysis, k: number): [number, number] {
  return [na.zinRe[k], na.zinIm[k]];
}

/** Current into the network onward from flat node k (V/Zin; 0 when open). */
function onwardCurrent(na: NodeAnalysis, k: number): [number, number] {
  const [zr, zi] = impedanceAt(na, k);
  if (!Number.isFinite(zr) || !Number.isFinite(zi)) return [0, 0];
  const d = zr * zr + zi * zi;
  const vr = na.vRe[k];
  const vi = na.vIm[k];
  return [(vr * zr + vi * zi) / d, (vi * zr - vr * zi) / d];
}

/** Each section's part stress at f0 (series, shunt, or a network judged at its ends). */
function sectionStress(built: BuiltChain, na: NodeAnalysis): PartStressReport[] {
  const out: PartStressReport[] = [];
  const m = new Float64Array(8);
  const ratings = built.settings.transmit?.ratings ?? {};
  const push = (stageId: string, p: PartStress) => {
    const r = ratings[stageId];
    const iRms = p.iPeak / Math.SQRT2;
    const vBad = r?.maxPeakVolts !== undefined ? p.vPeak > r.maxPeakVolts : null;
    const iBad = r?.maxRmsAmps !== undefined ? iRms > r.maxRmsAmps : null;
    const judged = vBad !== null || iBad !== null;
    out.push({ ...p, stageId, iRms, ratedPeakVolts: r?.maxPeakVolts ?? null, ratedRmsAmps: r?.maxRmsAmps ?? null, ok: judged ? !(vBad || iBad) : null }); // prettier-ignore
  };
  for (const stage of built.twoPorts) {
    for (let s = 0; s < stage.sectionCount; s++) {
      const j = stage.firstSection + s;
      const [vr0, vi0] = [na.vRe[j], na.vIm[j]];
      const [vr1, vi1] = [na.vRe[j + 1], na.vIm[j + 1]];
      const [ir0, ii0] = onwardCurrent(na, j);
      const [ir1, ii1] = onwardCurrent(na, j + 1);
      if (stage.model.innerParts && stage.sectionCount === 1) {
        for (const p of stage.model.innerParts(built.f0AtFlatNode[j], vr0, vi0)) push(stage.id, { ...p, label: `${stage.label}, ${p.label}` }); // prettier-ignore
        continue;
      }
      built.sections[j].abcd(built.f0AtFlatNode[j], m, 0);
      const unitDiag = m[0] === 1 && m[1] === 0 && m[6] === 1 && m[7] === 0;
      const name = `${stage.label}, part ${s + 1}`;
      if (unitDiag && m[4] === 0 && m[5] === 0) {
        const vPeak = hyp(vr0 - vr1, vi0 - vi1);
        const iPeak = hyp(ir0, ii0);
        push(stage.id, { label: `${name} (series)`, vPeak, iPeak, powerW: (m[2] * iPeak * iPeak) / 2 }); // prettier-ignore
      } else if (unitDiag && m[2] === 0 && m[3] === 0) {
        const vPeak = hyp(vr0, vi0);
        const iPeak = hyp(ir0 - ir1, ii0 - ii1);
        push(stage.id, { label: `${name} (to ground)`, vPeak, iPeak, powerW: (m[4] * vPeak * vPeak) / 2 }); // prettier-ignore
      } else {
        const vPeak = Math.max(hyp(vr0, vi0), hyp(vr1, vi1));
        const iPeak = Math.max(hyp(ir0, ii0), hyp(ir1, ii1));
        push(stage.id, { label: `${name} (at its ends)`, vPeak, iPeak, powerW: 0 });
      }
    }
  }
  const last = built.sections.length;
  const [ir, ii] = onwardCurrent(na, last);
  push(built.load.id, { label: `${built.load.label} (the antenna's load)`, vPeak: hyp(na.vRe[last], na.vIm[last]), iPeak: hyp(ir, ii), powerW: deliveredPower(na, last, 0) }); // prettier-ignore
  return out;
}

/**
 * The transmit report of a built transmit path, with its flags.
 * @param f0Na node analysis at f0 (one point), as the main analysis ran it
 */
export function analyseTransmit(
  built: BuiltChain,
  f0Na: NodeAnalysis,
): { report: TransmitReport; flags: Flag[] } {
  const f0 = built.settings.f0Hz;
  const limits = built.settings.transmit ?? {};
  const last = built.sections.length;
  const h = runNodeAnalysis(built, [f0, 2 * f0, 3 * f0]);
  const pAt = (i: number) => deliveredPower(h, last, i) / (h.emf[i] * h.emf[i]);
  const harmonics = [2, 3].map((n, k): HarmonicReport => {
    const attenuationDb = 10 * Math.log10(pAt(0) / pAt(k + 1));
    const limitDb = limits.minHarmonicAttenuationDb ?? null;
    return { n, fHz: n * f0, attenuationDb, limitDb, ok: limitDb === null ? null : attenuationDb >= limitDb }; // prettier-ignore
  });
  const deliveredW = deliveredPower(f0Na, last, 0);
  const zs = new Float64Array(2);
  built.source.model.impedance(f0, zs, 0);
  const emf = f0Na.emf[0];
  const availableW = (emf * emf) / (8 * zs[0]);
  const parts = sectionStress(built, f0Na);
  const rx = parts.find((p) => p.receiverInput);
  const limitDbm = limits.maxReceiverInputDbm ?? null;
  const receiverInput = rx
    ? { stageId: rx.stageId, part: rx.label, powerW: rx.powerW, dbm: dbm(rx.powerW), isolationDb: 10 * Math.log10(deliveredW / rx.powerW), limitDbm, ok: limitDbm === null ? null : dbm(rx.powerW) <= limitDbm } // prettier-ignore
    : null;
  const report: TransmitReport = {
    f0Hz: f0,
    availableW,
    deliveredW,
    deliveredDbm: dbm(deliveredW),
    networkLossDb: 10 * Math.log10(availableW / deliveredW),
    sourceSwingPeakV: hyp(f0Na.vRe[0], f0Na.vIm[0]),
    harmonics,
    receiverInput,
    parts,
  };
  return { report, flags: transmitFlags(report, built.source.id) };
}

const r1 = (x: number) => Math.round(x * 10) / 10;

function transmitFlags(t: TransmitReport, sourceId: string): Flag[] {
  const flags: Flag[] = [];
  for (const h of t.harmonics)
    if (h.ok === false)
      flags.push({ code: 'harmonics-high', severity: 'error', stageId: sourceId, message: `The output network attenuates the harmonic at ${h.n}·f0 by only ${r1(h.attenuationDb)} dB (at least ${h.limitDb} dB wanted): add a low-pass section or raise the network's Q.`, data: { n: h.n, attenuationDb: h.attenuationDb, limitDb: h.limitDb ?? 0 } }); // prettier-ignore
  const rx = t.receiverInput;
  if (rx && rx.ok === false)
    flags.push({ code: 'receiver-overdriven', severity: 'error', stageId: rx.stageId, message: `While transmitting, ${r1(rx.dbm)} dBm reaches the receiver's input (at most ${rx.limitDbm} dBm allowed; isolation ${r1(rx.isolationDb)} dB): improve the isolation of the receive branch.`, data: { dbm: rx.dbm, limitDbm: rx.limitDbm ?? 0 } }); // prettier-ignore
  for (const p of t.parts)
    if (p.ok === false)
      flags.push({ code: 'part-stress', severity: 'error', stageId: p.stageId, message: `${p.label} carries ${r1(p.vPeak)} V peak and ${p.iRms.toPrecision(3)} A rms at the transmit power, beyond its rating (${p.ratedPeakVolts ?? '—'} V peak, ${p.ratedRmsAmps ?? '—'} A rms): choose parts rated higher.`, data: { vPeak: p.vPeak, iRms: p.iRms } }); // prettier-ignore
  return flags;
}
