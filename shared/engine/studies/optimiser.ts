/**
 * Optimiser: Levenberg–Marquardt (the `ml-levenberg-marquardt` package) over chosen stage
 * values, each bounded and searched on a logarithmic scale between its bounds (component
 * values span decades). Every goal gives one weighted residual; the package minimises their
 * sum of squares against zero.
 *
 * Residual scales: a frequency or width off by 1 % costs 1; a level 1 dB past its limit
 * costs 1; one-sided goals (NF, return loss, image rejection, ripple) cost nothing when met.
 */
import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import type { ChainDocument } from '../../schema/chain';
import type { OptimiserGoal, OptimiserSpec } from '../../schema/studies';
import { analyzeChain } from '../index';
import type { AnalysisResult } from '../types';
import { cloneForEdit, readValue, StudySetupError, writeValue } from './chain-values';
import type { StudyInputs } from './monte-carlo';

/** Iterations of one round of the package (see runOptimiser). */
const ROUND = 5;
/** Cost of a goal that cannot be judged at all (e.g. no resonance found). */
const MISSING = 100;

export interface GoalReading {
  label: string;
  /** The judged figure (null when missing). */
  value: number | null;
  residual: number;
}

export interface OptimiserResult {
  variables: {
    stageId: string;
    key: string;
    before: number;
    after: number;
    min: number;
    max: number;
  }[];
  before: { cost: number; goals: GoalReading[] };
  after: { cost: number; goals: GoalReading[] };
  iterations: number;
  evaluations: number;
  /** The chain with the optimised values, ready to save as a variant. */
  document: ChainDocument;
}

export interface OptimiserProgress {
  evaluations: number;
  bestCost: number;
  bestValues: number[];
}

const toUnit = (v: number, min: number, max: number) => Math.log(v / min) / Math.log(max / min);
const fromUnit = (u: number, min: number, max: number) => min * Math.pow(max / min, u);

function goalLabel(g: OptimiserGoal): string {
  switch (g.kind) {
    case 'resonance':
      return `Resonance of ${g.stageId} at ${g.targetHz} Hz`;
    case 'bandwidth':
      return `−3 dB width at node ${g.node}: ${g.targetHz} Hz`;
    case 'return-loss':
      return `Return loss ≥ ${g.minDb} dB, ${g.startHz}–${g.stopHz} Hz`;
    case 'noise-figure':
      return `Noise figure ≤ ${g.maxDb} dB`;
    case 'gain':
      return `Gain ${g.targetDb} dB`;
    case 'image-rejection':
      return `Image rejection ≥ ${g.minDb} dB`;
    case 'ripple':
      return `Ripple ≤ ${g.maxDb} dB at node ${g.node}, ${g.startHz}–${g.stopHz} Hz`;
  }
}

const hinge = (x: number) => (x > 0 ? x : 0);

/** Reads every goal from one analysis (with the sweep). */
export function readGoals(result: AnalysisResult, goals: OptimiserGoal[]): GoalReading[] {
  return goals.map((g) => {
    const label = goalLabel(g);
    const miss = { label, value: null, residual: MISSING * g.weight };
    switch (g.kind) {
      case 'resonance': {
        const r = result.resonators.find((x) => x.stageId === g.stageId);
        const fr = r?.resonanceHz;
        if (fr === null || fr === undefined) return miss;
        return { label, value: fr, residual: (g.weight * (fr / g.targetHz - 1)) / 0.01 };
      }
      case 'bandwidth': {
        const bw = result.selectivity.find((s) => s.node === g.node)?.bw3dbHz;
        if (bw === null || bw === undefined) return miss;
        return { label, value: bw, residual: (g.weight * (bw / g.targetHz - 1)) / 0.01 };
      }
      case 'noise-figure': {
        const v = result.levels.noiseFigureDb;
        return { label, value: v, residual: g.weight * hinge(v - g.maxDb) };
      }
      case 'gain': {
        const v = result.levels.totalGainDb;
        return { label, value: v, residual: g.weight * (v - g.targetDb) };
      }
      case 'image-rejection': {
        const v = result.selectivity[result.selectivity.length - 1]?.imageRejectionDb;
        if (v === null || v === undefined) return miss;
        return { label, value: v, residual: g.weight * hinge(g.minDb - v) };
      }
      case 'return-loss': {
        const s = result.sweep;
        if (!s) return miss;
        let worst = Infinity;
        s.freqsHz.forEach((f, i) => {
          if (f >= g.startHz && f <= g.stopHz) worst = Math.min(worst, s.returnLossDb[i]);
        });
        if (!Number.isFinite(worst)) return miss;
        return { label, value: worst, residual: g.weight * hinge(g.minDb - worst) };
      }
      case 'ripple': {
        const s = result.sweep?.nodes.find((n) => n.index === g.node);
        if (!s || !result.sweep) return miss;
        let lo = Infinity;
        let hi = -Infinity;
        result.sweep.freqsHz.forEach((f, i) => {
          if (f < g.startHz || f > g.stopHz) return;
          lo = Math.min(lo, s.stepUpDb[i]);
          hi = Math.max(hi, s.stepUpDb[i]);
        });
        if (!(hi >= lo)) return miss;
        return { label, value: hi - lo, residual: g.weight * hinge(hi - lo - g.maxDb) };
      }
    }
  });
}

const costOf = (goals: GoalReading[]) => goals.reduce((s, g) => s + g.residual * g.residual, 0);

/**
 * The sweep of the optimiser's analyses: its own points when given, and wide enough that a
 * resonance searched for lies inside it even from a start far off its target (the engine
 * searches resonances within the sweep).
 */
function widenSweep(doc: ChainDocument, spec: OptimiserSpec): void {
  const sw = doc.settings.sweep;
  if (spec.points !== undefined) sw.points = spec.points;
  for (const g of spec.goals) {
    if (g.kind !== 'resonance') continue;
    sw.startHz = Math.min(sw.startHz, g.targetHz / 2);
    sw.stopHz = Math.max(sw.stopHz, g.targetHz * 2);
  }
}

/** Checks the spec against the chain (every variable exists, its bounds hold its value). */
export function checkOptimiserSpec(inputs: StudyInputs, spec: OptimiserSpec): void {
  for (const v of spec.variables) {
    const value = readValue(inputs.doc, v);
    if (!(v.max > v.min))
      throw new StudySetupError(
        `variable ${v.stageId}.${v.key}: the upper bound must be above the lower`,
      );
    if (value < v.min || value > v.max) {
      throw new StudySetupError(
        `variable ${v.stageId}.${v.key}: its value ${value} lies outside its bounds ${v.min}…${v.max}`,
      );
    }
  }
  for (const g of spec.goals) {
    if (g.kind === 'resonance' && !inputs.doc.stages.some((s) => s.id === g.stageId)) {
      throw new StudySetupError(`goal "resonance": the chain has no stage "${g.stageId}"`);
    }
  }
}

/** Runs the optimiser; `onProgress` reports after every evaluation of the chain. */
export function runOptimiser(
  inputs: StudyInputs,
  spec: OptimiserSpec,
  onProgress?: (p: OptimiserProgress) => void,
): OptimiserResult {
  checkOptimiserSpec(inputs, spec);
  const vars = spec.variables;
  const start = vars.map((v) => readValue(inputs.doc, v));
  const docFor = (values: number[], forSaving = false) => {
    const d = cloneForEdit(inputs.doc);
    if (!forSaving) widenSweep(d, spec);
    vars.forEach((v, i) => writeValue(d, v, values[i]));
    return d;
  };
  const evaluate = (values: number[]): GoalReading[] => {
    try {
      return readGoals(analyzeChain(docFor(values), { dataFiles: inputs.dataFiles }), spec.goals);
    } catch {
      return spec.goals.map((g) => ({
        label: goalLabel(g),
        value: null,
        residual: MISSING * g.weight,
      }));
    }
  };
  let evaluations = 0;
  let best = { cost: Infinity, values: start };
  let cacheKey = '';
  let cache: GoalReading[] = [];
  const residualsAt = (u: number[]): GoalReading[] => {
    const key = u.join(',');
    if (key === cacheKey) return cache;
    const values = u.map((x, i) => fromUnit(x, vars[i].min, vars[i].max));
    cache = evaluate(values);
    cacheKey = key;
    evaluations++;
    const cost = costOf(cache);
    if (cost < best.cost) best = { cost, values };
    onProgress?.({ evaluations, bestCost: best.cost, bestValues: best.values });
    return cache;
  };
  const before = evaluate(start);
  // The package keeps stepping from a rejected point, where a goal may be unreadable and its
  // gradient flat; so it runs in short rounds, each restarted from the best point so far.
  const m = Math.max(2, spec.goals.length); // it wants two data points at least
  let iterations = 0;
  let u0 = start.map((v, i) => toUnit(v, vars[i].min, vars[i].max));
  let fit = { parameterValues: u0, parameterError: Infinity, iterations: 0 };
  while (iterations < spec.maxIterations && best.cost > 1e-12) {
    const before = best.cost;
    fit = levenbergMarquardt(
      { x: Array.from({ length: m }, (_, i) => i), y: new Array<number>(m).fill(0) },
      (u: number[]) => (i: number) => (i < spec.goals.length ? residualsAt(u)[i].residual : 0),
      {
        initialValues: u0,
        minValues: vars.map(() => 0),
        maxValues: vars.map(() => 1),
        gradientDifference: 1e-5,
        damping: 1e-2,
        maxIterations: Math.min(ROUND, spec.maxIterations - iterations),
        errorTolerance: 1e-12,
      },
    );
    iterations += Math.max(1, fit.iterations);
    u0 = best.values.map((v, i) => toUnit(v, vars[i].min, vars[i].max));
    if (!(best.cost < before * (1 - 1e-9))) break;
  }
  const afterValues = best.values;
  const after = evaluate(afterValues);
  return {
    variables: vars.map((v, i) => ({
      stageId: v.stageId,
      key: v.key,
      before: start[i],
      after: afterValues[i],
      min: v.min,
      max: v.max,
    })),
    before: { cost: costOf(before), goals: before },
    after: { cost: costOf(after), goals: after },
    iterations,
    evaluations,
    document: docFor(afterValues, true),
  };
}
