/**
 * Runs one study in a worker thread, so the worker process's own loop stays free to write
 * progress, keep its heartbeat and act on a cancel at once (it ends the thread). Messages to
 * the parent: progress, checkpoint (work to resume from), done (the result), failed.
 */
import { parentPort, workerData } from 'node:worker_threads';
import type { ChainDocument } from '../../shared/schema/chain';
import type { StudySpec } from '../../shared/schema/studies';
import type { MeasuredNetwork } from '../../shared/engine';
import {
  monteCarloResult,
  planMonteCarlo,
  runBandStudy,
  runOptimiser,
  runTrial,
  StudySetupError,
  targetChecks,
  trialPasses,
  writeValue,
  type Trial,
} from '../../shared/engine/studies';

export interface ThreadInput {
  spec: StudySpec;
  doc: ChainDocument;
  dataFiles?: Record<string, MeasuredNetwork>;
  checkpoint: unknown;
}

export type ThreadMessage =
  | {
      type: 'progress';
      fraction: number;
      done: number;
      total: number;
      interim?: Record<string, unknown>;
    }
  | { type: 'checkpoint'; checkpoint: unknown }
  | { type: 'done'; result: unknown }
  | { type: 'failed'; message: string };

const post = (m: ThreadMessage) => parentPort!.postMessage(m);
const PROGRESS_MS = 200;
const CHECKPOINT_MS = 2000;

function monteCarlo(input: ThreadInput & { spec: Extract<StudySpec, { kind: 'monte-carlo' }> }) {
  const inputs = { doc: input.doc, dataFiles: input.dataFiles };
  const plan = planMonteCarlo(inputs, input.spec);
  const saved = (input.checkpoint as { trials?: Trial[] } | null)?.trials ?? [];
  const trials: Trial[] = saved.slice(0, input.spec.trials);
  const total = input.spec.trials;
  const targets = input.doc.settings.targets;
  let lastProgress = 0;
  let lastCheckpoint = Date.now();
  const judged = targetChecks(targets).length > 0;
  let passed = trials.filter((t) => judged && trialPasses(t, plan, targets)).length;
  for (let i = trials.length; i < total; i++) {
    const t = runTrial(inputs, plan, i);
    trials.push(t);
    if (judged && trialPasses(t, plan, targets)) passed++;
    const now = Date.now();
    if (now - lastProgress > PROGRESS_MS || i === total - 1) {
      lastProgress = now;
      const interim = {
        trials: trials.length,
        yieldSoFar: judged ? passed / trials.length : null,
        resumedFrom: saved.length || null,
      };
      post({
        type: 'progress',
        fraction: trials.length / total,
        done: trials.length,
        total,
        interim,
      });
    }
    if (now - lastCheckpoint > CHECKPOINT_MS) {
      lastCheckpoint = now;
      post({ type: 'checkpoint', checkpoint: { trials } });
    }
  }
  return monteCarloResult(plan, trials, targets);
}

function optimiser(input: ThreadInput & { spec: Extract<StudySpec, { kind: 'optimiser' }> }) {
  const doc = structuredClone(input.doc);
  // Resume from the best values a previous run reached.
  const best = (input.checkpoint as { bestValues?: number[] } | null)?.bestValues;
  if (best && best.length === input.spec.variables.length) {
    input.spec.variables.forEach((v, i) => writeValue(doc, v, best[i]));
  }
  const expected = input.spec.maxIterations * (input.spec.variables.length + 1);
  let lastProgress = 0;
  let lastCheckpoint = Date.now();
  const result = runOptimiser({ doc, dataFiles: input.dataFiles }, input.spec, (p) => {
    const now = Date.now();
    if (now - lastProgress > PROGRESS_MS) {
      lastProgress = now;
      post({
        type: 'progress',
        fraction: Math.min(0.99, p.evaluations / expected),
        done: p.evaluations,
        total: expected,
        interim: { bestCost: p.bestCost, bestValues: p.bestValues },
      });
    }
    if (now - lastCheckpoint > CHECKPOINT_MS) {
      lastCheckpoint = now;
      post({ type: 'checkpoint', checkpoint: { bestValues: p.bestValues } });
    }
  });
  // A resumed run started from its checkpoint: report "before" from the chain as saved.
  if (best) {
    result.variables.forEach(
      (v, i) => (v.before = Number(readNumber(input.doc, v.stageId, v.key) ?? best[i])),
    );
  }
  return result;
}

function readNumber(doc: ChainDocument, stageId: string, key: string): number | null {
  const v = doc.stages.find((s) => s.id === stageId)?.values[key];
  return typeof v === 'number' ? v : null;
}

function run(input: ThreadInput): unknown {
  const spec = input.spec;
  switch (spec.kind) {
    case 'monte-carlo':
      return monteCarlo({ ...input, spec });
    case 'band':
      return runBandStudy({ doc: input.doc, dataFiles: input.dataFiles }, spec, (done, total, p) =>
        post({
          type: 'progress',
          fraction: done / total,
          done,
          total,
          interim: { dialHz: p.dialHz },
        }),
      );
    case 'optimiser':
      return optimiser({ ...input, spec });
  }
}

try {
  post({ type: 'done', result: run(workerData as ThreadInput) });
} catch (err) {
  const message = err instanceof Error ? err.message : String(err);
  post({
    type: 'failed',
    message:
      err instanceof StudySetupError ? message : `the study stopped with an error: ${message}`,
  });
}
