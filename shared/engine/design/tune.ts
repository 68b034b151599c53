/**
 * Tune to f0: solve one inductance or capacitance so that a resonator of the chain (declared
 * by a stage or found in the network) resonates at the target, by root finding on the whole
 * chain, so coupling, loading and parasitics all count.
 *
 * The unknown is x = ln(value) and the residual g(x) = ln(fr/target). For an LC resonance
 * fr ∝ value^(−1/2), which gives the first step; after that a secant step is taken, kept
 * inside the bracket once the residual has changed sign (bisection when the secant step
 * leaves it). The answer is the chain's own resonance, not the closed form.
 */
import { analyzeResonators } from '../core/resonators';
import { StageParameterError } from '../errors';
import type { ParamSpec, ResonatorReport } from '../types';
import {
  buildDoc,
  definitionOf,
  numberValue,
  paramShown,
  stageOf,
  withValue,
  type ChainDoc,
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
  resonator: ResonatorRef;
  element: ElementRef;
  targetHz: number;
  /** Relative accuracy of the resonance (default 1e-9). */
  tolerance?: number;
}

export interface TuneResult {
  element: ElementRef;
  previousValue: number;
  value: number;
  unit: 'henry' | 'farad';
  targetHz: number;
  resonanceHz: number;
  /** |fr − target|/target after the solve. */
  relativeError: number;
  loadedQ: number | null;
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
  doc: ChainDoc,
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
  doc: ChainDoc,
  ref: ResonatorRef,
  options: DesignOptions = {},
): ResonatorReport | null {
  const found = analyzeResonators(buildDoc(doc, options)).find(
    (r) => r.stageId === ref.stageId && r.label === ref.label,
  );
  return found ?? null;
}

function elementSpec(doc: ChainDoc, ref: ElementRef, options: DesignOptions) {
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

/** A search range that holds the target: the chain's sweep widened to target ÷ 1.5 … × 1.5. */
function widenedSearch(doc: ChainDoc, targetHz: number): ChainDoc {
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
  doc: ChainDoc,
  req: TuneRequest,
  options: DesignOptions = {},
): TuneResult {
  const { targetHz } = req;
  if (!(targetHz > 0) || !Number.isFinite(targetHz)) {
    throw new StageParameterError('targetHz', `the target must be above 0 Hz (got ${targetHz})`);
  }
  const tol = req.tolerance ?? 1e-9;
  const { stage, spec } = elementSpec(doc, req.element, options);
  const start = numberValue(stage, spec);
  const base = widenedSearch(doc, targetHz);
  const lo = spec.min !== undefined && spec.min > 0 ? spec.min : start * 1e-6;
  const hi = spec.max ?? start * 1e6;
  let evaluations = 0;
  const residual = (x: number): number | null => {
    evaluations++;
    const value = Math.exp(x);
    const r = findResonator(withValue(base, stage.id, spec.key, value), req.resonator, options);
    return r?.resonanceHz ? Math.log(r.resonanceHz / targetHz) : null;
  };
  let x0 = Math.log(start);
  let g0 = residual(x0);
  if (g0 === null) {
    throw new StageParameterError(
      'resonator',
      `the resonator "${req.resonator.label}" has no resonance near ${targetHz} Hz with the present values`,
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
  const final = findResonator(withValue(doc, stage.id, spec.key, value), req.resonator, options);
  const resonanceHz = final?.resonanceHz ?? NaN;
  const relativeError = Math.abs(resonanceHz - targetHz) / targetHz;
  if (!(relativeError < Math.max(tol * 100, 1e-6))) {
    throw new StageParameterError(
      'element',
      `${spec.label} of stage "${stage.id}" cannot bring "${req.resonator.label}" to ` +
        `${targetHz} Hz within its range (${lo} … ${hi}); choose another element to solve`,
    );
  }
  return {
    element: req.element,
    previousValue: start,
    value,
    unit: spec.unit,
    targetHz,
    resonanceHz,
    relativeError,
    loadedQ: final?.loadedQ ?? null,
    bandwidthHz: final?.bandwidthHz ?? null,
    iterations: evaluations,
  };
}
