/**
 * From a chain document to a "built chain": every value checked against its stage type's
 * parameter schema (all problems collected, then one ChainValidationError), every stage's
 * model built, and the sections of all two-ports laid out flat with maps back to stages and
 * user-level nodes (stage boundaries).
 */
import { chainSettingsSchema, type ChainSettings, type ModeKind } from '../../schema/chain';
import { ChainValidationError, StageParameterError, type ChainIssue } from '../errors';
import type {
  AbcdFill,
  Caution,
  LoadModel,
  MeasuredNetwork,
  ParamSpec,
  ParamValues,
  Section,
  SourceModel,
  StageDefinition,
  StageModel,
  TwoPortModel,
} from '../types';
import { hasModes, issueInDocument, modeView, readModes } from '../modes/apply-mode';
import { formatQuantity } from './format';
import { pointwiseFill } from './nodes';

/** One stage of the chain after validation and building; `M` is its role's model. */
export interface BuiltStage<M extends StageModel = StageModel> {
  /** Position in the document's `stages` (0 = source). */
  index: number;
  id: string;
  type: string;
  /** The instance's label, or the type's label when the instance has none. */
  label: string;
  definition: StageDefinition;
  values: ParamValues;
  model: M;
  /** Flat index of the stage's first section; the flat node at its input. */
  firstSection: number;
  sectionCount: number;
}

/** A chain ready for analysis. User-level node k sits between two-port k−1 and two-port k. */
export interface BuiltChain {
  settings: ChainSettings;
  source: BuiltStage<SourceModel>;
  load: BuiltStage<LoadModel>;
  /** The stages between source and load, in order (two-port k spans user nodes k → k+1). */
  twoPorts: BuiltStage<TwoPortModel>[];
  /**
   * All sections of all two-ports, in order. Flat node j is the input of section j. Each
   * has its block form (`fill`): its own, or its point form called once per point.
   */
  sections: FilledSection[];
  /** For each section, the index in `twoPorts` of the stage that owns it. */
  sectionStage: Int32Array;
  /** For each user-level node (0 … twoPorts.length), its flat node. */
  userNodeFlat: Int32Array;
  /** The design frequency at each flat node (translated after a mixer), Hz. */
  f0AtFlatNode: Float64Array;
  /** The mode this chain was built in, when the document has modes. */
  mode?: ModeRef;
  /** Cautions of the whole chain (every mode of a chain that has a transmit mode). */
  chainCautions?: Caution[];
}

/** Which mode a result is of. */
export interface ModeRef {
  id: string;
  name: string;
  kind: ModeKind;
}

/** A section whose block form is always there. */
export type FilledSection = Section & { fill: AbcdFill };

/** Lowest input frequency behind a mixer that the bound of the evaluated range considers. */
const MIN_TRANSLATED_HZ = 1e-3;

/** The loose shape accepted from callers (a parsed ChainDocument or one before defaults). */
export interface ChainLike {
  settings?: unknown;
  stages?: unknown;
  /** Operating modes (see `modes/`). */
  modes?: unknown;
}

interface StageLike {
  id?: unknown;
  type?: unknown;
  label?: unknown;
  values?: unknown;
  dataFileId?: unknown;
}

/** What the caller resolved outside the engine (which does no I/O). */
export interface BuildOptions {
  /**
   * Parsed data files by `dataFileId`. When given, a stage whose file is missing here is an
   * issue; when absent, stages with a file id are built without it (they fall back to their
   * own parameters).
   */
  dataFiles?: Readonly<Record<string, MeasuredNetwork>>;
  /**
   * The mode to build (see `modes/`); absent: the first mode of a chain that has modes, or
   * the chain as written.
   */
  mode?: string;
  /**
   * A chain built before from a document that differs at most in some stage values (a
   * study's drawn chain and its nominal): its parsed settings, when the settings are the
   * same, and the model of every stage whose type, values and design frequency are the same
   * are taken over instead of built again. Values are still checked. Models are immutable
   * once built, so sharing them is safe.
   */
  like?: BuiltChain;
}

/** The settings each built chain was parsed from (as JSON), for `BuildOptions.like`. */
const settingsSource = new WeakMap<ChainSettings, string>();

/** "Stage 3 "Detector" (diode-detector)" — how messages name a stage. */
export function stageName(index: number, label: string, type: string): string {
  return `Stage ${index + 1} "${label}" (${type})`;
}

function paramName(spec: ParamSpec): string {
  const l = spec.label || spec.key;
  // Lower-case only an ordinary first word ("Load resistance"); keep "IIP3", "LO frequency",
  // "S-parameter points" and "Q of the coil" as written.
  const second = l.charAt(1);
  return second && second !== second.toUpperCase() ? l[0].toLowerCase() + l.slice(1) : l;
}

function showParam(spec: ParamSpec, resolved: ParamValues): boolean {
  return !spec.showWhen || resolved[spec.showWhen.key] === spec.showWhen.equals;
}

function describe(v: unknown): string {
  return typeof v === 'string' ? JSON.stringify(v) : String(v);
}

/** Checks one value against its spec; returns the problem ("must be ...") or null. */
function checkValue(spec: ParamSpec, v: unknown): string | null {
  const unit = (x: number) => formatQuantity(x, spec.unit, 6);
  switch (spec.kind) {
    case 'number':
      if (typeof v !== 'number') return `must be a number (got ${describe(v)})`;
      if (!Number.isFinite(v)) return `must be a finite number (got ${describe(v)})`;
      if (spec.min !== undefined && spec.max !== undefined) {
        // Name the whole range, so the message says what would be accepted.
        const low = spec.exclusiveMin ? !(v > spec.min) : !(v >= spec.min);
        if (low || !(v <= spec.max)) {
          const from = spec.exclusiveMin ? `above ${unit(spec.min)}` : `from ${unit(spec.min)}`;
          return `must be ${from} up to ${unit(spec.max)} (got ${unit(v)})`;
        }
        return null;
      }
      if (spec.min !== undefined) {
        if (spec.exclusiveMin && !(v > spec.min))
          return `must be above ${unit(spec.min)} (got ${describe(v)})`;
        if (!spec.exclusiveMin && !(v >= spec.min))
          return `must be at least ${unit(spec.min)} (got ${describe(v)})`;
      }
      if (spec.max !== undefined && !(v <= spec.max))
        return `must be at most ${unit(spec.max)} (got ${describe(v)})`;
      return null;
    case 'enum': {
      const allowed = (spec.options ?? []).map((o) => o.value);
      if (typeof v !== 'string' || !allowed.includes(v))
        return `must be one of ${allowed.join(', ')} (got ${describe(v)})`;
      return null;
    }
    case 'boolean':
      return typeof v === 'boolean' ? null : `must be true or false (got ${describe(v)})`;
    case 'text':
      if (typeof v !== 'string') return `must be text (got ${describe(v)})`;
      return v.length <= 200 ? null : `must be at most 200 characters (got ${v.length})`;
  }
  return `has a kind the engine does not know ("${String(spec.kind)}")`;
}

function settingsIssues(raw: unknown): { settings?: ChainSettings; issues: ChainIssue[] } {
  const issues: ChainIssue[] = [];
  const s = (raw ?? {}) as Record<string, unknown>;
  const f0 = s['f0Hz'];
  if (typeof f0 !== 'number' || !Number.isFinite(f0) || f0 <= 0) {
    issues.push({
      path: ['settings', 'f0Hz'],
      message: `Design frequency must be a finite frequency above 0 Hz (got ${describe(f0)})`,
    });
  }
  const parsed = chainSettingsSchema.safeParse(raw);
  if (!parsed.success) {
    for (const zi of parsed.error.issues) {
      const path = ['settings', ...zi.path.map((p) => (typeof p === 'symbol' ? String(p) : p))];
      if (path[1] === 'f0Hz' && issues.length > 0) continue; // already said above
      issues.push({ path, message: `Settings ${path.slice(1).join('.')}: ${zi.message}` });
    }
  }
  return { settings: parsed.success ? parsed.data : undefined, issues };
}

/** Resolves a stage's values (defaults filled, hidden ones reset) and reports bad ones. */
function resolveValues(
  def: StageDefinition,
  given: Record<string, unknown>,
  where: { index: number; id: string; name: string },
  issues: ChainIssue[],
): ParamValues {
  const resolved: ParamValues = {};
  for (const spec of def.params) {
    const v = given[spec.key];
    resolved[spec.key] = v === undefined ? spec.default : (v as number | string | boolean);
  }
  for (const spec of def.params) {
    if (!showParam(spec, resolved)) {
      resolved[spec.key] = spec.default; // hidden: neither checked nor used
      continue;
    }
    const problem = checkValue(spec, resolved[spec.key]);
    if (problem) {
      issues.push({
        stageId: where.id,
        stageIndex: where.index,
        param: spec.key,
        path: ['stages', where.index, 'values', spec.key],
        message: `${where.name}: ${paramName(spec)} ${problem}`,
      });
    }
  }
  return resolved;
}

/** What a model lacks for its role, or null when it has what the node analysis reads. */
function checkModel(role: StageDefinition['role'], m: StageModel): string | null {
  if (!m || typeof m !== 'object') return 'its builder returned no model';
  const has = (key: string) => typeof (m as unknown as Record<string, unknown>)[key] === 'function';
  if (role === 'source' && !(has('emf') && has('impedance')))
    return 'a source model needs an EMF and an impedance';
  if (role === 'load' && !has('impedance')) return 'a load model needs an impedance';
  if (role === 'two-port' && !Array.isArray((m as TwoPortModel).sections))
    return 'a two-port model needs a list of sections';
  return null;
}

/**
 * The model of stage `index` of `like` when it was built from the same type, values and
 * design frequency at its input (so building it again would give the same model), else null.
 */
function sameStage(
  like: BuiltChain,
  index: number,
  id: string,
  def: StageDefinition,
  values: ParamValues,
  f0: number,
): StageModel | null {
  const prev =
    index === 0
      ? like.source
      : like.load.index === index
        ? like.load
        : like.twoPorts.find((s) => s.index === index);
  if (!prev || prev.id !== id || prev.definition !== def) return null;
  if (like.f0AtFlatNode[prev.firstSection] !== f0) return null;
  for (const spec of def.params) if (prev.values[spec.key] !== values[spec.key]) return null;
  return prev.model;
}

/** The settings as JSON for comparing ('' when they cannot be written as JSON). */
function settingsJson(raw: unknown): string {
  try {
    return JSON.stringify(raw) ?? '';
  } catch {
    return '';
  }
}

function isTwoPort(s: BuiltStage): s is BuiltStage<TwoPortModel> {
  return s.definition.role === 'two-port';
}

/**
 * Validates a chain against a catalogue and builds every stage.
 * @param doc the chain document (defaults of the settings are filled here)
 * @param catalogue the stage types to accept
 * @throws ChainValidationError listing every problem found, each naming stage and parameter
 */
export function buildChain(
  doc: ChainLike,
  catalogue: readonly StageDefinition[],
  options: BuildOptions = {},
): BuiltChain {
  if (doc && typeof doc === 'object' && (hasModes(doc) || options.mode !== undefined)) {
    const view = modeView(doc, options.mode, catalogue);
    try {
      const built = buildAsWritten(view.doc, catalogue, options);
      if (!view.mode) return built;
      const { mode } = view;
      const transmits = readModes(doc).modes.some((m) => m.kind === 'transmit');
      return {
        ...built,
        mode: { id: mode.id, name: mode.name, kind: mode.kind },
        ...(transmits ? { chainCautions: ['transmit', 'rf-exposure'] as Caution[] } : {}),
      };
    } catch (e) {
      if (!(e instanceof ChainValidationError)) throw e;
      throw new ChainValidationError(e.issues.map((i) => issueInDocument(view, i)));
    }
  }
  return buildAsWritten(doc, catalogue, options);
}

function buildAsWritten(
  doc: ChainLike,
  catalogue: readonly StageDefinition[],
  options: BuildOptions,
): BuiltChain {
  if (!doc || typeof doc !== 'object') {
    throw new ChainValidationError([
      { path: [], message: 'A chain must be an object with "settings" and "stages"' },
    ]);
  }
  const like = options.like;
  const rawSettings = settingsJson(doc.settings);
  const { settings, issues } =
    like && rawSettings !== '' && rawSettings === settingsSource.get(like.settings)
      ? { settings: like.settings, issues: [] as ChainIssue[] }
      : settingsIssues(doc.settings);
  if (settings) settingsSource.set(settings, rawSettings);
  const byType = new Map(catalogue.map((d) => [d.type, d]));
  const stagesRaw = doc.stages;
  if (!Array.isArray(stagesRaw) || stagesRaw.length < 2) {
    issues.push({ path: ['stages'], message: 'A chain needs at least a source and a load stage' });
    throw new ChainValidationError(issues);
  }
  const last = stagesRaw.length - 1;
  const resolved: { def: StageDefinition; values: ParamValues; st: StageLike; name: string }[] = [];
  stagesRaw.forEach((raw: unknown, index) => {
    const st = (raw ?? {}) as StageLike;
    const type = typeof st.type === 'string' ? st.type : '';
    const id = typeof st.id === 'string' && st.id ? st.id : `#${index + 1}`;
    const def = byType.get(type);
    const label = typeof st.label === 'string' && st.label ? st.label : (def?.label ?? type);
    const name = stageName(index, label, type || 'no type');
    if (!def) {
      issues.push({
        stageId: id,
        stageIndex: index,
        path: ['stages', index, 'type'],
        message: `${name}: unknown stage type "${type}"; choose one from the stage catalogue`,
      });
      return;
    }
    const wanted = index === 0 ? 'source' : index === last ? 'load' : 'two-port';
    if (def.role !== wanted) {
      const where = index === 0 ? 'first' : index === last ? 'last' : 'between source and load';
      issues.push({
        stageId: id,
        stageIndex: index,
        path: ['stages', index, 'type'],
        message: `${name}: a ${def.role} cannot be ${where}; the ${where === 'first' ? 'first stage must be a source' : where === 'last' ? 'last stage must be a load' : 'stages in between must be two-ports'}`,
      });
    }
    const given =
      st.values && typeof st.values === 'object' ? (st.values as Record<string, unknown>) : {};
    const values = resolveValues(def, given, { index, id, name }, issues);
    resolved.push({ def, values, st: { ...st, id, label }, name });
  });
  if (issues.length > 0 || !settings) throw new ChainValidationError(issues);

  // Build in order, carrying the design frequency through frequency-translating sections,
  // and an upper bound of the frequencies evaluated: the searches look up to twice the wider
  // of the sweep and the 2·f0 search range (a detached tank within a factor 2 of its loaded
  // resonance). Behind a mixer |f − LO| or f + LO peaks at an end of the input range.
  let f0 = settings.f0Hz;
  let fMax = 2 * Math.max(settings.sweep.stopHz, 2 * settings.f0Hz);
  const built: BuiltStage[] = [];
  const f0Flat: number[] = [];
  let flat = 0;
  resolved.forEach(({ def, values, st, name }, index) => {
    let model: StageModel;
    const fileId = typeof st.dataFileId === 'string' ? st.dataFileId : undefined;
    const dataFile = fileId && options.dataFiles ? options.dataFiles[fileId] : undefined;
    if (fileId && options.dataFiles && !dataFile) {
      issues.push({
        stageId: st.id as string,
        stageIndex: index,
        path: ['stages', index, 'dataFileId'],
        message: `${name}: the attached data file "${fileId}" was not found; attach it again or remove it`,
      });
      return;
    }
    // A stage built before from the same inputs is taken over (see BuildOptions.like).
    const same =
      like &&
      !fileId &&
      like.settings.temperatureK === settings.temperatureK &&
      like.settings.sweep.stopHz === settings.sweep.stopHz // the same fMaxHz
        ? sameStage(like, index, st.id as string, def, values, f0)
        : null;
    try {
      model =
        same ??
        def.build(values, {
          f0Hz: f0,
          fMaxHz: fMax,
          temperatureK: settings.temperatureK,
          ...(dataFile ? { dataFile } : {}),
        });
    } catch (e) {
      const param = e instanceof StageParameterError ? e.param : undefined;
      issues.push({
        stageId: st.id as string,
        stageIndex: index,
        param,
        path: param ? ['stages', index, 'values', param] : ['stages', index],
        message: `${name}: ${e instanceof Error ? e.message : String(e)}`,
      });
      return;
    }
    const bad = checkModel(def.role, model);
    if (bad) {
      issues.push({
        stageId: st.id as string,
        stageIndex: index,
        path: ['stages', index],
        message: `${name}: ${bad}`,
      });
      return;
    }
    const sections = def.role === 'two-port' ? (model as TwoPortModel).sections : [];
    const count = sections.length;
    built.push({
      index,
      id: st.id as string,
      type: def.type,
      label: st.label as string,
      definition: def,
      values,
      model,
      firstSection: flat,
      sectionCount: count,
    });
    for (let k = 0; k < count; k++) {
      f0Flat.push(f0);
      const tr = sections[k].translate;
      if (tr) {
        f0 = tr(f0);
        fMax = Math.max(tr(MIN_TRANSLATED_HZ), tr(fMax));
      }
    }
    flat += count;
  });
  if (issues.length > 0) throw new ChainValidationError(issues);
  f0Flat.push(f0);

  // Roles were checked above (first a source, last a load, two-ports between) and each
  // model against its role, so these narrowings hold.
  const twoPorts = built.slice(1, -1).filter(isTwoPort);
  const sections = twoPorts.flatMap((s) =>
    s.model.sections.map((sec): FilledSection =>
      sec.fill ? (sec as FilledSection) : { ...sec, fill: pointwiseFill(sec) },
    ),
  );
  const sectionStage = new Int32Array(sections.length);
  const userNodeFlat = new Int32Array(twoPorts.length + 1);
  twoPorts.forEach((s, k) => {
    sectionStage.fill(k, s.firstSection, s.firstSection + s.sectionCount);
    userNodeFlat[k] = s.firstSection;
  });
  userNodeFlat[twoPorts.length] = sections.length;
  return {
    settings,
    source: built[0] as BuiltStage<SourceModel>,
    load: built[built.length - 1] as BuiltStage<LoadModel>,
    twoPorts,
    sections,
    sectionStage,
    userNodeFlat,
    f0AtFlatNode: Float64Array.from(f0Flat),
  };
}
