/**
 * A Monte Carlo trial's chain built from the nominal chain: only the stages whose values were
 * drawn are built again, everything else (settings, the other stages' models, the layout of
 * sections and nodes) is the nominal's.
 *
 * buildChain with `like` already reuses the models of unchanged stages, but it still reads
 * the settings, resolves and checks every value of every stage, and lays the chain out again:
 * most of a trial's building. Here a drawn stage gets its nominal values with the drawn ones
 * put in (checked against the stage's parameter ranges as buildChain checks them) and its
 * model from its builder with the very context buildChain gave it for the nominal (design
 * frequency and highest frequency at its input, temperature, data file), recorded once.
 *
 * Whatever this does not handle is left to buildChain (`build` returns null): a chain with
 * modes (a mode may override a drawn value), a drawn value out of range or refused by its
 * builder (buildChain then names it), a drawn stage that changes frequency (a mixer: the
 * stages behind it see other frequencies) or whose section count changes, and a drawn
 * value that decides whether another parameter is shown.
 */
import type { ChainDocument } from '../../schema/chain';
import { buildChain, type BuiltChain, type BuiltStage, type FilledSection } from '../core/build';
import { pointwiseFill } from '../core/nodes';
import { defaultCatalogue } from '../default-catalogue';
import type {
  BuildContext,
  MeasuredNetwork,
  ParamSpec,
  ParamValues,
  StageDefinition,
  StageModel,
  TwoPortModel,
} from '../types';

/** One drawn value: stage position in the document, parameter key, value. */
export interface DrawnValue {
  stageIndex: number;
  key: string;
  value: number;
}

/** Builds the chains of drawn values like one nominal chain. */
export interface DrawnChainBuilder {
  /** The chain with these values drawn, or null when buildChain must build it. */
  build(drawn: readonly DrawnValue[]): BuiltChain | null;
}

/** Whether a number passes its spec as buildChain's value check passes it. */
function inRange(spec: ParamSpec, v: number): boolean {
  if (spec.kind !== 'number' || !Number.isFinite(v)) return false;
  if (spec.min !== undefined && !(spec.exclusiveMin ? v > spec.min : v >= spec.min)) return false;
  return spec.max === undefined || v <= spec.max;
}

/** The contexts buildChain gives each stage's builder, by document position (no modes). */
function recordContexts(
  doc: ChainDocument,
  dataFiles: Readonly<Record<string, MeasuredNetwork>> | undefined,
): BuildContext[] | null {
  const contexts: BuildContext[] = [];
  const recording = defaultCatalogue().map((def): StageDefinition => {
    const build = (values: ParamValues, ctx: BuildContext): StageModel => {
      contexts.push(ctx);
      return def.build(values, ctx);
    };
    return { ...def, build } as StageDefinition;
  });
  buildChain(doc, recording, { dataFiles });
  return contexts.length === doc.stages.length ? contexts : null;
}

const filled = (s: TwoPortModel['sections'][number]): FilledSection =>
  s.fill ? (s as FilledSection) : { ...s, fill: pointwiseFill(s) };

/**
 * The builder of drawn chains like `nominal` (built from `doc` with the default catalogue),
 * or null when the chain has modes.
 */
export function drawnChainBuilder(
  doc: ChainDocument,
  nominal: BuiltChain,
  dataFiles?: Readonly<Record<string, MeasuredNetwork>>,
): DrawnChainBuilder | null {
  if (nominal.mode || (doc.modes?.length ?? 0) > 0) return null;
  const recorded = recordContexts(doc, dataFiles);
  if (!recorded) return null;
  const contexts = recorded;
  const last = doc.stages.length - 1;
  const stageAt = (i: number): BuiltStage | undefined =>
    i === 0 ? nominal.source : i === last ? nominal.load : nominal.twoPorts[i - 1];

  /** The stage at document position i with `changes` drawn, or null to leave it to buildChain. */
  function drawnStage(i: number, changes: readonly DrawnValue[]): BuiltStage | null {
    const prev = stageAt(i);
    if (!prev || prev.index !== i) return null;
    const def = prev.definition;
    const values: ParamValues = { ...prev.values };
    for (const c of changes) {
      const spec = def.params.find((p) => p.key === c.key);
      if (!spec || def.params.some((p) => p.showWhen?.key === c.key)) return null;
      if (spec.showWhen && values[spec.showWhen.key] !== spec.showWhen.equals) continue; // hidden
      if (!inRange(spec, c.value)) return null;
      values[c.key] = c.value;
    }
    let model: StageModel;
    try {
      model = def.build(values, contexts[i]);
    } catch {
      return null;
    }
    if (def.role === 'two-port') {
      const sections = (model as TwoPortModel).sections;
      if (!Array.isArray(sections) || sections.length !== prev.sectionCount) return null;
      if (sections.some((s) => s.translate)) return null;
    }
    return { ...prev, values, model };
  }

  function build(drawn: readonly DrawnValue[]): BuiltChain | null {
    const byStage = new Map<number, DrawnValue[]>();
    for (const d of drawn) {
      const list = byStage.get(d.stageIndex);
      if (list) list.push(d);
      else byStage.set(d.stageIndex, [d]);
    }
    let { source, load } = nominal;
    const twoPorts = nominal.twoPorts.slice();
    const sections = nominal.sections.slice();
    for (const [i, changes] of byStage) {
      const stage = drawnStage(i, changes);
      if (!stage) return null;
      if (i === 0) source = stage as BuiltChain['source'];
      else if (i === last) load = stage as BuiltChain['load'];
      else {
        const twoPort = stage as BuiltStage<TwoPortModel>;
        twoPorts[i - 1] = twoPort;
        twoPort.model.sections.forEach((s, k) => (sections[twoPort.firstSection + k] = filled(s)));
      }
    }
    return { ...nominal, source, load, twoPorts, sections };
  }

  return { build };
}
