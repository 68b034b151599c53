import Papa from 'papaparse';
import { applySignificantFigures } from '../../core/format/number-format';
import { budgetCsvTable } from '../editor/results/budget-csv';
import { budgetTable } from '../editor/results/budget-rows';
import { sampleDocument, sampleResult } from '../editor/results/testing/sample-analysis';
import { CSV_PRECISION_NOTE, csvFileText } from './csv-download';

describe('csv download text', () => {
  it('should state the precision first and keep full precision whatever the screen shows', () => {
    applySignificantFigures(2);
    try {
      const text = csvFileText([budgetCsvTable(budgetTable(sampleResult(), sampleDocument()))]);
      expect(text.split('\r\n')[0]).toBe(CSV_PRECISION_NOTE);
      const parsed = Papa.parse<string[]>(text, { comments: '#', skipEmptyLines: true });
      expect(parsed.errors).toEqual([]);
      expect(parsed.data[0].slice(0, 2)).toEqual(['Quantity', 'Unit']);
      const resistance = parsed.data.find((row) => row[0] === 'Z looking in, R')!;
      expect(resistance[1]).toBe('ohm');
      // 48.2 Ω is written out in full, not as the "48 Ω" two figures give on screen.
      expect(resistance[2]).toBe('48.2');
    } finally {
      applySignificantFigures(4);
    }
  });
});
