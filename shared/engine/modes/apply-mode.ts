/**
 * A chain in one of its modes: the mode's path (or every stage), less the stages it leaves
 * out, with its parameter overrides applied. The result is an ordinary chain without modes,
 * validated and built like any other; issues found in it are named in the document's terms
 * (the stage's place in `stages`, or the mode's override that set the bad value).
 */
import type { ChainDocument, Mode, StageInstance } from '../../schema/chain';
import { ChainValidationError, type ChainIssue } from '../errors';
import type { StageDefinition } from '../types';

/** A chain in one mode, with what is needed to name its issues in the document's terms. */
export interface ModeView<D extends ChainDocument = ChainDocument> {
  /** The chain of this mode: no `modes`, its stages in the mode's order. */
  doc: Omit<D, 'modes'>;
  /** The mode (undefined: the chain has no modes and is analysed as written). */
  mode?: Mode;
  /** Position of the mode in the document's `modes`. */
  modeIndex: number;
  /** For each stage of `doc`, its position in the document's `stages`. */
  documentIndex: number[];
}

/** Whether a document declares modes. */
export function hasModes(doc: Pick<ChainDocument, 'modes'>): boolean {
  return (doc.modes?.length ?? 0) > 0;
}

/** The ids of the document's modes, in order (empty: no modes). */
export function modeIds(doc: Pick<ChainDocument, 'modes'>): string[] {
  return (doc.modes ?? []).map((m) => m.id);
}

/**
 * The chain in a mode.
 * @param modeId the mode; absent: the first mode (or the chain as written when it has none)
 * @param catalogue when given, an override of a parameter the stage's type lacks is an issue
 * @throws ChainValidationError for an unknown mode, a mode naming unknown stages or
 *   parameters, a stage both in the path and bypassed, or duplicate mode ids
 */
export function modeView<D extends ChainDocument>(
  doc: D,
  modeId?: string,
  catalogue?: readonly StageDefinition[],
): ModeView<D> {
  const { modes: _modes, ...rest } = doc;
  const { stages } = doc;
  const modes = doc.modes ?? [];
  if (modes.length === 0) {
    if (modeId !== undefined)
      throw new ChainValidationError([
        { path: ['modes'], message: `The chain has no mode "${modeId}"; it has no modes at all` },
      ]);
    return { doc: rest, modeIndex: -1, documentIndex: stages.map((_s, i) => i) };
  }
  const modeIndex = modeId === undefined ? 0 : modes.findIndex((m) => m.id === modeId);
  if (modeIndex < 0) {
    throw new ChainValidationError([
      {
        path: ['modes'],
        message: `The chain has no mode "${modeId}"; its modes are ${modes.map((m) => `"${m.id}"`).join(', ')}`,
      },
    ]);
  }
  const mode = modes[modeIndex];
  const issues = modeIssues(modes, stages, catalogue);
  if (issues.length > 0) throw new ChainValidationError(issues);

  const indexById = new Map(stages.map((s, i) => [s.id, i]));
  const bypass = new Set(mode.bypass ?? []);
  const order = mode.path
    ? mode.path.map((id) => indexById.get(id) as number)
    : stages.map((_s, i) => i);
  const documentIndex = order.filter((i) => !bypass.has(stages[i].id));
  const modeStages = documentIndex.map((i): StageInstance => {
    const st = stages[i];
    const over = mode.values?.[st.id];
    if (!over) return st;
    const values = { ...st.values, ...over };
    // What the user typed for an overridden value no longer describes it.
    const entered = st.entered
      ? Object.fromEntries(Object.entries(st.entered).filter(([k]) => !(k in over)))
      : undefined;
    return { ...st, values, ...(entered ? { entered } : {}) };
  });
  const own = mode.settings;
  const settings = {
    ...doc.settings,
    ...(own?.f0Hz !== undefined ? { f0Hz: own.f0Hz } : {}),
    ...(own?.sweep !== undefined ? { sweep: own.sweep } : {}),
  };
  return { doc: { ...rest, settings, stages: modeStages }, mode, modeIndex, documentIndex };
}

/** Every reference problem of the modes (all modes, not only the one analysed). */
export function modeIssues(
  modes: readonly Mode[],
  stages: readonly StageInstance[],
  catalogue?: readonly StageDefinition[],
): ChainIssue[] {
  const issues: ChainIssue[] = [];
  const byId = new Map(stages.map((s) => [s.id, s]));
  const byType = new Map((catalogue ?? []).map((d) => [d.type, d]));
  const seen = new Set<string>();
  modes.forEach((m, i) => {
    const at = (...path: (string | number)[]) => ['modes', i, ...path];
    const who = `Mode "${m.name}"`;
    if (seen.has(m.id))
      issues.push({ path: at('id'), message: `Mode id "${m.id}" is used twice; give each mode its own id` }); // prettier-ignore
    seen.add(m.id);
    const known = (id: string, path: (string | number)[]) => {
      if (byId.has(id)) return true;
      issues.push({ path: at(...path), message: `${who} names stage "${id}", which is not in the chain; use the id of one of its stages` }); // prettier-ignore
      return false;
    };
    for (const [id, over] of Object.entries(m.values ?? {})) {
      if (!known(id, ['values', id])) continue;
      const def = byType.get(byId.get(id)?.type ?? '');
      if (!def) continue; // an unknown type is reported by the build
      for (const key of Object.keys(over)) {
        if (!def.params.some((p) => p.key === key))
          issues.push({ path: at('values', id, key), message: `${who} sets "${key}" of stage "${id}", but a ${def.label.toLowerCase()} has no such parameter; its parameters are ${def.params.map((p) => p.key).join(', ')}` }); // prettier-ignore
      }
    }
    (m.bypass ?? []).forEach((id, k) => known(id, ['bypass', k]));
    const inPath = new Set<string>();
    (m.path ?? []).forEach((id, k) => {
      if (!known(id, ['path', k])) return;
      if (inPath.has(id))
        issues.push({ path: at('path', k), message: `${who} lists stage "${id}" twice in its path; a stage appears once` }); // prettier-ignore
      if ((m.bypass ?? []).includes(id))
        issues.push({ path: at('bypass'), message: `${who} both follows stage "${id}" in its path and leaves it out; remove it from one of the two` }); // prettier-ignore
      inPath.add(id);
    });
    if (m.path && catalogue) issues.push(...pathRoleIssues(m, i, byId, byType));
  });
  return issues;
}

/**
 * Names an issue of the mode's chain in the document's terms: the stage's place in
 * `stages`, or the mode's override when the mode set the bad value.
 */
export function issueInDocument(view: ModeView, issue: ChainIssue): ChainIssue {
  if (!view.mode || issue.stageIndex === undefined || issue.path[0] !== 'stages') return issue;
  const docIndex = view.documentIndex[issue.stageIndex] ?? issue.stageIndex;
  const overridden =
    issue.stageId !== undefined &&
    issue.param !== undefined &&
    view.mode.values?.[issue.stageId]?.[issue.param] !== undefined;
  const path = overridden
    ? ['modes', view.modeIndex, 'values', issue.stageId as string, issue.param as string]
    : ['stages', docIndex, ...issue.path.slice(2)];
  const message = `In mode "${view.mode.name}": ${issue.message}${overridden ? ' (a value this mode sets)' : ''}`; // prettier-ignore
  return { ...issue, stageIndex: docIndex, path, message };
}

/** A path runs from a source through two-ports to a load. */
function pathRoleIssues(
  m: Mode,
  modeIndex: number,
  byId: Map<string, StageInstance>,
  byType: Map<string, StageDefinition>,
): ChainIssue[] {
  const path = (m.path ?? []).filter((id) => !(m.bypass ?? []).includes(id));
  const last = path.length - 1;
  const issues: ChainIssue[] = [];
  path.forEach((id, k) => {
    const def = byType.get(byId.get(id)?.type ?? '');
    if (!def) return;
    const wanted = k === 0 ? 'source' : k === last ? 'load' : 'two-port';
    if (def.role === wanted) return;
    const where = k === 0 ? 'first' : k === last ? 'last' : 'in between';
    const need =
      k === 0
        ? 'a source (an antenna, a generator, a power amplifier)'
        : k === last
          ? 'a load'
          : 'a two-port';
    issues.push({
      stageId: id,
      path: ['modes', modeIndex, 'path', (m.path ?? []).indexOf(id)],
      message: `Mode "${m.name}": stage "${id}" is a ${def.role} but stands ${where} in the path; a mode's path needs ${need} there`,
    });
  });
  return issues;
}
