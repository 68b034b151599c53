/**
 * The response at a study's judged node over the sweep, for many chains that differ from one
 * nominal chain only in some stage values (a Monte Carlo run's drawn chains).
 *
 * A trial needs the sweep for one thing: the step-up |V[node]|/|Es| at the judged node, which
 * brackets the peak and the −3 dB edges. So this runs only what that needs: the backward pass
 * (load → source) and the voltage from the source up to the node, with the node analysis's own
 * steps in the same order (core/nodes.ts), so the figures are the ones a full sweep gives. The
 * impedance toward the source at each node (the forward pass), and voltages past the node, are
 * not worked out.
 *
 * A section whose stage was not drawn is the nominal's own object (buildChain with `like`
 * takes its model over), and its matrices over the grid are the same in every trial: they are
 * filled once, for the nominal, and read from then on. Only the drawn stages' sections are
 * filled per trial. A section behind a drawn frequency-changing section sees other
 * frequencies, so from there on nothing is read from the nominal.
 */
import type { BuiltChain } from '../core/build';
import {
  backSection,
  MIN_NODE_HZ,
  sourceStep,
  voltageSection,
  type NodeAnalysis,
} from '../core/nodes';
import type { Probe } from '../core/probe';
import { locateEdge, locateGridPeak, powerMax, stepUpPower, toDb } from '../core/response-shape';
import type { ComplexFn, Section } from '../types';

const { log10, max } = Math;

/** The response at one node over a fixed grid, for chains like one nominal chain. */
export interface JudgedSweep {
  /** Input frequencies of the grid, Hz. */
  readonly freqs: Float64Array;
  /**
   * A node analysis of `built` (a chain built like the nominal, its load level settled) over
   * the grid, worked out only as far as the voltage at flat node `flat` needs: the frequencies,
   * EMF and Zin at every node, and the voltages at nodes 0 … flat. Zsrc and the voltages past
   * `flat` are not filled. Its arrays are the sweep's own, valid until the next call.
   */
  run(built: BuiltChain, flat: number): NodeAnalysis;
}

/** The stage model's own section behind flat section j (stable while the model is reused). */
function modelSection(built: BuiltChain, j: number): Section {
  const stage = built.twoPorts[built.sectionStage[j]];
  return stage.model.sections[j - stage.firstSection];
}

function fillComplex(fn: ComplexFn, f: Float64Array, fo: number, n: number, out: Float64Array) {
  if (fn.fill) fn.fill(f, fo, n, out, 0, 2);
  else for (let k = 0; k < n; k++) fn(f[fo + k], out, 2 * k);
}

/**
 * One step of the passes: sections from … to−1, as one matrix per grid point. A run of the
 * nominal's sections carries its product (`m`), the same in every trial; a single section
 * (`m` null) reads its matrices of the trial.
 */
interface Step {
  from: number;
  to: number;
  m: Float64Array | null;
}

/**
 * The steps over sections 0 … N−1 (N = hits.length): each run of sections read from the
 * nominal (`hits`) joined into one product matrix, a run never crossing node `flat` (whose
 * voltage is asked). The ABCD matrix of a cascade is the product of its sections' matrices
 * (each at its own node's frequency), so Zin and the voltage across a run come out as across
 * its sections one by one, to rounding; the grid only brackets the peak and the edges, which
 * are then located at single frequencies. A run whose product is not finite everywhere (a
 * section's open or short) keeps its sections apart.
 */
function planSteps(mats: Float64Array[], hits: Uint8Array, flat: number, P: number): Step[] {
  const N = hits.length;
  const steps: Step[] = [];
  let j = 0;
  while (j < N) {
    let end = j + 1;
    if (hits[j]) while (end < N && hits[end] && end !== flat) end++;
    const joined = end - j > 1 ? product(mats, j, end, P) : null;
    if (joined) steps.push({ from: j, to: end, m: joined });
    else for (let i = j; i < end; i++) steps.push({ from: i, to: i + 1, m: null });
    j = end;
  }
  return steps;
}

/** The product of sections from … to−1's matrices at every grid point, or null if not finite. */
function product(mats: Float64Array[], from: number, to: number, P: number): Float64Array | null {
  const out = Float64Array.from(mats[from]);
  for (let j = from + 1; j < to; j++) {
    const b = mats[j];
    for (let o = 0; o < 8 * P; o += 8) {
      const [ar, ai, br, bi, cr, ci, dr, di] = [out[o], out[o + 1], out[o + 2], out[o + 3], out[o + 4], out[o + 5], out[o + 6], out[o + 7]]; // prettier-ignore
      const [er, ei, fr, fi, gr, gi, hr, hi] = [b[o], b[o + 1], b[o + 2], b[o + 3], b[o + 4], b[o + 5], b[o + 6], b[o + 7]]; // prettier-ignore
      // [A B; C D]·[E F; G H]
      out[o] = ar * er - ai * ei + (br * gr - bi * gi);
      out[o + 1] = ar * ei + ai * er + (br * gi + bi * gr);
      out[o + 2] = ar * fr - ai * fi + (br * hr - bi * hi);
      out[o + 3] = ar * fi + ai * fr + (br * hi + bi * hr);
      out[o + 4] = cr * er - ci * ei + (dr * gr - di * gi);
      out[o + 5] = cr * ei + ci * er + (dr * gi + di * gr);
      out[o + 6] = cr * fr - ci * fi + (dr * hr - di * hi);
      out[o + 7] = cr * fi + ci * fr + (dr * hi + di * hr);
    }
  }
  return out.every(Number.isFinite) ? out : null;
}

/**
 * The judged-node sweep of chains like `nominal` (as built; its load level need not be settled)
 * over `freqs`.
 */
export function createJudgedSweep(nominal: BuiltChain, freqs: ArrayLike<number>): JudgedSweep {
  const P = freqs.length;
  const grid = Float64Array.from(freqs);
  let N = -1;
  let fNodeAll = new Float64Array(0);
  let zinReAll = fNodeAll;
  let zinImAll = fNodeAll;
  let vReAll = fNodeAll;
  let vImAll = fNodeAll;
  let scratch: Float64Array[] = [];
  const mats: Float64Array[] = [];
  /** 1 where section j's matrices were read from the nominal in the last fill. */
  let hits = new Uint8Array(0);
  const zsRe = new Float64Array(P);
  const zsIm = new Float64Array(P);
  const emf = new Float64Array(P);
  const pair = new Float64Array(2 * P);
  const unfilled = new Float64Array(0);

  function shape(n: number): void {
    if (n === N) return;
    N = n;
    fNodeAll = new Float64Array((N + 1) * P);
    zinReAll = new Float64Array((N + 1) * P);
    zinImAll = new Float64Array((N + 1) * P);
    vReAll = new Float64Array((N + 1) * P);
    vImAll = new Float64Array((N + 1) * P);
    scratch = Array.from({ length: N }, () => new Float64Array(8 * P));
    hits = new Uint8Array(N);
  }

  /** Fills sections 0 … N−1 into `mats`; a nominal section's matrices come from `fixed`. */
  function fillSections(built: BuiltChain, fixed: Map<Section, Float64Array> | null): void {
    const fNode = fNodeAll;
    fNode.set(grid, 0);
    let sameFrequencies = true;
    for (let j = 0; j < N; j++) {
      const s = built.sections[j];
      const own = fixed && sameFrequencies ? fixed.get(modelSection(built, j)) : undefined;
      hits[j] = own ? 1 : 0;
      if (own) mats[j] = own;
      else {
        s.fill(fNode, j * P, P, scratch[j], 0);
        mats[j] = scratch[j];
      }
      const at = j * P;
      const tr = s.translate;
      if (tr) {
        if (!own) sameFrequencies = false;
        for (let k = 0; k < P; k++) fNode[at + P + k] = max(tr(fNode[at + k]), MIN_NODE_HZ);
      } else fNode.copyWithin(at + P, at, at + P);
    }
  }

  // The nominal's matrices over the grid, kept for every later chain.
  shape(nominal.sections.length);
  fillSections(nominal, null);
  const fixed = new Map<Section, Float64Array>();
  for (let j = 0; j < N; j++) fixed.set(modelSection(nominal, j), Float64Array.from(mats[j]));
  const nominalSource = nominal.source.model;
  fillComplex(nominalSource.impedance, grid, 0, P, pair);
  const fixedZs = Float64Array.from(pair);
  const fixedEmf = Float64Array.from(grid, (f) => nominalSource.emf(f));

  /** The steps of the last fill for node `flat`, by which sections were the nominal's. */
  const plans = new Map<string, Step[]>();
  function stepsFor(flat: number): Step[] {
    const key = `${flat}:${hits.join('')}`;
    let steps = plans.get(key);
    if (!steps) {
      steps = planSteps(mats, hits, flat, P);
      plans.set(key, steps);
    }
    return steps;
  }

  function run(built: BuiltChain, flat: number): NodeAnalysis {
    shape(built.sections.length);
    fillSections(built, fixed);
    // Locals, not the closure's reassignable bindings, in the loops below.
    const zinRe = zinReAll;
    const zinIm = zinImAll;
    const vRe = vReAll;
    const vIm = vImAll;
    const fNode = fNodeAll;
    // Backward pass, load → source.
    fillComplex(built.load.model.impedance, fNode, N * P, P, pair);
    for (let k = 0; k < P; k++) {
      zinRe[N * P + k] = pair[2 * k];
      zinIm[N * P + k] = pair[2 * k + 1];
    }
    const steps = stepsFor(flat);
    for (let q = steps.length - 1; q >= 0; q--) {
      const { from, to } = steps[q];
      const m = steps[q].m ?? mats[from];
      backSection(m, 0, zinRe, zinIm, from * P, (to - from) * P, P);
    }
    // The voltage at the source terminal, then step by step up to the node.
    const source = built.source.model;
    const zs = source === nominalSource ? fixedZs : pair;
    if (source === nominalSource) emf.set(fixedEmf);
    else {
      for (let k = 0; k < P; k++) emf[k] = source.emf(grid[k]);
      fillComplex(source.impedance, grid, 0, P, pair);
    }
    for (let k = 0; k < P; k++) {
      zsRe[k] = zs[2 * k];
      zsIm[k] = zs[2 * k + 1];
      sourceStep(emf, zsRe, zsIm, zinRe, zinIm, vRe, vIm, k, k);
    }
    for (const { from, to, m: joined } of steps) {
      if (from >= flat) break;
      const m = joined ?? mats[from];
      // A section of its own may be one shunt admittance, a joined run is not said to be.
      const shunt = joined === null && built.sections[from].ladder === 'shunt';
      voltageSection(m, 0, zinRe, zinIm, to * P, P, vRe, vIm, from * P, vRe, vIm, to * P, shunt); // prettier-ignore
    }
    return {
      points: P,
      nodes: N + 1,
      freqs: grid,
      fNode,
      zinRe,
      zinIm,
      zsrcRe: unfilled,
      zsrcIm: unfilled,
      vRe,
      vIm,
      emf,
      blockAbcd: unfilled,
      blockPair: pair,
      runs: 1,
    };
  }

  return { freqs: grid, run };
}

/** The −3 dB points are the half-power points (as core/selectivity.ts reads them). */
const HALF_POWER_DB = 10 * log10(2);

/** What a study reads at its judged node: peak, −3 dB width, image rejection. */
export interface JudgedSelectivity {
  peakHz: number | null;
  bw3dbHz: number | null;
  imageRejectionDb: number | null;
}

const finiteOrNull = (v: number | null): number | null =>
  v === null || !Number.isFinite(v) ? null : v;

/**
 * The judged node's selectivity figures as core/selectivity.ts states them for one node (peak
 * and −3 dB edges bracketed on the sweep and located at single frequencies, the image
 * rejection from single frequencies), from the judged-node sweep.
 */
export function judgedSelectivity(
  built: BuiltChain,
  sweep: JudgedSweep,
  probe: Probe,
  node: number,
  imageHz: number | null,
): JudgedSelectivity {
  const flat = built.userNodeFlat[node];
  const na = sweep.run(built, flat);
  const power = new Float64Array(na.points);
  stepUpPower(na, flat, power);
  const k = powerMax(power, na.points);
  const peak = k >= 0 ? locateGridPeak(probe, na, flat, k) : null;
  let bw3: number | null = null;
  if (peak && na.points > 2) {
    const lo = locateEdge(probe, flat, na, power, k, peak.db - HALF_POWER_DB, -1);
    const hi = locateEdge(probe, flat, na, power, k, peak.db - HALF_POWER_DB, 1);
    bw3 = lo && hi ? hi.fHz - lo.fHz : null;
  }
  const image =
    imageHz === null
      ? null
      : toDb(probe.at(built.settings.f0Hz, flat, true)) - toDb(probe.at(imageHz, flat, true));
  return {
    peakHz: peak ? finiteOrNull(peak.fHz) : null,
    bw3dbHz: finiteOrNull(bw3),
    imageRejectionDb: finiteOrNull(image),
  };
}
