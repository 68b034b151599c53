/**
 * Monte Carlo results: per-figure statistics and histograms, the yield against the chain's
 * targets, and which tolerance drives the losses most.
 */
import type { ChainTargets } from '../../schema/chain';
import { targetChecks, type MetricInfo } from './metrics';
import type { MonteCarloPlan, Trial } from './monte-carlo';
import { correlation, histogram, summarise, type Histogram, type Summary } from './statistics';

export interface FigureResult extends MetricInfo {
  nominal: number | null;
  summary: Summary;
  histogram: Histogram;
}

export interface TargetResult {
  key: string;
  label: string;
  /** Trials that miss this target (a trial may miss several). */
  failures: number;
}

export interface SensitivityRow {
  stageId: string;
  key: string;
  label: string;
  tolerancePct: number;
  /** Yield among trials whose draw of this value is in its inner half, and outer half. */
  yieldInner: number | null;
  yieldOuter: number | null;
  /** yieldInner − yieldOuter: how much the wide draws of this value cost. */
  yieldDrop: number | null;
  /** Correlation of the draw with each figure (same order as `figures`). */
  correlations: (number | null)[];
}

export interface MonteCarloResult {
  trials: number;
  distribution: 'uniform' | 'normal';
  seed: number;
  node: number;
  figures: FigureResult[];
  /** null when the chain states no targets. */
  yield: { passed: number; fraction: number; targets: TargetResult[] } | null;
  sensitivity: SensitivityRow[];
  /** Trials whose chain could not be analysed, and the first reason. */
  failedTrials: number;
  firstFailure: string | null;
  /** Per trial: draws then figures, for scatter plots (rounded to 7 significant digits). */
  rows: { draws: number[]; metrics: (number | null)[]; pass: boolean | null }[];
}

const round7 = (v: number | null) => (v === null ? null : Number(v.toPrecision(7)));

/** Whether a trial meets every target (false when a judged figure is missing). */
export function trialPasses(
  trial: Trial,
  plan: MonteCarloPlan,
  targets: ChainTargets | undefined,
): boolean {
  return targetChecks(targets).every((c) => {
    const v = trial.metrics[plan.metrics.findIndex((m) => m.key === c.metric)];
    return v !== null && v !== undefined && c.pass(v);
  });
}

/** Builds the result of a finished (or partial, for interim figures) set of trials. */
export function monteCarloResult(
  plan: MonteCarloPlan,
  trials: Trial[],
  targets: ChainTargets | undefined,
  bins = 30,
): MonteCarloResult {
  const checks = targetChecks(targets);
  const column = (j: number) => trials.map((t) => t.metrics[j]);
  const figures = plan.metrics.map((m, j) => {
    const col = column(j);
    return {
      ...m,
      nominal: plan.nominal[j],
      summary: summarise(col),
      histogram: histogram(col, bins),
    };
  });
  const passes = checks.length ? trials.map((t) => trialPasses(t, plan, targets)) : null;
  let yieldPart: MonteCarloResult['yield'] = null;
  if (passes) {
    const passed = passes.filter(Boolean).length;
    const targetsOut = checks.map((c) => {
      const j = plan.metrics.findIndex((m) => m.key === c.metric);
      const failures = trials.filter((t) => {
        const v = t.metrics[j];
        return v === null || !c.pass(v);
      }).length;
      return { key: c.key, label: c.label, failures };
    });
    yieldPart = {
      passed,
      fraction: trials.length ? passed / trials.length : 0,
      targets: targetsOut,
    };
  }
  const sensitivity = plan.tolerances.map((tol, k) => {
    const draws = trials.map((t) => t.draws[k]);
    const mags = draws.map(Math.abs).sort((a, b) => a - b);
    const median = mags.length ? mags[Math.floor(mags.length / 2)] : 0;
    let inner: number | null = null;
    let outer: number | null = null;
    if (passes) {
      let ni = 0, pi = 0, no = 0, po = 0; // prettier-ignore
      trials.forEach((t, i) => {
        if (Math.abs(t.draws[k]) < median) {
          ni++;
          if (passes[i]) pi++;
        } else {
          no++;
          if (passes[i]) po++;
        }
      });
      inner = ni ? pi / ni : null;
      outer = no ? po / no : null;
    }
    return {
      stageId: tol.stageId,
      key: tol.key,
      label: tol.label,
      tolerancePct: tol.tolerancePct,
      yieldInner: inner,
      yieldOuter: outer,
      yieldDrop: inner !== null && outer !== null ? inner - outer : null,
      correlations: plan.metrics.map((_, j) => correlation(draws, column(j))),
    };
  });
  sensitivity.sort(
    (a, b) =>
      (b.yieldDrop ?? -Infinity) - (a.yieldDrop ?? -Infinity) ||
      maxAbs(b.correlations) - maxAbs(a.correlations),
  );
  const failed = trials.filter((t) => t.error);
  return {
    trials: trials.length,
    distribution: plan.spec.distribution,
    seed: plan.spec.seed,
    node: plan.node,
    figures,
    yield: yieldPart,
    sensitivity,
    failedTrials: failed.length,
    firstFailure: failed[0]?.error ?? null,
    rows: trials.map((t, i) => ({
      draws: t.draws.map((d) => round7(d)!),
      metrics: t.metrics.map(round7),
      pass: passes ? passes[i] : null,
    })),
  };
}

const maxAbs = (xs: (number | null)[]) => Math.max(0, ...xs.map((x) => Math.abs(x ?? 0)));
