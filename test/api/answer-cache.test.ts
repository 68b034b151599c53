/**
 * Analysis answers kept for a moment: the same request again is answered from memory, per
 * user; a changed document or a request for a fresh analysis is computed.
 */
import type { ChainDocument } from '../../shared/schema/chain';
import { createUser, send, signIn, type Client } from './support/agents';
import { exampleChain } from './support/chain-fixture';
import { createTestContext, type TestContext } from './support/test-db';

let ctx: TestContext;
let ada: Client;
let bob: Client;

const twoMetre: ChainDocument = exampleChain('two-metre-coupled-preselector');

beforeAll(async () => {
  ctx = await createTestContext();
  await createUser(ctx.services.orm.em.fork(), 'ada@answers.test');
  await createUser(ctx.services.orm.em.fork(), 'bob@answers.test');
  ada = await signIn(ctx.app, 'ada@answers.test');
  bob = await signIn(ctx.app, 'bob@answers.test');
});
afterAll(() => ctx.close());

const analyse = (client: Client, document: ChainDocument, fresh = false) => {
  const req = send(client, 'post', '/api/analysis', { document, traces: ['zIn', 'returnLoss'] });
  return fresh ? req.set('cache-control', 'no-cache') : req;
};

describe('kept analysis answers', () => {
  it('should answer the same request again from memory, with the same answer', async () => {
    const first = await analyse(ada, twoMetre);
    expect(first.status).toBe(200);
    expect(first.headers['x-analysis-answer']).toBe('computed');
    const again = await analyse(ada, twoMetre);
    expect(again.status).toBe(200);
    expect(again.headers['x-analysis-answer']).toBe('cached');
    expect(again.body).toEqual(first.body);
  });

  it('should compute a changed document afresh', async () => {
    const before = await analyse(ada, twoMetre);
    const stages = structuredClone(twoMetre.stages);
    const feeder = stages.find((s) => s.id === 'feeder')!;
    // A longer feed line: the impedance the chain presents moves.
    feeder.values = { ...feeder.values, length: 12 };
    const changed = await analyse(ada, { ...twoMetre, stages });
    expect(changed.status).toBe(200);
    expect(changed.headers['x-analysis-answer']).toBe('computed');
    expect(changed.body.sweep.returnLossDb).not.toEqual(before.body.sweep.returnLossDb);
  });

  it('should compute when asked for a fresh analysis, and find the kept answer equal to it', async () => {
    const kept = await analyse(ada, twoMetre);
    expect(kept.headers['x-analysis-answer']).toBe('cached');
    const fresh = await analyse(ada, twoMetre, true);
    expect(fresh.status).toBe(200);
    expect(fresh.headers['x-analysis-answer']).toBe('computed');
    expect(fresh.body).toEqual(kept.body);
  });

  it("should not answer one user from another's kept answers", async () => {
    const theirs = await analyse(bob, twoMetre);
    expect(theirs.status).toBe(200);
    expect(theirs.headers['x-analysis-answer']).toBe('computed');
  });

  it('should share one analysis between identical requests in flight together', async () => {
    const document = { ...twoMetre, name: `${twoMetre.name} (twice at once)` };
    const both = await Promise.all([analyse(ada, document), analyse(ada, document)]);
    expect(both.map((r) => r.status)).toEqual([200, 200]);
    expect(both.map((r) => r.headers['x-analysis-answer']).sort()).toEqual(['cached', 'computed']);
    expect(both[1].body).toEqual(both[0].body);
  });
});
