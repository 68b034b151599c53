/**
 * Two jobs of the analysis thread besides the API's own analysis: a shared link's figures
 * (every mode of a chain with modes) and an export's file.
 */
import { analyzeChain } from '../../shared/engine';
import { SpiceExportError } from '../../shared/engine/spice/netlist';
import { TouchstoneExportError } from '../../shared/io/chain-touchstone';
import type { SharedModeDto } from '../../shared/schema/api';
import type { AnalysisOutcome, AnalysisTask } from './analysis-task';
import { engineRefusal } from './engine-errors';
import { buildExportFile } from './export-file';

type Analysed = { ok: true; json: string } | { ok: false; message: string };

function analysed(task: AnalysisTask, mode?: string): Analysed {
  try {
    const result = analyzeChain(task.document, {
      sweep: true,
      ...(task.dataFiles ? { dataFiles: task.dataFiles } : {}),
      ...(mode ? { mode } : {}),
    });
    return { ok: true, json: JSON.stringify(result) };
  } catch (err) {
    const refused = engineRefusal(err);
    if (!refused) throw err;
    return { ok: false, message: refused.message };
  }
}

/**
 * A shared link's figures as the members of its JSON answer: `analysis` (the whole result
 * with the sweep, or null and `analysisError`) and, for a chain with modes whose analysis
 * runs, `modes` with each mode's (a mode the engine refuses carries its reason).
 */
export function runShared(task: AnalysisTask): AnalysisOutcome {
  const first = analysed(task);
  if (!first.ok) {
    return { kind: 'json', json: JSON.stringify({ analysis: null, analysisError: first.message }) };
  }
  const modes = (task.document.modes ?? []).map((mode) => {
    const head = { id: mode.id, name: mode.name, kind: mode.kind };
    const entry = analysed(task, mode.id);
    // The result is already JSON text: put it in as it is rather than parse it back.
    if (entry.ok) return `${JSON.stringify(head).slice(0, -1)},"analysis":${entry.json}}`;
    const refused: SharedModeDto = { ...head, analysis: null, analysisError: entry.message };
    return JSON.stringify(refused);
  });
  const members = [`"analysis":${first.json}`, ...(modes.length ? [`"modes":[${modes.join(',')}]`] : [])]; // prettier-ignore
  return { kind: 'json', json: `{${members.join(',')}}` };
}

/** The export's file; a stage the format cannot express is refused with `cannot-export`. */
export function runExport(task: AnalysisTask): AnalysisOutcome {
  try {
    return { kind: 'export', file: buildExportFile(task.document, task.export!, task.dataFiles) };
  } catch (err) {
    if (err instanceof SpiceExportError || err instanceof TouchstoneExportError) {
      return { kind: 'refused', code: 'cannot-export', message: err.message, details: { stageId: err.stageId } }; // prettier-ignore
    }
    const refused = engineRefusal(err);
    if (refused) return refused;
    throw err;
  }
}
