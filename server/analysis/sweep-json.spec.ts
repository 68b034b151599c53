import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { analyzeChain } from '../../shared/engine';
import type { SweepReport } from '../../shared/engine/types';
import { parseChainDocument } from '../../shared/schema/parse-chain';
import { SWEEP_TRACES, sweepToColumns, type SweepTrace } from '../../shared/schema/sweep-columns';
import type { SweepPacking } from '../../shared/schema/sweep-packing';
import { REPO_ROOT } from '../config';
import { answerWithSweepJson } from './sweep-json';

/** A shipped example (`examples/<file>`), parsed as the engine takes it. */
function example(file: string) {
  return parseChainDocument(
    JSON.parse(readFileSync(path.join(REPO_ROOT, 'examples', file), 'utf8')),
  );
}

/** What the hand-written bytes must equal: the answer as JSON.stringify writes it. */
function expected(
  head: object,
  sweep: SweepReport,
  traces: readonly SweepTrace[],
  nodes?: number[],
  packing?: SweepPacking,
) {
  return JSON.stringify({ ...head, sweep: sweepToColumns(sweep, traces, nodes, packing) });
}

function written(
  head: object,
  sweep: SweepReport,
  traces: readonly SweepTrace[],
  nodes?: number[],
  packing?: SweepPacking,
) {
  return Buffer.from(
    answerWithSweepJson(JSON.stringify(head), sweep, traces, nodes, packing),
  ).toString();
}

/** A sweep whose every trace is `values`. */
function sweepOf(values: number[]): SweepReport {
  return {
    freqsHz: values,
    nodes: [
      { index: 0, stepUpDb: values, phaseDeg: values },
      { index: 3, stepUpDb: [...values].reverse(), phaseDeg: values },
    ],
    zIn: { re: values, im: [...values].reverse() },
    returnLossDb: values,
  };
}

// A fixed-seed generator, so a failure names values that can be replayed.
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => (s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32;
}

describe('the sweep columns written by hand', () => {
  const examples = readdirSync(path.join(REPO_ROOT, 'examples')).filter((f) =>
    f.endsWith('.chain.json'),
  );

  it.each(examples)('should write %s byte for byte as JSON.stringify does', (file) => {
    const doc = example(file);
    const { sweep, ...rest } = analyzeChain(doc, { sweep: true });
    expect(sweep).toBeDefined();
    expect(written(rest, sweep!, SWEEP_TRACES)).toBe(expected(rest, sweep!, SWEEP_TRACES));
    const some: SweepTrace[] = ['stepUp', 'returnLoss'];
    const nodes = [sweep!.nodes[sweep!.nodes.length - 1].index];
    expect(written(rest, sweep!, some, nodes)).toBe(expected(rest, sweep!, some, nodes));
    const packed = written(rest, sweep!, SWEEP_TRACES, undefined, 'differences');
    expect(packed).toBe(expected(rest, sweep!, SWEEP_TRACES, undefined, 'differences'));
    expect(JSON.parse(packed).sweep.packing).toBe('differences');
    expect(written(rest, sweep!, some, nodes, 'differences')).toBe(
      expected(rest, sweep!, some, nodes, 'differences'),
    );
  });

  it('should write an untouched report’s lazy traces as the same bytes as the settled traces', () => {
    const doc = example('two-metre-coupled-preselector.chain.json');
    for (const packing of ['plain', 'differences'] as const) {
      const { sweep, ...rest } = analyzeChain(doc, { sweep: true });
      // Written first, from traces never read (the writer computes them without settling).
      const lazy = written(rest, sweep!, SWEEP_TRACES, undefined, packing);
      expect(Object.getOwnPropertyDescriptor(sweep!.nodes[0], 'stepUpDb')?.get).toBeDefined();
      expect(lazy).toBe(expected(rest, sweep!, SWEEP_TRACES, undefined, packing));
      expect(written(rest, sweep!, SWEEP_TRACES, undefined, packing)).toBe(lazy);
    }
  });

  it('should write a report read in place as the same bytes as a copied one', () => {
    const doc = example('two-metre-coupled-preselector.chain.json');
    const { sweep: copied, ...rest } = analyzeChain(doc, { sweep: true });
    const want = written(rest, copied!, SWEEP_TRACES, undefined, 'differences');
    const inPlace = analyzeChain(doc, { sweep: true, sweepInPlace: true }).sweep!;
    expect(written(rest, inPlace, SWEEP_TRACES, undefined, 'differences')).toBe(want);
  });

  it('should write a trace assigned over a lazy one as assigned', () => {
    const doc = example(examples[0]);
    const { sweep, ...rest } = analyzeChain(doc, { sweep: true });
    sweep!.returnLossDb = sweep!.freqsHz.map((_, i) => i / 7);
    sweep!.nodes[0].stepUpDb = sweep!.freqsHz.map((_, i) => -i / 3);
    const text = written(rest, sweep!, SWEEP_TRACES);
    expect(JSON.parse(text).sweep.returnLossDb[7]).toBe(1);
    expect(text).toBe(expected(rest, sweep!, SWEEP_TRACES));
  });

  it('should write difference columns as JSON.stringify does: smooth, spread, zeros, gaps', () => {
    const random = lcg(20261203);
    const smooth = Array.from({ length: 3000 }, (_, i) => 40 * Math.cos(i / 300) - 3);
    // A column whose second differences are large (counts near the exact limit).
    const spread = Array.from({ length: 500 }, () => (random() - 0.5) * 10 ** (random() * 8));
    const zeros = [0, -0, 0];
    const gaps = [1, NaN, 3];
    // Columns found unpackable only after their first steps were written: a count beyond the
    // exact limit, and a shift too far from the finest for an exact power of ten.
    const late = [1e-12, 2e-12, 5, 6];
    const far = [1e-15, 2e-15, 1e8];
    for (const values of [late, far]) {
      expect(Array.isArray(JSON.parse(written({}, sweepOf(values), ['returnLoss'], undefined, 'differences')).sweep.returnLossDb)).toBe(true); // prettier-ignore
    }
    for (const values of [smooth, spread, zeros, gaps, late, far, []]) {
      expect(written({ a: 1 }, sweepOf(values), SWEEP_TRACES, undefined, 'differences')).toBe(
        expected({ a: 1 }, sweepOf(values), SWEEP_TRACES, undefined, 'differences'),
      );
    }
  });

  it('should write awkward values as JSON.stringify does: halves, carries, signs, extremes, non-finite', () => {
    const awkward = [
      0,
      -0,
      NaN,
      Infinity,
      -Infinity,
      1,
      -1,
      0.5,
      -0.5,
      2.5,
      -2.5,
      17.5,
      -17.5,
      9.9999996,
      -9.9999995,
      999999.5,
      1234565,
      1234575,
      0.0001234565,
      1e-6,
      1.5e-6,
      2e-6,
      2.5e-6,
      1e-7,
      5e-324,
      1e-300,
      0.1,
      0.3,
      1 / 3,
      -2 / 3,
      120e6,
      120025000.5,
      1e14,
      9.99999999e14,
      1e15,
      2 ** 53,
      1e21,
      1e300,
      -1e300,
    ];
    expect(written({ a: 1 }, sweepOf(awkward), SWEEP_TRACES)).toBe(
      expected({ a: 1 }, sweepOf(awkward), SWEEP_TRACES),
    );
  });

  it('should write random values of every magnitude as JSON.stringify does', () => {
    const random = lcg(20261202);
    const values: number[] = [];
    for (let i = 0; i < 20_000; i++) {
      values.push((random() - 0.5) * 10 ** Math.floor(random() * 44 - 22));
      // Exact halves at the rounding digit, where the direction of rounding shows.
      values.push((Math.round(random() * 2e6) + 0.5) * 10 ** Math.floor(random() * 16 - 10));
    }
    expect(written({ a: 1 }, sweepOf(values), SWEEP_TRACES)).toBe(
      expected({ a: 1 }, sweepOf(values), SWEEP_TRACES),
    );
  });

  it('should keep the head as UTF-8, and return bytes of its own length after a larger answer', () => {
    const head = { name: 'Préselector 2 m — Ω' };
    const small = sweepOf([1, 2, 3]);
    const big = sweepOf(Array.from({ length: 180_000 }, (_, i) => i * 1.000001));
    expect(written(head, big, ['stepUp'])).toBe(expected(head, big, ['stepUp']));
    const text = written(head, small, ['zIn']);
    expect(text).toBe(expected(head, small, ['zIn']));
    expect(JSON.parse(text).name).toBe(head.name);
  });

  it('should write only the sweep when the head is an empty object', () => {
    const sweep = sweepOf([1.25, -3]);
    expect(written({}, sweep, ['returnLoss'])).toBe(expected({}, sweep, ['returnLoss']));
  });
});
