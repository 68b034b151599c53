/**
 * The document of a new, blank chain: a resistive source straight into an R‖C load,
 * each at its catalogue defaults. Built from the catalogue the server sends so the type
 * keys and parameter defaults are the ones the engine knows.
 */
import type { ChainDocumentInput } from '../../../../shared/schema/chain';
import type { StageTypeInfo } from '../../../../shared/engine/types';

/** Catalogue entries this module reads; the rest of StageTypeInfo is not needed here. */
export type CatalogueEntry = Pick<StageTypeInfo, 'type' | 'role' | 'label'> & {
  params: Pick<StageTypeInfo['params'][number], 'key' | 'default'>[];
};

/** Accepts the catalogue as a bare list or wrapped in `{ types }` / `{ stages }`. */
export function catalogueEntries(body: unknown): CatalogueEntry[] {
  const list = Array.isArray(body)
    ? body
    : ((body as { types?: unknown; stages?: unknown } | null)?.types ??
      (body as { stages?: unknown } | null)?.stages);
  if (!Array.isArray(list)) {
    throw new Error('The stage catalogue from the server is not a list of stage types.');
  }
  return list.filter(
    (e): e is CatalogueEntry =>
      !!e && typeof e === 'object' && typeof e.type === 'string' && Array.isArray(e.params),
  );
}

/** Prefers a type whose key matches `preferred`, else the first of the role. */
function pick(
  entries: CatalogueEntry[],
  role: CatalogueEntry['role'],
  preferred: RegExp,
): CatalogueEntry {
  const ofRole = entries.filter((e) => e.role === role);
  const chosen = ofRole.find((e) => preferred.test(e.type)) ?? ofRole[0];
  if (!chosen) {
    throw new Error(
      `The stage catalogue has no ${role} type, so a blank chain cannot be made. ` +
        'Start from an example instead.',
    );
  }
  return chosen;
}

function defaults(entry: CatalogueEntry): Record<string, number | string | boolean> {
  return Object.fromEntries(entry.params.map((p) => [p.key, p.default]));
}

/** A chain with a design frequency of f0Hz and a sweep of one octave either side. */
export function blankChainDocument(
  name: string,
  catalogue: CatalogueEntry[],
  f0Hz = 1e6,
): ChainDocumentInput {
  const source = pick(catalogue, 'source', /resist|generator/i);
  const load = pick(catalogue, 'load', /(^|-)r-?c(-|$)|rc-load|parallel/i);
  return {
    name,
    description: '',
    settings: {
      f0Hz,
      sweep: { startHz: f0Hz / 2, stopHz: f0Hz * 2, points: 401, scale: 'log' },
    },
    stages: [
      { id: 'source', type: source.type, label: source.label, values: defaults(source) },
      { id: 'load', type: load.type, label: load.label, values: defaults(load) },
    ],
  };
}
