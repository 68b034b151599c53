/**
 * The ladder's own steps (ladder-steps.ts): a section that is one shunt admittance
 * (Section.ladder 'shunt') passes the voltage through, the node analysis copying V across it
 * instead of taking V/(A + B·Y) with A = 1, B = 0; shunt and series sections take the general
 * steps' expressions with their ones and zeros written in, filled by their one part alone.
 * None may change a number the general steps give: every node's voltage and impedances, in
 * the analysis that keeps every row, in one that keeps some rows only, and in the probe's
 * single-point voltage, equal those of the same chain with no section said to be a ladder's
 * (every step the general one). Circuit
 * law (common practice): an admittance across the line joins its two ends into one node, so
 * they carry one voltage.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { analyzeBuilt, buildChain, STAGE_DEFINITIONS } from '../../shared/engine';
import type { BuiltChain } from '../../shared/engine/core/build';
import {
  createNodeAnalysis,
  runNodeAnalysis,
  voltageSection,
} from '../../shared/engine/core/nodes';
import { createProbe } from '../../shared/engine/core/probe';
import { frequencyGrid } from '../../shared/engine/core/sweep';
import { seriesSection, shuntSection } from '../../shared/engine/stages/common';
import { parseChainDocument } from '../../shared/schema/parse-chain';
import { benchChain } from '../../scripts/bench/bench-chain';

const ROOT = join(__dirname, '..', '..');
const EXAMPLES = readdirSync(join(ROOT, 'examples'))
  .filter((f) => f.endsWith('.chain.json'))
  .map((f) => [f, JSON.parse(readFileSync(join(ROOT, 'examples', f), 'utf8'))] as const);

/** The same chain with every section's step the general one (none said to be a ladder's). */
function general(built: BuiltChain): BuiltChain {
  return {
    ...built,
    sections: built.sections.map((s) => ({ ...s, ladder: undefined })),
  };
}

/** Equal to the bit, a zero's sign aside (the general step rounds 1 + 0·Y, the copy does not). */
function expectSameArray(a: Float64Array, b: Float64Array, what: string): void {
  expect(a.length).toBe(b.length);
  for (let i = 0; i < a.length; i++) {
    if (a[i] === b[i] || (Number.isNaN(a[i]) && Number.isNaN(b[i]))) continue;
    throw new Error(`${what}[${i}]: ${a[i]} with the copy against ${b[i]} with the general step`);
  }
}

describe('a shunt section passes the voltage through', () => {
  it('is said of the sections shuntSection and seriesSection make, and of no other', () => {
    const built = buildChain(parseChainDocument(benchChain(201)), STAGE_DEFINITIONS);
    const shunts = built.sections.filter((s) => s.ladder === 'shunt').length;
    // The bench chain's tanks, traps and shunt parts (12 of its 23 sections).
    expect(shunts).toBeGreaterThanOrEqual(10);
    expect(shunts).toBeLessThan(built.sections.length);
    const y = Object.assign(
      (_f: number, out: Float64Array, o: number) => {
        out[o] = 1e-3;
        out[o + 1] = 0;
      },
      {
        fill(
          _f: Float64Array,
          _fo: number,
          n: number,
          out: Float64Array,
          oo: number,
          stride: number,
        ) {
          for (let k = 0; k < n; k++) out.set([1e-3, 0], oo + stride * k);
        },
      },
    );
    expect(shuntSection(y).ladder).toBe('shunt');
    expect(seriesSection(y).ladder).toBe('series');
    // One shape for both (types.ts says why).
    expect(Object.keys(seriesSection(y))).toEqual(Object.keys(shuntSection(y)));
    expect(Object.keys(shuntSection(y))).toEqual(['ladder', 'partFill', 'abcd', 'fill']);
    expect(built.sections.filter((s) => s.ladder === 'series').length).toBeGreaterThanOrEqual(4);
  });

  it.each(EXAMPLES)('gives every number of the general step for %s', (_file, raw) => {
    const built = buildChain(parseChainDocument(raw), STAGE_DEFINITIONS);
    const grid = frequencyGrid(built.settings.sweep);
    const plain = general(built);
    const copied = runNodeAnalysis(built, grid, createNodeAnalysis(built, grid.length));
    const stepped = runNodeAnalysis(plain, grid, createNodeAnalysis(plain, grid.length));
    for (const key of ['vRe', 'vIm', 'zinRe', 'zinIm', 'zsrcRe', 'zsrcIm'] as const) {
      expectSameArray(copied[key], stepped[key], key);
    }
    // Some rows kept only (the long sweep's loop): the user nodes' voltages, two impedances.
    const keep = { voltageAt: built.userNodeFlat, impedanceAt: [0, built.sections.length >> 1] };
    const keptCopied = runNodeAnalysis(built, grid, createNodeAnalysis(built, grid.length, keep));
    const keptStepped = runNodeAnalysis(plain, grid, createNodeAnalysis(plain, grid.length, keep));
    for (const key of ['vRe', 'vIm', 'zinRe', 'zinIm', 'zsrcRe', 'zsrcIm'] as const) {
      expectSameArray(keptCopied[key], keptStepped[key], `kept ${key}`);
    }
    // The probe's single-point voltage at every node, at three points of the sweep.
    const probe = createProbe(built);
    const probePlain = createProbe(plain);
    for (const f of [grid[0], grid[grid.length >> 1], grid[grid.length - 1]]) {
      for (let node = 0; node <= built.sections.length; node++) {
        const a = probe.at(f, node, true);
        const b = probePlain.at(f, node, true);
        if (!(a === b || (Number.isNaN(a) && Number.isNaN(b)))) {
          throw new Error(`probe at ${f} Hz, node ${node}: ${a} against ${b}`);
        }
      }
    }
  });

  it.each(EXAMPLES)('gives the same selectivity at nodes joined by shunts for %s', (_file, raw) => {
    // A user node joined to the one before it by shunt sections alone takes that node's
    // report (selectivity.ts); with no section said to be a shunt every node's is searched.
    const built = buildChain(parseChainDocument(raw), STAGE_DEFINITIONS);
    const copied = analyzeBuilt(built, { sweep: false }).selectivity;
    const searched = analyzeBuilt(general(built), { sweep: false }).selectivity;
    expect(JSON.stringify(copied)).toBe(JSON.stringify(searched));
    expect(copied.map((r) => r.node)).toEqual(Array.from(built.userNodeFlat, (_, n) => n));
  });

  it('gives what the general step gives through a shorted, an open and a dead node', () => {
    // Four points across one shunt section (Y = 2 mS + j5 mS): Zin at its output finite,
    // zero (a short), open; and a dead input.
    const m = new Float64Array(32);
    for (let k = 0; k < 4; k++) m.set([1, 0, 0, 0, 2e-3, 5e-3, 1, 0], 8 * k);
    const zRe = Float64Array.of(50, 0, Infinity, 50);
    const zIm = Float64Array.of(-20, 0, 0, 7);
    const vRe = Float64Array.of(0.3, 0.3, -0.2, 0);
    const vIm = Float64Array.of(-0.1, 0.4, 0.5, 0);
    const copied = [new Float64Array(4), new Float64Array(4)];
    const stepped = [new Float64Array(4), new Float64Array(4)];
    voltageSection(m, 0, zRe, zIm, 0, 4, vRe, vIm, 0, copied[0], copied[1], 0, true);
    voltageSection(m, 0, zRe, zIm, 0, 4, vRe, vIm, 0, stepped[0], stepped[1], 0, false);
    expect(Array.from(copied[0])).toEqual([0.3, 0, -0.2, 0]);
    expect(Array.from(copied[1])).toEqual([-0.1, 0, 0.5, 0]);
    expectSameArray(copied[0], stepped[0], 'vRe');
    expectSameArray(copied[1], stepped[1], 'vIm');
  });
});
