/**
 * Cumulative selectivity at each user-level node from the step-up |V[n]|/|Es| over the
 * sweep: peak, −3 dB and −60 dB bandwidths, the depth the response reaches, shape factor,
 * attenuation at stated offsets and at the image frequency of a chain with a mixer.
 */
import type { SelectivityReport } from '../types';
import type { BuiltChain } from './build';
import { keptScratch } from './kept-scratch';
import { runNodeAnalysis, sharedWorkspace, type NodeAnalysis } from './nodes';
import { probeOf } from './probe';
import { stepUp } from './quantities';
import {
  dbAt,
  locateEdge,
  locateGridPeak,
  HALF_POWER_DB,
  mayFallScanned,
  scanStepUpPower,
  toDb,
  type PowerScan,
  type ShapeMemo,
} from './response-shape';

// Globals read once: a global lookup inside a hot loop is slow in some hosts (test VMs).
const { abs } = Math;
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

/**
 * A −60 dB width is stated only when the response goes on falling through −60 dB: on each
 * side, half as far again from the peak as its −60 dB edge (in log frequency), it must be
 * FLOOR_MARGIN_DB further down (a single tuned circuit falls 3.5 dB there). A response that
 * levels off near −60 dB (a filter whose ultimate rejection is 60 dB) gives a width set by
 * whatever adds the last fraction of a dB, which says nothing about selectivity; such a node
 * states how deep it gets there instead (depthDb). Our rule.
 */
export const FLOOR_MARGIN_DB = 3;

/** The step-up powers of one node, read within one call only: kept between analyses. */
const powerScratch = keptScratch(1 << 16);

/**
 * Selectivity report of every user-level node. Peaks and band edges are bracketed on the
 * sweep and located by evaluating the chain at single frequencies (peaks to 1e-8 relative,
 * edges to 1e-10), so they do not depend on the sweep's spacing.
 * @param sweepNa node analysis over the sweep grid
 * @param imageHz image frequency at the input (null without a mixer)
 * @param only the one user-level node to report (a study's judged node) without its −60 dB
 *   width and depth (null there), else every node in full
 * @param shapes shapes already found on `sweepNa` in this analysis, by flat node (a coupled
 *   pair's output: resonators.ts), read instead of searched again
 */
export function analyzeSelectivity(
  built: BuiltChain,
  sweepNa: NodeAnalysis,
  imageHz: number | null,
  only?: number,
  shapes?: ShapeMemo,
): SelectivityReport[] {
  const { f0Hz, offsetsHz } = built.settings;
  // Exact points: f0, each offset below and above, and the image.
  const exact: number[] = [f0Hz];
  for (const off of offsetsHz) exact.push(f0Hz - off > 0 ? f0Hz - off : f0Hz, f0Hz + off);
  if (imageHz !== null) exact.push(imageHz);
  const ex = runNodeAnalysis(built, exact, sharedWorkspace('exact', built, exact.length));
  const P = sweepNa.points;
  const power = powerScratch(P);
  const scan: PowerScan = { k: -1, minBelow: Infinity, minAbove: Infinity };
  const probe = probeOf(built);
  const reports: SelectivityReport[] = [];
  // The last report worked out here (not read from a shape), at which flat node.
  let last: { flat: number; report: SelectivityReport } | null = null;
  for (let n = 0; n < built.userNodeFlat.length; n++) {
    if (only !== undefined && n !== only) continue;
    const flat = built.userNodeFlat[n];
    // A coupled pair's peak and width at this node are these very searches (resonators.ts):
    // its shape is read instead of found again.
    const known = shapes?.get(flat);
    // A node joined to the last one by shunt sections alone (a tank or a resistor across the
    // line between two stages) is the same node: every voltage the searches read there, on the
    // grid and at single frequencies, is the last one's copied (node-steps.ts), so its report
    // is the last one's.
    if (!known && last && sameNode(built, last.flat, flat)) {
      reports.push({ ...last.report, node: n, offsets: last.report.offsets.map((o) => ({ ...o })) }); // prettier-ignore
      continue;
    }
    // One pass: the powers, the grid peak, and whether either side may reach −60 dB.
    if (!known) scanStepUpPower(sweepNa, flat, power, scan);
    const nodePower = known ? known.power : power;
    const nodeScan = known ? known.scan : scan;
    const k = nodeScan.k;
    const peak = known ? known.peak : k >= 0 ? locateGridPeak(probe, sweepNa, flat, k) : null;
    let e3: [number, number] | null = null;
    let e60: [number, number] | null = null;
    let deepest: number | null = null;
    if (peak && P > 2) {
      const lo3 = known ? known.lo : locateEdge(probe, flat, sweepNa, power, k, peak.db - HALF_POWER_DB, -1); // prettier-ignore
      const hi3 = known ? known.hi : locateEdge(probe, flat, sweepNa, power, k, peak.db - HALF_POWER_DB, 1); // prettier-ignore
      e3 = lo3 && hi3 ? [lo3.fHz, hi3.fHz] : null;
      const deep = only === undefined;
      // A −60 dB width needs both edges: the second is looked for only when the first exists.
      const at60 = peak.db - 60;
      const lo60 = deep && mayFallScanned(nodeScan, at60, -1) ? locateEdge(probe, flat, sweepNa, nodePower, k, at60, -1) : null; // prettier-ignore
      const hi60 = lo60 && mayFallScanned(nodeScan, at60, 1) ? locateEdge(probe, flat, sweepNa, nodePower, k, at60, 1) : null; // prettier-ignore
      if (lo60 && hi60) {
        const fp = peak.fHz;
        const further = Math.max(
          dbAt(probe, flat, fp * (lo60.fHz / fp) ** 1.5),
          dbAt(probe, flat, fp * (hi60.fHz / fp) ** 1.5),
        );
        if (further <= peak.db - 60 - FLOOR_MARGIN_DB) e60 = [lo60.fHz, hi60.fHz];
        else deepest = peak.db - further;
      }
    }
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
      depthDb: deepest !== null && isFiniteNumber(deepest) ? deepest : null,
      shapeFactor: bw3 && bw60 ? bw60 / bw3 : null,
      offsets,
      imageHz,
      imageRejectionDb: isFiniteNumber(imageRejectionDb ?? 0) ? imageRejectionDb : null,
    });
    last = known ? null : { flat, report: reports[reports.length - 1] };
  }
  return reports;
}

/**
 * Flat nodes a ≤ b joined by shunt sections alone (Section.ladder 'shunt'): one electrical
 * node. Not topology.ts's `group`, which reads the matrices at f0 and so may join nodes whose
 * voltages the node analysis steps generally: the report is reused only where its voltages are
 * copied, which the declared kind alone guarantees.
 */
function sameNode(built: BuiltChain, a: number, b: number): boolean {
  for (let j = a; j < b; j++) if (built.sections[j].ladder !== 'shunt') return false;
  return true;
}
