/**
 * The two tanks of a coupled pair, and where the pair really peaks.
 *
 * Each tank's Q comes from its own susceptance slope and the conductance at its node (see
 * coupledExtract): the node's total susceptance carries the partner's resonance too. The first
 * tank (partner downstream) is reported loaded by everything at its node and detached as
 * itself plus the source; it is damped by its partner on purpose, so it gets no loading ratio.
 * The second tank (partner upstream) is judged like any tank: with and without the stages
 * after it.
 *
 * A pair pulled by its coupling or by what hangs across it does not peak where either tank
 * alone resonates, so the pair also reports the maximum of the voltage at its output node and
 * the −3 dB width there; the detune flag judges the pair by that.
 */
import type { ComplexFn, ResonatorDecl } from '../types';
import type { BuiltChain, BuiltStage } from './build';
import {
  coupledExtract,
  DIFF_STEP,
  ownResonance,
  probePointEval,
  type OwnResonanceMemo,
  resonate,
  type Extract,
  type PointEval,
  type Resonance,
} from './extract-resonance';
import { nearestRisingOutward } from './nearest-crossing';
import { solveBracketed } from './refine';
import type { NodeAnalysis } from './nodes';
import type { Probe } from './probe';
import { halfPowerShape, type ShapeMemo } from './response-shape';

const isFiniteNumber = Number.isFinite;

type ShuntDecl = ResonatorDecl & { kind: 'shunt' };

/** What a coupled tank reports (before the common fields are added). */
export interface CoupledTankFigures {
  flat: number;
  /** Input frequency of the tank's resonance, Hz. */
  fIn: number | null;
  resonanceHz: number | null;
  loadedQ: number | null;
  unloadedQ: number | null;
  detachedQ: number | null;
  loadingRatio: number | null;
  downstreamShare: number | null;
  detachedFr: number | null;
}

const nn = (x: number | undefined) => (x === undefined || Number.isNaN(x) ? null : x);

/** The flat node of a pair's tank: the stage's first for the first tank, else its last. */
export function pairTankFlat(stage: BuiltStage, decl: ShuntDecl): number {
  return decl.coupledPartner === 'downstream'
    ? stage.firstSection
    : stage.firstSection + stage.sectionCount;
}

/**
 * Whether a section before `flat` changes frequency: a pair's tank there is searched on the
 * grid's node analysis (its Zsrc, Zin and frequency at `flat`), else on its own susceptance.
 */
export function translatedBefore(built: BuiltChain, flat: number): boolean {
  let translated = false;
  for (let j = 0; j < flat; j++) translated ||= !!built.sections[j].translate;
  return translated;
}

/**
 * One tank of a pair.
 * @param memo the analysis's own-resonance answers so far: both tanks are usually one element
 */
export function coupledTank(
  built: BuiltChain,
  gridNa: NodeAnalysis,
  probe: Probe,
  stage: BuiltStage,
  decl: ShuntDecl,
  memo?: OwnResonanceMemo,
): CoupledTankFigures {
  const first = decl.coupledPartner === 'downstream';
  const flat = pairTankFlat(stage, decl);
  const grid = gridNa.freqs;
  const f0 = built.settings.f0Hz;
  const own = decl.ownAdmittance;
  const extracts = [
    coupledExtract(flat, own, true, true, false),
    coupledExtract(flat, own, true, false, first),
  ];
  const translated = translatedBefore(built, flat);
  // The extracts read Zsrc, Zin and the frequency at the tank's node only.
  const at = probePointEval(probe, flat);
  const [att, det] = translated
    ? extracts.map((x) => resonate(at, grid, gridNa, x, f0))
    : ownSusceptanceZero(at, own, grid, f0, extracts);
  const qA = nn(att?.q);
  const qD = nn(det?.q);
  let share: number | null = null;
  if (att && !first) {
    probe.at(att.fIn, flat);
    const zr = probe.zinRe[flat];
    const zi = probe.zinIm[flat];
    const gDown = isFiniteNumber(zr) && isFiniteNumber(zi) ? zr / (zr * zr + zi * zi) : 0;
    share = att.real > 0 ? gDown / att.real : null;
  }
  return {
    flat,
    fIn: att ? att.fIn : null,
    resonanceHz: att ? att.fr : null,
    loadedQ: qA,
    unloadedQ: att ? ownResonance(own, att.fr, memo) : null,
    detachedQ: qD,
    detachedFr: det ? det.fr : null,
    loadingRatio: !first && qA && qD ? qA / qD : null,
    downstreamShare: share,
  };
}

/**
 * Both resonances of one tank (attached and detached) when nothing before its node changes
 * frequency. Their imaginary part is the tank's own susceptance at the input frequency, so
 * the bracket and the zero are found on the element alone and the chain is evaluated once,
 * at the zero, for both real parts: the same numbers as `resonate` with each extract, which
 * evaluated the chain at every step of the search only to read the node's frequency.
 */
export function ownSusceptanceZero(
  at: PointEval,
  own: ComplexFn,
  grid: Float64Array,
  target: number,
  extracts: Extract[],
): (Resonance | null)[] {
  const y = new Float64Array(2);
  const ownIm = (f: number) => {
    own(f, y, 0);
    return y[1];
  };
  const valueAt = (i: number, v: Float64Array) => {
    v[0] = ownIm(grid[i]);
    v[1] = grid[i];
  };
  const k = nearestRisingOutward(grid.length, (i) => grid[i], valueAt, target, new Float64Array(2)); // prettier-ignore
  const fIn = k < 0 ? NaN : solveBracketed(ownIm, grid[k], grid[k + 1]);
  if (!isFiniteNumber(fIn)) return extracts.map(() => null);
  const fLo = fIn * (1 - DIFF_STEP);
  const fHi = fIn * (1 + DIFF_STEP);
  const imLo = ownIm(fLo);
  const slope = (ownIm(fHi) - imLo) / (2 * Math.PI * (fHi - fLo)); // d(im)/dω at the node
  const view = at(fIn);
  const out = new Float64Array(3);
  return extracts.map((extract) => {
    extract(view, 0, out);
    const real = out[0];
    const q = ((2 * Math.PI * fIn) / (2 * real)) * slope;
    return { fIn, fr: fIn, real, q: isFiniteNumber(q) && q > 0 ? q : NaN };
  });
}

/**
 * Where a pair peaks: the highest point of the voltage at its output node over the grid,
 * located by single-frequency evaluations, and its −3 dB width there (input Hz).
 * @param memo where the shape found is kept for the selectivity of the same grid (when given)
 */
export function pairPeak(
  built: BuiltChain,
  gridNa: NodeAnalysis,
  probe: Probe,
  stage: BuiltStage,
  memo?: ShapeMemo,
): { peakHz: number; bandwidthHz: number | null } | null {
  const flat = stage.firstSection + stage.sectionCount;
  const shape = halfPowerShape(probe, gridNa, flat);
  memo?.set(flat, shape);
  const { peak, lo, hi } = shape;
  if (!peak) return null;
  return { peakHz: peak.fHz, bandwidthHz: lo && hi ? hi.fHz - lo.fHz : null };
}
