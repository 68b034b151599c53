/**
 * Modes of a chain as immutable edits of the document: create, rename, delete, a mode's
 * value overrides and its "leave out" list. Pure functions: the editor store commits each
 * result as one undo step.
 */
import type { ChainDocument, StageInstance } from '../../../../../shared/schema/chain';
import type { ChainMode, ModeKind } from './mode-types';

type Value = number | string | boolean;

/** The modes of a document (none: the chain as written is its only mode). */
export function modesOf(doc: ChainDocument): ChainMode[] {
  return doc.modes ?? [];
}

/** The mode `id` of `doc`, or null for the chain as written (or an id no longer there). */
export function findMode(doc: ChainDocument, id: string | null): ChainMode | null {
  return id === null ? null : (modesOf(doc).find((m) => m.id === id) ?? null);
}

/** The document with `modes` replaced; no modes leaves the key out (as older chains are). */
export function withModes(doc: ChainDocument, modes: ChainMode[]): ChainDocument {
  const { modes: _old, ...rest } = doc;
  return modes.length > 0 ? { ...rest, modes } : rest;
}

/** A slug from a mode's name, unique among `taken` ("receive", "receive-2", …). */
export function modeIdFor(name: string, taken: readonly string[]): string {
  const base =
    name
      .normalize('NFKD')
      .replace(/[^A-Za-z0-9]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .toLowerCase()
      .slice(0, 40) || 'mode';
  let id = base;
  for (let n = 2; taken.includes(id); n++) id = `${base}-${n}`;
  return id;
}

/** A new mode with no overrides; returns the document and the new mode's id. */
export function addMode(
  doc: ChainDocument,
  name: string,
  kind: ModeKind,
): { doc: ChainDocument; id: string } {
  const modes = modesOf(doc);
  const id = modeIdFor(
    name,
    modes.map((m) => m.id),
  );
  return { doc: withModes(doc, [...modes, { id, name: name.trim(), kind }]), id };
}

/** Renames a mode (its id stays, so links and comparisons keep working) or changes its kind. */
export function updateMode(
  doc: ChainDocument,
  id: string,
  change: { name?: string; kind?: ModeKind },
): ChainDocument {
  const name = change.name?.trim();
  return withModes(
    doc,
    modesOf(doc).map((m) =>
      m.id === id
        ? { ...m, ...(name ? { name } : {}), ...(change.kind ? { kind: change.kind } : {}) }
        : m,
    ),
  );
}

export function deleteMode(doc: ChainDocument, id: string): ChainDocument {
  return withModes(
    doc,
    modesOf(doc).filter((m) => m.id !== id),
  );
}

function replaceMode(doc: ChainDocument, next: ChainMode): ChainDocument {
  return withModes(
    doc,
    modesOf(doc).map((m) => (m.id === next.id ? next : m)),
  );
}

/** The mode without empty `values`, `bypass` or per-stage override maps. */
function tidy(mode: ChainMode): ChainMode {
  const next: ChainMode = { ...mode };
  const values = Object.fromEntries(
    Object.entries(mode.values ?? {}).filter(([, v]) => Object.keys(v).length > 0),
  );
  if (Object.keys(values).length > 0) next.values = values;
  else delete next.values;
  if (!next.bypass?.length) delete next.bypass;
  return next;
}

/** Sets mode `modeId`'s value of `key` on stage `stageId`. */
export function setOverride(
  doc: ChainDocument,
  modeId: string,
  stageId: string,
  key: string,
  value: Value,
): ChainDocument {
  const mode = findMode(doc, modeId);
  if (!mode) return doc;
  const stageValues = { ...(mode.values?.[stageId] ?? {}), [key]: value };
  return replaceMode(doc, tidy({ ...mode, values: { ...mode.values, [stageId]: stageValues } }));
}

/** Drops mode `modeId`'s override of `key` on stage `stageId`: the chain's value applies again. */
export function clearOverride(
  doc: ChainDocument,
  modeId: string,
  stageId: string,
  key: string,
): ChainDocument {
  const mode = findMode(doc, modeId);
  if (!mode?.values?.[stageId] || !(key in mode.values[stageId])) return doc;
  const { [key]: _dropped, ...stageValues } = mode.values[stageId];
  return replaceMode(doc, tidy({ ...mode, values: { ...mode.values, [stageId]: stageValues } }));
}

/**
 * Leaves stage `stageId` out of mode `modeId` (or puts it back). A mode with its own path
 * takes the stage off the path, or puts it back where the chain has it.
 */
export function setBypass(
  doc: ChainDocument,
  modeId: string,
  stageId: string,
  leftOut: boolean,
): ChainDocument {
  const mode = findMode(doc, modeId);
  if (!mode) return doc;
  const others = (mode.bypass ?? []).filter((id) => id !== stageId);
  if (mode.path) {
    const onPath = new Set(mode.path.filter((id) => id !== stageId));
    if (!leftOut) onPath.add(stageId);
    const path = doc.stages.map((s) => s.id).filter((id) => onPath.has(id));
    return replaceMode(doc, tidy({ ...mode, bypass: others, path }));
  }
  return replaceMode(doc, tidy({ ...mode, bypass: leftOut ? [...others, stageId] : others }));
}

/**
 * Removes every mention of a deleted stage from the modes (its overrides, its place in
 * "leave out" and in a path), so the document stays valid.
 */
export function forgetStage(doc: ChainDocument, stageId: string): ChainDocument {
  if (!doc.modes) return doc;
  return withModes(
    doc,
    doc.modes.map((mode) => {
      const { [stageId]: _dropped, ...values } = mode.values ?? {};
      const next: ChainMode = {
        ...mode,
        values,
        bypass: mode.bypass?.filter((id) => id !== stageId),
      };
      if (mode.path) next.path = mode.path.filter((id) => id !== stageId);
      return tidy(next);
    }),
  );
}

/** The keys mode `mode` overrides on stage `stageId`. */
export function overriddenKeys(mode: ChainMode | null, stageId: string): Set<string> {
  return new Set(Object.keys(mode?.values?.[stageId] ?? {}));
}

/**
 * Why a stage takes no part in a mode: left out by its "leave out" list, or not on its
 * explicit path; null when it takes part.
 */
export function leftOutBy(mode: ChainMode | null, stageId: string): 'bypass' | 'path' | null {
  if (!mode) return null;
  if (mode.bypass?.includes(stageId)) return 'bypass';
  if (mode.path && !mode.path.includes(stageId)) return 'path';
  return null;
}

/**
 * The stage as mode `mode` sets it, for display and for the form: the overrides on top of
 * the chain's values. An overridden value shows the text typed for it in this session
 * (`typed`), or the value written out.
 */
export function stageInMode(
  stage: StageInstance,
  mode: ChainMode | null,
  typed: ReadonlyMap<string, TypedText> = new Map(),
): StageInstance {
  const overrides = mode?.values?.[stage.id];
  if (!overrides || Object.keys(overrides).length === 0) return stage;
  const entered = { ...(stage.entered ?? {}) };
  for (const [key, value] of Object.entries(overrides)) {
    // After an undo the value may no longer be the one the text was typed for.
    const text = typed.get(typedKey(mode.id, stage.id, key));
    if (text?.value === value) entered[key] = text.text;
    else delete entered[key];
  }
  const next: StageInstance = { ...stage, values: { ...stage.values, ...overrides }, entered };
  if (Object.keys(entered).length === 0) delete next.entered;
  return next;
}

/** Text typed for an override, with the value it read as. */
export interface TypedText {
  text: string;
  value: Value;
}

/** The key under which the text typed for an override is remembered. */
export function typedKey(modeId: string, stageId: string, key: string): string {
  return `${modeId}\u0000${stageId}\u0000${key}`;
}

/** Whether the chain has a transmit mode (it then carries the transmit caution). */
export function hasTransmitMode(doc: Pick<ChainDocument, 'modes'>): boolean {
  return (doc.modes ?? []).some((m) => m.kind === 'transmit');
}

/**
 * The document the results of mode `mode` are read against: its stages with the mode's
 * values, without those it leaves out, in its path's order. (The server applies the mode
 * itself for the analysis; this only lets the tables name and place the stages.)
 */
export function documentForResults(doc: ChainDocument, mode: ChainMode | null): ChainDocument {
  if (!mode) return withModes(doc, []);
  const byId = new Map(doc.stages.map((s) => [s.id, stageInMode(s, mode)]));
  const order = mode.path ?? doc.stages.map((s) => s.id);
  const stages = order
    .filter((id) => !mode.bypass?.includes(id))
    .map((id) => byId.get(id))
    .filter((s): s is StageInstance => s !== undefined);
  return { ...withModes(doc, []), stages };
}
