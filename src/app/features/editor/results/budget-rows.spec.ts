import { type BudgetRow, budgetColumns, budgetTable, nodeOfStage } from './budget-rows';
import { NO_VALUE } from './format-quantity';
import { sampleDocument, sampleResult } from './testing/sample-analysis';

describe('budget-rows', () => {
  const result = sampleResult();
  const document = sampleDocument();

  describe('columns', () => {
    it('should make one column per node, named after the stage ending there', () => {
      const columns = budgetColumns(result, document);
      expect(columns.map((c) => c.id)).toEqual(['n0', 'n1', 'n2', 'n3', 'n4']);
      expect(columns.map((c) => c.after)).toEqual([
        'Antenna',
        'Preselector',
        'LNA',
        'Mixer',
        'IF filter',
      ]);
    });

    it('should tie node 0 to the source and the others to the stage ending there', () => {
      expect(budgetColumns(result, document).map((c) => c.stageId)).toEqual([
        'ant',
        'tank',
        'lna',
        'mix',
        'if',
      ]);
    });

    it('should carry the translated frequency after the mixer', () => {
      const columns = budgetColumns(result, document);
      expect(columns[2].frequencyHz).toBe(10e6);
      expect(columns[3].frequencyHz).toBe(455e3);
    });
  });

  describe('nodeOfStage', () => {
    it('should map a two-port to its output node', () => {
      expect(nodeOfStage('lna', result, document)).toBe(2);
    });

    it('should map the source to node 0 and the load to the last node', () => {
      expect(nodeOfStage('ant', result, document)).toBe(0);
      expect(nodeOfStage('det', result, document)).toBe(4);
    });

    it('should give null for no selection or an unknown stage', () => {
      expect(nodeOfStage(null, result, document)).toBeNull();
      expect(nodeOfStage('gone', result, document)).toBeNull();
    });
  });

  describe('lines', () => {
    const table = budgetTable(result, document);
    const row = (key: string) => {
      const line = table.lines.find((l): l is BudgetRow => l.kind === 'quantity' && l.key === key);
      if (!line) throw new Error(`no budget line ${key}`);
      return line;
    };

    it('should give every quantity line one cell per column', () => {
      for (const line of table.lines) {
        if (line.kind === 'quantity') expect(line.cells).toHaveLength(5);
      }
    });

    it('should group the quantities under headings in reading order', () => {
      const groups = table.lines.filter((l) => l.kind === 'group').map((l) => l.label);
      expect(groups).toEqual([
        'Impedance',
        'Voltage',
        'Gain',
        'Noise and linearity',
        'Level plan',
        'Match',
      ]);
    });

    it('should show impedances in both rectangular and polar form', () => {
      expect(row('zin-rect').cells[1]).toBe('2.400 kΩ + j150.0 Ω');
      expect(row('zin-polar').cells[0]).toBe('48.30 Ω ∠-3.680°');
      expect(row('zsrc-rect').cells[1]).toBe('2.150 kΩ - j80.00 Ω');
    });

    it('should show node voltages as rms and as the peak phasor', () => {
      expect(row('v-rms').cells[1]).toBe('10.00 µV rms');
      expect(row('v-peak').cells[1]).toBe('14.10 µV pk ∠0.000°');
    });

    it('should show step-up as a multiplier and in dB', () => {
      expect(row('stepup').cells[1]).toBe('×7.050  (16.97 dB)');
    });

    it('should leave stage quantities empty at the source node', () => {
      expect(row('gain-stage-v').cells[0]).toBe(NO_VALUE);
      expect(row('nf-cum').cells[0]).toBe(NO_VALUE);
      expect(row('nf-cum').cells[3]).toBe('3.300 dB');
    });

    it('should show a missing intercept as a dash, not as zero', () => {
      expect(row('iip3-stage').cells[1]).toBe(NO_VALUE);
      expect(row('iip3-stage').cells[2]).toBe('5.000 dBm');
      expect(row('p1db-stage').cells[2]).toBe('-5.000 dBm');
      expect(row('p1db-cum').cells[2]).toBe('-4.200 dBm');
    });

    it('should show noise temperatures beside the noise figures', () => {
      expect(row('te-stage').cells[0]).toBe(NO_VALUE);
      expect(row('te-out').cells[1]).toBe('290.0 K');
    });

    it('should give VSWR and return loss only against a chosen reference', () => {
      expect(row('vswr').cells[0]).toBe('1.020 : 1');
      expect(row('return-loss').cells[0]).toBe('40.00 dB re 50 Ω');
      expect(row('vswr').cells[4]).toBe('no reference set');
      expect(row('return-loss').cells[4]).toBe('no reference set');
      expect(row('level-reference').cells[4]).toBe('no reference set');
      expect(row('level-volts').cells[2]).toBe('1.000 mV rms');
    });

    it('should show the frequency at each node', () => {
      expect(row('frequency').cells).toEqual([
        '10.00 MHz',
        '10.00 MHz',
        '10.00 MHz',
        '455.0 kHz',
        '455.0 kHz',
      ]);
    });
  });
});
