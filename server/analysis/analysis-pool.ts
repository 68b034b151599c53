/**
 * Analyses run on a pool of worker threads (piscina), so the event loop only parses,
 * authorises and sends: a large sweep never holds up other requests, `/api/health`
 * included. Two budgets guard the pool: stages × sweep points per request (checked before
 * any work, 422) and wall time per analysis, queue wait included (503; a thread still
 * running the analysis is terminated and replaced).
 */
import { existsSync, mkdirSync, mkdtempSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import path from 'node:path';
import { AsyncResource } from 'node:async_hooks';
import { Piscina } from 'piscina';
import type { ChainDocument } from '../../shared/schema/chain';
import { HttpError } from '../common/errors';
import { REPO_ROOT } from '../config';
import type { AnalysisOutcome, AnalysisTask } from './analysis-task';
import { serverBundleOptions } from './worker-build';

export interface AnalysisLimits {
  /** Most stages × sweep points one analysis may ask for. */
  maxStagePoints: number;
  /** Longest an analysis may take, waiting in the queue included, ms. */
  timeoutMs: number;
  /** Worker threads. */
  threads: number;
  /** Analyses that may wait for a thread; more are refused with 503 at once. */
  maxQueue: number;
}

const positiveInt = (value: string | undefined, fallback: number) => {
  const n = Number(value);
  return value && Number.isInteger(n) && n > 0 ? n : fallback;
};

/** The limits from CW_ANALYSIS_* variables (see DEVELOPERS.md), defaults otherwise. */
export function analysisLimitsFromEnv(env: NodeJS.ProcessEnv = process.env): AnalysisLimits {
  return {
    // 64 stages × 15,625 points, or 12 stages × 83,333: a second or two of one core.
    maxStagePoints: positiveInt(env.CW_ANALYSIS_MAX_STAGE_POINTS, 1_000_000),
    timeoutMs: positiveInt(env.CW_ANALYSIS_TIMEOUT_MS, 10_000),
    threads: positiveInt(env.CW_ANALYSIS_THREADS, Math.max(1, availableParallelism())),
    maxQueue: positiveInt(env.CW_ANALYSIS_MAX_QUEUE, 64),
  };
}

/** A chain whose sweep is over the per-request budget (stages × points). */
export class AnalysisTooLargeError extends HttpError {
  constructor(stages: number, points: number, max: number) {
    const fit = Math.max(1, Math.floor(max / stages));
    super(
      422,
      'analysis-too-large',
      `this chain asks for ${stages} stages × ${points.toLocaleString('en')} sweep points = ` +
        `${(stages * points).toLocaleString('en')}, above the server's limit of ` +
        `${max.toLocaleString('en')} stages × points per analysis; set the sweep to at most ` +
        `${fit.toLocaleString('en')} points (or use the command-line analyser for larger sweeps)`,
      { stages, points, maxStagePoints: max, maxPoints: fit },
    );
  }
}

/** An analysis that ran out of time; its thread was replaced. */
export class AnalysisTimeoutError extends HttpError {
  constructor(timeoutMs: number) {
    super(
      503,
      'analysis-timeout',
      `the analysis did not finish within ${timeoutMs / 1000} s and was stopped; ` +
        'try fewer sweep points, or try again when the server is less busy',
    );
  }
}

/** Every thread is busy and the queue is full. */
export class AnalysisBusyError extends HttpError {
  constructor() {
    super(503, 'analysis-busy', 'the server is busy with other analyses; try again in a moment');
  }
}

/** The pool was ended while the analysis waited or ran. */
export class AnalysisStoppedError extends HttpError {
  constructor() {
    super(503, 'analysis-stopped', 'the server stopped this analysis while restarting; try again');
  }
}

let limits = analysisLimitsFromEnv();

/**
 * Made as the module loads, so with no request's async context: what starts in it (the
 * pool's threads, the deadline timer) carries none.
 */
const outsideRequests = new AsyncResource('analysis-pool');
let pool: Piscina<AnalysisTask, AnalysisOutcome> | null = null;

let devBundle: string | undefined;

/**
 * The bundled thread next to the bundled server (a production start). From the TypeScript
 * sources (development server, tests) the thread is bundled once per process with esbuild:
 * a thread compiling the engine through a TypeScript loader takes seconds to start and
 * runs the hot loops slower.
 */
function workerFile(): string {
  const bundled = path.join(__dirname, 'analysis-worker.js');
  if (existsSync(bundled)) return bundled;
  if (!devBundle) {
    // Inside the repository, so the bundle's require() finds node_modules.
    const dir = path.join(REPO_ROOT, 'dist', 'dev');
    mkdirSync(dir, { recursive: true });
    const out = path.join(mkdtempSync(path.join(dir, 'analysis-')), 'analysis-worker.js');
    // Required here, not imported: esbuild is a development tool, absent from a production
    // install, which never reaches this line.
    // eslint-disable-next-line @typescript-eslint/no-require-imports
    const esbuild = require('esbuild') as typeof import('esbuild');
    esbuild.buildSync({
      ...serverBundleOptions(REPO_ROOT),
      entryPoints: [path.join(__dirname, 'analysis-worker.ts')],
      outfile: out,
    });
    devBundle = out;
  }
  return devBundle;
}

/**
 * Each thread's young generation, MB (V8's default tops out at 48). An analysis allocates
 * about a megabyte of short-lived arrays; with the default, a thread serving a steady load
 * collected its young generation several times a second, and each collection copied (and
 * soon promoted) the arrays of the analysis in hand, which then took full collections to
 * free. A larger one is collected a fraction as often, for the same survivors per
 * collection.
 */
export const ANALYSIS_YOUNG_GENERATION_MB = 96;

// At least one thread: piscina 5 with minThreads 0 can leave the first task waiting.
function thePool(minThreads = 1): Piscina<AnalysisTask, AnalysisOutcome> {
  // Its threads and ports would otherwise hold the async context of the request that
  // happened to start it (after a timeout, a new pool starts in one) for the pool's life.
  pool ??= outsideRequests.runInAsyncScope(() => newPool(minThreads));
  return pool;
}

function newPool(minThreads: number): Piscina<AnalysisTask, AnalysisOutcome> {
  return new Piscina<AnalysisTask, AnalysisOutcome>({
    filename: workerFile(),
    resourceLimits: { maxYoungGenerationSizeMb: ANALYSIS_YOUNG_GENERATION_MB },
    minThreads: Math.max(1, Math.min(minThreads, limits.threads)),
    maxThreads: limits.threads,
    maxQueue: limits.maxQueue,
    idleTimeout: 60_000,
  });
}

/**
 * Sets the limits (the environment's, overridden by `overrides`) and ends the pool, so the
 * next analysis starts one with them. With `keepPool`, the running pool stays and only the
 * budgets change (the thread and queue sizes apply to the next pool).
 */
export async function configureAnalysis(
  overrides: Partial<AnalysisLimits> = {},
  opts: { keepPool?: boolean } = {},
): Promise<void> {
  limits = { ...analysisLimitsFromEnv(), ...overrides };
  if (!opts.keepPool) await stopAnalysisPool();
}

/** The limits in force. */
export function analysisLimits(): Readonly<AnalysisLimits> {
  return limits;
}

/** Starts every thread now (a server start), rather than on the first analysis. */
export function startAnalysisPool(): void {
  thePool(limits.threads);
}

/** Ends the threads (server stop, tests); the next analysis starts a new pool. */
export async function stopAnalysisPool(): Promise<void> {
  const old = pool;
  pool = null;
  const ending = [...retired].map((p) => p.destroy());
  retired.clear();
  if (old) await old.destroy();
  await Promise.allSettled(ending);
}

/** Throws AnalysisTooLargeError when `doc` is over the stages × points budget. */
export function assertWithinBudget(doc: ChainDocument, runs = 1): void {
  const stages = doc.stages.length * runs;
  const points = doc.settings.sweep.points;
  if (stages * points > limits.maxStagePoints) {
    throw new AnalysisTooLargeError(stages, points, limits.maxStagePoints);
  }
}

/** Whether `doc` is within the stages × points budget, analysed `runs` times (modes). */
export function withinBudget(doc: ChainDocument, runs = 1): boolean {
  return doc.stages.length * runs * doc.settings.sweep.points <= limits.maxStagePoints;
}

/**
 * Runs `task` on a thread within the time budget.
 * @throws AnalysisTimeoutError, AnalysisBusyError
 */
export async function runOnPool(task: AnalysisTask): Promise<AnalysisOutcome> {
  const { timeoutMs } = limits;
  const timeout = new AbortController();
  const deadline = { at: performance.now() + timeoutMs, controller: timeout };
  watchDeadline(deadline);
  const running = thePool();
  inFlight++;
  heldBy.set(running, (heldBy.get(running) ?? 0) + 1);
  try {
    return await running.run(task, { signal: timeout.signal });
  } catch (err) {
    if (timeout.signal.aborted) {
      retire(running);
      throw new AnalysisTimeoutError(timeoutMs);
    }
    if (err instanceof Error && /queue is at limit|all Workers are busy/.test(err.message)) {
      throw new AnalysisBusyError();
    }
    // The pool was ended (a server stop or a change of limits) with this analysis on it.
    if (err instanceof Error && /Terminating worker thread/.test(err.message)) {
      throw new AnalysisStoppedError();
    }
    throw err;
  } finally {
    deadlines.delete(deadline);
    inFlight--;
    const left = (heldBy.get(running) ?? 1) - 1;
    if (left > 0) heldBy.set(running, left);
    else heldBy.delete(running);
    if (left <= 0 && retired.has(running)) end(running);
  }
}

interface Deadline {
  /** performance.now() at which the analysis is stopped. */
  at: number;
  controller: AbortController;
}

/** The analyses in hand and when each runs out of time. */
const deadlines = new Set<Deadline>();
/** How often the deadlines are checked, ms: an analysis is stopped at most this late. */
const DEADLINE_CHECK_MS = 100;
let deadlineTimer: NodeJS.Timeout | undefined;

/**
 * Watches `deadline` with one timer for every analysis, not a timer per analysis
 * (`AbortSignal.timeout`). A timer made while a request is handled carries that request's
 * async context, its entity manager included, for as long as it is pending: ten seconds per
 * analysis kept some two thousand request contexts alive under a steady load, and the
 * garbage collector copied and promoted them all. This timer is made outside any request
 * (`outsideRequests`) and runs only while analyses are in hand.
 */
function watchDeadline(deadline: Deadline): void {
  deadlines.add(deadline);
  deadlineTimer ??= outsideRequests.runInAsyncScope(() =>
    setInterval(checkDeadlines, DEADLINE_CHECK_MS).unref(),
  );
}

function checkDeadlines(): void {
  const now = performance.now();
  for (const d of deadlines) {
    if (d.at <= now) {
      deadlines.delete(d);
      d.controller.abort(new Error('the analysis ran out of time'));
    }
  }
  if (deadlines.size === 0 && deadlineTimer) {
    clearInterval(deadlineTimer);
    deadlineTimer = undefined;
  }
}

type Pool = Piscina<AnalysisTask, AnalysisOutcome>;
/** Analyses each pool holds (queued or running). */
const heldBy = new Map<Pool, number>();
/** Pools replaced after a timeout, ended once the analyses they hold are done. */
const retired = new Set<Pool>();

/**
 * After a timeout piscina has terminated the thread, but the pool may not start a new one
 * for the next task: a new pool takes the next analyses, the old one finishes the analyses
 * it holds and is then ended. Not with `close()` while it holds any: piscina 5's close
 * forbids new threads, and a thread finishing a task while others wait (one thread short of
 * the maximum, the timed-out one) then spins the event loop forever trying to add one.
 */
function retire(old: Pool): void {
  if (pool !== old) return;
  pool = null;
  retired.add(old);
  if (!heldBy.has(old)) end(old);
}

function end(old: Pool): void {
  retired.delete(old);
  old.destroy().catch((err: unknown) => console.error('[server] ending an analysis pool:', err));
}

let inFlight = 0;

/** Analyses queued or running now. */
export function analysesInFlight(): number {
  return inFlight;
}

/** Ids of the pool's live threads (a timed-out analysis's thread is replaced by a new one). */
export function analysisThreadIds(): number[] {
  return pool ? pool.threads.map((t) => t.threadId) : [];
}
