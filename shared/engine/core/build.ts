/**
 * From a chain document to a "built chain": every value checked against its stage type's
 * parameter schema (all problems collected, then one ChainValidationError), every stage's
 * model built, and the sections of all two-ports laid out flat with maps back to stages and
 * user-level nodes (stage boundaries).
 *
 * The document comes parsed by the chain schema (`parseChainDocument`, or a request body the
 * server parsed): its settings and modes are not checked again here. What only the stage
 * catalogue knows (types, roles, each value's range) is.
 */
import type { ChainDocument, ChainSettings, ModeKind, StageInstance } from '../../schema/chain';
import { ChainValidationError, StageParameterError, type ChainIssue } from '../errors';
import type {
  AbcdFill,
  Caution,
  LoadModel,
  MeasuredNetwork,
  ParamValues,
  Section,
  SourceModel,
  StageDefinition,
  StageModel,
  TwoPortModel,
} from '../types';
import { issueInDocument, modeView } from '../modes/apply-mode';
import { builtSettings, reusableSettings, sameStage } from './model-reuse';
import { pointwiseFill } from './nodes';
import { resolveValues } from './stage-values';

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

/** What the builder reads of a document: a mode's chain has no `modes`. */
export type ChainBody = Pick<ChainDocument, 'settings' | 'stages'>;

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
   * study's drawn chain and its nominal): the model of every stage whose type, values and
   * design frequency are the same is taken over instead of built again (`model-reuse.ts`).
   * Values are still checked.
   */
  like?: BuiltChain;
}

/** "Stage 3 "Detector" (diode-detector)" — how messages name a stage. */
export function stageName(index: number, label: string, type: string): string {
  return `Stage ${index + 1} "${label}" (${type})`;
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

function isTwoPort(s: BuiltStage): s is BuiltStage<TwoPortModel> {
  return s.definition.role === 'two-port';
}

/**
 * Validates a chain against a catalogue and builds every stage.
 * @param doc the chain document as the chain schema parsed it (`parseChainDocument`)
 * @param catalogue the stage types to accept
 * @throws ChainValidationError listing every problem found, each naming stage and parameter
 */
export function buildChain(
  doc: ChainDocument,
  catalogue: readonly StageDefinition[],
  options: BuildOptions = {},
): BuiltChain {
  if (doc.modes?.length || options.mode !== undefined) {
    const view = modeView(doc, options.mode, catalogue);
    try {
      const built = buildAsWritten(view.doc, catalogue, options);
      if (!view.mode) return built;
      const { mode } = view;
      const transmits = (doc.modes ?? []).some((m) => m.kind === 'transmit');
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

/** A stage whose type is known, its values resolved. */
interface ResolvedStage {
  def: StageDefinition;
  values: ParamValues;
  st: StageInstance;
  /** The instance's label, or the type's. */
  label: string;
  name: string;
}

/** Each stage's type looked up, its role and values checked; problems go to `issues`. */
function resolveStages(
  stages: readonly StageInstance[],
  catalogue: readonly StageDefinition[],
  issues: ChainIssue[],
): ResolvedStage[] {
  const byType = new Map(catalogue.map((d) => [d.type, d]));
  const last = stages.length - 1;
  const resolved: ResolvedStage[] = [];
  stages.forEach((st, index) => {
    const { id, type } = st;
    const def = byType.get(type);
    const label = st.label || (def?.label ?? type);
    const name = stageName(index, label, type);
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
    const values = resolveValues(def, st.values, { index, id, name }, issues);
    resolved.push({ def, values, st, label, name });
  });
  return resolved;
}

function buildAsWritten(
  doc: ChainBody,
  catalogue: readonly StageDefinition[],
  options: BuildOptions,
): BuiltChain {
  const settings = builtSettings(doc.settings, options.like);
  const issues: ChainIssue[] = [];
  // The schema asks for two stages; a mode that leaves stages out can still have fewer.
  if (doc.stages.length < 2) {
    issues.push({ path: ['stages'], message: 'A chain needs at least a source and a load stage' });
    throw new ChainValidationError(issues);
  }
  const resolved = resolveStages(doc.stages, catalogue, issues);
  if (issues.length > 0) throw new ChainValidationError(issues);
  const like = options.like && reusableSettings(options.like, settings) ? options.like : undefined;

  // Build in order, carrying the design frequency through frequency-translating sections,
  // and an upper bound of the frequencies evaluated: the searches look up to twice the wider
  // of the sweep and the 2·f0 search range (a detached tank within a factor 2 of its loaded
  // resonance). Behind a mixer |f − LO| or f + LO peaks at an end of the input range.
  let f0 = settings.f0Hz;
  let fMax = 2 * Math.max(settings.sweep.stopHz, 2 * settings.f0Hz);
  const built: BuiltStage[] = [];
  const f0Flat: number[] = [];
  let flat = 0;
  resolved.forEach(({ def, values, st, label, name }, index) => {
    let model: StageModel;
    const fileId = st.dataFileId;
    const dataFile = fileId && options.dataFiles ? options.dataFiles[fileId] : undefined;
    if (fileId && options.dataFiles && !dataFile) {
      issues.push({
        stageId: st.id,
        stageIndex: index,
        path: ['stages', index, 'dataFileId'],
        message: `${name}: the attached data file "${fileId}" was not found; attach it again or remove it`,
      });
      return;
    }
    // A stage built before from the same inputs is taken over (see BuildOptions.like).
    const same = like && !fileId ? sameStage(like, index, st.id, def, values, f0) : null;
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
        stageId: st.id,
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
        stageId: st.id,
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
      id: st.id,
      type: def.type,
      label,
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
