/**
 * Modes of a chain (receive, transmit, band states): the chain in one mode, and the analysis
 * of every mode. Framework-free.
 */
import type { ChainDocument } from '../../schema/chain';
import { analyzeChain, type AnalyzeOptions } from '../analyze';
import { ChainValidationError, type ChainIssue } from '../errors';
import { defaultCatalogue } from '../default-catalogue';
import type { AnalysisResult } from '../types';
import { buildChain, type BuildOptions } from '../core/build';
import { modeView } from './apply-mode';

export { insertStagesAfter } from './edit';
export {
  hasModes,
  issueInDocument,
  modeIds,
  modeIssues,
  modeView,
  type ModeView,
} from './apply-mode';

/**
 * The chain document in one mode: the mode's stages in order, its overrides applied, no
 * `modes`. Validated like any chain (against the catalogue) before it is returned.
 * @param modeId absent: the first mode (a chain without modes comes back as written)
 * @throws ChainValidationError naming every problem in the document's terms
 */
export function chainInMode(
  doc: ChainDocument,
  modeId?: string,
  options: BuildOptions & { catalogue?: AnalyzeOptions['catalogue'] } = {},
): Omit<ChainDocument, 'modes'> {
  const catalogue = options.catalogue ?? defaultCatalogue();
  buildChain(doc, catalogue, { ...options, mode: modeId }); // throws in the document's terms
  return modeView(doc, modeId, catalogue).doc;
}

/**
 * Every problem of a chain in every one of its modes (empty when each mode can be
 * analysed). A chain without modes is checked as written.
 */
export function modeValidationIssues(
  doc: ChainDocument,
  catalogue = defaultCatalogue(),
  options: BuildOptions = {},
): ChainIssue[] {
  const modes = doc.modes ?? [];
  const ids = modes.length > 0 ? modes.map((m) => m.id) : [undefined];
  const all: ChainIssue[] = [];
  const seen = new Set<string>();
  for (const mode of ids) {
    try {
      buildChain(doc, catalogue, { ...options, mode });
    } catch (e) {
      if (!(e instanceof ChainValidationError)) throw e;
      for (const i of e.issues) {
        // A fault of the shared document shows once, not once per mode.
        const key = `${i.path.join('/')}|${i.message.replace(/^In mode "[^"]*": /, '')}`;
        if (!seen.has(key)) all.push(i);
        seen.add(key);
      }
    }
  }
  return all;
}

/** The analysis of one mode, or why that mode cannot be analysed. */
export type ModeAnalysis =
  | { modeId: string | null; ok: true; result: AnalysisResult }
  | { modeId: string | null; ok: false; issues: ChainIssue[] };

/**
 * Analyses the chain in every mode (each mode's figures, flags and plots are its own). A
 * chain without modes gives one entry with `modeId` null. A mode that cannot be analysed
 * gives its issues; the others are still analysed.
 */
export function analyseModes(doc: ChainDocument, options: AnalyzeOptions = {}): ModeAnalysis[] {
  const modes = doc.modes ?? [];
  const ids = modes.length > 0 ? modes.map((m) => m.id) : [undefined];
  return ids.map((mode): ModeAnalysis => {
    const modeId = mode ?? null;
    try {
      return { modeId, ok: true, result: analyzeChain(doc, { ...options, mode }) };
    } catch (e) {
      if (!(e instanceof ChainValidationError)) throw e;
      return { modeId, ok: false, issues: e.issues };
    }
  });
}
