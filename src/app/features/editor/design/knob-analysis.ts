/**
 * What the value knob's worker computes, as a plain function (the worker only passes messages):
 * the chain is built in the mode on screen and its node analysis run over the sweep (thinned
 * to at most 401 points) and at f0, giving the sweep the main plots draw and the f0 figures
 * (gain, noise figure, sensitivity) — no resonance search, selectivity or flags, which the
 * server's full analysis supplies once the value is released (nor the detector's drive-level
 * settling).
 */
import { buildChain } from '../../../../../shared/engine/core/build';
import { runNodeAnalysis } from '../../../../../shared/engine/core/nodes';
import { stepUp } from '../../../../../shared/engine/core/quantities';
import {
  levelsReport,
  nodeReports,
  stageReports,
  sweepReport,
} from '../../../../../shared/engine/core/reports';
import { frequencyGrid } from '../../../../../shared/engine/core/sweep';
import { defaultCatalogue } from '../../../../../shared/engine/default-catalogue';
import { ChainValidationError, StageParameterError } from '../../../../../shared/engine/errors';
import { modeView } from '../../../../../shared/engine/modes/apply-mode';
import type { StageDefinition } from '../../../../../shared/engine/types';
import type { ChainDocument } from '../../../../../shared/schema/chain';
import {
  ChainDocumentError,
  jsonPath,
  parseChainDocument,
} from '../../../../../shared/schema/parse-chain';
import type { KnobAnswer, KnobQuestion } from './knob-messages';

const LIVE_POINTS = 401;

/**
 * The name the live analysis gives a chain: the engine reads neither the chain's name nor its
 * description, so a name being typed (or cleared) must not stop the figures while a value turns.
 */
const LIVE_NAME = 'chain being tuned';

/**
 * The editor's document as the engine takes it: parsed, with the schema's defaults, its name
 * and description (which no figure depends on) set aside.
 * @throws ChainDocumentError for a field the engine does need
 */
export function liveDocument(document: ChainDocument): ChainDocument {
  return parseChainDocument({ ...document, name: LIVE_NAME, description: '' });
}

/** "stage 2 "Preselector", values.l" for a path into the document's stages; else "$.settings…". */
function fieldName(document: ChainDocument, path: readonly (string | number)[]): string {
  const [head, index, ...rest] = path;
  if (head !== 'stages' || typeof index !== 'number') return jsonPath(path);
  const stage = document.stages[index] as Partial<ChainDocument['stages'][number]> | undefined;
  const label = stage?.label?.trim() || stage?.type || stage?.id || '';
  const name = `stage ${index + 1}${label ? ` "${label}"` : ''}`;
  return rest.length ? `${name}, ${rest.join('.')}` : name;
}

/** Why the live analysis cannot run, naming each field to fix. */
export function liveFailure(document: ChainDocument, err: unknown): string {
  if (err instanceof ChainDocumentError) {
    const each = err.problems.map((p) => `${fieldName(document, p.path)}: ${p.message}`);
    return `Live figures paused until this is fixed: ${each.join('; ')}.`;
  }
  if (err instanceof ChainValidationError || err instanceof StageParameterError) {
    return `Live figures paused until this is fixed: ${err.message}`;
  }
  return `The live analysis failed: ${err instanceof Error ? err.message : String(err)}`;
}

/** The knob's answer to `question`: the live figures, or a message saying what stops them. */
export function knobAnswer(
  question: KnobQuestion,
  catalogue: readonly StageDefinition[] = defaultCatalogue(),
  now: () => number = () => performance.now(),
): KnobAnswer {
  const started = now();
  try {
    const doc = liveDocument(question.document);
    const built = buildChain(doc, catalogue, question.mode ? { mode: question.mode } : {});
    // A mode may have its own design frequency and sweep.
    const { settings } = modeView(doc, question.mode, catalogue).doc;
    const sweep = settings.sweep;
    const freqs = frequencyGrid({ ...sweep, points: Math.min(sweep.points, LIVE_POINTS) });
    const na = runNodeAnalysis(built, freqs);
    const flat = built.userNodeFlat[built.userNodeFlat.length - 1];
    const db = Array.from(freqs, (_, i) => 20 * Math.log10(stepUp(na, flat, i)));
    let peak = 0;
    for (let i = 1; i < db.length; i++) if (db[i] > db[peak]) peak = i;
    // −3 dB edges by linear interpolation on the live grid.
    const level = db[peak] - 3.0103;
    const edge = (dir: 1 | -1): number | null => {
      for (let i = peak; i + dir >= 0 && i + dir < db.length; i += dir) {
        if (db[i + dir] <= level) {
          const t = (db[i] - level) / (db[i] - db[i + dir]);
          return freqs[i] + t * (freqs[i + dir] - freqs[i]);
        }
      }
      return null;
    };
    const lo = edge(-1);
    const hi = edge(1);
    const atF0 = runNodeAnalysis(built, [settings.f0Hz]);
    const stages = stageReports(built, atF0);
    return {
      id: question.id,
      ok: true,
      freqsHz: Array.from(freqs),
      stepUpDb: db,
      peakHz: db.length ? freqs[peak] : null,
      bw3dbHz: lo !== null && hi !== null ? hi - lo : null,
      stepUpAtF0Db: 20 * Math.log10(stepUp(atF0, flat, 0)),
      live: {
        sweep: sweepReport(built, na),
        nodes: nodeReports(built, atF0),
        stages,
        levels: levelsReport(built, atF0, stages),
      },
      ms: now() - started,
    };
  } catch (e) {
    return { id: question.id, ok: false, message: liveFailure(question.document, e) };
  }
}
