import { readFileSync } from 'node:fs';
import path from 'node:path';
import type { ChainDocumentInput } from '../../../shared/schema/chain';
import { FIXTURES } from './test-db';

/** The fixture chain as a client would send it (no `variantOf`). */
export function fixtureChain(overrides: Partial<ChainDocumentInput> = {}): ChainDocumentInput {
  const raw = JSON.parse(
    readFileSync(path.join(FIXTURES, 'examples', 'test-tank.chain.json'), 'utf8'),
  );
  return { ...raw, ...overrides };
}
