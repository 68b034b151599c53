/**
 * The analysis thread (run by the piscina pool in ./analysis-pool.ts): the engine's whole
 * analysis, the sweep put into columns and the answer serialised, off the event loop.
 */
import { analyzeChain, ChainValidationError, StageParameterError } from '../../shared/engine';
import { sweepToColumns, type AnalysisDto } from '../../shared/schema/sweep-columns';
import type { AnalysisOutcome, AnalysisTask } from './analysis-task';

function refusal(err: unknown): AnalysisOutcome | null {
  if (err instanceof ChainValidationError) {
    return { kind: 'refused', message: err.message, details: err.issues };
  }
  if (err instanceof StageParameterError) {
    return {
      kind: 'refused',
      message: err.message,
      details: [{ param: err.param, path: [], message: err.message }],
    };
  }
  return null;
}

export default function runAnalysis(task: AnalysisTask): AnalysisOutcome {
  const sweep = task.want === 'answer' && task.traces.length > 0;
  let result;
  try {
    result = analyzeChain(task.document, {
      sweep,
      plan: task.want === 'answer' ? (task.plan ?? false) : false,
      ...(task.dataFiles ? { dataFiles: task.dataFiles } : {}),
    });
  } catch (err) {
    const refused = refusal(err);
    if (refused) return refused;
    throw err;
  }
  if (task.want === 'flag-count') {
    const count = result.flags.filter((f) => f.severity === 'warning' || f.severity === 'error');
    return { kind: 'flag-count', count: count.length };
  }
  const { sweep: full, ...rest } = result;
  const answer: AnalysisDto = full
    ? { ...rest, sweep: sweepToColumns(full, task.traces, task.nodes) }
    : rest;
  return { kind: 'answer', json: JSON.stringify(answer) };
}
