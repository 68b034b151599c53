/**
 * The q-budget of a matching network or filter: the insertion loss its parts' finite Q cause
 * at f0, in dB, and the part Q that would bring that loss under the chain's limit.
 *
 * Loss = 10·log10(P_ideal/P_real), with P the power the stage delivers out of its output node
 * in the chain as built (the terminations it really sees), P_ideal with every part-Q
 * parameter set lossless (1e12). It counts the power the parts dissipate and the match they
 * spoil by their loss (for an L network of loaded Q Qn built with parts of unloaded Q Qu the
 * dissipated part alone is about 10·log10(1/(1 − Qn/Qu)), common practice). The part Q
 * needed: every part-Q parameter raised to at least q, the stage rebuilt and evaluated at f0
 * between the terminations the chain gives it, with q solved for (log-space bisection to 1 %).
 */
import type { ParamValues, Section, StageDefinition, TwoPortModel } from '../types';
import type { BuiltChain, BuiltStage } from './build';
import { backStep, sourceStep, voltageStep, type NodeAnalysis } from './nodes';

const { log10, sqrt } = Math;
const isFinite = Number.isFinite;
/** A part-Q parameter's upper bound (the catalogue's "1e12 is lossless"). */
const LOSSLESS_Q = 1e12;

/** The q-budget of one stage. */
export interface QBudget {
  lossDb: number;
  /** Part Q (all parts) that brings the loss down to the limit; null when none does. */
  neededQ: number | null;
  /** The lowest part Q the stage has now. */
  partQ: number;
}

/**
 * Keys of a stage's part-Q parameters: the catalogue's Q parameters (ratio, up to 1e12, the
 * unloaded Q of a part), not a design's loaded Q.
 */
function partQKeys(stage: BuiltStage): string[] {
  const def = stage.definition;
  let keys = partQKeysOf.get(def);
  if (!keys) partQKeysOf.set(def, (keys = findPartQKeys(def)));
  return keys;
}

/** Each stage type's part-Q keys, found once per type (its parameter list never changes). */
const partQKeysOf = new WeakMap<StageDefinition, string[]>();

function findPartQKeys(def: StageDefinition): string[] {
  return def.params
    .filter(
      (p) =>
        p.kind === 'number' &&
        p.unit === 'ratio' &&
        p.max === LOSSLESS_Q &&
        (p.help ?? '').startsWith('Unloaded Q'),
    )
    .map((p) => p.key);
}

/**
 * Stages judged: passive matching networks, and filters of more than one section (a filter
 * between terminations, such as a coupled pair), with part-Q parameters. A single tuned
 * circuit across or in the line is not: a tank feeding a high-impedance grid or detector
 * dissipates most of the little power it takes on purpose, and its loading is what the
 * loading flag judges.
 */
export function judgedForQ(stage: BuiltStage): stage is BuiltStage<TwoPortModel> {
  const cat = stage.definition.category;
  return (
    'sections' in stage.model &&
    (cat === 'matching' || (cat === 'filter' && stage.sectionCount > 1)) &&
    stage.sectionCount > 0 &&
    (stage.model as TwoPortModel).sections.every((s) => !s.unilateral && !s.translate) &&
    partQKeys(stage).length > 0
  );
}

/**
 * The stage between what the chain puts on either side of it at f0: the source side as its
 * Thevenin equivalent at the stage's input (Zsrc there, and the open-circuit voltage the node
 * analysis implies: V·(Zsrc + Zin)/Zin), the load side as Zin at its output. Neither depends
 * on the stage's own parts, so a stage rebuilt with other part Q is judged by evaluating its
 * own sections alone instead of the whole chain again.
 */
interface Surroundings {
  /** Flat index of the stage's first section. */
  first: number;
  /** |Voc|², V² (PEAK). */
  voc2: number;
  zsRe: number;
  zsIm: number;
  zlRe: number;
  zlIm: number;
  /** The frequency each of the stage's sections sees, Hz. */
  fNode: Float64Array;
}

function surroundings(f0Na: NodeAnalysis, stage: BuiltStage<TwoPortModel>): Surroundings {
  const i = stage.firstSection;
  const o = i + stage.sectionCount;
  const zr = f0Na.zinRe[i];
  const zi = f0Na.zinIm[i];
  const zsRe = f0Na.zsrcRe[i];
  const zsIm = f0Na.zsrcIm[i];
  const v2 = f0Na.vRe[i] ** 2 + f0Na.vIm[i] ** 2;
  // An open input draws nothing: its voltage is the open-circuit voltage itself.
  const voc2 = isFinite(zr) && isFinite(zi) ? (v2 * ((zsRe + zr) ** 2 + (zsIm + zi) ** 2)) / (zr * zr + zi * zi) : v2; // prettier-ignore
  return { first: i, voc2, zsRe, zsIm, zlRe: f0Na.zinRe[o], zlIm: f0Na.zinIm[o], fNode: f0Na.fNode.slice(i, o) }; // prettier-ignore
}

/**
 * Power the sections deliver into the load side, W, fed from the source side (see
 * Surroundings): the node analysis's own steps (nodes.ts) over the stage's sections alone,
 * driven by a 1 V EMF and scaled by |Voc|².
 */
function deliveredThrough(sections: readonly Section[], at: Surroundings): number {
  const n = sections.length;
  const { m, zinRe, zinIm, vRe, vIm, zsRe, zsIm } = scratchFor(n);
  for (let j = 0; j < n; j++) sections[j].abcd(at.fNode[j], m, 8 * j);
  zinRe[n] = at.zlRe;
  zinIm[n] = at.zlIm;
  for (let j = n - 1; j >= 0; j--) backStep(m, 8 * j, zinRe, zinIm, j + 1, j);
  zsRe[0] = at.zsRe;
  zsIm[0] = at.zsIm;
  sourceStep(UNIT_EMF, zsRe, zsIm, zinRe, zinIm, vRe, vIm, 0, 0);
  for (let j = 0; j < n; j++) voltageStep(m, 8 * j, zinRe, zinIm, vRe, vIm, j, j + 1, sections[j].ladder === 'shunt'); // prettier-ignore
  const zr = at.zlRe;
  const zi = at.zlIm;
  const g = isFinite(zr) && isFinite(zi) ? zr / (zr * zr + zi * zi) : 0;
  return (at.voc2 * (vRe[n] ** 2 + vIm[n] ** 2) * g) / 2;
}

/**
 * The arrays of {@link deliveredThrough}, kept between calls (a q-budget evaluates its stage
 * a dozen times or so, every analysis): each slot it reads it has written in the same call.
 */
interface DeliveryScratch {
  sections: number;
  m: Float64Array;
  zinRe: Float64Array;
  zinIm: Float64Array;
  vRe: Float64Array;
  vIm: Float64Array;
  /** The source side's impedance, one slot each. */
  zsRe: Float64Array;
  zsIm: Float64Array;
}

let delivery: DeliveryScratch | null = null;

function scratchFor(sections: number): DeliveryScratch {
  if (delivery && delivery.sections >= sections) return delivery;
  const n = Math.max(sections, 8);
  delivery = {
    sections: n,
    m: new Float64Array(8 * n),
    zinRe: new Float64Array(n + 1),
    zinIm: new Float64Array(n + 1),
    vRe: new Float64Array(n + 1),
    vIm: new Float64Array(n + 1),
    zsRe: new Float64Array(1),
    zsIm: new Float64Array(1),
  };
  return delivery;
}

const UNIT_EMF = Float64Array.of(1);

/** Power out of the stage at f0 with its part Q raised to at least q (Infinity: as built). */
function powerOut(
  built: BuiltChain,
  at: Surroundings,
  stage: BuiltStage<TwoPortModel>,
  keys: string[],
  q: number,
): number {
  if (!Number.isFinite(q)) {
    const first = stage.firstSection;
    return deliveredThrough(built.sections.slice(first, first + stage.sectionCount), at);
  }
  const values = { ...stage.values };
  for (const k of keys) values[k] = Math.max(Number(values[k]), q);
  const sections = sectionsWith(built, stage, values);
  return sections ? deliveredThrough(sections, at) : NaN;
}

/** The stage's sections rebuilt from other values (same section count), or null. */
function sectionsWith(
  built: BuiltChain,
  stage: BuiltStage<TwoPortModel>,
  values: ParamValues,
): readonly Section[] | null {
  let model;
  try {
    model = stage.definition.build(values, {
      f0Hz: built.f0AtFlatNode[stage.firstSection],
      temperatureK: built.settings.temperatureK,
    });
  } catch {
    return null; // values the stage cannot take: no figure rather than a wrong one
  }
  if (!('sections' in model) || model.sections.length !== stage.sectionCount) return null;
  return model.sections;
}

/**
 * The stage's q-budget at f0, or null when it has no figure (no power through it) or its
 * loss cannot exceed the limit (the source side's available power is within the limit of
 * what it delivers).
 * @param f0Na the chain's node analysis at f0
 * @param limitDb the loss above which the needed Q is worked out
 */
export function qBudget(
  built: BuiltChain,
  f0Na: NodeAnalysis,
  stage: BuiltStage<TwoPortModel>,
  limitDb: number,
): QBudget | null {
  const keys = partQKeys(stage);
  const at = surroundings(f0Na, stage);
  const real = powerOut(built, at, stage, keys, Infinity);
  // No lossless stage delivers more than the source side makes available, |Voc|²/(8·Re Zs):
  // when that is within the limit of what the stage delivers now, so is its loss, and the
  // lossless rebuild is not needed.
  const available = at.zsRe > 0 ? at.voc2 / (8 * at.zsRe) : NaN;
  if (real > 0 && available <= real * 10 ** (limitDb / 10)) return null;
  const ideal = powerOut(built, at, stage, keys, LOSSLESS_Q);
  if (!(ideal > 0 && real > 0)) return null;
  const lossAt = (q: number) => 10 * log10(ideal / powerOut(built, at, stage, keys, q));
  const lossDb = 10 * log10(ideal / real);
  const partQ = Math.min(...keys.map((k) => Number(stage.values[k])));
  if (!(lossDb > limitDb)) return { lossDb, neededQ: null, partQ };
  let lo = partQ;
  let hi = LOSSLESS_Q;
  while (hi / lo > 1.01) {
    const mid = sqrt(lo * hi);
    const l = lossAt(mid);
    if (!Number.isFinite(l)) return { lossDb, neededQ: null, partQ };
    if (l > limitDb) lo = mid;
    else hi = mid;
  }
  return { lossDb, neededQ: hi, partQ };
}
