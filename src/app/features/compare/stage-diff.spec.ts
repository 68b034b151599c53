import { applySignificantFigures } from '../../core/format/number-format';
import type { ChainDocument } from '../../../../shared/schema/chain';
import { stageDiffRows } from './stage-diff';

const doc = (stages: ChainDocument['stages']) => ({ stages }) as ChainDocument;
const tank = (c: number) => ({
  id: 'tank',
  type: 'shunt-lc-tank',
  label: 'Tank',
  values: { l: 1e-6, c },
});
const src = { id: 'src', type: 'resistive-generator', label: 'Source', values: { r: 50 } };

describe('stageDiffRows', () => {
  it('lists only the stages that differ, highlighting the differing variant', () => {
    const rows = stageDiffRows([doc([src, tank(100e-12)]), doc([src, tank(120e-12)])]);
    expect(rows).toHaveLength(1);
    expect(rows[0].stageId).toBe('tank');
    expect(rows[0].cells.map((c) => c.differs)).toEqual([false, true]);
    expect(rows[0].cells[1].text).toBe('c 1.2e-10');
    expect(rows[0].cells[0].text).toBe('c 1e-10');
  });

  it('shows a stage only one variant has as absent in the others', () => {
    const extra = { id: 'm1', type: 'l-match', label: 'Match', values: { l: 1e-6 } };
    const rows = stageDiffRows([doc([src]), doc([src, extra])]);
    expect(rows).toHaveLength(1);
    expect(rows[0].cells[0].text).toBe('—');
    expect(rows[0].cells[1]).toEqual({ text: 'l-match, l 1e-6', differs: true });
  });

  it('finds nothing when the variants are equal', () => {
    expect(stageDiffRows([doc([src, tank(1e-10)]), doc([src, tank(1e-10)])])).toEqual([]);
  });

  it('writes values with their unit and prefix at the chosen significant figures', () => {
    const unitOf = (_type: string, key: string) => (key === 'c' ? 'farad' : undefined) as 'farad';
    const rows = stageDiffRows([doc([tank(100e-12)]), doc([tank(123.456e-12)])], unitOf);
    // The stages' values are the user's: rounded, not padded ('100 pF', not '100.0 pF').
    expect(rows[0].cells[0].text).toBe('c 100 pF');
    expect(rows[0].cells[1].text).toBe('c 123.5 pF');
    applySignificantFigures(6);
    try {
      expect(stageDiffRows([doc([tank(100e-12)]), doc([tank(123.456e-12)])], unitOf)[0].cells[1].text).toBe('c 123.456 pF'); // prettier-ignore
    } finally {
      applySignificantFigures(4);
    }
  });
});
