import type { UnitKind } from '../engine/types';
import { formatEngineering } from './format';
import { parseQuantity } from './parse';
import { checkRange } from './range';

describe('formatEngineering', () => {
  describe('edges', () => {
    it('should write zero without a prefix', () => {
      expect(formatEngineering(0, 'henry')).toBe('0 H');
    });
    it('should write NaN as a dash and infinities as ∞', () => {
      expect(formatEngineering(NaN, 'ohm')).toBe('—');
      expect(formatEngineering(Infinity, 'ohm')).toBe('∞ Ω');
      expect(formatEngineering(-Infinity, 'db')).toBe('-∞ dB');
    });
    it('should move to the next prefix when rounding reaches 1000', () => {
      expect(formatEngineering(999.96, 'hertz', 3)).toBe('1 kHz');
      expect(formatEngineering(999.4, 'hertz', 3)).toBe('999 Hz');
    });
  });

  describe('prefixes', () => {
    it.each<[number, UnitKind, string]>([
      [22e-6, 'henry', '22 µH'],
      [77.5e3, 'hertz', '77.5 kHz'],
      [2200, 'ohm', '2.2 kΩ'],
      [4.7e-12, 'farad', '4.7 pF'],
      [7.1e6, 'hertz', '7.1 MHz'],
      [1.2e9, 'hertz', '1.2 GHz'],
      [0.04, 'siemens', '40 mS'],
      [-0.0015, 'volt', '-1.5 mV'],
      [1e-4, 'volt-per-metre', '100 µV/m'],
      [3.1831e-9, 'farad', '3.18 nF'],
      [2e-16, 'farad', '0.2 fF'],
      [1e99, 'farad', '1e99 F'],
      [5e-324, 'ohm', '5e-324 Ω'],
      [-2e15, 'ohm', '-2e15 Ω'],
    ])('should write %p %s as "%s"', (value, kind, text) => {
      expect(formatEngineering(value, kind)).toBe(text);
    });
    it('should honour the number of significant digits', () => {
      expect(formatEngineering(3.1831e-9, 'farad', 5)).toBe('3.1831 nF');
      expect(formatEngineering(3.1831e-9, 'farad', 1)).toBe('3 nF');
    });
  });

  describe('kinds without prefixes', () => {
    it.each<[number, UnitKind, string]>([
      [-95, 'dbm', '-95 dBm'],
      [-3.0103, 'db', '-3.01 dB'],
      [290, 'kelvin', '290 K'],
      [45, 'degree', '45°'],
      [10, 'percent', '10%'],
      [0.25, 'ratio', '0.25'],
      [12, 'none', '12'],
      [1e-7, 'ratio', '1e-7'],
      [1e12, 'ratio', '1e12'],
      [2.5e6, 'none', '2.5e6'],
      [999999, 'none', '1e6'],
    ])('should write %p %s as "%s"', (value, kind, text) => {
      expect(formatEngineering(value, kind)).toBe(text);
    });
  });

  describe('round trip with parseQuantity', () => {
    it.each<[number, UnitKind]>([
      [22e-6, 'henry'],
      [4.7e-12, 'farad'],
      [2200, 'ohm'],
      [77.5e3, 'hertz'],
      [-95, 'dbm'],
      [100e-6, 'volt-per-metre'],
      [290, 'kelvin'],
    ])('should read back %p %s from its formatted text', (value, kind) => {
      const r = parseQuantity(formatEngineering(value, kind, 6), kind);
      expect(r).toEqual({ ok: true, value: expect.closeTo(value, 15) });
    });
  });
});

describe('checkRange', () => {
  it('should accept a value inside the range', () => {
    expect(checkRange(1e-6, { min: 1e-9, max: 1, unit: 'henry' })).toBeNull();
  });
  it('should say the lower bound in the unit of the field', () => {
    expect(checkRange(1e-12, { min: 1e-9, unit: 'henry' })).toBe('must be at least 1 nH');
  });
  it('should treat an exclusive minimum as strict', () => {
    expect(checkRange(0, { min: 0, exclusiveMin: true, unit: 'ohm' })).toBe('must be above 0 Ω');
  });
  it('should say the upper bound', () => {
    expect(checkRange(2, { max: 1, unit: 'ratio' })).toBe('must be at most 1');
  });
});
