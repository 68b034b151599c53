/**
 * Study results as CSV, on small real runs of the study engines (one tank, C ± 5 %, and an
 * optimiser pulling C back onto f0 = 1/(2π√(LC))): every trial and figure reads back from
 * the CSV (papaparse) as the study's own numbers.
 */
import Papa from 'papaparse';
import {
  monteCarloResult,
  planMonteCarlo,
  runOptimiser,
  runTrials,
} from '../../shared/engine/studies';
import { csvText } from '../../shared/io/csv-writer';
import {
  monteCarloFiguresCsv,
  monteCarloSensitivityCsv,
  monteCarloTrialsCsv,
  optimiserCsv,
} from '../../shared/io/study-csv';
import { monteCarloSpecSchema, optimiserSpecSchema } from '../../shared/schema/studies';
import { singleTank } from './helpers/study-chains';

jest.setTimeout(120_000);

const readBack = (text: string) => {
  const parsed = Papa.parse<string[]>(text, { skipEmptyLines: true });
  expect(parsed.errors).toEqual([]);
  return parsed.data;
};

describe('study results as CSV', () => {
  const doc = singleTank({ l: 10e-6, c: 100e-12, tolerances: { c: 5 }, points: 201 });
  const plan = planMonteCarlo(
    { doc },
    monteCarloSpecSchema.parse({ kind: 'monte-carlo', trials: 20, seed: 7 }),
  );
  const result = monteCarloResult(plan, runTrials({ doc }, plan, 0, 20), doc.settings.targets);

  it('should give one line per trial with its draws and figures', () => {
    const [head, ...rows] = readBack(csvText(monteCarloTrialsCsv(result)));
    expect(rows).toHaveLength(20);
    expect(head[0]).toBe('Trial');
    expect(head).toHaveLength(1 + result.sensitivity.length + result.figures.length + 1);
    rows.forEach((row, i) => {
      expect(Number(row[1])).toBe(result.rows[i].draws[0]);
      const metric = result.rows[i].metrics[0];
      expect(row[1 + result.sensitivity.length]).toBe(metric === null ? '' : String(metric));
    });
  });

  it('should give each figure its nominal value and spread', () => {
    const [, ...rows] = readBack(csvText(monteCarloFiguresCsv(result)));
    expect(rows).toHaveLength(result.figures.length);
    const f = result.figures[0];
    expect(rows[0][0]).toBe(f.label);
    // Nine significant figures: equal to the study's mean within a part in 10⁸.
    expect(Number(rows[0][4]) / f.summary.mean!).toBeCloseTo(1, 8);
  });

  it('should give one sensitivity line per toleranced value', () => {
    const [head, ...rows] = readBack(csvText(monteCarloSensitivityCsv(result)));
    expect(rows).toHaveLength(result.sensitivity.length);
    for (const row of rows) expect(row).toHaveLength(head.length);
  });

  it("should give the optimiser's values before and after", () => {
    const r = runOptimiser(
      { doc: singleTank({ l: 10e-6, c: 130e-12, points: 201 }) },
      optimiserSpecSchema.parse({
        kind: 'optimiser',
        variables: [{ stageId: 'tank', key: 'c', min: 10e-12, max: 1e-9 }],
        goals: [
          { kind: 'resonance', stageId: 'tank', targetHz: 1 / (2 * Math.PI * Math.sqrt(1e-15)) },
        ],
      }),
    );
    const rows = readBack(csvText(optimiserCsv(r)));
    expect(rows[1]).toEqual([
      'tank c',
      '1.3e-10',
      String(Number(r.variables[0].after.toPrecision(9))),
      '1e-11',
      '1e-9',
    ]);
    expect(Number(rows[1][2]) / 100e-12).toBeCloseTo(1, 4);
    expect(rows.at(-1)![0]).toBe('Cost (sum of squared goal misses)');
  });
});
