/**
 * Taking a stage's model over from a chain built before (`BuildOptions.like`): a study's drawn
 * chain and its nominal differ at most in some values, so every stage whose inputs are the
 * same keeps the model already built. Models are immutable once built, so sharing is safe.
 */
import type { ChainSettings } from '../../schema/chain';
import type { ParamValues, StageDefinition, StageModel } from '../types';
import { attachment } from './attached';
import type { BuiltChain } from './build';

/**
 * The settings (as JSON) of each built chain's settings object, written when a later build
 * first compares its own with them: a chain built without `like` does not pay for it.
 */
const settingsSource = attachment<ChainSettings, string>('settings JSON');

/** The JSON of a built chain's settings (which nothing changes once built). */
function sourceJson(settings: ChainSettings): string {
  let json = settingsSource.get(settings);
  if (json === undefined) settingsSource.set(settings, (json = JSON.stringify(settings)));
  return json;
}

/**
 * A deep copy of plain data (objects, arrays and primitives, as the chain schema parses
 * them), as `structuredClone` makes it but without its serialisation; anything else (a Date,
 * a Map) goes to `structuredClone`.
 */
function copyPlain<T>(value: T): T {
  if (typeof value !== 'object' || value === null) return value;
  if (Array.isArray(value)) return value.map(copyPlain) as T;
  if (Object.getPrototypeOf(value) !== Object.prototype) return structuredClone(value);
  const out: Record<string, unknown> = {};
  for (const key of Object.keys(value)) out[key] = copyPlain((value as Record<string, unknown>)[key]); // prettier-ignore
  return out as T;
}

/**
 * The settings object of a chain being built: `like`'s own when the document's settings are
 * the same (callers tell a chain built like another by this identity, e.g. a study's trial
 * reusing its nominal's sweep), else a copy, so that the built chain does not change when
 * the caller edits its document afterwards (a band study moves the dial in place).
 */
export function builtSettings(settings: ChainSettings, like?: BuiltChain): ChainSettings {
  if (like && sourceJson(like.settings) === JSON.stringify(settings)) return like.settings;
  return copyPlain(settings);
}

/**
 * Whether models of `like` can stand for this chain's at all: built at the same temperature
 * and for the same highest frequency evaluated (which follows from the sweep's stop).
 */
export function reusableSettings(like: BuiltChain, settings: ChainSettings): boolean {
  return (
    like.settings.temperatureK === settings.temperatureK &&
    like.settings.sweep.stopHz === settings.sweep.stopHz &&
    like.settings.f0Hz === settings.f0Hz
  );
}

/**
 * The model of stage `index` of `like` when it was built from the same type, values and
 * design frequency at its input (so building it again would give the same model), else null.
 */
export function sameStage(
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
