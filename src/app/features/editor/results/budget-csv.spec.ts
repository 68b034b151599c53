import { budgetCsv, csvFileName } from './budget-csv';
import { budgetTable } from './budget-rows';
import { sampleDocument, sampleResult } from './testing/sample-analysis';

describe('budget-csv', () => {
  describe('budgetCsv', () => {
    const csv = budgetCsv(budgetTable(sampleResult(), sampleDocument()));
    const lines = csv.split('\r\n');

    it('should end every line with CRLF', () => {
      expect(csv.endsWith('\r\n')).toBe(true);
      expect(lines[lines.length - 1]).toBe('');
    });

    it('should head the columns with the nodes and what precedes them', () => {
      expect(lines[0]).toBe(
        'Quantity,Unit,Node 0 (Antenna),Node 1 (Preselector),Node 2 (LNA),Node 3 (Mixer),Node 4 (IF filter)',
      );
    });

    it('should give every line the same number of fields', () => {
      const body = lines.slice(0, -1);
      const counts = body.map((l) => l.replace(/"[^"]*"/g, 'x').split(',').length);
      expect(new Set(counts)).toEqual(new Set([7]));
    });

    it('should split impedances into resistance and reactance in ohms', () => {
      expect(lines).toContain('"Z looking in, R",ohm,48.2,2400,50,50,5000');
      expect(lines).toContain('"Z looking in, X",ohm,-3.1,150,0,0,-1200');
    });

    it('should write the frequency after the mixer at the IF', () => {
      expect(lines).toContain('Frequency at node,Hz,10000000,10000000,10000000,455000,455000');
    });

    it('should leave stage quantities empty at the source node', () => {
      expect(lines).toContain('Stage noise figure,dB,,0.8,2,10,3');
    });

    it('should leave group headings out', () => {
      expect(lines.some((l) => l.startsWith('Impedance'))).toBe(false);
    });
  });

  describe('csvFileName', () => {
    it('should name the file after the chain, its reference impedance and the table', () => {
      expect(csvFileName('Ten metre, "first" try', 'budget', 50)).toBe(
        'ten-metre-first-try_50ohm_budget.csv',
      );
    });

    it('should fall back when nothing usable is left', () => {
      expect(csvFileName('***')).toBe('chain_budget.csv');
    });
  });
});
