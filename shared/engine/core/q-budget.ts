/**
 * The q-budget of a matching network or filter: the insertion loss its parts' finite Q cause
 * at f0, in dB, and the part Q that would bring that loss under the chain's limit.
 *
 * Loss = 10·log10(P_ideal/P_real), with P the power the stage delivers out of its output node
 * in the chain as built (the terminations it really sees), P_ideal with every part-Q
 * parameter set lossless (1e12). It counts the power the parts dissipate and the match they
 * spoil by their loss (for an L network of loaded Q Qn built with parts of unloaded Q Qu the
 * dissipated part alone is about 10·log10(1/(1 − Qn/Qu)), common practice). The part Q
 * needed: every part-Q parameter raised to at least q, the stage rebuilt and the chain
 * evaluated at f0, with q solved for (log-space bisection to 1 %).
 */
import type { ParamValues, TwoPortModel } from '../types';
import type { BuiltChain, BuiltStage } from './build';
import { pointwiseFill, runNodeAnalysis, sharedWorkspace, type NodeAnalysis } from './nodes';
import { deliveredPower } from './quantities';

const { log10, sqrt } = Math;
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
  return stage.definition.params
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

/** Power out of the stage at f0 with its part Q raised to at least q (Infinity: as built). */
function powerOut(
  built: BuiltChain,
  stage: BuiltStage<TwoPortModel>,
  keys: string[],
  q: number,
): number {
  let b: BuiltChain | null = built;
  if (Number.isFinite(q)) {
    const values = { ...stage.values };
    for (const k of keys) values[k] = Math.max(Number(values[k]), q);
    b = withValues(built, stage, values);
  }
  if (!b) return NaN;
  const na = runNodeAnalysis(b, [built.settings.f0Hz], sharedWorkspace('point', b, 1));
  return deliveredPower(na, stage.firstSection + stage.sectionCount, 0);
}

/** The chain with one stage rebuilt from other values (same section count), or null. */
function withValues(
  built: BuiltChain,
  stage: BuiltStage<TwoPortModel>,
  values: ParamValues,
): BuiltChain | null {
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
  const sections = model.sections;
  const all = built.sections.slice();
  for (let j = 0; j < sections.length; j++) {
    const sec = sections[j];
    all[stage.firstSection + j] = sec.fill ? { ...sec, fill: sec.fill } : { ...sec, fill: pointwiseFill(sec) }; // prettier-ignore
  }
  return { ...built, sections: all };
}

/**
 * The stage's q-budget at f0, or null when it has no figure (no power through it).
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
  const ideal = powerOut(built, stage, keys, LOSSLESS_Q);
  const real = deliveredPower(f0Na, stage.firstSection + stage.sectionCount, 0);
  if (!(ideal > 0 && real > 0)) return null;
  const lossAt = (q: number) => 10 * log10(ideal / powerOut(built, stage, keys, q));
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
