/**
 * Chain-file import: an exported `.chain.json` comes back as a new chain; a malformed file,
 * an unknown format version and an oversized file are refused with where and what to fix.
 * A smaller fuzz run (fast-check, fixed seed) checks the route never answers 500.
 */
import fc from 'fast-check';
import { chainDocumentSchema } from '../../shared/schema/chain';
import { CHAIN_FILE_MAX_CHARS } from '../../shared/io/chain-file';
import { createUser, createWorkspace, send, signIn, type Client } from './support/agents';
import { fixtureChain } from './support/chain-fixture';
import { createTestContext, type TestContext } from './support/test-db';

let ctx: TestContext;
let editor: Client;
let wid: string;
let otherWid: string;

beforeAll(async () => {
  ctx = await createTestContext();
  const em = ctx.services.orm.em.fork();
  const e = await createUser(em, 'editor@import.test');
  wid = (await createWorkspace(em, 'Imports', [[e, 'editor']])).id;
  otherWid = (await createWorkspace(em, 'Elsewhere', [[e, 'editor']])).id;
  editor = await signIn(ctx.app, 'editor@import.test');
});
afterAll(() => ctx.close());

const url = () => `/api/workspaces/${wid}/chains/import`;

async function exported(name: string): Promise<string> {
  const doc = chainDocumentSchema.parse(fixtureChain({ name }));
  const res = await send(editor, 'post', '/api/export', { document: doc, format: 'json' });
  expect(res.status).toBe(200);
  return res.text;
}

describe('POST /api/workspaces/:wid/chains/import', () => {
  it('imports an exported chain file as a new chain with the same document', async () => {
    const text = await exported('Imported tank');
    const res = await send(editor, 'post', url(), { text, fileName: 'imported-tank.chain.json' });
    expect(res.status).toBe(201);
    expect(res.body.chain.name).toBe('Imported tank');
    expect(res.body.detachedDataFiles).toEqual([]);
    const read = await send(editor, 'get', `/api/chains/${res.body.chain.id}`);
    expect(read.status).toBe(200);
    expect(read.body.document).toEqual(chainDocumentSchema.parse(JSON.parse(text)));
    const list = await send(editor, 'get', `/api/workspaces/${wid}/chains?q=Imported`);
    expect(list.body.items.map((c: { id: string }) => c.id)).toContain(res.body.chain.id);
  });

  it('detaches a data file the workspace does not hold, and says which stage', async () => {
    const up = await send(editor, 'post', `/api/workspaces/${otherWid}/files`, {
      name: 'elsewhere.s2p',
      content: '# MHz S RI R 50\n1 0 0 0.9 0 0.9 0 0 0\n',
    });
    expect(up.status).toBe(201);
    const doc = fixtureChain({ name: 'With a file' });
    doc.stages.splice(1, 0, {
      id: 'meas',
      type: 'measured-two-port',
      label: 'Filter',
      values: {},
      dataFileId: up.body.id,
    });
    const res = await send(editor, 'post', url(), { text: JSON.stringify(doc) });
    expect(res.status).toBe(201);
    expect(res.body.detachedDataFiles).toEqual([{ stageId: 'meas', label: 'Filter' }]);
    const stage = res.body.chain.document.stages.find((s: { id: string }) => s.id === 'meas');
    expect(stage.dataFileId).toBeUndefined();
  });

  it('refuses text that is not JSON with 422 and its line and column', async () => {
    const text = (await exported('Broken')).replace('"stages": [', '"stages": [,');
    const line = text.split('\n').findIndex((l) => l.includes('"stages": [,')) + 1;
    const res = await send(editor, 'post', url(), { text, fileName: 'broken.chain.json' });
    expect(res.status).toBe(422);
    expect(res.body.error).toBe('chain-file-not-json');
    expect(res.body.details.line).toBe(line);
    expect(res.body.message).toContain(`broken.chain.json, line ${line}, column`);
  });

  it('refuses an unknown format version with 422 saying which version is read', async () => {
    const doc = { ...JSON.parse(await exported('Future')), formatVersion: 7 };
    const res = await send(editor, 'post', url(), { text: JSON.stringify(doc) });
    expect(res.status).toBe(422);
    expect(res.body.error).toBe('chain-file-unknown-version');
    expect(res.body.message).toContain('format version 7');
    expect(res.body.message).toContain('reads version 1');
  });

  it('refuses a field the schema rejects with its JSON path', async () => {
    const doc = JSON.parse(await exported('Bad field'));
    doc.stages[1].type = 42;
    const res = await send(editor, 'post', url(), { text: JSON.stringify(doc) });
    expect(res.status).toBe(422);
    expect(res.body.details.path).toBe('$.stages[1].type');
    expect(res.body.message).toContain('$.stages[1].type');
  });

  it('refuses a file above the size limit with 413 and creates nothing', async () => {
    const before = await send(editor, 'get', `/api/workspaces/${wid}/chains`);
    const doc = JSON.parse(await exported('Huge'));
    doc.description = 'x'.repeat(10);
    const text = JSON.stringify(doc) + ' '.repeat(CHAIN_FILE_MAX_CHARS);
    const res = await send(editor, 'post', url(), { text });
    expect(res.status).toBe(413);
    expect(res.body.message).toContain('at most 512 KiB');
    const after = await send(editor, 'get', `/api/workspaces/${wid}/chains`);
    expect(after.body.total).toBe(before.body.total);
  });

  it('answers 422 (never 500) to 200 random and mutated files (fast-check, seed 13)', async () => {
    const base = await exported('Fuzz');
    const mutated = fc
      .tuple(fc.nat({ max: base.length }), fc.nat({ max: 40 }), fc.string({ maxLength: 8 }))
      .map(([at, cut, insert]) => base.slice(0, at) + insert + base.slice(at + cut));
    await fc.assert(
      fc.asyncProperty(fc.oneof(mutated, fc.string({ maxLength: 200 })), async (text) => {
        const res = await send(editor, 'post', url(), { text });
        expect([201, 422]).toContain(res.status);
        if (res.status === 422) {
          const d = res.body.details ?? {};
          expect(d.line !== null || d.path !== null).toBe(true);
        }
      }),
      { seed: 13, numRuns: 200 },
    );
  });
});
