/**
 * Property: every finite number the chain schema accepts, put into any stage value of a
 * working chain, gets a finite answer or a 422 that names what to fix; never a 500 and never
 * a 200 whose figures have turned into nulls (JSON's spelling of NaN and Infinity). A figure
 * is "one the answer must have" when the unaltered chain's answer has a number there.
 */
import fc from 'fast-check';
import type { ChainDocumentInput } from '../../shared/schema/chain';
import { createUser, send, signIn, type Client } from './support/agents';
import { fixtureChain } from './support/chain-fixture';
import { createTestContext, type TestContext } from './support/test-db';

jest.setTimeout(300_000);

let ctx: TestContext;
let client: Client;
let baseline: Record<string, unknown>;
const CENTRE_FIGURES = ['nodes', 'stages', 'levels'];

/** The fixture chain with a short sweep, so each run stays quick but covers the sweep too. */
const chain = (): ChainDocumentInput => {
  const doc = fixtureChain();
  return { ...doc, settings: { ...doc.settings, sweep: { ...doc.settings.sweep!, points: 21 } } };
};

/** The numeric stage values of the chain, as [stage index, key]. */
const NUMERIC = chain().stages.flatMap((st, i) =>
  Object.entries(st.values ?? {})
    .filter(([, v]) => typeof v === 'number')
    .map(([k]) => [i, k] as const),
);

/** Paths where `reference` holds a number but `answer` does not (null, missing, other). */
function lostNumbers(reference: unknown, answer: unknown, path = '', out: string[] = []) {
  if (typeof reference === 'number') {
    if (typeof answer !== 'number' || !Number.isFinite(answer)) out.push(path || '(root)');
  } else if (Array.isArray(reference)) {
    if (!Array.isArray(answer)) out.push(path);
    else reference.forEach((r, i) => lostNumbers(r, answer[i], `${path}[${i}]`, out));
  } else if (reference && typeof reference === 'object') {
    if (!answer || typeof answer !== 'object') out.push(path);
    else
      for (const [k, r] of Object.entries(reference))
        lostNumbers(r, (answer as Record<string, unknown>)[k], `${path}.${k}`, out);
  }
  return out;
}

beforeAll(async () => {
  ctx = await createTestContext();
  await createUser(ctx.services.orm.em.fork(), 'fuzz@finite.test');
  client = await signIn(ctx.app, 'fuzz@finite.test');
  const res = await send(client, 'post', '/api/analysis', { document: chain(), sweep: true });
  expect(res.status).toBe(200);
  baseline = res.body;
}, 60_000);
afterAll(() => ctx.close());

describe('finite answers', () => {
  it('should answer any finite stage value with finite figures or a 422', async () => {
    expect(NUMERIC.length).toBeGreaterThan(3);
    const extremes = fc.constantFrom(1e308, -1e308, 5e-324, -5e-324, 1e-300, 1e300, 0, 1, -1);
    await fc.assert(
      fc.asyncProperty(
        fc.constantFrom(...NUMERIC),
        fc.oneof(extremes, fc.double({ noNaN: true, noDefaultInfinity: true })),
        async ([stage, key], value) => {
          const doc = chain();
          doc.stages[stage] = {
            ...doc.stages[stage],
            values: { ...doc.stages[stage].values, [key]: value },
          };
          const res = await send(client, 'post', '/api/analysis', { document: doc, sweep: true });
          if (res.status === 422) {
            expect(res.body.message).toEqual(expect.any(String));
            return;
          }
          expect(res.status).toBe(200);
          // The figures at the centre frequency: node impedances, levels and step-up, the
          // stage budget. (A bandwidth may honestly be unknown when its edges leave the sweep.)
          const lost = CENTRE_FIGURES.flatMap((k) =>
            lostNumbers(baseline[k], res.body[k], `.${k}`),
          );
          expect(lost.slice(0, 5)).toEqual([]);
          // The sweep keeps its frequency axis and is not mostly nulls.
          const values = JSON.stringify(res.body.sweep ?? {}).match(/-?\d|null/g) ?? [];
          const nulls = values.filter((v) => v === 'null').length;
          expect(nulls).toBeLessThan(values.length / 2);
        },
      ),
      { numRuns: 200, seed: 20261202 },
    );
  });
});
