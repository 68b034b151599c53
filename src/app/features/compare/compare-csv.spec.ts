import { csvText } from '../../../../shared/io/csv-writer';
import { sampleResult } from '../editor/results/testing/sample-analysis';
import { compareFiguresCsv, stageDiffCsv } from './compare-csv';
import { compareRows, type CompareVariant } from './compare-rows';

describe('compare-csv', () => {
  const second = sampleResult();
  second.levels = { ...second.levels, noiseFigureDb: 3.25 };
  const variants: CompareVariant[] = [
    { id: 'a', name: 'First, try', result: sampleResult() },
    { id: 'b', name: 'Second', result: second },
  ];

  it('should give one column per variant with the compared numbers, not the rounded text', () => {
    const rows = compareRows(variants);
    const table = compareFiguresCsv(variants, rows);
    expect(table.columns).toEqual(['Quantity', 'Reading', 'First, try', 'Second']);
    const nf = rows.findIndex((r) => r.key === 'nf');
    expect(table.rows[nf].slice(1)).toEqual(['lower is better', rows[nf].cells[0].value, 3.25]);
    expect(csvText(table).split('\r\n')[0]).toBe('Quantity,Reading,"First, try",Second');
  });

  it('should write the differing stages as the table words them', () => {
    const table = stageDiffCsv(variants, [
      {
        stageId: 'tank',
        label: 'Preselector',
        cells: [
          { text: 'C 10 pF', differs: false },
          { text: 'C 12 pF', differs: true },
        ],
      },
    ]);
    expect(table.rows).toEqual([['Preselector', 'C 10 pF', 'C 12 pF']]);
  });
});
