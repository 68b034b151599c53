import { applySignificantFigures } from '../../core/format/number-format';
import { formatPart } from './part-format';

describe('formatPart', () => {
  const part = {
    partNumber: 'C-150P',
    kind: 'capacitor' as const,
    value: 150e-12,
    q: 800,
    qFreqHz: 7e6,
    tolerancePct: 2,
    notes: '',
  };

  afterEach(() => applySignificantFigures(4));

  it('should write a part as its datasheet states it, without padding zeros', () => {
    applySignificantFigures(4);
    expect(formatPart(part)).toMatchObject({
      value: '150 pF',
      q: 'Q 800 at 7 MHz',
      tolerance: '± 2 %',
    });
  });

  it('should still round a stated value to the chosen figures', () => {
    applySignificantFigures(3);
    expect(formatPart({ ...part, value: 152.37e-12 }).value).toBe('152 pF');
  });
});
