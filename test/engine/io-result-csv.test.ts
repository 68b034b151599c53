/**
 * The analysis tables as CSV, on the long-wave loop example (a heavily loaded tank, so it
 * has flags): every cell read back with a CSV parser (papaparse) is the engine's own
 * number or sentence, not the rounded text on screen.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import Papa from 'papaparse';
import { analyzeChain } from '../../shared/engine';
import { csvText } from '../../shared/io/csv-writer';
import { flagsCsv, levelsCsv, resonatorsCsv, selectivityCsv } from '../../shared/io/result-csv';
import { chainDocumentSchema } from '../../shared/schema/chain';

const file = path.join(__dirname, '..', '..', 'examples', 'longwave-time-signal-loop.chain.json');
const { variantOf: _v, ...raw } = JSON.parse(readFileSync(file, 'utf8'));
const doc = chainDocumentSchema.parse(raw);
const result = analyzeChain(doc, { sweep: true });

const readBack = (text: string) => {
  const parsed = Papa.parse<string[]>(text, { skipEmptyLines: true });
  expect(parsed.errors).toEqual([]);
  return parsed.data;
};

describe('analysis tables as CSV', () => {
  it('should hold every flag sentence word for word, worst first', () => {
    expect(result.flags.length).toBeGreaterThan(0);
    const [head, ...rows] = readBack(csvText(flagsCsv(result, doc)));
    expect(head).toEqual(['Severity', 'Stage', 'Code', 'Message']);
    expect(rows.map((r) => r[3]).sort()).toEqual(result.flags.map((f) => f.message).sort());
    const rank = { error: 0, warning: 1, info: 2 } as Record<string, number>;
    const ranks = rows.map((r) => rank[r[0]]);
    expect(ranks).toEqual([...ranks].sort((a, b) => a - b));
  });

  it("should give each resonator's Q and bandwidth as the engine's numbers", () => {
    const [head, ...rows] = readBack(csvText(resonatorsCsv(result, doc)));
    expect(rows).toHaveLength(result.resonators.length);
    const q = head.indexOf('Loaded Q');
    const bw = head.indexOf('Bandwidth (Hz)');
    result.resonators.forEach((r, i) => {
      expect(Number(rows[i][q])).toBeCloseTo(r.loadedQ!, 6);
      expect(Number(rows[i][bw]) / r.bandwidthHz!).toBeCloseTo(1, 8);
    });
  });

  it('should give one selectivity line per node with both sides of every offset', () => {
    const [head, ...rows] = readBack(csvText(selectivityCsv(result)));
    expect(rows).toHaveLength(result.selectivity.length);
    const offsets = doc.settings.offsetsHz.length;
    expect(head).toHaveLength(10 + 2 * offsets);
    for (const row of rows) expect(row).toHaveLength(head.length);
  });

  it('should give the noise figure and sensitivity of the chain', () => {
    const rows = readBack(csvText(levelsCsv(result, doc)));
    const value = (figure: string) => Number(rows.find((r) => r[0] === figure)![1]);
    expect(value('Noise figure')).toBeCloseTo(result.levels.noiseFigureDb, 6);
    expect(value('Sensitivity')).toBeCloseTo(result.levels.sensitivityDbm, 6);
    expect(value('Design frequency')).toBe(doc.settings.f0Hz);
  });
});
