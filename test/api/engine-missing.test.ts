/**
 * The server starts and keeps saving chains while the engine is missing or incomplete;
 * only the analysis routes answer 503.
 */
import { createUser, createWorkspace, send, signIn, type Client } from './support/agents';
import { fixtureChain } from './support/chain-fixture';
import { createTestContext, type TestContext } from './support/test-db';

// An engine module without its functions, as while it is being written.
jest.mock('../../shared/engine', () => ({}));

let ctx: TestContext;
let editor: Client;
let wid: string;
let warn: jest.SpyInstance;

beforeAll(async () => {
  ctx = await createTestContext();
  const em = ctx.services.orm.em.fork();
  const user = await createUser(em, 'editor@no-engine.test');
  wid = (await createWorkspace(em, 'No engine', [[user, 'editor']])).id;
  editor = await signIn(ctx.app, 'editor@no-engine.test');
});
beforeEach(() => {
  warn = jest.spyOn(console, 'warn').mockImplementation(() => undefined);
});
afterAll(() => ctx.close());

describe('without an engine', () => {
  it('should answer 503 on the analysis routes, saying why', async () => {
    const analysis = await send(editor, 'post', '/api/analysis', { document: fixtureChain() });
    expect(analysis.status).toBe(503);
    expect(analysis.body.error).toBe('engine-unavailable');
    expect((await send(editor, 'get', '/api/catalogue')).status).toBe(503);
    // The server log says once why analysis is off.
    expect(warn).toHaveBeenCalledTimes(1);
    expect(String(warn.mock.calls[0][0])).toContain('analysis is unavailable');
  });

  it('should still save chains, with no flags counted', async () => {
    const res = await send(editor, 'post', `/api/workspaces/${wid}/chains`, {
      document: fixtureChain(),
    });
    expect(res.status).toBe(201);
    expect(res.body.flagCount).toBe(0);
  });
});
