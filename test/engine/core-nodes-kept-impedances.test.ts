/**
 * A node analysis that keeps the frequencies and impedances of some nodes only
 * (`impedanceAt`): each kept row of fNode, Zin and Zsrc is the full analysis's row for that
 * node, bit for bit, the voltages and the EMF are the full analysis's, on every example chain
 * and the bench chain (mixers, coupled tanks, amplifiers, series resonators) over several
 * blocks of points; the analysis's sweep keeps the rows its resonator search reads, and
 * finds what a sweep keeping every node's finds.
 */
import { analyzeBuilt, sweepImpedanceNodes } from '../../shared/engine/analyze';
import { buildChain, type BuiltChain } from '../../shared/engine/core/build';
import { seriesExtract } from '../../shared/engine/core/extract-resonance';
import { risingLoopCrossings } from '../../shared/engine/core/found-series';
import { settleLoadLevel } from '../../shared/engine/core/load-level';
import { BLOCK, createNodeAnalysis, impedanceRow, isLongSweep, runNodeAnalysis, sharedWorkspace, type NodeAnalysis } from '../../shared/engine/core/nodes'; // prettier-ignore
import { gIn, reflectionMag } from '../../shared/engine/core/quantities';
import { sweepReport } from '../../shared/engine/core/reports';
import { risingCrossings } from '../../shared/engine/core/resonance-search';
import {
  analyzeSelectivity,
  findMixer,
  imageFrequency,
} from '../../shared/engine/core/selectivity';
import { analyzeResonators } from '../../shared/engine/core/resonators';
import type { ShapeMemo } from '../../shared/engine/core/response-shape';
import { frequencyGrid } from '../../shared/engine/core/sweep';
import { defaultCatalogue } from '../../shared/engine/default-catalogue';
import { isTrapResonance } from '../../shared/engine/transmit';
import { chainDocumentSchema } from '../../shared/schema/chain';
import { benchChain } from '../../scripts/bench/bench-chain';
import { builtExample, differences, exampleKeys, grid } from './helpers/kept-rows';

const BENCH = 'bench chain';
const keys = [...exampleKeys, BENCH];

/** The chain, its sweep over `points` points when given. */
function builtOf(key: string, points?: number): BuiltChain {
  if (key === BENCH) return buildChain(chainDocumentSchema.parse(benchChain(points ?? 1001)), defaultCatalogue()); // prettier-ignore
  return builtExample(key, points);
}

const ROWS = ['fNode', 'zinRe', 'zinIm', 'zsrcRe', 'zsrcIm'] as const;

/** Every difference between an analysis keeping `nodes`' impedances and the full one. */
function compare(kept: NodeAnalysis, full: NodeAnalysis, nodes: readonly number[]): string[] {
  const P = full.points;
  const out: string[] = [];
  for (const key of ['freqs', 'vRe', 'vIm', 'emf'] as const) {
    out.push(...differences(kept[key], full[key], key));
  }
  for (const node of nodes) {
    const row = impedanceRow(kept, node);
    for (const key of ROWS) {
      const got = kept[key].subarray(row * P, (row + 1) * P);
      const want = full[key].subarray(node * P, (node + 1) * P);
      out.push(...differences(got, want, `${key} at node ${node}`));
    }
  }
  return out;
}

/** Every other node of the chain, beginning with the first or the second. */
function everyOther(built: BuiltChain, from: number): number[] {
  const out: number[] = [];
  for (let n = from; n <= built.sections.length; n += 2) out.push(n);
  return out;
}

describe('node analysis keeping some nodes’ impedances', () => {
  it.each(keys)('%s: the kept rows are the full analysis’s, exactly', (key) => {
    const built = builtOf(key);
    const freqs = grid(built);
    const full = runNodeAnalysis(built, freqs);
    // Node 0 and the load kept, or neither: the values pass through unkept nodes at both
    // ends; with the middle node only, through runs of unkept nodes.
    const middle = [Math.floor(built.sections.length / 2)];
    for (const nodes of [everyOther(built, 0), everyOther(built, 1), middle]) {
      const kept = runNodeAnalysis(built, freqs, createNodeAnalysis(built, freqs.length, { impedanceAt: nodes })); // prettier-ignore
      expect({ key, nodes, diff: compare(kept, full, nodes) }).toEqual({ key, nodes, diff: [] });
      for (const k of ROWS) expect(kept[k].length).toBe(nodes.length * freqs.length);
    }
  });

  it.each(keys)('%s: with only the user nodes’ voltages kept too, the same numbers', (key) => {
    const built = builtOf(key);
    const freqs = grid(built, BLOCK + 1);
    const full = runNodeAnalysis(built, freqs);
    const nodes = sweepImpedanceNodes(built);
    const ws = createNodeAnalysis(built, freqs.length, { voltageAt: built.userNodeFlat, impedanceAt: nodes }); // prettier-ignore
    const kept = runNodeAnalysis(built, freqs, ws);
    const P = freqs.length;
    const diff: string[] = [];
    for (const k of ROWS) {
      for (const n of nodes) {
        const row = impedanceRow(kept, n);
        diff.push(...differences(kept[k].subarray(row * P, (row + 1) * P), full[k].subarray(n * P, (n + 1) * P), `${k} at ${n}`)); // prettier-ignore
      }
    }
    for (const n of built.userNodeFlat) {
      const row = kept.vRow![n];
      for (const k of ['vRe', 'vIm'] as const) {
        diff.push(...differences(kept[k].subarray(row * P, (row + 1) * P), full[k].subarray(n * P, (n + 1) * P), `${k} at ${n}`)); // prettier-ignore
      }
    }
    expect({ key, diff }).toEqual({ key, diff: [] });
  });

  it('a reused workspace keeps its rows and gives the new frequencies’ values', () => {
    const built = builtOf('shortwave-superhet-coupled-pair');
    const nodes = everyOther(built, 1);
    const first = grid(built);
    const ws = createNodeAnalysis(built, first.length, { impedanceAt: nodes });
    runNodeAnalysis(built, first, ws);
    const second = first.map((f) => f + (first[1] - first[0]) / 2);
    const again = runNodeAnalysis(built, second, ws);
    expect(again).toBe(ws);
    expect(compare(again, runNodeAnalysis(built, second), nodes)).toEqual([]);
  });

  it('impedanceRow: the node itself, its kept row, or a refusal; a node not of the chain refused', () => {
    const built = builtOf('two-metre-coupled-preselector');
    const nodes = built.sections.length + 1;
    const all = createNodeAnalysis(built, 4);
    expect(all.zRow).toBeUndefined();
    expect(impedanceRow(all, nodes - 1)).toBe(nodes - 1);
    const some = createNodeAnalysis(built, 4, { impedanceAt: [nodes - 1, 2, nodes - 1] });
    expect(Array.from(some.zRow!)).toEqual(Array.from({ length: nodes }, (_, n) => (n === 2 ? 0 : n === nodes - 1 ? 1 : -1))); // prettier-ignore
    expect(impedanceRow(some, 2)).toBe(0);
    expect(impedanceRow(some, nodes - 1)).toBe(1);
    expect(() => impedanceRow(some, 0)).toThrow(/impedances are not kept/);
    expect(some.zinRe.length).toBe(2 * 4);
    expect(() => createNodeAnalysis(built, 4, { impedanceAt: [nodes] })).toThrow(/impedanceAt: .* not a node/); // prettier-ignore
    expect(() => createNodeAnalysis(built, 4, { impedanceAt: [-1] })).toThrow(RangeError);
  });

  it('the readers of impedances refuse a node whose rows are not kept', () => {
    const built = builtOf(BENCH);
    const freqs = grid(built, 40);
    const na = runNodeAnalysis(built, freqs, createNodeAnalysis(built, freqs.length, { impedanceAt: [0, 2] })); // prettier-ignore
    expect(() => risingCrossings(na, 1)).toThrow(/not kept/);
    expect(() => risingLoopCrossings(na, 3)).toThrow(/not kept/);
    expect(() => gIn(na, 5, 0)).toThrow(/not kept/);
    expect(() => reflectionMag(na, 1, 0)).toThrow(/not kept/);
    const out = new Float64Array(3);
    // A series extract reads its section's input and output: the output (node 3) is not kept.
    expect(() => seriesExtract(built, 2)(na, 0, out)).toThrow(/node 3's impedances are not kept/);
    expect(() => risingCrossings(na, 2)).not.toThrow();
  });

  it('a shared workspace is reused only for the same kept impedances', () => {
    const built = builtOf('shortwave-superhet-single-tank');
    const key = 'kept-impedances-test';
    const nodes = [0, 2];
    const a = sharedWorkspace(key, built, 50, { impedanceAt: nodes });
    expect(sharedWorkspace(key, built, 50, { impedanceAt: nodes })).toBe(a);
    const other = sharedWorkspace(key, built, 50, { impedanceAt: [0] });
    expect(other).not.toBe(a);
    const every = sharedWorkspace(key, built, 50);
    expect(every.zRow).toBeUndefined();
    expect(sharedWorkspace(key, built, 50, { impedanceAt: nodes })).not.toBe(every);
  });
});

describe('kept impedances in a whole analysis', () => {
  it.each(keys)('%s: resonators and sweep as from every node’s impedances', (key) => {
    const built = settleLoadLevel(builtOf(key));
    const freqs = frequencyGrid(built.settings.sweep);
    const nodes = sweepImpedanceNodes(built);
    expect(nodes[0]).toBe(0);
    expect(nodes).toEqual([...new Set(nodes)].sort((a, b) => a - b));
    const kept = runNodeAnalysis(built, freqs, createNodeAnalysis(built, freqs.length, { voltageAt: built.userNodeFlat, impedanceAt: nodes })); // prettier-ignore
    const full = runNodeAnalysis(built, freqs);
    const keptShapes: ShapeMemo = new Map();
    const fullShapes: ShapeMemo = new Map();
    expect(analyzeResonators(built, kept, keptShapes)).toEqual(analyzeResonators(built, full, fullShapes)); // prettier-ignore
    expect(keptShapes).toEqual(fullShapes);
    expect(JSON.parse(JSON.stringify(sweepReport(built, kept)))).toEqual(
      JSON.parse(JSON.stringify(sweepReport(built, full))),
    );
  });

  it.each(['shortwave-superhet-coupled-pair', 'two-metre-coupled-preselector', BENCH])(
    '%s over a sweep too long to keep: the analysis (keeping those rows) reports the same',
    (key) => {
      const short = builtOf(key);
      // Just past the length whose workspace is not kept between analyses.
      const points = Math.ceil(((1 << 22) + 1) / ((short.sections.length + 1) * 7)) + 1;
      const built = settleLoadLevel(builtOf(key, points));
      expect(isLongSweep(built, points)).toBe(true);
      expect(isLongSweep(built, points - 2)).toBe(false);
      const full = runNodeAnalysis(built, frequencyGrid(built.settings.sweep));
      const result = analyzeBuilt(built);
      const want = analyzeResonators(built, full, new Map())
        .filter((r) => !isTrapResonance(built, r))
        .map(({ flat: _f, fIn: _i, f0LocalHz: _l, downstreamLabel: _d, name: _n, ...r }) => r);
      expect(result.resonators).toEqual(want);
      expect(result.selectivity).toEqual(analyzeSelectivity(built, full, imageFrequency(built, findMixer(built)))); // prettier-ignore
      const sweep = result.sweep!;
      const all = sweepReport(built, full);
      expect(Array.from(sweep.zIn.re)).toEqual(Array.from(all.zIn.re));
      expect(Array.from(sweep.zIn.im)).toEqual(Array.from(all.zIn.im));
      expect(Array.from(sweep.returnLossDb)).toEqual(Array.from(all.returnLossDb));
    },
  );

  it('the bench chain keeps about half its nodes’ impedances', () => {
    const built = settleLoadLevel(builtOf(BENCH));
    const nodes = sweepImpedanceNodes(built);
    expect(nodes.length).toBeLessThan(built.sections.length + 1);
    expect(nodes.length).toBeGreaterThan(1);
  });
});
