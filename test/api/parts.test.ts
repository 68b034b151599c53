/**
 * The parts bin: a CSV of the team's inductors and capacitors previewed with its header
 * mapping, imported, listed, replaced and deleted; bad lists refused with the line.
 */
import fc from 'fast-check';
import { PARTS_CSV_MAX_CHARS } from '../../shared/io/parts-csv';
import { createUser, createWorkspace, send, signIn, type Client } from './support/agents';
import { createTestContext, type TestContext } from './support/test-db';

let ctx: TestContext;
let editor: Client;
let viewer: Client;
let wid: string;

beforeAll(async () => {
  ctx = await createTestContext();
  const em = ctx.services.orm.em.fork();
  const e = await createUser(em, 'editor@parts.test');
  const v = await createUser(em, 'viewer@parts.test');
  wid = (
    await createWorkspace(em, 'Parts', [
      [e, 'editor'],
      [v, 'viewer'],
    ])
  ).id;
  editor = await signIn(ctx.app, 'editor@parts.test');
  viewer = await signIn(ctx.app, 'viewer@parts.test');
});
afterAll(() => ctx.close());

const base = () => `/api/workspaces/${wid}/parts`;
// The team's own headings: "Ref" for the part number, "L/C" for the kind, "Qu" and "@".
const TEAM_CSV =
  'Ref;L/C;Nominal;Qu;@;Tol;Remarks\n' +
  'BIN-7;L;2.2 uH;85;7 MHz;5;air core\n' +
  'BIN-9;C;150p;800;7 MHz;±2 %;"NP0, 100 V"\n';

describe('parts bin', () => {
  it('previews with a guessed mapping, then with the mapping the user chose', async () => {
    const guessed = await send(editor, 'post', `${base()}/preview`, { text: TEAM_CSV });
    expect(guessed.status).toBe(200);
    expect(guessed.body.headers).toEqual(['Ref', 'L/C', 'Nominal', 'Qu', '@', 'Tol', 'Remarks']);
    // "Ref", "L/C" and "@" are not spellings the guess knows; the rest are. Without a kind
    // column "150p" (no unit) cannot be read: the preview says where, with the columns.
    expect(guessed.body.mapping).toEqual({ value: 2, q: 3, tolerance: 5, notes: 6 });
    expect(guessed.body.parts).toEqual([]);
    expect(guessed.body.problem).toEqual({
      line: 3,
      message: expect.stringContaining('line 3: say whether "150p" is an inductor or a capacitor'),
    });
    const mapping = { partNumber: 0, kind: 1, value: 2, q: 3, qFreq: 4, tolerance: 5, notes: 6 };
    const chosen = await send(editor, 'post', `${base()}/preview`, { text: TEAM_CSV, mapping });
    expect(chosen.status).toBe(200);
    expect(chosen.body.parts).toEqual([
      {
        partNumber: 'BIN-7',
        kind: 'inductor',
        value: 2.2e-6,
        q: 85,
        qFreqHz: 7e6,
        tolerancePct: 5,
        notes: 'air core',
        line: 2,
      },
      {
        partNumber: 'BIN-9',
        kind: 'capacitor',
        value: 150e-12,
        q: 800,
        qFreqHz: 7e6,
        tolerancePct: 2,
        notes: 'NP0, 100 V',
        line: 3,
      },
    ]);
    // A preview stores nothing.
    expect((await send(viewer, 'get', base())).body).toEqual([]);
  });

  it('imports, lists for a viewer, replaces and deletes', async () => {
    const mapping = { partNumber: 0, kind: 1, value: 2, q: 3, qFreq: 4, tolerance: 5, notes: 6 };
    const first = await send(editor, 'post', `${base()}/import`, { text: TEAM_CSV, mapping });
    expect(first.status).toBe(201);
    expect(first.body.added).toBe(2);
    const list = await send(viewer, 'get', base());
    expect(list.status).toBe(200);
    // Capacitors before inductors, then by value.
    expect(list.body.map((p: { partNumber: string }) => p.partNumber)).toEqual(['BIN-9', 'BIN-7']);
    const more = await send(editor, 'post', `${base()}/import`, {
      text: 'Part number,Value,Q\nC-47P,47 pF,600\n',
    });
    expect(more.body.parts).toHaveLength(3);
    const replaced = await send(editor, 'post', `${base()}/import`, {
      text: 'Part number,Value\nL-1U,1 uH\n',
      replace: true,
    });
    expect(replaced.body.parts.map((p: { partNumber: string }) => p.partNumber)).toEqual(['L-1U']);
    const id = replaced.body.parts[0].id;
    expect((await send(viewer, 'delete', `${base()}/${id}`)).status).toBe(403);
    expect((await send(editor, 'delete', `${base()}/${id}`)).status).toBe(204);
    expect((await send(editor, 'delete', `${base()}/${id}`)).status).toBe(404);
  });

  it.each([
    ['a value without a unit or kind', 'Value\n22\n', 2, 'inductor or a capacitor'],
    ['a bad value', 'Kind,Value\nL,22 uF\n', 2, '"Value" "22 uF"'],
    ['a negative Q', 'Value,Q\n10 uH,-3\n', 2, 'not a Q above 0'],
    ['a tolerance over 100 %', 'Value,Tolerance\n10 uH,150\n', 2, 'percentage from 0 to 100'],
    ['no value column', 'Part,Notes\nX,y\n', 1, 'no column holds the value'],
    ['an open quote', 'Value,Notes\n10 uH,ok\n10 uH,"open\n', 3, 'Quoted field unterminated'],
  ])('refuses %s with 422 naming line %i and nothing stored', async (_what, text, line, says) => {
    const before = (await send(editor, 'get', base())).body.length;
    const res = await send(editor, 'post', `${base()}/import`, { text });
    expect(res.status).toBe(422);
    expect(res.body.details).toEqual({ line });
    expect(res.body.message).toMatch(new RegExp(`^line ${line}: `));
    expect(res.body.message).toContain(says);
    expect((await send(editor, 'get', base())).body.length).toBe(before);
  });

  it('refuses a list over the size limit with 413', async () => {
    const text = 'Value\n' + '10 uH\n'.repeat(PARTS_CSV_MAX_CHARS / 6 + 10);
    const res = await send(editor, 'post', `${base()}/preview`, { text });
    expect(res.status).toBe(413);
  });

  it('answers 201 or 422 with a line (never 500) to 150 random lists (fast-check, seed 5)', async () => {
    const cell = fc.oneof(
      fc.constantFrom('10 uH', '100p', 'L', 'C', '"', '80', '7 MHz', '5 %', ''),
      fc.string({ maxLength: 6 }),
    );
    const csv = fc
      .array(fc.array(cell, { minLength: 1, maxLength: 6 }), { maxLength: 6 })
      .map((rows) => ['Part,Kind,Value,Q,Q at,Tol', ...rows.map((r) => r.join(','))].join('\n'));
    await fc.assert(
      fc.asyncProperty(csv, async (text) => {
        const res = await send(editor, 'post', `${base()}/import`, { text, replace: true });
        expect([201, 422]).toContain(res.status);
        if (res.status === 422) expect(res.body.details.line).toBeGreaterThanOrEqual(1);
      }),
      { seed: 5, numRuns: 150 },
    );
  });
});
