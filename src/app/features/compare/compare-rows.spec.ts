import type { AnalysisResult } from '../../../../shared/engine/types';
import { sampleResult } from '../editor/results/testing/sample-analysis';
import {
  bestIndexes,
  compareRows,
  lastNodeSelectivity,
  loadedQText,
  type CompareVariant,
} from './compare-rows';

/** The sample result with the last node's image rejection and the noise figure replaced. */
function variant(id: string, imageDb: number | null, nfDb: number): CompareVariant {
  const result: AnalysisResult = sampleResult();
  const last = result.nodes.length - 1;
  result.selectivity = result.selectivity.map((s) =>
    s.node === last ? { ...s, imageRejectionDb: imageDb } : s,
  );
  result.levels = { ...result.levels, noiseFigureDb: nfDb };
  return { id, name: `Chain ${id}`, result };
}

const row = (rows: ReturnType<typeof compareRows>, key: string) => {
  const found = rows.find((r) => r.key === key);
  if (!found) throw new Error(`no row ${key}`);
  return found;
};

describe('bestIndexes', () => {
  it('should pick the highest or the lowest value by the row direction', () => {
    expect(bestIndexes([14.2, 32.5, 20], 'higher')).toEqual([1]);
    expect(bestIndexes([14.2, 32.5, 20], 'lower')).toEqual([0]);
  });

  it('should mark every tied winner but nothing when all values are equal', () => {
    expect(bestIndexes([3, 1, 1], 'lower')).toEqual([1, 2]);
    expect(bestIndexes([2, 2], 'higher')).toEqual([]);
  });

  it('should skip missing values and need two known values to choose', () => {
    expect(bestIndexes([null, 5, 7], 'higher')).toEqual([2]);
    expect(bestIndexes([null, 5], 'higher')).toEqual([]);
    expect(bestIndexes([NaN, 5, 4], 'lower')).toEqual([2]);
  });

  it('should never mark a row without a better direction', () => {
    expect(bestIndexes([1, 2, 3], 'none')).toEqual([]);
  });
});

describe('compareRows', () => {
  it('should give one cell per variant in every row, in the variants’ order', () => {
    const rows = compareRows([variant('a', 14.2, 3), variant('b', 32.5, 4), variant('c', 20, 5)]);
    expect(rows.length).toBeGreaterThan(10);
    for (const r of rows) expect(r.cells).toHaveLength(3);
    expect(rows.map((r) => r.key)).toEqual(
      expect.arrayContaining(['f0', 'stages', 'gain', 'nf', 'sensitivity', 'iip3', 'sfdr']),
    );
    expect(rows.map((r) => r.key)).toEqual(
      expect.arrayContaining(['bw3', 'bw60', 'shape', 'image', 'loadedQ', 'errors', 'warnings']),
    );
  });

  it('should write the stated design frequency without padding, the results with theirs', () => {
    const rows = compareRows([variant('a', 14.2, 3)]);
    expect(row(rows, 'f0').cells[0].text).toBe('10 MHz');
    expect(row(rows, 'image').cells[0].text).toBe('14.20 dB');
  });

  it('should mark the best image rejection (higher) and the best noise figure (lower)', () => {
    const rows = compareRows([variant('a', 14.2, 3), variant('b', 32.5, 4)]);
    const image = row(rows, 'image');
    expect(image.better).toBe('higher');
    expect(image.hint).toBe('higher is better');
    expect(image.cells.map((c) => c.best)).toEqual([false, true]);
    expect(image.cells.map((c) => c.text)).toEqual(['14.20 dB', '32.50 dB']);
    const nf = row(rows, 'nf');
    expect(nf.better).toBe('lower');
    expect(nf.cells.map((c) => c.best)).toEqual([true, false]);
  });

  it('should read selectivity at the last node', () => {
    const v = variant('a', 14.2, 3);
    const sel = lastNodeSelectivity(v.result!);
    expect(sel?.node).toBe(v.result!.nodes.length - 1);
    const rows = compareRows([v, variant('b', 1, 3)]);
    expect(row(rows, 'bw3').cells[0].value).toBe(sel?.bw3dbHz ?? null);
    expect(row(rows, 'bw3').better).toBe('none');
    expect(row(rows, 'bw3').cells.some((c) => c.best)).toBe(false);
  });

  it('should show a dash for a variant without a result and leave it out of the choice', () => {
    const rows = compareRows([
      { id: 'x', name: 'Refused', result: null },
      variant('a', 14.2, 3),
      variant('b', 32.5, 4),
    ]);
    const image = row(rows, 'image');
    expect(image.cells[0]).toEqual({ value: null, text: '—', best: false });
    expect(image.cells.map((c) => c.best)).toEqual([false, false, true]);
  });

  it('should list the loaded Q of every resonator by its label', () => {
    const v = variant('a', 14.2, 3);
    const text = loadedQText(v.result!);
    for (const r of v.result!.resonators) expect(text).toContain(r.label);
    expect(row(compareRows([v]), 'loadedQ').cells[0].text).toBe(text);
  });

  it('should count error and warning flags separately, fewer being better', () => {
    const clean = variant('a', 14.2, 3);
    clean.result!.flags = [];
    const flagged = variant('b', 14.2, 3);
    const rows = compareRows([clean, flagged]);
    const warnings = row(rows, 'warnings');
    const expected = flagged.result!.flags.filter((f) => f.severity === 'warning').length;
    expect(expected).toBeGreaterThan(0);
    expect(warnings.cells.map((c) => c.value)).toEqual([0, expected]);
    expect(warnings.cells.map((c) => c.best)).toEqual([true, false]);
    expect(row(rows, 'errors').cells.map((c) => c.best)).toEqual([true, false]);
  });
});
