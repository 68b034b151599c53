import { readFileSync } from 'node:fs';
import path from 'node:path';
import { REPO_ROOT } from '../../../server/config';
import {
  chainDocumentSchema,
  type ChainDocument,
  type ChainDocumentInput,
} from '../../../shared/schema/chain';
import { FIXTURES } from './test-db';

/** The fixture chain as a client would send it (no `variantOf`). */
export function fixtureChain(overrides: Partial<ChainDocumentInput> = {}): ChainDocumentInput {
  const raw = JSON.parse(
    readFileSync(path.join(FIXTURES, 'examples', 'test-tank.chain.json'), 'utf8'),
  );
  return { ...raw, ...overrides };
}

/** A shipped example (`examples/<name>.chain.json`), parsed as the server parses a request. */
export function exampleChain(name: string): ChainDocument {
  return chainDocumentSchema.parse(
    JSON.parse(readFileSync(path.join(REPO_ROOT, 'examples', `${name}.chain.json`), 'utf8')),
  );
}
