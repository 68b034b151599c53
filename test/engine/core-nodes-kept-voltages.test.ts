/**
 * A node analysis that keeps the voltages of some nodes only (`voltageAt`): each kept row is
 * the full analysis's row for that node, bit for bit, and every other array is the full
 * analysis's, on every example chain (mixers, coupled tanks, amplifiers, an open detector
 * input) over several blocks of points, with a fresh and with a reused workspace.
 */
import { BLOCK, createNodeAnalysis, runNodeAnalysis, sharedWorkspace, voltageRow, type NodeAnalysis } from '../../shared/engine/core/nodes'; // prettier-ignore
import { analyzeBuilt } from '../../shared/engine/analyze';
import { settleLoadLevel } from '../../shared/engine/core/load-level';
import { sweepReport } from '../../shared/engine/core/reports';
import {
  analyzeSelectivity,
  findMixer,
  imageFrequency,
} from '../../shared/engine/core/selectivity';
import { frequencyGrid } from '../../shared/engine/core/sweep';
import {
  builtExample as builtOf,
  differences,
  exampleKeys as keys,
  grid,
} from './helpers/kept-rows';

/** Every difference between a kept-voltage analysis and the full one. */
function compare(kept: NodeAnalysis, full: NodeAnalysis, nodes: readonly number[]): string[] {
  const P = full.points;
  const out: string[] = [];
  for (const key of ['freqs', 'fNode', 'zinRe', 'zinIm', 'zsrcRe', 'zsrcIm', 'emf'] as const) {
    out.push(...differences(kept[key], full[key], key));
  }
  for (const node of nodes) {
    const row = kept.vRow![node];
    for (const key of ['vRe', 'vIm'] as const) {
      const got = kept[key].subarray(row * P, (row + 1) * P);
      const want = full[key].subarray(node * P, (node + 1) * P);
      out.push(...differences(got, want, `${key} at node ${node}`));
    }
  }
  return out;
}

describe('node analysis keeping some nodes’ voltages', () => {
  it.each(keys)('%s: the user nodes’ rows are the full analysis’s, exactly', (key) => {
    const built = builtOf(key);
    const freqs = grid(built);
    const userNodes = Array.from(built.userNodeFlat);
    const full = runNodeAnalysis(built, freqs);
    const kept = runNodeAnalysis(built, freqs, createNodeAnalysis(built, freqs.length, { voltageAt: userNodes })); // prettier-ignore
    expect(compare(kept, full, userNodes)).toEqual([]);
    // Only those rows are held.
    expect(kept.vRe.length).toBe(new Set(userNodes).size * freqs.length);
    expect(kept.vIm.length).toBe(kept.vRe.length);
  });

  it('keeps the rows in ascending node order, once each, and marks the others −1', () => {
    const built = builtOf('two-metre-coupled-preselector');
    const nodes = built.sections.length + 1;
    expect(nodes).toBeGreaterThan(3);
    const listed = [nodes - 1, 1, nodes - 1, 0];
    const na = createNodeAnalysis(built, 10, { voltageAt: listed });
    const want = Array.from({ length: nodes }, (_, n) => (n === 0 ? 0 : n === 1 ? 1 : n === nodes - 1 ? 2 : -1)); // prettier-ignore
    expect(Array.from(na.vRow!)).toEqual(want);
    expect(na.vRe.length).toBe(3 * 10);
    // Without the option every node has its row at its own index.
    const all = createNodeAnalysis(built, 10);
    expect(all.vRow).toBeUndefined();
    expect(all.vRe.length).toBe(nodes * 10);
  });

  it('a node in the middle only, the source and the load not kept: the same numbers', () => {
    // The voltage passes through unkept nodes at both ends of the chain.
    for (const key of keys) {
      const built = builtOf(key);
      const freqs = grid(built, BLOCK + 1);
      const middle = [Math.floor(built.sections.length / 2)];
      const full = runNodeAnalysis(built, freqs);
      const kept = runNodeAnalysis(built, freqs, createNodeAnalysis(built, freqs.length, { voltageAt: middle })); // prettier-ignore
      expect({ key, diff: compare(kept, full, middle) }).toEqual({ key, diff: [] });
    }
  });

  it('a reused workspace keeps its rows and gives the new frequencies’ values', () => {
    const built = builtOf('shortwave-superhet-coupled-pair');
    const userNodes = Array.from(built.userNodeFlat);
    const first = grid(built);
    const ws = createNodeAnalysis(built, first.length, { voltageAt: userNodes });
    runNodeAnalysis(built, first, ws);
    // The same number of points, half a step apart: every value changes.
    const second = first.map((f) => f + (first[1] - first[0]) / 2);
    const again = runNodeAnalysis(built, second, ws);
    expect(again).toBe(ws);
    expect(compare(again, runNodeAnalysis(built, second), userNodes)).toEqual([]);
  });

  it('refuses a node the chain does not have', () => {
    const built = builtOf('shortwave-superhet-single-tank');
    const nodes = built.sections.length + 1;
    expect(() => createNodeAnalysis(built, 4, { voltageAt: [nodes] })).toThrow(RangeError);
    expect(() => createNodeAnalysis(built, 4, { voltageAt: [-1] })).toThrow(/not a node/);
    expect(() => createNodeAnalysis(built, 4, { voltageAt: [0.5] })).toThrow(/not a node/);
  });
});

describe('kept voltages in a whole analysis', () => {
  it('voltageRow: the node itself, its kept row, or a refusal', () => {
    const built = builtOf('two-metre-coupled-preselector');
    const nodes = built.sections.length + 1;
    const all = createNodeAnalysis(built, 4);
    expect(voltageRow(all, nodes - 1)).toBe(nodes - 1);
    const some = createNodeAnalysis(built, 4, { voltageAt: [0, nodes - 1] });
    expect(voltageRow(some, 0)).toBe(0);
    expect(voltageRow(some, nodes - 1)).toBe(1);
    expect(() => voltageRow(some, 1)).toThrow(/not kept/);
  });

  it('a shared workspace is reused only for the same kept nodes', () => {
    const built = builtOf('shortwave-superhet-single-tank');
    const user = Array.from(built.userNodeFlat);
    const key = 'kept-voltages-test';
    const a = sharedWorkspace(key, built, 50, { voltageAt: user });
    expect(a.vRow).toBeDefined();
    expect(sharedWorkspace(key, built, 50, { voltageAt: user })).toBe(a);
    const other = sharedWorkspace(key, built, 50, { voltageAt: [0] });
    expect(other).not.toBe(a);
    expect(voltageRow(other, 0)).toBe(0);
    const every = sharedWorkspace(key, built, 50);
    expect(every.vRow).toBeUndefined();
    expect(sharedWorkspace(key, built, 50, { voltageAt: user })).not.toBe(every);
  });

  it.each(keys)('%s: selectivity and sweep as from every node’s voltages', (key) => {
    // The analysis keeps the sweep's voltages at the user's nodes only; what it reports must
    // be what a node analysis keeping every node's gives.
    const built = builtOf(key);
    const result = analyzeBuilt(built);
    const settled = settleLoadLevel(built);
    const full = runNodeAnalysis(settled, frequencyGrid(settled.settings.sweep));
    const image = imageFrequency(settled, findMixer(settled));
    expect(result.selectivity).toEqual(analyzeSelectivity(settled, full, image));
    expect(JSON.parse(JSON.stringify(result.sweep))).toEqual(
      JSON.parse(JSON.stringify(sweepReport(settled, full))),
    );
  });
});
