/**
 * Modes of a chain: overrides, bypass and an explicit path give the chain of each mode;
 * every problem is named in the document's terms. Checks: voltage-divider closed forms
 * (Ohm's law, P = |V|²/(2R) with peak phasors).
 */
import {
  analyseModes,
  analyzeChain,
  chainInMode,
  ChainValidationError,
  validateChain,
} from '../../shared/engine';
import {
  chainDocumentSchema,
  type ChainDocument,
  type ChainDocumentInput,
} from '../../shared/schema/chain';
import { parseChainDocument } from '../../shared/schema/parse-chain';

const gen = { id: 'gen', type: 'resistive-generator', values: { r: 50, level: 'emf', emf: 1 } };
const pad = { id: 'r1', type: 'lumped-element', values: { position: 'series', element: 'resistor', r: 50 } }; // prettier-ignore
const alt = { id: 'gen2', type: 'resistive-generator', values: { r: 100, level: 'emf', emf: 2 } };
const load = { id: 'load', type: 'rc-load', values: { r: 50, c: 0 } };

function rawDoc(extra: Partial<ChainDocumentInput> = {}): ChainDocumentInput {
  return {
    name: 'modes test',
    settings: { f0Hz: 1e6, sweep: { startHz: 0.5e6, stopHz: 1.5e6, points: 11 } },
    stages: [gen, pad, load],
    ...extra,
  };
}

const doc = (extra: Partial<ChainDocumentInput> = {}): ChainDocument =>
  parseChainDocument(rawDoc(extra));

/** Power into the load of an EMF (peak) behind a total series resistance (closed form). */
const pLoad = (emf: number, rSeries: number, rl: number) => ((emf * rl) / (rSeries + rl)) ** 2 / (2 * rl); // prettier-ignore
const delivered = (r: ReturnType<typeof analyzeChain>) => r.nodes[r.nodes.length - 1].deliveredW;

function issuesOf(fn: () => unknown) {
  try {
    fn();
  } catch (e) {
    if (e instanceof ChainValidationError) return e.issues;
    throw e;
  }
  throw new Error('expected a ChainValidationError');
}

describe('chain modes', () => {
  it('a chain without modes is analysed as written, with no mode in its result', () => {
    const r = analyzeChain(doc(), { sweep: false });
    expect(r.mode).toBeUndefined();
    expect(delivered(r)).toBeCloseTo(pLoad(1, 100, 50), 12);
    expect(analyseModes(doc(), { sweep: false }).map((m) => m.modeId)).toEqual([null]);
  });

  it('overrides, bypass and an explicit path each give their own chain and figures', () => {
    const d = doc({
      stages: [gen, pad, load, alt],
      modes: [
        { id: 'high', name: 'High', kind: 'state', values: { r1: { r: 150 } }, bypass: ['gen2'] },
        { id: 'through', name: 'Through', bypass: ['r1', 'gen2'] },
        { id: 'other', name: 'Other source', kind: 'receive', path: ['gen2', 'r1', 'load'] },
      ],
    });
    const all = analyseModes(d, { sweep: false });
    expect(all.map((m) => m.modeId)).toEqual(['high', 'through', 'other']);
    const p = all.map((m) => (m.ok ? delivered(m.result) : NaN));
    expect(p[0]).toBeCloseTo(pLoad(1, 200, 50), 12);
    expect(p[1]).toBeCloseTo(pLoad(1, 50, 50), 12);
    expect(p[2]).toBeCloseTo(pLoad(2, 150, 50), 12);
    const first = all[0];
    expect(first.ok && first.result.mode).toEqual({ id: 'high', name: 'High', kind: 'state' });
    // No mode named: the first one.
    expect(delivered(analyzeChain(d, { sweep: false }))).toBeCloseTo(p[0], 15);
    const inOther = chainInMode(d, 'other');
    expect(inOther.stages.map((s) => s.id)).toEqual(['gen2', 'r1', 'load']);
    expect('modes' in inOther).toBe(false);
  });

  it('a chain with a transmit mode carries the transmit caution in every mode', () => {
    const d = doc({
      modes: [
        { id: 'rx', name: 'Receive', kind: 'receive' },
        { id: 'tx', name: 'Transmit', kind: 'transmit' },
      ],
    });
    for (const m of analyseModes(d, { sweep: false })) {
      expect(m.ok && m.result.cautions?.map((c) => c.caution)).toEqual(['transmit', 'rf-exposure']); // prettier-ignore
      expect(m.ok && m.result.cautions?.[0].message).toMatch(/licen[cs]e/);
    }
    const noTx = analyzeChain(doc({ modes: [{ id: 'a', name: 'A' }] }), { sweep: false });
    expect(noTx.cautions).toBeUndefined();
  });

  it('names unknown modes, stages and parameters, and a path without a source first', () => {
    // Stages a mode names that the chain lacks: the parse refuses them, naming the path.
    expect(() =>
      doc({
        modes: [
          { id: 'a', name: 'A', values: { nope: { r: 1 } } },
          { id: 'b', name: 'B', bypass: ['ghost'] },
        ],
      }),
    ).toThrow(/\$\.modes\[0\]\.values\.nope: .*stage "nope", which is not in the chain.*\$\.modes\[1\]\.bypass\[0\]: .*"ghost"/); // prettier-ignore
    // What only the catalogue knows: parameters a stage type has, and the roles in a path.
    const d = doc({
      modes: [
        { id: 'a', name: 'A', values: { r1: { resistance: 5 } } },
        { id: 'b', name: 'B', path: ['r1', 'gen', 'load'] },
      ],
    });
    const messages = validateChain(d).map((i) => `${i.path.join('.')}: ${i.message}`);
    expect(messages).toEqual(
      expect.arrayContaining([
        expect.stringMatching(/^modes\.0\.values\.r1\.resistance: .*no such parameter/),
        expect.stringMatching(/^modes\.1\.path\.0: .*stands first.*needs a source/),
      ]),
    );
    expect(issuesOf(() => analyzeChain(doc({ modes: [{ id: 'a', name: 'A' }] }), { mode: 'zz' }))[0].message).toMatch(/no mode "zz".*"a"/); // prettier-ignore
    expect(issuesOf(() => analyzeChain(doc(), { mode: 'zz' }))[0].message).toMatch(/no modes/);
  });

  it('a bad value a mode sets is reported at the mode, one in a stage at the stage', () => {
    const d = doc({
      stages: [gen, pad, { ...load, values: { r: -1 } }],
      modes: [{ id: 'a', name: 'A', values: { r1: { r: -5 } } }],
    });
    const issues = issuesOf(() => analyzeChain(d));
    expect(issues.map((i) => i.path.join('.'))).toEqual(['modes.0.values.r1.r', 'stages.2.values.r']); // prettier-ignore
    expect(issues[0].message).toMatch(/^In mode "A": .*a value this mode sets/);
  });

  it('the document schema refuses duplicate mode ids, unknown stages and bad slugs', () => {
    const parsed = chainDocumentSchema.safeParse(
      rawDoc({
        modes: [
          { id: 'rx', name: 'Receive' },
          { id: 'rx', name: 'Again', bypass: ['ghost'] },
          { id: 'Band 2', name: 'Band 2' },
        ],
      }),
    );
    expect(parsed.success).toBe(false);
    const found = parsed.error?.issues.map((i) => `${i.path.join('.')}: ${i.message}`) ?? [];
    expect(found).toEqual(
      expect.arrayContaining([
        expect.stringMatching(/^modes\.1\.id: .*used twice/),
        expect.stringMatching(/^modes\.1\.bypass\.0: .*"ghost"/),
        expect.stringMatching(/^modes\.2\.id: .*lower-case/),
      ]),
    );
    expect(chainDocumentSchema.safeParse(rawDoc()).success).toBe(true);
  });
});
