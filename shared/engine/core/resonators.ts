/**
 * Resonators and loaded Q.
 *
 * Shunt tank at node n: Y(f) = 1/Zsrc[n] + 1/Zin[n] = G + jB (everything attached to the
 * node). fr is where B rises through zero nearest f0 (bracketed on a fine log grid, then
 * refined by bisection); loaded Q = (ωr/2G)·dB/dω by central difference. Detached Q uses
 * Y = 1/Zsrc[n] only (the tank sits on the source side of its node, the downstream side is
 * removed); unloaded Q uses the tank's own admittance. Series resonator: loop impedance
 * Z = Zsrc(in) + Zseries + Zin(out) = R + jX, Q = (ωr/2R)·dX/dω.
 *
 * Searches run over the input frequency (what the sweep varies); Q and fr are stated at the
 * node's own frequency, which differs after a mixer. Only rising crossings count: a falling
 * one is a pole of B (a series resonance elsewhere), not a resonance of the tank.
 */
import type { ComplexFn, ResonatorDecl, ResonatorReport } from '../types';
import type { BuiltChain } from './build';
import { createNodeAnalysis, runNodeAnalysis, type NodeAnalysis } from './nodes';
import { logGrid } from './sweep';

// Globals read once: a global lookup inside a hot loop is slow in some hosts (test VMs).
const { PI, abs, log, max, min } = Math;
const isFiniteNumber = Number.isFinite;

/** Grid points of the bracketing search. */
const SEARCH_POINTS = 4001;
/** Relative step of the central difference for dB/dω. */
const DIFF_STEP = 1e-6;

/** A resonator report plus what the flags need to word their sentences. */
export interface ResonatorFinding extends ResonatorReport {
  /** Flat node (shunt) or flat index of the section (series). */
  flat: number;
  /** Design frequency at the resonator's node, Hz. */
  f0LocalHz: number;
  /** Label of what the tank's downstream side begins with. */
  downstreamLabel: string;
}

/** Writes (real part, imaginary part, local frequency) of the probed quantity at point i. */
type Extract = (na: NodeAnalysis, i: number, out: Float64Array) => void;

/**
 * The input-frequency range searched for resonances: the sweep span widened to include f0;
 * a sweep narrower than 0.1 % (such as a one-point sweep) searches f0/2 … 2·f0 instead.
 */
export function searchRange(built: BuiltChain): [number, number] {
  const { f0Hz, sweep } = built.settings;
  const lo = min(sweep.startHz, f0Hz);
  const hi = max(sweep.stopHz, f0Hz);
  return hi / lo < 1.001 ? [f0Hz / 2, f0Hz * 2] : [lo, hi];
}

/**
 * Index k of the rising zero crossing (v[k] < 0 ≤ v[k+1]) whose interpolated frequency is
 * nearest `target`, or −1 when there is none. With `local` (the node's own frequency at each
 * point, which falls as the input rises behind a mixer whose LO is above the signal), "rising"
 * means rising with the local frequency.
 */
export function nearestRisingCrossing(
  f: ArrayLike<number>,
  v: ArrayLike<number>,
  target: number,
  local?: ArrayLike<number>,
): number {
  let best = -1;
  let bestDist = Infinity;
  for (let k = 0; k + 1 < f.length; k++) {
    const s = orientation(local, k);
    const a = s * v[k];
    const b = s * v[k + 1];
    if (!(a < 0 && b >= 0) || !isFiniteNumber(a) || !isFiniteNumber(b)) continue;
    const fc = f[k] + ((f[k + 1] - f[k]) * -a) / (b - a);
    const d = abs(log(fc / target));
    if (d < bestDist) {
      bestDist = d;
      best = k;
    }
  }
  return best;
}

/** +1 when the local frequency rises from point k to k+1 (or none is given), else −1. */
function orientation(local: ArrayLike<number> | undefined, k: number): number {
  return !local || local[k + 1] >= local[k] ? 1 : -1;
}

/** Refines a bracketed rising zero of `g` on [lo, hi] by bisection to machine precision. */
export function bisectRising(g: (f: number) => number, lo: number, hi: number): number {
  if (g(hi) === 0) return hi;
  for (let it = 0; it < 200 && hi - lo > 4 * Number.EPSILON * hi; it++) {
    const mid = 0.5 * (lo + hi);
    const v = g(mid);
    if (v === 0) return mid;
    if (v < 0) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

interface Resonance {
  fIn: number;
  fr: number;
  real: number;
  q: number;
}

/** Finds the resonance of one probed quantity and its Q. */
function resonate(
  built: BuiltChain,
  grid: Float64Array,
  gridNa: NodeAnalysis,
  extract: Extract,
  target: number,
): Resonance | null {
  const out = new Float64Array(3);
  const im = new Float64Array(grid.length);
  const local = new Float64Array(grid.length);
  for (let i = 0; i < grid.length; i++) {
    extract(gridNa, i, out);
    im[i] = out[1];
    local[i] = out[2];
  }
  const k = nearestRisingCrossing(grid, im, target, local);
  if (k < 0) return null;
  const sign = orientation(local, k);
  const one = createNodeAnalysis(built, 1);
  const f1 = new Float64Array(1);
  const probe = (f: number) => {
    f1[0] = f;
    runNodeAnalysis(built, f1, one);
    extract(one, 0, out);
    return sign * out[1];
  };
  const fIn = bisectRising(probe, grid[k], grid[k + 1]);
  probe(fIn);
  const real = out[0];
  const fr = out[2];
  const two = runNodeAnalysis(built, [fIn * (1 - DIFF_STEP), fIn * (1 + DIFF_STEP)]);
  extract(two, 0, out);
  const imLo = out[1];
  const fLo = out[2];
  extract(two, 1, out);
  const slope = (out[1] - imLo) / (2 * PI * (out[2] - fLo)); // d(im)/dω at the node
  const q = ((2 * PI * fr) / (2 * real)) * slope;
  return { fIn, fr, real, q: isFiniteNumber(q) && q > 0 ? q : NaN };
}

/** Resonance and Q of a resonator's own element (unloaded), searched around `near`. */
function ownResonance(fn: ComplexFn, near: number): number | null {
  const grid = logGrid(near / 3, near * 3, SEARCH_POINTS);
  const v = new Float64Array(grid.length);
  const out = new Float64Array(2);
  const imAt = (f: number) => {
    fn(f, out, 0);
    return out[1];
  };
  for (let i = 0; i < grid.length; i++) v[i] = imAt(grid[i]);
  const k = nearestRisingCrossing(grid, v, near);
  if (k < 0) return null;
  const fr = bisectRising(imAt, grid[k], grid[k + 1]);
  fn(fr, out, 0);
  const real = out[0];
  const h = fr * DIFF_STEP;
  const slope = (imAt(fr + h) - imAt(fr - h)) / (2 * PI * 2 * h);
  const q = ((2 * PI * fr) / (2 * real)) * slope;
  return isFiniteNumber(q) && q > 0 ? q : null;
}

function addInverse(re: number, im: number, out: Float64Array, o: number): void {
  if (!isFiniteNumber(re) || !isFiniteNumber(im)) return; // an open side adds nothing
  const d = re * re + im * im;
  out[o] += d === 0 ? Infinity : re / d;
  out[o + 1] += d === 0 ? 0 : -im / d;
}

function shuntExtract(node: number, downstream: boolean): Extract {
  return (na, i, out) => {
    const k = node * na.points + i;
    out[0] = 0;
    out[1] = 0;
    addInverse(na.zsrcRe[k], na.zsrcIm[k], out, 0);
    if (downstream) addInverse(na.zinRe[k], na.zinIm[k], out, 0);
    out[2] = na.fNode[k];
  };
}

/**
 * One tank of a coupled pair, probed at the stage boundary on the tank's far side from its
 * partner (electrically the tank's own node): real part = the conductance there (source,
 * and downstream when `downstream`; `ownToo` adds the tank's own when the probed side does
 * not already hold it), imaginary part = the tank's OWN susceptance, so Q = (ωr/2G)·dB/dω
 * uses the energy the tank itself stores, not the pair's split response.
 */
function coupledExtract(
  node: number,
  own: ComplexFn,
  withSource: boolean,
  downstream: boolean,
  ownToo: boolean,
): Extract {
  const y = new Float64Array(2);
  return (na, i, out) => {
    const k = node * na.points + i;
    out[0] = 0;
    out[1] = 0;
    if (withSource) addInverse(na.zsrcRe[k], na.zsrcIm[k], out, 0);
    if (downstream) addInverse(na.zinRe[k], na.zinIm[k], out, 0);
    const f = na.fNode[k];
    own(f, y, 0);
    if (ownToo) out[0] += y[0];
    out[1] = y[1];
    out[2] = f;
  };
}

function seriesExtract(built: BuiltChain, section: number): Extract {
  const m = new Float64Array(8);
  return (na, i, out) => {
    const kIn = section * na.points + i;
    const kOut = kIn + na.points;
    built.sections[section].abcd(na.fNode[kIn], m, 0);
    out[0] = na.zsrcRe[kIn] + m[2] + na.zinRe[kOut];
    out[1] = na.zsrcIm[kIn] + m[3] + na.zinIm[kOut];
    out[2] = na.fNode[kIn];
  };
}

/** User-level node of a flat node, or null when it is inside a stage. */
function userNodeOf(built: BuiltChain, flat: number): number | null {
  const k = built.userNodeFlat.indexOf(flat);
  return k < 0 ? null : k;
}

function downstreamOf(built: BuiltChain, flat: number): string {
  const next = built.twoPorts.find((s) => s.firstSection >= flat && s.sectionCount > 0);
  const inside = built.twoPorts.find(
    (s) => flat > s.firstSection && flat < s.firstSection + s.sectionCount,
  );
  if (inside) return `the rest of "${inside.label}"`;
  return `"${(next ?? built.load).label}"`;
}

const nn = (x: number | null | undefined) => (x === undefined || Number.isNaN(x) ? null : x);

/** Analyses every resonator every stage declares. */
export function analyzeResonators(built: BuiltChain): ResonatorFinding[] {
  const decls = built.twoPorts.flatMap((stage) =>
    (stage.model.resonators ?? []).map((decl) => ({ stage, decl })),
  );
  if (decls.length === 0) return [];
  const [lo, hi] = searchRange(built);
  const grid = logGrid(lo, hi, SEARCH_POINTS);
  const gridNa = runNodeAnalysis(built, grid);
  const f0 = built.settings.f0Hz;
  return decls.map(({ stage, decl }): ResonatorFinding => {
    const base = { stageId: stage.id, label: decl.label, kind: decl.kind };
    if (decl.kind === 'shunt' && decl.coupledPartner) {
      return coupledTank(built, grid, gridNa, stage, decl, base);
    }
    if (decl.kind === 'shunt') {
      const flat = stage.firstSection + max(0, min(decl.node, stage.sectionCount));
      const att = resonate(built, grid, gridNa, shuntExtract(flat, true), f0);
      const det = resonate(built, grid, gridNa, shuntExtract(flat, false), f0);
      let share: number | null = null;
      if (att) {
        const one = runNodeAnalysis(built, [att.fIn]);
        const k = flat;
        const zr = one.zinRe[k];
        const zi = one.zinIm[k];
        const gDown = isFiniteNumber(zr) && isFiniteNumber(zi) ? zr / (zr * zr + zi * zi) : 0;
        share = att.real > 0 ? gDown / att.real : null;
      }
      const qA = nn(att?.q);
      const qD = nn(det?.q);
      return {
        ...base,
        node: userNodeOf(built, flat),
        resonanceHz: att ? att.fr : null,
        loadedQ: qA,
        unloadedQ: att ? ownResonance(decl.ownAdmittance, att.fr) : null,
        bandwidthHz: att && qA ? att.fr / qA : null,
        detachedQ: qD,
        detachedBandwidthHz: det && qD ? det.fr / qD : null,
        loadingRatio: qA && qD ? qA / qD : null,
        downstreamShare: share,
        flat,
        f0LocalHz: built.f0AtFlatNode[flat],
        downstreamLabel: downstreamOf(built, flat),
      };
    }
    const section = stage.firstSection + decl.section;
    const res =
      decl.section >= 0 && decl.section < stage.sectionCount
        ? resonate(built, grid, gridNa, seriesExtract(built, section), f0)
        : null;
    const q = nn(res?.q);
    return {
      ...base,
      node: null,
      resonanceHz: res ? res.fr : null,
      loadedQ: q,
      unloadedQ: res ? ownResonance(decl.ownImpedance, res.fr) : null,
      bandwidthHz: res && q ? res.fr / q : null,
      detachedQ: null,
      detachedBandwidthHz: null,
      loadingRatio: null,
      downstreamShare: null,
      flat: section,
      f0LocalHz: built.f0AtFlatNode[min(section, built.f0AtFlatNode.length - 1)],
      downstreamLabel: downstreamOf(built, section + 1),
    };
  });
}

type BuiltStageOf = BuiltChain['twoPorts'][number];
type ShuntDecl = ResonatorDecl & { kind: 'shunt' };

/**
 * A tank of a coupled pair. Its Q comes from its own susceptance slope and the conductance
 * at its node (see coupledExtract). The first tank (partner downstream) is reported loaded
 * by everything at its node and detached as itself plus the source; it is damped by its
 * partner on purpose, so it gets no loading ratio. The second tank (partner upstream)
 * is judged like any tank: with and without the stages after it.
 */
function coupledTank(
  built: BuiltChain,
  grid: Float64Array,
  gridNa: NodeAnalysis,
  stage: BuiltStageOf,
  decl: ShuntDecl,
  base: Pick<ResonatorFinding, 'stageId' | 'label' | 'kind'>,
): ResonatorFinding {
  const first = decl.coupledPartner === 'downstream';
  const flat = first ? stage.firstSection : stage.firstSection + stage.sectionCount;
  const f0 = built.settings.f0Hz;
  const own = decl.ownAdmittance;
  const att = resonate(built, grid, gridNa, coupledExtract(flat, own, true, true, false), f0);
  const det = first
    ? resonate(built, grid, gridNa, coupledExtract(flat, own, true, false, true), f0)
    : resonate(built, grid, gridNa, coupledExtract(flat, own, true, false, false), f0);
  const qA = nn(att?.q);
  const qD = nn(det?.q);
  let share: number | null = null;
  if (att && !first) {
    const one = runNodeAnalysis(built, [att.fIn]);
    const zr = one.zinRe[flat];
    const zi = one.zinIm[flat];
    const gDown = isFiniteNumber(zr) && isFiniteNumber(zi) ? zr / (zr * zr + zi * zi) : 0;
    share = att.real > 0 ? gDown / att.real : null;
  }
  return {
    ...base,
    node: userNodeOf(built, flat),
    resonanceHz: att ? att.fr : null,
    loadedQ: qA,
    unloadedQ: att ? ownResonance(own, att.fr) : null,
    bandwidthHz: att && qA ? att.fr / qA : null,
    detachedQ: qD,
    detachedBandwidthHz: det && qD ? det.fr / qD : null,
    loadingRatio: !first && qA && qD ? qA / qD : null,
    downstreamShare: share,
    flat,
    f0LocalHz: built.f0AtFlatNode[flat],
    downstreamLabel: first ? 'its coupled partner' : downstreamOf(built, flat),
  };
}
