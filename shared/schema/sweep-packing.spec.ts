import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { analyzeChain } from '../engine';
import { parseChainDocument } from './parse-chain';
import {
  analysisFromDto,
  FREQUENCY_DIGITS,
  roundSignificant,
  SWEEP_DIGITS,
  SWEEP_TRACES,
  sweepToColumns,
} from './sweep-columns';
import { MAX_COUNT, packColumn, unpackColumn, type DifferenceColumn } from './sweep-packing';

const plain = (digits: number) => (values: ArrayLike<number>) =>
  Array.from(values, (v) => roundSignificant(v, digits));

/** What the plain packing's reader gets for `values`: the rounded values through JSON. */
function plainRead(values: number[], digits: number): number[] {
  return JSON.parse(JSON.stringify(plain(digits)(values)));
}

/** `values` packed, sent as JSON and read back. */
function packedRead(values: number[], digits: number): number[] {
  return unpackColumn(JSON.parse(JSON.stringify(packColumn(values, digits, plain(digits)))));
}

// A fixed-seed generator, so a failure names values that can be replayed.
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => (s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32;
}

const EXAMPLES = path.join(__dirname, '..', '..', 'examples');

describe('the differences packing of a sweep column', () => {
  it('should read back exactly the plain packing values of every example chain', () => {
    const files = readdirSync(EXAMPLES).filter((f) => f.endsWith('.chain.json'));
    expect(files.length).toBeGreaterThan(3);
    let packedColumns = 0;
    for (const file of files) {
      const doc = parseChainDocument(JSON.parse(readFileSync(path.join(EXAMPLES, file), 'utf8')));
      const { sweep } = analyzeChain(doc, { sweep: true });
      const wire = (packing: 'plain' | 'differences') =>
        JSON.parse(JSON.stringify({ sweep: sweepToColumns(sweep!, SWEEP_TRACES, undefined, packing) })); // prettier-ignore
      const packed = wire('differences');
      expect(packed.sweep.packing).toBe('differences');
      packedColumns += [packed.sweep.freqsHz, packed.sweep.zInRe, ...packed.sweep.stepUpDb].filter(
        (c) => !Array.isArray(c),
      ).length;
      // toEqual tells 0 from -0 and compares every double exactly.
      expect(analysisFromDto(packed).sweep).toEqual(analysisFromDto(wire('plain')).sweep);
    }
    // The examples' columns are packed, not sent plain as a fallback.
    expect(packedColumns).toBeGreaterThan(files.length * 3);
  });

  it('should send a smooth trace as small second differences', () => {
    const values = Array.from({ length: 2001 }, (_, i) => -20 + 9 * Math.sin(i / 400));
    const column = packColumn(values, SWEEP_DIGITS, plain(SWEEP_DIGITS)) as DifferenceColumn;
    expect(column.decimals).toBe(4);
    expect(Math.max(...column.steps.slice(2).map(Math.abs))).toBeLessThanOrEqual(3);
    expect(JSON.stringify(column).length).toBeLessThan(JSON.stringify(plain(6)(values)).length / 2);
  });

  it('should read back random values of every magnitude, halves and signs exactly', () => {
    const random = lcg(20261203);
    for (let trial = 0; trial < 400; trial++) {
      // Columns spanning up to about eight decades, some crossing zero, some with zeros.
      const scale = 10 ** Math.floor(random() * 30 - 15);
      const span = Math.floor(random() * 9);
      const values = Array.from({ length: 60 }, () => {
        const r = random();
        if (r < 0.03) return 0;
        if (r < 0.06) return -0;
        const v = (random() - 0.3) * scale * 10 ** Math.floor(random() * span);
        // Exact halves at the rounding digit, where the direction of rounding shows.
        return r < 0.2 ? Number(v.toPrecision(6)) + 0.5 * 10 ** (Math.floor(Math.log10(Math.abs(v) || 1)) - 5) : v; // prettier-ignore
      });
      for (const digits of [SWEEP_DIGITS, FREQUENCY_DIGITS]) {
        expect(packedRead(values, digits)).toEqual(plainRead(values, digits));
      }
    }
  });

  it('should send a column plain when its counts would not stay exact, and read it as plain', () => {
    const wide = [1e-9, 1, 1e9];
    expect(Array.isArray(packColumn(wide, SWEEP_DIGITS, plain(SWEEP_DIGITS)))).toBe(true);
    expect(packedRead(wide, SWEEP_DIGITS)).toEqual(plainRead(wide, SWEEP_DIGITS));
    const gaps = [1, NaN, 2, Infinity];
    expect(Array.isArray(packColumn(gaps, SWEEP_DIGITS, plain(SWEEP_DIGITS)))).toBe(true);
    expect(packedRead(gaps, SWEEP_DIGITS)).toEqual([1, null, 2, null]);
    // At the edge: the largest counts still packed stay exact through the reader's sums.
    const edge = [MAX_COUNT, -MAX_COUNT, MAX_COUNT];
    const column = packColumn(edge, 16, plain(16)) as DifferenceColumn;
    expect(column.decimals).toBe(0);
    expect(unpackColumn(column)).toEqual(edge);
  });

  it('should pack zeros and an empty column', () => {
    expect(packColumn([0, 0, -0], SWEEP_DIGITS, plain(SWEEP_DIGITS))).toEqual({
      decimals: 0,
      steps: [0, 0, 0],
    });
    expect(unpackColumn({ decimals: 3, steps: [] })).toEqual([]);
  });
});
