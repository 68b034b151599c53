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
  SWEEP_CHUNK,
  sweepChain,
  sweepChainInChunks,
  type SolveClock,
  type SweepChunkOptions,
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

/** Every trace of a report as plain arrays, keyed by name (the report computes them when read). */
function readTraces(s: SweepReport): Map<string, number[]> {
  const t = new Map<string, number[]>([['freqsHz', Array.from(s.freqsHz)]]);
  for (const n of s.nodes) {
    t.set(`n${n.index} stepUpDb`, Array.from(n.stepUpDb));
    t.set(`n${n.index} phaseDeg`, Array.from(n.phaseDeg));
  }
  t.set('zIn re', Array.from(s.zIn.re));
  t.set('zIn im', Array.from(s.zIn.im));
  t.set('returnLossDb', Array.from(s.returnLossDb));
  return t;
}

interface Chunk {
  from: number;
  points: number;
  traces: Map<string, number[]>;
}

/** Every chunk's traces, each read while `visit` runs (its report reads the workspace in place). */
function chunked(doc: ChainDocument, options: SweepChunkOptions): Chunk[] {
  const parts: Chunk[] = [];
  sweepChainInChunks(doc, options, (chunk, from, points) => {
    parts.push({ from, points, traces: readTraces(chunk) });
  });
  return parts;
}

/**
 * Where the chunks' traces, put end to end, first differ from the whole report's (Object.is:
 * the sign of a zero and NaN count), or '' when they are the same to the bit.
 */
function difference(parts: Chunk[], whole: SweepReport): string {
  for (const [name, expected] of readTraces(whole)) {
    const got = parts.flatMap((p) => p.traces.get(name) ?? []);
    if (got.length !== expected.length) return `${name}: ${got.length} points, expected ${expected.length}`; // prettier-ignore
    const i = got.findIndex((v, k) => !Object.is(v, expected[k]));
    if (i >= 0) return `${name}[${i}]: ${got[i]}, expected ${expected[i]}`;
  }
  return '';
}

describe('sweepChainInChunks: the sweep alone, a chunk of points at a time', () => {
  it.each(EXAMPLES)(
    'gives the sweep of sweepChain, bit for bit, for %s in every mode, chunks of 97 points',
    (_f, doc) => {
      for (const mode of modesOf(doc)) {
        const parts = chunked(doc, { mode, chunkPoints: 97 });
        const whole = sweepChain(doc, { mode });
        // The chunks cover the grid once, in order, each but the last 97 points long.
        expect(parts.map((p) => p.from)).toEqual(parts.map((_, k) => 97 * k));
        expect(parts.every((p) => p.points === whole.freqsHz.length)).toBe(true);
        expect(parts.slice(0, -1).every((p) => p.traces.get('freqsHz')!.length === 97)).toBe(true);
        expect(difference(parts, whole)).toBe('');
      }
    },
  );

  it('gives the same sweep through a mixer, one point per chunk', () => {
    const doc = FIXTURE('with-mixer.json');
    expect(difference(chunked(doc, { chunkPoints: 1 }), sweepChain(doc))).toBe('');
  });

  it('gives the long sweep of sweepChain in chunks of the default size, the last one shorter', () => {
    const doc = parseChainDocument(benchChain(30_000));
    const clock: SolveClock = {};
    const parts = chunked(doc, { clock });
    expect(parts).toHaveLength(Math.ceil(30_000 / SWEEP_CHUNK));
    expect(parts[parts.length - 1].traces.get('freqsHz')).toHaveLength(30_000 % SWEEP_CHUNK);
    expect(clock.solveMs).toBeGreaterThan(0);
    expect(difference(parts, sweepChain(doc))).toBe('');
  });

  it('refuses a chunk read after the next chunk was solved, and a chunk size below one point', () => {
    const [, doc] = EXAMPLES[0];
    const kept: SweepReport[] = [];
    sweepChainInChunks(doc, { chunkPoints: 10 }, (chunk) => kept.push(chunk));
    expect(kept.length).toBeGreaterThan(2);
    // Chunk 0's workspace was reused by chunk 1: reading it now would give chunk 1's values.
    expect(() => kept[0].nodes[0].stepUpDb).toThrow(/read after a later analysis/);
    for (const bad of [0, 2.5, Number.NaN]) {
      expect(() => sweepChainInChunks(doc, { chunkPoints: bad }, () => undefined)).toThrow(
        /chunkPoints must be a whole number of at least 1/,
      );
    }
  });

  it('refuses an invalid chain with the issues sweepChain gives, before any chunk', () => {
    const doc = FIXTURE('invalid-values.json');
    let visited = 0;
    expect(() => sweepChainInChunks(doc, {}, () => visited++)).toThrow(ChainValidationError);
    expect(visited).toBe(0);
  });
});
