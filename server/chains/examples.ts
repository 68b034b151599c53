import { promises as fs } from 'node:fs';
import path from 'node:path';
import type { ExampleDto } from '../../shared/schema/api';
import { chainDocumentSchema, type ChainDocument } from '../../shared/schema/chain';
import { NotFoundError } from '../common/errors';
import { zodDetails } from '../common/validate';

const SUFFIX = '.chain.json';
const KEY = /^[a-z0-9][a-z0-9-]{0,79}$/;

/** One example file, validated. `variantOf` is the key of the example it is a variant of. */
export interface ExampleChain {
  key: string;
  document: ChainDocument;
  variantOf?: string;
}

/** Reads and validates `examples/<key>.chain.json`; the error names the file and the field. */
export async function readExample(dir: string, key: string): Promise<ExampleChain> {
  if (!KEY.test(key)) throw new NotFoundError(`no example "${key}"; GET /api/examples lists them`);
  const file = path.join(dir, key + SUFFIX);
  let raw: unknown;
  try {
    raw = JSON.parse(await fs.readFile(file, 'utf8'));
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') {
      throw new NotFoundError(`no example "${key}"; GET /api/examples lists them`);
    }
    throw new Error(`examples: ${key}${SUFFIX} is not readable JSON: ${(err as Error).message}`);
  }
  // `variantOf` is a seed-only annotation, not part of the chain document.
  const { variantOf, ...doc } = (raw ?? {}) as Record<string, unknown>;
  const parsed = chainDocumentSchema.safeParse(doc);
  if (!parsed.success) {
    const first = zodDetails(parsed.error)[0];
    throw new Error(
      `examples: ${key}${SUFFIX} is not a valid chain: ${first.path}: ${first.message}`,
    );
  }
  return {
    key,
    document: parsed.data,
    variantOf: typeof variantOf === 'string' ? variantOf : undefined,
  };
}

/** Every valid example in `dir`, sorted by key; invalid files are logged and left out. */
export async function readExamples(dir: string): Promise<ExampleChain[]> {
  let names: string[];
  try {
    names = await fs.readdir(dir);
  } catch {
    return [];
  }
  const keys = names.filter((n) => n.endsWith(SUFFIX)).map((n) => n.slice(0, -SUFFIX.length));
  const examples: ExampleChain[] = [];
  for (const key of keys.sort()) {
    try {
      examples.push(await readExample(dir, key));
    } catch (err) {
      console.warn(`[server] ${(err as Error).message}`);
    }
  }
  return examples;
}

export function toExampleDto(e: ExampleChain): ExampleDto {
  return { key: e.key, name: e.document.name, description: e.document.description };
}
