/**
 * The analysis thread (run by the piscina pool in ./analysis-pool.ts): the engine's whole
 * analysis, the sweep put into columns and the answer serialised and compressed, and the
 * design assistants, off the event loop.
 */
import {
  analyseModes,
  analyzeChain,
  ChainValidationError,
  type AnalysisResult,
} from '../../shared/engine';
import { withMessageFigures } from '../../shared/engine/core/format';
import type { ModeAnalysisDto, ModesAnalysisDto } from '../../shared/schema/api';
import { sweepToColumns, type AnalysisDto } from '../../shared/schema/sweep-columns';
import { runDesignOp } from '../design/design-ops';
import type { AnalysisOutcome, AnalysisTask } from './analysis-task';
import { encodeAnswer } from './answer-encoding';
import { engineRefusal } from './engine-errors';
import { handOver } from './hand-over';
import { answerWithSweepJson } from './sweep-json';
import { runExport, runShared } from './thread-jobs';
import { lowerThreadPriority } from './thread-priority';

/** The analysis threads' nice value (the event loop keeps the process's, 0). */
const ANALYSIS_THREAD_NICE = 5;

// The event loop goes first: a long analysis must not hold /api/health or a sign-in back.
lowerThreadPriority(ANALYSIS_THREAD_NICE);

function toDto(result: AnalysisResult, task: AnalysisTask): AnalysisDto {
  const { sweep: full, ...rest } = result;
  return full
    ? { ...rest, sweep: sweepToColumns(full, task.traces, task.nodes, task.packing) }
    : rest;
}

/** The answer's JSON bytes, the sweep's columns written by hand (./sweep-json.ts). */
function answerBytes(result: AnalysisResult, task: AnalysisTask): Uint8Array {
  const { sweep: full, ...rest } = result;
  if (!full) return Buffer.from(JSON.stringify(rest), 'utf8');
  return answerWithSweepJson(JSON.stringify(rest), full, task.traces, task.nodes, task.packing);
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
      const refused = engineRefusal(new ChainValidationError(entry.issues));
      return { ...head, ok: false, message: refused!.message, issues: entry.issues };
    }),
  };
  return JSON.stringify(answer);
}

function runDesign(task: AnalysisTask): AnalysisOutcome {
  try {
    // The document travels once, beside the rest of the request.
    const request = { ...(task.request as object), document: task.document };
    const answer = runDesignOp(task.op!, request, task.dataFiles ? { dataFiles: task.dataFiles } : {}); // prettier-ignore
    return { kind: 'json', json: JSON.stringify(answer) };
  } catch (err) {
    const refused = engineRefusal(err);
    if (refused) return refused;
    // The assistants' own checks of what they were asked (a coil form, a value to snap).
    if (err instanceof RangeError) {
      return { kind: 'refused', code: 'design-refused', message: err.message, details: [] };
    }
    throw err;
  }
}

function runWhole(task: AnalysisTask): AnalysisOutcome {
  try {
    const result = analyzeChain(task.document, {
      sweep: task.traces.length > 0,
      ...(task.dataFiles ? { dataFiles: task.dataFiles } : {}),
    });
    return { kind: 'json', json: JSON.stringify(result) };
  } catch (err) {
    const refused = engineRefusal(err);
    if (refused) return refused;
    throw err;
  }
}

/** The thread's job, its messages written to the figures the client asked for. */
export default function runAnalysis(task: AnalysisTask): AnalysisOutcome {
  return handOver(withMessageFigures(task.figures, () => runTask(task)));
}

function runTask(task: AnalysisTask): AnalysisOutcome {
  if (task.want === 'design') return runDesign(task);
  if (task.want === 'result') return runWhole(task);
  if (task.want === 'shared') return runShared(task);
  if (task.want === 'export') return runExport(task);
  const sweep = task.want === 'answer' && task.traces.length > 0;
  const options = {
    sweep,
    plan: task.want === 'answer' ? (task.plan ?? false) : false,
    ...(task.dataFiles ? { dataFiles: task.dataFiles } : {}),
  };
  try {
    if (task.want === 'answer' && task.allModes) {
      return { kind: 'answer', ...encodeAnswer(allModes(task, options), task.encoding) };
    }
    // The sweep is written out below, before this thread's next analysis, so its report may
    // read the reused workspace rather than a copy (not for all modes above: each mode's
    // sweep is written only after the later modes have run).
    const result = analyzeChain(task.document, {
      ...options,
      ...(task.mode ? { mode: task.mode } : {}),
      sweepInPlace: true,
    });
    if (task.want === 'flag-count') {
      const count = result.flags.filter((f) => f.severity === 'warning' || f.severity === 'error');
      return { kind: 'flag-count', count: count.length };
    }
    return { kind: 'answer', ...encodeAnswer(answerBytes(result, task), task.encoding) };
  } catch (err) {
    const refused = engineRefusal(err);
    if (refused) return refused;
    throw err;
  }
}
