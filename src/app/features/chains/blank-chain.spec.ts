import { chainDocumentSchema } from '../../../../shared/schema/chain';
import { blankChainDocument, CatalogueEntry, catalogueEntries } from './blank-chain';

describe('blankChainDocument', () => {
  it('should build a valid document from a resistive source and an R‖C load', () => {
    const doc = blankChainDocument('Loop test', CATALOGUE, 77.5e3);
    const parsed = chainDocumentSchema.parse(doc);
    expect(parsed.stages.map((s) => s.type)).toEqual(['resistive-source', 'rc-load']);
    expect(parsed.stages[0].values).toEqual({ r: 50, emf: 1e-3 });
    expect(parsed.settings.sweep.startHz).toBeCloseTo(38.75e3);
    expect(parsed.settings.sweep.stopHz).toBeCloseTo(155e3);
  });

  it('should prefer the resistive source over other sources', () => {
    const doc = blankChainDocument('x', [CATALOGUE[2], ...CATALOGUE]);
    expect(doc.stages[0].type).toBe('resistive-source');
  });

  it('should say what to do when the catalogue has no load type', () => {
    expect(() => blankChainDocument('x', [CATALOGUE[0]])).toThrow(/no load type.*example/);
  });
});

describe('catalogueEntries', () => {
  it('should accept a catalogue wrapped in an object', () => {
    expect(catalogueEntries({ types: CATALOGUE }).length).toBe(3);
  });

  it('should reject an answer that is not a list', () => {
    expect(() => catalogueEntries({ nope: 1 })).toThrow(/not a list/);
  });
});

// Helpers
const CATALOGUE: CatalogueEntry[] = [
  {
    type: 'resistive-source',
    role: 'source',
    label: 'Resistive source',
    params: [
      { key: 'r', default: 50 },
      { key: 'emf', default: 1e-3 },
    ],
  },
  { type: 'rc-load', role: 'load', label: 'R‖C load', params: [{ key: 'r', default: 1e4 }] },
  { type: 'short-monopole', role: 'source', label: 'Short monopole', params: [] },
];
