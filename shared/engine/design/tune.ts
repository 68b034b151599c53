/**
 * Tune to f0: solve one inductance or capacitance so that a resonator of the chain (declared
 * by a stage or found in the network) resonates at the target, or so that the pass-band peak
 * of the response at a chosen node sits there, by root finding on the whole chain, so
 * coupling, loading and parasitics all count.
 *
 * The unknown is x = ln(value) and the residual g(x) = ln(fr/target) (fr: the resonance or
 * the peak). For an LC resonance
 * fr ∝ value^(−1/2), which gives the first step; after that a secant step is taken, kept
 * inside the bracket once the residual has changed sign (bisection when the secant step
 * leaves it). The answer is the chain's own resonance, not the closed form.
 */
import { analyzeResonators } from '../core/resonators';
import { StageParameterError } from '../errors';
import { passbandPeak } from './passband-peak';
import type { ParamSpec, ResonatorReport } from '../types';
import type { ChainDocument } from '../../schema/chain';
import {
  buildDoc,
  definitionOf,
  numberValue,
  paramShown,
  stageOf,
  withValue,
  type DesignOptions,
} from './chain-edit';

/** Which resonator: as listed in the analysis result's `resonators`. */
export interface ResonatorRef {
  stageId: string;
  label: string;
}

/** Which value to solve: a stage and one of its inductance or capacitance parameters. */
export interface ElementRef {
  stageId: string;
  key: string;
}

export interface TuneRequest {
  /** The resonator to put on the target (required unless `peakNode` is given). */
  resonator?: ResonatorRef;
  element: ElementRef;
  targetHz: number;
  /**
   * Put the pass-band peak of |V|/|Es| at this user-level node on the target instead of the
   * resonator's resonance.
   */
  peakNode?: number;
  /** Relative accuracy of the resonance (default 1e-9; 1e-8 for a peak). */
  tolerance?: number;
}

export interface TuneResult {
  element: ElementRef;
  previousValue: number;
  value: number;
  unit: 'henry' | 'farad';
  targetHz: number;
  /** What was put on the target: a resonator's resonance or the pass-band peak at a node. */
  target: 'resonance' | 'peak';
  /** The node whose peak was tuned (target 'peak'). */
  peakNode?: number;
  /** The resonance, or the peak, after the solve. */
  resonanceHz: number;
  /** |fr − target|/target after the solve. */
  relativeError: number;
  /** The resonator's loaded Q; for a peak without a resonator, peak ÷ −3 dB width. */
  loadedQ: number | null;
  /** The resonator's −3 dB width; for a peak, the −3 dB width at its node. */
  bandwidthHz: number | null;
  iterations: number;
}

/** A value that can be solved for a resonator, and where it sits. */
export interface TuneCandidate extends ElementRef {
  label: string;
  unit: 'henry' | 'farad';
  value: number;
  /** The resonator's own stage, or the one before or after it. */
  where: 'own' | 'before' | 'after';
}

const MAX_ITERATIONS = 80;

function isReactive(p: ParamSpec): p is ParamSpec & { unit: 'henry' | 'farad' } {
  return p.kind === 'number' && (p.unit === 'henry' || p.unit === 'farad');
}

/**
 * The values that can tune a resonator: inductances and capacitances of its own stage and
 * of the stages on either side of it (e.g. the capacitor across a coupled secondary).
 */
export function tuneCandidates(
  doc: ChainDocument,
  resonator: ResonatorRef,
  options: DesignOptions = {},
): TuneCandidate[] {
  const index = doc.stages.findIndex((s) => s.id === resonator.stageId);
  if (index < 0) stageOf(doc, resonator.stageId);
  const out: TuneCandidate[] = [];
  const places: [number, TuneCandidate['where']][] = [
    [index, 'own'],
    [index + 1, 'after'],
    [index - 1, 'before'],
  ];
  for (const [i, where] of places) {
    const stage = doc.stages[i];
    if (!stage) continue;
    const def = definitionOf(stage, options);
    for (const p of def.params) {
      if (!isReactive(p) || !paramShown(p, stage.values)) continue;
      out.push({
        stageId: stage.id,
        key: p.key,
        label: p.label,
        unit: p.unit,
        where,
        value: numberValue(stage, p),
      });
    }
  }
  return out;
}

/** The resonator's report in a fresh resonance analysis of `doc`, or null when it is gone. */
export function findResonator(
  doc: ChainDocument,
  ref: ResonatorRef,
  options: DesignOptions = {},
): ResonatorReport | null {
  const found = analyzeResonators(buildDoc(doc, options)).find(
    (r) => r.stageId === ref.stageId && r.label === ref.label,
  );
  return found ?? null;
}

function elementSpec(doc: ChainDocument, ref: ElementRef, options: DesignOptions) {
  const stage = stageOf(doc, ref.stageId);
  const spec = definitionOf(stage, options).params.find((p) => p.key === ref.key);
  if (!spec || !isReactive(spec)) {
    throw new StageParameterError(
      'element',
      `stage "${stage.id}" has no inductance or capacitance "${ref.key}" to solve`,
    );
  }
  return { stage, spec };
}

/** What the solve moves: the resonance or the peak after a change, with its Q and width. */
interface Tracked {
  hz: number | null;
  loadedQ: number | null;
  bandwidthHz: number | null;
}

/** The quantity a request tunes, measured on a document. */
function trackerFor(req: TuneRequest, options: DesignOptions): (doc: ChainDocument) => Tracked {
  if (req.peakNode !== undefined) {
    const node = req.peakNode;
    return (doc) => {
      const sweep = doc.settings.sweep;
      const peak = passbandPeak(buildDoc(doc, options), node, sweep.startHz, sweep.stopHz);
      const bw = peak?.bandwidthHz ?? null;
      return { hz: peak?.peakHz ?? null, bandwidthHz: bw, loadedQ: peak && bw ? peak.peakHz / bw : null }; // prettier-ignore
    };
  }
  const ref = req.resonator;
  if (!ref) {
    throw new StageParameterError('resonator', 'name a resonator to tune, or a node whose peak to tune'); // prettier-ignore
  }
  return (doc) => {
    const r = findResonator(doc, ref, options);
    return { hz: r?.resonanceHz ?? null, loadedQ: r?.loadedQ ?? null, bandwidthHz: r?.bandwidthHz ?? null }; // prettier-ignore
  };
}

/** A search range that holds the target: the chain's sweep widened to target ÷ 1.5 … × 1.5. */
function widenedSearch(doc: ChainDocument, targetHz: number): ChainDocument {
  const s = doc.settings.sweep;
  return {
    ...doc,
    settings: {
      ...doc.settings,
      sweep: {
        ...s,
        startHz: Math.min(s.startHz, targetHz / 1.5),
        stopHz: Math.max(s.stopHz, targetHz * 1.5),
      },
    },
  };
}

/**
 * Solves the element's value so the resonator sits at the target frequency.
 * @throws StageParameterError naming what to change when the resonator cannot reach it.
 */
export function tuneResonator(
  doc: ChainDocument,
  req: TuneRequest,
  options: DesignOptions = {},
): TuneResult {
  const { targetHz } = req;
  if (!(targetHz > 0) || !Number.isFinite(targetHz)) {
    throw new StageParameterError('targetHz', `the target must be above 0 Hz (got ${targetHz})`);
  }
  const peak = req.peakNode !== undefined;
  // A peak is located by golden section on a flat top: about 1e-10 relative, so 1e-8.
  const tol = req.tolerance ?? (peak ? 1e-8 : 1e-9);
  const track = trackerFor(req, options);
  const what = peak
    ? `the peak at node ${req.peakNode}`
    : `the resonator "${req.resonator?.label}"`;
  const { stage, spec } = elementSpec(doc, req.element, options);
  const start = numberValue(stage, spec);
  const base = widenedSearch(doc, targetHz);
  const lo = spec.min !== undefined && spec.min > 0 ? spec.min : start * 1e-6;
  const hi = spec.max ?? start * 1e6;
  let evaluations = 0;
  const residual = (x: number): number | null => {
    evaluations++;
    const hz = track(withValue(base, stage.id, spec.key, Math.exp(x))).hz;
    return hz ? Math.log(hz / targetHz) : null;
  };
  let x0 = Math.log(start);
  let g0 = residual(x0);
  if (g0 === null) {
    throw new StageParameterError(
      'resonator',
      `${what} is not found near ${targetHz} Hz with the present values`,
    );
  }
  let bracket: [number, number] | null = null; // [x with g > 0, x with g < 0]
  let x1 = x0 + 2 * g0; // fr ∝ value^(−1/2)
  for (let it = 0; it < MAX_ITERATIONS; it++) {
    if (Math.abs(g0) < tol) break;
    x1 = Math.min(Math.max(x1, Math.log(lo)), Math.log(hi));
    let g1 = residual(x1);
    // The resonance left the search range: step back halfway until it is found again.
    for (let back = 0; g1 === null && back < 30; back++) {
      x1 = 0.5 * (x0 + x1);
      g1 = residual(x1);
    }
    if (g1 === null) break;
    if (g1 > 0 !== g0 > 0) bracket = g1 > 0 ? [x1, x0] : [x0, x1];
    else if (bracket) bracket = g1 > 0 ? [x1, bracket[1]] : [bracket[0], x1];
    const slope = (g1 - g0) / (x1 - x0);
    x0 = x1;
    g0 = g1;
    let next = Number.isFinite(slope) && slope !== 0 ? x1 - g1 / slope : x1 + 2 * g1;
    if (bracket && !(next > Math.min(...bracket) && next < Math.max(...bracket))) {
      next = 0.5 * (bracket[0] + bracket[1]);
    }
    x1 = next;
  }
  const value = Math.exp(x0);
  const final = track(withValue(peak ? base : doc, stage.id, spec.key, value));
  const resonanceHz = final.hz ?? NaN;
  const relativeError = Math.abs(resonanceHz - targetHz) / targetHz;
  if (!(relativeError < Math.max(tol * 100, 1e-6))) {
    throw new StageParameterError(
      'element',
      `${spec.label} of stage "${stage.id}" cannot bring ${what} to ` +
        `${targetHz} Hz within its range (${lo} … ${hi}); choose another element to solve`,
    );
  }
  return {
    element: req.element,
    previousValue: start,
    value,
    unit: spec.unit,
    targetHz,
    target: peak ? 'peak' : 'resonance',
    ...(peak ? { peakNode: req.peakNode } : {}),
    resonanceHz,
    relativeError,
    loadedQ: final.loadedQ,
    bandwidthHz: final.bandwidthHz,
    iterations: evaluations,
  };
}
