/**
 * The analysis thread (run by the piscina pool in ./analysis-pool.ts): the engine's whole
 * analysis, the sweep put into columns and the answer serialised, off the event loop.
 */
import {
  analyseModes,
  analyzeChain,
  ChainValidationError,
  StageParameterError,
  type AnalysisResult,
} from '../../shared/engine';
import type { ModeAnalysisDto, ModesAnalysisDto } from '../../shared/schema/api';
import { sweepToColumns, type AnalysisDto } from '../../shared/schema/sweep-columns';
import type { AnalysisOutcome, AnalysisTask } from './analysis-task';

function refusal(err: unknown): Extract<AnalysisOutcome, { kind: 'refused' }> | null {
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

function toDto(result: AnalysisResult, task: AnalysisTask): AnalysisDto {
  const { sweep: full, ...rest } = result;
  return full ? { ...rest, sweep: sweepToColumns(full, task.traces, task.nodes) } : rest;
}

/** Every mode's analysis; a mode the engine refuses carries its reason, the others still run. */
function allModes(task: AnalysisTask, options: Parameters<typeof analyzeChain>[1]): string {
  const byId = new Map((task.document.modes ?? []).map((m) => [m.id, m]));
  const answer: ModesAnalysisDto = {
    modes: analyseModes(task.document, options).map((entry): ModeAnalysisDto => {
      const mode = entry.modeId === null ? undefined : byId.get(entry.modeId);
      const head = {
        id: entry.modeId,
        name: mode?.name ?? 'As written',
        kind: mode?.kind ?? ('receive' as const),
      };
      if (entry.ok) return { ...head, ok: true, result: toDto(entry.result, task) };
      const refused = refusal(new ChainValidationError(entry.issues));
      return { ...head, ok: false, message: refused!.message, issues: entry.issues };
    }),
  };
  return JSON.stringify(answer);
}

export default function runAnalysis(task: AnalysisTask): AnalysisOutcome {
  const sweep = task.want === 'answer' && task.traces.length > 0;
  const options = {
    sweep,
    plan: task.want === 'answer' ? (task.plan ?? false) : false,
    ...(task.dataFiles ? { dataFiles: task.dataFiles } : {}),
  };
  try {
    if (task.want === 'answer' && task.allModes) {
      return { kind: 'answer', json: allModes(task, options) };
    }
    const result = analyzeChain(task.document, {
      ...options,
      ...(task.mode ? { mode: task.mode } : {}),
    });
    if (task.want === 'flag-count') {
      const count = result.flags.filter((f) => f.severity === 'warning' || f.severity === 'error');
      return { kind: 'flag-count', count: count.length };
    }
    return { kind: 'answer', json: JSON.stringify(toDto(result, task)) };
  } catch (err) {
    const refused = refusal(err);
    if (refused) return refused;
    throw err;
  }
}
