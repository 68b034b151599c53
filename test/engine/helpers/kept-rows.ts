/**
 * What the kept-rows tests of the node analysis share (core-nodes-kept-impedances and
 * core-nodes-kept-voltages): the example chains, a grid of several blocks of points, and a
 * bit-for-bit comparison of two arrays.
 */
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { buildChain, type BuiltChain } from '../../../shared/engine/core/build';
import { BLOCK } from '../../../shared/engine/core/nodes';
import { defaultCatalogue } from '../../../shared/engine/default-catalogue';
import { chainDocumentSchema } from '../../../shared/schema/chain';

const DIR = path.join(__dirname, '..', '..', '..', 'examples');

/** The example chains' names (their files without `.chain.json`). */
export const exampleKeys = readdirSync(DIR)
  .filter((n) => n.endsWith('.chain.json'))
  .map((n) => n.slice(0, -'.chain.json'.length));

/** An example chain, built, its sweep over `points` points when given. */
export function builtExample(key: string, points?: number): BuiltChain {
  const { variantOf: _v, ...raw } = JSON.parse(readFileSync(path.join(DIR, `${key}.chain.json`), 'utf8')); // prettier-ignore
  if (points !== undefined) raw.settings.sweep.points = points;
  return buildChain(chainDocumentSchema.parse(raw), defaultCatalogue());
}

/** Frequencies over the chain's sweep: three full blocks and a part of one. */
export function grid(built: BuiltChain, points = 3 * BLOCK + 17): Float64Array {
  const { startHz, stopHz } = built.settings.sweep;
  return Float64Array.from({ length: points }, (_, i) => startHz + ((stopHz - startHz) * i) / (points - 1)); // prettier-ignore
}

/** Where two arrays differ (Object.is: NaN equals NaN, +0 is not −0), at most a few. */
export function differences(
  got: ArrayLike<number>,
  want: ArrayLike<number>,
  what: string,
): string[] {
  const out: string[] = [];
  if (got.length !== want.length) return [`${what}: length ${got.length} ≠ ${want.length}`];
  for (let i = 0; i < want.length && out.length < 3; i++) {
    if (!Object.is(got[i], want[i])) out.push(`${what}[${i}]: ${got[i]} ≠ ${want[i]}`);
  }
  return out;
}
