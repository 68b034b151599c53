/**
 * The one way from JSON to a chain document the engine accepts: the zod schema's parse, with
 * its defaults filled. The engine takes only the parsed `ChainDocument`, so the CLI, the
 * benchmark, the study thread and tests call this once and pass the result on.
 */
import { chainDocumentSchema, type ChainDocument } from './chain';

/** One problem of a document, at a path into it. */
export interface ChainDocumentProblem {
  path: (string | number)[];
  message: string;
}

/** A value that is not a chain document; the message names the path of every problem. */
export class ChainDocumentError extends Error {
  constructor(
    readonly problems: ChainDocumentProblem[],
    what = 'the chain document',
  ) {
    super(
      `${what} is not a valid chain: ` +
        problems.map((p) => `${jsonPath(p.path)}: ${p.message}`).join('; '),
    );
    this.name = 'ChainDocumentError';
  }
}

/** `$.stages[2].values.l` from a zod issue path. */
export function jsonPath(path: readonly PropertyKey[]): string {
  let out = '$';
  for (const key of path) {
    if (typeof key === 'number') out += `[${key}]`;
    else if (typeof key === 'string' && /^[A-Za-z_$][\w$]*$/.test(key)) out += `.${key}`;
    else out += `[${JSON.stringify(String(key))}]`;
  }
  return out;
}

/**
 * The chain document in `json` (already decoded from text), defaults filled.
 * @param what how messages name the document (e.g. the file it came from)
 * @throws ChainDocumentError naming the path and the problem of every field the schema refuses
 */
export function parseChainDocument(json: unknown, what?: string): ChainDocument {
  const parsed = chainDocumentSchema.safeParse(json);
  if (parsed.success) return parsed.data;
  throw new ChainDocumentError(
    parsed.error.issues.map((i) => ({
      path: i.path.map((p) => (typeof p === 'number' ? p : String(p))),
      message: i.message,
    })),
    what,
  );
}
