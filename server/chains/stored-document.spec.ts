import type { ChainDocument } from '../../shared/schema/chain';
import { parseChainDocument } from '../../shared/schema/parse-chain';
import { HttpError } from '../common/errors';
import { storedDocument } from './stored-document';

const saved = (): ChainDocument =>
  parseChainDocument({
    name: 'Saved',
    settings: { f0Hz: 1e6, sweep: { startHz: 1e5, stopHz: 1e7, points: 11 } },
    stages: [
      { id: 's', type: 'resistive-generator' },
      { id: 'l', type: 'envelope-detector' },
    ],
  });

describe('a stored document brought to the current schema', () => {
  it('gets the default of a field the schema gained after it was saved', () => {
    const doc = saved();
    // As a chain saved before the q-budget threshold existed reads back from the database.
    const { qBudgetLossDb: _gone, ...older } = doc.settings.thresholds;
    const stored = { ...doc, settings: { ...doc.settings, thresholds: older } } as ChainDocument;
    expect(stored.settings.thresholds.qBudgetLossDb).toBeUndefined();
    expect(storedDocument(stored).settings.thresholds.qBudgetLossDb).toBe(1);
  });

  it('is a 422 naming the field when today’s schema refuses it', () => {
    const stored = { ...saved(), name: '' };
    let error: unknown;
    try {
      storedDocument(stored);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(HttpError);
    expect(error).toMatchObject({ status: 422, code: 'invalid-chain' });
    expect((error as Error).message).toMatch(/^the saved chain is not a valid chain: \$\.name: /);
  });
});
