/**
 * Small helpers the design assistants share: a chain document copied with one value changed,
 * building it against the catalogue, and finding a resonator's entry again after a change.
 */
import type { ChainDocument, StageInstance } from '../../schema/chain';
import { buildChain, type BuildOptions, type BuiltChain } from '../core/build';
import { defaultCatalogue } from '../default-catalogue';
import { StageParameterError } from '../errors';
import type { ParamSpec, StageDefinition } from '../types';

/** What the caller resolved outside the engine, as for analyzeChain. */
export interface DesignOptions extends BuildOptions {
  catalogue?: readonly StageDefinition[];
}

/** Builds a chain document (throws ChainValidationError listing what to fix). */
export function buildDoc(doc: ChainDocument, options: DesignOptions = {}): BuiltChain {
  return buildChain(doc, options.catalogue ?? defaultCatalogue(), options);
}

/** A deep copy of the document (plain JSON data). */
export function copyDoc<T extends ChainDocument>(doc: T): T {
  return structuredClone(doc);
}

/** The document with stage `stageId`'s value `key` set to `value` (the input is untouched). */
export function withValue(
  doc: ChainDocument,
  stageId: string,
  key: string,
  value: number,
): ChainDocument {
  const out = { ...doc, stages: doc.stages.map((s) => ({ ...s, values: { ...s.values } })) };
  stageOf(out, stageId).values[key] = value;
  return out;
}

/** The stage with this id. @throws StageParameterError naming the id. */
export function stageOf(doc: ChainDocument, stageId: string): StageInstance {
  const stage = doc.stages.find((s) => s.id === stageId);
  if (!stage) {
    throw new StageParameterError('stageId', `there is no stage "${stageId}" in this chain`);
  }
  return stage;
}

/** The stage type's definition. @throws StageParameterError for an unknown type. */
export function definitionOf(stage: StageInstance, options: DesignOptions = {}): StageDefinition {
  const def = (options.catalogue ?? defaultCatalogue()).find((d) => d.type === stage.type);
  if (!def) {
    throw new StageParameterError('type', `stage "${stage.id}" has an unknown type ${stage.type}`);
  }
  return def;
}

/** Whether a parameter is shown for these values (its showWhen condition holds). */
export function paramShown(spec: ParamSpec, values: StageInstance['values']): boolean {
  if (!spec.showWhen) return true;
  return values[spec.showWhen.key] === spec.showWhen.equals;
}

/** The stage's value for a numeric key, falling back to the schema's default. */
export function numberValue(stage: StageInstance, spec: ParamSpec): number {
  const v = stage.values[spec.key];
  return typeof v === 'number' ? v : Number(spec.default);
}

/** Stage categories built from parts you buy (not device models such as an amplifier's). */
const PART_CATEGORIES = new Set(['element', 'filter', 'matching', 'coupler']);

/**
 * The component parameters of a stage (inductances, capacitances, resistances that carry a
 * tolerance, i.e. parts you buy) shown for its current values.
 */
export function componentParams(stage: StageInstance, def: StageDefinition): ParamSpec[] {
  if (!PART_CATEGORIES.has(def.category)) return [];
  return def.params.filter(
    (p) =>
      p.kind === 'number' &&
      (p.unit === 'henry' || p.unit === 'farad' || p.unit === 'ohm') &&
      p.tolerance === true &&
      paramShown(p, stage.values),
  );
}
