/**
 * The sweep alone (`sweepChain`) against the sweep of the whole analysis: the same solve over
 * the same grid keeps fewer rows, so every trace must be the same to the bit, on every
 * example in every mode, on a chain with a mixer (frequencies translated), and on a sweep
 * long enough for the whole analysis to keep only its resonator nodes' rows.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import {
  analyzeChain,
  ChainValidationError,
  hasModes,
  sweepChain,
  type SolveClock,
  type SweepReport,
} from '../../shared/engine';
import { isLongSweep } from '../../shared/engine/core/nodes';
import { buildChain, STAGE_DEFINITIONS } from '../../shared/engine';
import type { ChainDocument } from '../../shared/schema/chain';
import { parseChainDocument } from '../../shared/schema/parse-chain';
import { benchChain } from '../../scripts/bench/bench-chain';

const ROOT = join(__dirname, '..', '..');
const read = (file: string) => parseChainDocument(JSON.parse(readFileSync(file, 'utf8')), file);
const EXAMPLES = readdirSync(join(ROOT, 'examples'))
  .filter((f) => f.endsWith('.chain.json'))
  .map((f) => [f, read(join(ROOT, 'examples', f))] as const);
const FIXTURE = (name: string) => read(join(ROOT, 'test', 'fixtures', 'chains', name));

/** Every trace of a report, read out (the report computes them when read). */
function traces(s: SweepReport) {
  return JSON.stringify({
    freqsHz: s.freqsHz,
    nodes: s.nodes.map((n) => [n.index, n.stepUpDb, n.phaseDeg]),
    zIn: s.zIn,
    returnLossDb: s.returnLossDb,
  });
}

const modesOf = (doc: ChainDocument) => (hasModes(doc) ? doc.modes!.map((m) => m.id) : [undefined]);

describe('sweepChain: the sweep alone', () => {
  it.each(EXAMPLES)(
    'gives the whole analysis sweep, bit for bit, for %s in every mode',
    (_f, doc) => {
      for (const mode of modesOf(doc)) {
        const whole = analyzeChain(doc, { sweep: true, mode }).sweep!;
        expect(traces(sweepChain(doc, { mode }))).toBe(traces(whole));
      }
    },
  );

  it('gives the same sweep through a mixer, where the nodes after it are at other frequencies', () => {
    const doc = FIXTURE('with-mixer.json');
    expect(traces(sweepChain(doc))).toBe(traces(analyzeChain(doc, { sweep: true }).sweep!));
  });

  it('gives the same sweep where the whole analysis keeps only some nodes (a long sweep)', () => {
    const doc = parseChainDocument(benchChain(30_000));
    const built = buildChain(doc, STAGE_DEFINITIONS);
    // The whole analysis takes its long-sweep path here (the point of this case).
    expect(isLongSweep(built, 30_000)).toBe(true);
    const clock: SolveClock = {};
    const alone = traces(sweepChain(doc, { clock }));
    expect(clock.solveMs).toBeGreaterThan(0);
    expect(alone).toBe(traces(analyzeChain(doc, { sweep: true }).sweep!));
  });

  it('refuses an invalid chain with the issues the whole analysis gives', () => {
    const doc = FIXTURE('invalid-values.json');
    const issues = (run: () => unknown) => {
      try {
        run();
      } catch (e) {
        expect(e).toBeInstanceOf(ChainValidationError);
        return (e as ChainValidationError).issues;
      }
      throw new Error('no error');
    };
    const alone = issues(() => sweepChain(doc));
    expect(alone.length).toBeGreaterThan(0);
    expect(alone).toEqual(issues(() => analyzeChain(doc, { sweep: true })));
  });

  it('keeps a copy unless read in place, and refuses a report read in place after the next sweep', () => {
    const [, doc] = EXAMPLES[0];
    const copied = sweepChain(doc);
    const expected = traces(copied);
    // Read in place before the next sweep: the same traces.
    expect(traces(sweepChain(doc, { inPlace: true }))).toBe(expected);
    const unread = sweepChain(doc, { inPlace: true });
    sweepChain(doc, { inPlace: true });
    expect(() => unread.nodes[0].stepUpDb).toThrow(/read after a later analysis/);
    // The copy is its own: later sweeps leave it as it was.
    expect(traces(copied)).toBe(expected);
  });
});
