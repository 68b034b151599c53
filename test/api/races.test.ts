/**
 * Requests racing each other over the same rows: each race runs 50 times. The answers may
 * differ by which request wins, but none is a 500, and no row is left pointing at one that
 * was deleted.
 */
import type { ChainDocumentInput } from '../../shared/schema/chain';
import { chainDocumentSchema } from '../../shared/schema/chain';
import { createChain } from '../../server/chains/chain-store';
import { ChainSchema } from '../../server/chains/chain.entity';
import { DataFileSchema } from '../../server/files/data-file.entity';
import { UserSchema } from '../../server/users/user.entity';
import { WorkspaceSchema } from '../../server/workspaces/workspace.entity';
import { createUser, createWorkspace, send, signIn, type Client } from './support/agents';
import { fixtureChain } from './support/chain-fixture';
import { createTestContext, type TestContext } from './support/test-db';

const ROUNDS = 50;
const ONE_PORT = '! a loop on the bench\n# MHz S RI R 50\n0.5 0.2 -0.3\n2.0 0.1 -0.5\n';

let ctx: TestContext;
let editor: Client;
let wid: string;
let editorId: string;

beforeAll(async () => {
  ctx = await createTestContext();
  const em = ctx.services.orm.em.fork();
  const user = await createUser(em, 'racer@races.test');
  editorId = user.id;
  wid = (await createWorkspace(em, 'Race track', [[user, 'editor']])).id;
  editor = await signIn(ctx.app, 'racer@races.test');
});
afterAll(() => ctx.close());

async function freshChain(name: string) {
  const em = ctx.services.orm.em.fork();
  return createChain(em, {
    workspace: await em.findOneOrFail(WorkspaceSchema, wid),
    document: chainDocumentSchema.parse(fixtureChain({ name })),
    user: await em.findOneOrFail(UserSchema, editorId),
    message: 'race',
  });
}

function withFile(doc: ChainDocumentInput, fileId: string): ChainDocumentInput {
  doc.stages[0] = {
    id: 'ant',
    type: 'measured-antenna',
    label: 'Bench loop',
    values: { fieldRms: 50e-6, effectiveHeight: 0.2 },
    dataFileId: fileId,
  };
  return doc;
}

/** Starts both requests in the same tick, alternating which one is sent first. */
async function race<A, B>(round: number, a: () => Promise<A>, b: () => Promise<B>) {
  if (round % 2 === 0) return Promise.all([a(), b()]);
  const [rb, ra] = await Promise.all([b(), a()]);
  return [ra, rb] as [A, B];
}

describe('races', () => {
  it(`should answer "duplicate as variant" racing a delete of its source without a 500 (${ROUNDS} rounds)`, async () => {
    const seen = new Map<string, number>();
    for (let round = 0; round < ROUNDS; round++) {
      const source = await freshChain(`Source ${round}`);
      const [dup, del] = await race(
        round,
        () => send(editor, 'post', `/api/chains/${source.id}/duplicate`, { asVariant: true }),
        () => send(editor, 'delete', `/api/chains/${source.id}`),
      );
      const key = `${dup.status}/${del.status}`;
      seen.set(key, (seen.get(key) ?? 0) + 1);
      expect(del.status).toBe(204);
      expect([201, 404, 409]).toContain(dup.status);
      if (dup.status === 409) expect(dup.body.error).toBe('gone');
      if (dup.status === 201) {
        // The variant outlived its source: its link is cleared, not dangling.
        const copy = await ctx.services.orm.em.fork().findOneOrFail(ChainSchema, dup.body.id);
        expect(copy.parent).toBeNull();
      }
    }
    if (process.env.CW_RACE_REPORT) process.stdout.write(`duplicate race: ${[...seen]}\n`);
    // Both orders happened, so the race was really run (and not one side always first).
    expect([...seen.keys()].length).toBeGreaterThan(1);
  }, 120_000);

  it(`should never leave a chain using a data file deleted while it was saved (${ROUNDS} rounds)`, async () => {
    const outcomes = new Map<string, number>();
    for (let round = 0; round < ROUNDS; round++) {
      const em = ctx.services.orm.em.fork();
      const file = em.create(DataFileSchema, {
        workspace: await em.findOneOrFail(WorkspaceSchema, wid),
        name: `loop-${round}.s1p`,
        kind: 's1p',
        content: ONE_PORT,
        portCount: 1,
        pointCount: 2,
        fMinHz: 0.5e6,
        fMaxHz: 2e6,
        uploadedBy: await em.findOneOrFail(UserSchema, editorId),
      });
      await em.flush();
      const chain = await freshChain(`Uses file ${round}`);
      const [save, del] = await race(
        round,
        () =>
          send(editor, 'put', `/api/chains/${chain.id}`, {
            version: chain.version,
            document: withFile(fixtureChain({ name: `Uses file ${round}` }), file.id),
          }),
        () => send(editor, 'delete', `/api/workspaces/${wid}/files/${file.id}`),
      );
      const key = `${save.status}/${del.status}`;
      outcomes.set(key, (outcomes.get(key) ?? 0) + 1);
      // Exactly one wins: the save (and the delete is refused) or the delete (and the save is).
      expect([key]).toEqual([expect.stringMatching(/^(200\/409|422\/204)$/)]);
      const check = ctx.services.orm.em.fork();
      const fileLeft = await check.count(DataFileSchema, { id: file.id });
      const stored = await check.findOneOrFail(ChainSchema, chain.id);
      const usesFile = stored.document.stages.some((s) => s.dataFileId === file.id);
      // A chain that uses the file implies the file is still there.
      expect(!usesFile || fileLeft === 1).toBe(true);
    }
    if (process.env.CW_RACE_REPORT) process.stdout.write(`file race: ${[...outcomes]}\n`);
  }, 120_000);

  it('should refuse to save a chain naming a data file that does not exist', async () => {
    const chain = await freshChain('Names a ghost file');
    const res = await send(editor, 'put', `/api/chains/${chain.id}`, {
      version: chain.version,
      document: withFile(fixtureChain(), '0b0e7a52-6c1f-4d36-9a57-0d5f6a3c9e10'),
    });
    expect(res.status).toBe(422);
    expect(res.body).toMatchObject({ error: 'missing-data-file', details: { stageId: 'ant' } });
    expect(res.body.message).toContain('stage 1 (Bench loop)');
  });
});
