import type { StageTypeInfo } from '../../../../shared/engine/types';
import {
  sampleDocument,
  sampleResult,
  sampleTransmit,
} from '../editor/results/testing/sample-analysis';
import { budgetParts, GENERAL_CAUTION, reportCautions, reportModel } from './report-model';
import { budgetTable } from '../editor/results/budget-rows';
import { decibels } from '../editor/results/format-quantity';

const noTypes = new Map<string, StageTypeInfo>();

describe('report-model', () => {
  const doc = sampleDocument();
  const result = sampleResult();

  it("should carry a transmit mode's figures: power, harmonics, isolation, part stress", () => {
    expect(reportModel(doc, result, noTypes).transmit).toBeNull();
    const tx = reportModel(
      doc,
      { ...sampleResult(), transmit: sampleTransmit() },
      noTypes,
    ).transmit!;
    // Numbers as the app's formatter writes them (its significant figures are a setting).
    expect(tx.delivered).toBe(`94.50 mW (${decibels(19.75, 'dBm')})`);
    expect(tx.harmonics.map((h) => [h.n, h.attenuation, h.limit, h.ok])).toEqual([
      // The limits are the user's: written as stated, not padded to the figures.
      [2, decibels(16.3), '20 dB', false],
      [3, decibels(30.9), '20 dB', true],
    ]);
    expect(tx.receiver).toMatchObject({ isolation: decibels(34.2), verdict: 'no limit stated' });
    expect(tx.parts.map((p) => p.ok)).toEqual([null, false]);
    expect(tx.parts[1].rating).toBe('2 V peak'); // a stated rating, not padded
    expect(tx.frequency).toBe('433.92 MHz');
  });

  it('should write the stated design frequency, reference and stage values without padding', () => {
    const stated = sampleDocument();
    stated.stages[1].values = { l: 2.2e-3, q: 120 };
    const types = new Map<string, StageTypeInfo>([
      ['shunt-lc-tank', { type: 'shunt-lc-tank', label: 'Parallel LC tank', category: 'element', role: 'two-port', params: [
        { key: 'l', label: 'Inductance', unit: 'henry', kind: 'number', default: 1e-6 },
        { key: 'q', label: 'Coil Q', unit: 'none', kind: 'number', default: 100 },
      ] } as unknown as StageTypeInfo], // prettier-ignore
    ]);
    const model = reportModel(stated, result, types);
    expect(model.f0).toBe('10 MHz');
    expect(model.reference).toBe('50 Ω');
    expect(model.strip[1].values).toEqual(['Inductance 2.2 mH', 'Coil Q 120']);
    // Without the catalogue (a signed-out reader) the values are rounded, not padded, too.
    expect(reportModel(stated, result, noTypes).strip[1].values).toEqual(['l 0.0022', 'q 120']);
  });

  it('should draw every stage in order and mark each with its worst flag', () => {
    const { strip } = reportModel(doc, result, noTypes);
    expect(strip.map((c) => c.label)).toEqual([
      'Antenna',
      'Preselector',
      'LNA',
      'Mixer',
      'IF filter',
      'Detector',
    ]);
    expect(strip.map((c) => c.worst)).toEqual([null, 'error', null, null, 'info', 'warning']);
    // Without the catalogue, the ends are still drawn as source and load.
    expect(strip[0].category).toBe('source');
    expect(strip[5].category).toBe('load');
  });

  it('should split a wide budget into parts that keep every line and every column once', () => {
    const table = budgetTable(result, doc);
    const parts = budgetParts(table.columns, table.lines, 2);
    expect(parts.map((p) => p.columns.length)).toEqual([2, 2, 1]);
    expect(parts.flatMap((p) => p.columns.map((c) => c.id))).toEqual(
      table.columns.map((c) => c.id),
    );
    for (const part of parts) {
      expect(part.lines).toHaveLength(table.lines.length);
      for (const line of part.lines) {
        if (line.kind === 'quantity') expect(line.cells).toHaveLength(part.columns.length);
      }
    }
  });

  it('should list the flags worst first with their sentences', () => {
    const { flags } = reportModel(doc, result, noTypes);
    expect(flags.map((f) => f.flag.severity)).toEqual(['error', 'warning', 'info']);
    expect(flags[0].flag.message).toContain('pulls the tank Q from 90 to 25');
  });

  it('should always end the cautions with the general one', () => {
    const cautions = reportCautions(doc, result, noTypes);
    expect(cautions.map((c) => c.key)).toEqual(['general']);
    expect(cautions[0].text).toContain(GENERAL_CAUTION);
    expect(cautions[0].text).toContain('licensed practice');
  });

  it('should bring the stage types’ cautions, and a transmit path brings RF exposure', () => {
    const types = new Map<string, StageTypeInfo>([
      ['amplifier', { type: 'amplifier', cautions: ['transmit'] } as StageTypeInfo],
      ['mixer', { type: 'mixer', cautions: ['high-voltage'] } as StageTypeInfo],
    ]);
    const keys = reportCautions(doc, result, types).map((c) => c.key);
    expect(keys).toEqual(['transmit', 'rf-exposure', 'high-voltage', 'general']);
  });

  it("should take the analysis's own caution sentences and name its mode", () => {
    const withMode = {
      ...result,
      mode: { id: 'tx', name: 'Transmit', kind: 'transmit' as const },
      cautions: [{ caution: 'transmit' as const, message: 'Transmit needs a licence here.' }],
    };
    const model = reportModel(doc, withMode, noTypes);
    expect(model.mode).toBe('Transmit');
    expect(model.cautions[0]).toEqual({ key: 'transmit', text: 'Transmit needs a licence here.' });
  });

  it('should give the reference impedance of the chain, 50 Ω when it sets none', () => {
    expect(reportModel(doc, result, noTypes).referenceOhm).toBe(50);
    const at75 = { ...doc, settings: { ...doc.settings, referenceOhm: 75 } };
    expect(reportModel(at75, result, noTypes).referenceOhm).toBe(75);
  });

  it('should still draw the strip and cautions when the chain was not analysed', () => {
    const model = reportModel(doc, null, noTypes);
    expect(model.strip).toHaveLength(6);
    expect(model.budget).toEqual([]);
    expect(model.flags).toEqual([]);
    expect(model.cautions.at(-1)?.key).toBe('general');
  });
});

describe('report-model with a transmit mode', () => {
  it('should bring the transmit and RF exposure cautions to every mode of the chain', () => {
    const doc = {
      ...sampleDocument(),
      modes: [{ id: 'tx', name: 'Transmit', kind: 'transmit' as const }],
    };
    const keys = reportCautions(doc, sampleResult(), noTypes).map((c) => c.key);
    expect(keys).toEqual(['transmit', 'rf-exposure', 'general']);
  });
});
