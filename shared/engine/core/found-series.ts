/**
 * Series resonances found in a through path, and the unloaded Q of every found resonance.
 *
 * Series: the current through a series element (a section with A = D = 1, C = 0) sees the
 * loop impedance Z = Zsrc + Zin at its input node, everything upstream plus the element and
 * everything downstream. Where X = Im Z rises through zero the loop resonates; loaded
 * Q = (ωr/2R)·dX/dω, the series form of the node rule (for a series RLC, Q = X/R: common
 * practice). A run of consecutive series sections shares one loop, so it is searched once,
 * at its first section.
 *
 * Detached (our rule, the series twin of topology.ts's): everything downstream of the tuned
 * circuit removed, which for a series loop means shorted: the loop keeps the source side and
 * the run's series sections up to the last reactive one (|X| > R at fr); what follows is
 * replaced by a short.
 *
 * Unloaded Q of a found resonance (our rule): the tuned circuit by itself, with both its
 * terminations taken away: downstream cut as for the detached Q, and the source's resistive
 * part removed: its resistance for a series loop (its reactance stays: an antenna's
 * capacitance is part of the tuned circuit), its conductance for a parallel one (its
 * susceptance stays). What is left damps only through the losses of the parts between, at
 * their own resonance near the loaded one. A node behind an amplifier keeps the amplifier's
 * output resistance, which this rule cannot tell from a part's loss.
 */
import type { ComplexFn } from '../types';
import type { BuiltChain } from './build';
import { createProbe, type Probe } from './probe';
import {
  cutAt,
  resonanceIn,
  resonanceNear,
  type AdmittanceOf,
  type Bracket,
  type NodeResonance,
} from './resonance-search';
import { impedanceRow, type NodeAnalysis } from './nodes';

const isFiniteNumber = Number.isFinite;
const abs = Math.abs;
/** |X| at or below this fraction of R at both grid ends is rounding, not a crossing. */
const ROUNDING_X = 1e-9;

/** Section j is a series impedance alone (A = D = 1, C = 0) at its design frequency. */
export function seriesSections(built: BuiltChain): Uint8Array {
  const N = built.sections.length;
  const out = new Uint8Array(N);
  const m = new Float64Array(8);
  for (let j = 0; j < N; j++) {
    const s = built.sections[j];
    if (s.unilateral || s.translate) continue;
    s.abcd(built.f0AtFlatNode[j], m, 0);
    out[j] = m[0] === 1 && m[1] === 0 && m[4] === 0 && m[5] === 0 && m[6] === 1 && m[7] === 0 ? 1 : 0; // prettier-ignore
  }
  return out;
}

/** The loop impedance at a node after `probe.at`: Zsrc + Zin (R, X); NaN when a side is open. */
export const loopAt: AdmittanceOf = (p, node, out) => {
  out[0] = p.zsrcRe[node] + p.zinRe[node];
  out[1] = p.zsrcIm[node] + p.zinIm[node];
  if (!isFiniteNumber(out[0]) || !isFiniteNumber(out[1])) out[0] = out[1] = NaN;
};

/** The loop with the series run shorted at `cut`: Zsrc + Σ Z of sections node … cut−1. */
export function shortedAt(built: BuiltChain, cut: number): AdmittanceOf {
  const m = new Float64Array(8);
  return (p, node, out) => {
    let r = p.zsrcRe[node];
    let x = p.zsrcIm[node];
    for (let j = node; j < cut; j++) {
      built.sections[j].abcd(p.fNode[j], m, 0);
      r += m[2];
      x += m[3];
    }
    out[0] = isFiniteNumber(r) && isFiniteNumber(x) ? r : NaN;
    out[1] = isFiniteNumber(r) && isFiniteNumber(x) ? x : NaN;
  };
}

/** Every rising crossing of the loop reactance at `node` over the grid. */
export function risingLoopCrossings(na: NodeAnalysis, node: number): Bracket[] {
  const out: Bracket[] = [];
  const base = impedanceRow(na, node) * na.points;
  const x = (i: number) => na.zsrcIm[base + i] + na.zinIm[base + i];
  const r = (i: number) => na.zsrcRe[base + i] + na.zinRe[base + i];
  for (let i = 0; i + 1 < na.points; i++) {
    const sign = na.fNode[base + i + 1] >= na.fNode[base + i] ? 1 : -1;
    const a = sign * x(i);
    const b = sign * x(i + 1);
    if (!(a < 0 && b >= 0) || !isFiniteNumber(a) || !isFiniteNumber(b)) continue;
    if (abs(a) <= ROUNDING_X * abs(r(i)) && abs(b) <= ROUNDING_X * abs(r(i + 1))) continue;
    out.push({ k: i, sign, lo: a, hi: b });
  }
  return out;
}
/** Where the detached series loop is shorted: after the run's last reactive series section. */
export function seriesCut(built: BuiltChain, series: Uint8Array, node: number, fr: number): number {
  const m = new Float64Array(8);
  let cut = node;
  for (let j = node; j < series.length && series[j]; j++) {
    built.sections[j].abcd(fr, m, 0);
    if (abs(m[3]) > abs(m[2])) cut = j + 1;
  }
  return cut;
}

/** The figures of one found series resonance. */
export interface SeriesFigures {
  resonanceHz: number;
  fIn: number;
  loadedQ: number | null;
  unloadedQ: number | null;
  bandwidthHz: number | null;
  detachedQ: number | null;
  detachedBandwidthHz: number | null;
  loadingRatio: number | null;
  downstreamShare: number | null;
  /** Section after which the detached loop is shorted. */
  cut: number;
}

const nn = (x: number) => (Number.isNaN(x) ? null : x);

/** Locates a loop resonance on a grid bracket [k, k+1] at `node`. */
export function locateSeries(
  na: NodeAnalysis,
  probe: Probe,
  node: number,
  b: Bracket,
): NodeResonance | null {
  const scratch = new Float64Array(2);
  return resonanceIn(probe, node, na.freqs[b.k], na.freqs[b.k + 1], b.sign, loopAt, scratch, b.lo, b.hi); // prettier-ignore
}

/** Measures a located series resonance: detached Q, downstream share, unloaded Q. */
export function seriesFigures(
  built: BuiltChain,
  series: Uint8Array,
  probe: Probe,
  unloaded: Probe | null,
  node: number,
  att: NodeResonance,
): SeriesFigures {
  const scratch = new Float64Array(2);
  const cut = seriesCut(built, series, node, att.fr);
  const shorted = shortedAt(built, cut);
  const det = resonanceNear(probe, node, att.fIn, att.sign, shorted, scratch);
  probe.at(att.fIn, node);
  shorted(probe, node, scratch);
  const rDet = scratch[0];
  const own = unloaded && resonanceNear(unloaded, node, att.fIn, att.sign, shorted, scratch);
  const qA = nn(att.q);
  const qD = det ? nn(det.q) : null;
  return {
    resonanceHz: att.fr,
    fIn: att.fIn,
    loadedQ: qA,
    unloadedQ: own ? nn(own.q) : null,
    bandwidthHz: qA ? att.fr / qA : null,
    detachedQ: qD,
    detachedBandwidthHz: det && qD ? det.fr / qD : null,
    loadingRatio: qA && qD ? qA / qD : null,
    downstreamShare: att.g > 0 && isFiniteNumber(rDet) ? (att.g - rDet) / att.g : null,
    cut,
  };
}

/** Unloaded Q of a found parallel resonance at `node`, cut open at `cut` (rule above). */
export function unloadedShuntQ(
  unloaded: Probe,
  node: number,
  cut: number,
  att: NodeResonance,
): number | null {
  const own = resonanceNear(unloaded, node, att.fIn, att.sign, cutAt(cut), new Float64Array(2));
  return own ? nn(own.q) : null;
}

/**
 * A probe of the chain with the source's resistive part removed: for `series` its
 * resistance (Zs → j·Xs), else its conductance (Ys → j·Bs; a plain resistor becomes open).
 */
export function unloadedProbe(built: BuiltChain, series: boolean): Probe {
  const zs = built.source.model.impedance;
  const t = new Float64Array(2);
  const impedance: ComplexFn = (f, out, o) => {
    zs(f, t, 0);
    if (series) {
      out[o] = 0;
      out[o + 1] = t[1];
      return;
    }
    // Keep only the susceptance: Zs' = 1/(j·Bs), Bs = −Xs/|Zs|².
    const d = t[0] * t[0] + t[1] * t[1];
    const bs = d === 0 ? Infinity : -t[1] / d;
    out[o] = bs === 0 ? Infinity : 0;
    out[o + 1] = bs === 0 ? 0 : -1 / bs;
  };
  return createProbe({ ...built, source: { ...built.source, model: { ...built.source.model, impedance } } }); // prettier-ignore
}
