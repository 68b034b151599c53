import type { UnitKind } from '../engine/types';
import { parseQuantity } from './parse';

function valueOf(text: string, kind: UnitKind): number {
  const r = parseQuantity(text, kind);
  if (!r.ok) throw new Error(`expected "${text}" to parse as ${kind}, got: ${r.message}`);
  return r.value;
}

function messageOf(text: string, kind: UnitKind): string {
  const r = parseQuantity(text, kind);
  if (r.ok) throw new Error(`expected "${text}" to be refused as ${kind}, got ${r.value}`);
  return r.message;
}

describe('parseQuantity', () => {
  describe('numbers with units', () => {
    it.each<[string, UnitKind, number]>([
      ['22 uH', 'henry', 22e-6],
      ['22uH', 'henry', 22e-6],
      ['22 µH', 'henry', 22e-6],
      ['4.7 pF', 'farad', 4.7e-12],
      ['77.5 kHz', 'hertz', 77.5e3],
      ['7.1 MHz', 'hertz', 7.1e6],
      ['7.1 mhz', 'hertz', 7.1e6],
      ['2 kohm', 'ohm', 2000],
      ['2.2 kΩ', 'ohm', 2200],
      ['1 Mohm', 'ohm', 1e6],
      ['40 mA/V', 'siemens', 0.04],
      ['10 mS', 'siemens', 0.01],
      ['100 uV/m', 'volt-per-metre', 1e-4],
      ['1.5 m', 'metre', 1.5],
      ['2 m', 'metre', 2],
      ['30 cm', 'metre', 0.3],
      ['290 K', 'kelvin', 290],
      ['45 deg', 'degree', 45],
      ['45°', 'degree', 45],
      ['1 mW', 'watt', 1e-3],
      ['3 uV', 'volt', 3e-6],
    ])('should read "%s" as %s', (text, kind, expected) => {
      expect(valueOf(text, kind)).toBeCloseTo(expected, 12 - Math.floor(Math.log10(expected)));
    });

    it('should convert an offset temperature scale to kelvin', () => {
      expect(valueOf('17 degC', 'kelvin')).toBeCloseTo(290.15, 9);
    });
  });

  describe('prefix-only shorthand and component codes', () => {
    it.each<[string, UnitKind, number]>([
      ['22u', 'henry', 22e-6],
      ['2.2k', 'ohm', 2200],
      ['2.2K', 'ohm', 2200],
      ['100n', 'farad', 100e-9],
      ['4p7', 'farad', 4.7e-12],
      ['2k2', 'ohm', 2200],
      ['4R7', 'ohm', 4.7],
      ['4k7 ohm', 'ohm', 4700],
      ['1M', 'ohm', 1e6],
      ['455k', 'hertz', 455e3],
    ])('should read "%s" as %s', (text, kind, expected) => {
      expect(valueOf(text, kind)).toBeCloseTo(expected, 12 - Math.floor(Math.log10(expected)));
    });
  });

  describe('plain numbers', () => {
    it.each<[string, UnitKind, number]>([
      ['50', 'ohm', 50],
      ['1e-6', 'henry', 1e-6],
      ['.5', 'ratio', 0.5],
      ['-3', 'db', -3],
      ['  12  ', 'none', 12],
      ['+7', 'dbm', 7],
    ])('should read "%s" as the SI value of %s', (text, kind, expected) => {
      expect(valueOf(text, kind)).toBe(expected);
    });
  });

  describe('levels and percentages', () => {
    it('should read dBm for a power level', () => {
      expect(valueOf('-95 dBm', 'dbm')).toBe(-95);
    });
    it('should convert a power in watts to dBm', () => {
      expect(valueOf('1 mW', 'dbm')).toBeCloseTo(0, 12);
      expect(valueOf('1 W', 'dbm')).toBeCloseTo(30, 12);
    });
    it('should convert dBm to watts for a power kind', () => {
      expect(valueOf('30 dBm', 'watt')).toBeCloseTo(1, 12);
    });
    it('should read dB for a dB kind', () => {
      expect(valueOf('-3 dB', 'db')).toBe(-3);
    });
    it('should read dBuV for a voltage and dBuV/m for a field strength', () => {
      expect(valueOf('0 dBuV', 'volt')).toBeCloseTo(1e-6, 15);
      expect(valueOf('40 dBuV/m', 'volt-per-metre')).toBeCloseTo(1e-4, 15);
    });
    it('should keep a percentage in percent for a percent kind', () => {
      expect(valueOf('10 %', 'percent')).toBe(10);
      expect(valueOf('10%', 'percent')).toBe(10);
    });
    it('should turn a percentage into a fraction for a ratio', () => {
      expect(valueOf('10 %', 'ratio')).toBeCloseTo(0.1, 15);
    });
  });

  describe('expressions', () => {
    it('should evaluate a capacitor from its reactance at a frequency', () => {
      // C = 1/(2π f X) with X = 50 Ω left bare: 3.183 nF.
      expect(valueOf('1/(2*pi*1 MHz*50)', 'farad')).toBeCloseTo(3.1831e-9, 12);
    });
    it('should evaluate an inductor from its reactance at a frequency', () => {
      expect(valueOf('50/(2*pi*1 MHz)', 'henry')).toBeCloseTo(7.9577e-6, 9);
    });
    it('should evaluate a fully dimensioned expression', () => {
      expect(valueOf('1/(2*pi*1 MHz*50 ohm)', 'farad')).toBeCloseTo(3.1831e-9, 12);
    });
    it('should evaluate arithmetic on plain numbers', () => {
      expect(valueOf('2*(3+4)', 'none')).toBe(14);
      expect(valueOf('sqrt(50*200)', 'ohm')).toBeCloseTo(100, 12);
    });
    it('should add quantities of the same kind', () => {
      expect(valueOf('100 pF + 22 pF', 'farad')).toBeCloseTo(122e-12, 20);
    });
  });

  describe('refusals', () => {
    it('should name both dimensions when the unit is of the wrong kind', () => {
      expect(messageOf('4.7 pF', 'henry')).toBe('expected an inductance (H), got a capacitance');
      expect(messageOf('1 MHz', 'ohm')).toBe('expected a resistance (Ω), got a frequency');
      expect(messageOf('2 V', 'dbm')).toBe('expected a power level (dBm), got a voltage');
    });
    it('should refuse a time where a frequency is wanted', () => {
      expect(messageOf('1 us', 'hertz')).toBe('expected a frequency (Hz), got a time');
    });
    it('should refuse dB where a resistance is wanted', () => {
      expect(messageOf('3 dB', 'ohm')).toMatch(/expected a resistance/);
    });
    it('should refuse a percentage for a physical kind', () => {
      expect(messageOf('10 %', 'henry')).toBe('expected an inductance (H), got a percentage');
    });
    it('should ask for a value when the text is empty', () => {
      expect(messageOf('   ', 'henry')).toBe('enter an inductance (H), e.g. 22 uH');
    });
    it('should explain an unknown unit and the case rule', () => {
      expect(messageOf('22 uh', 'henry')).toMatch(/"uh" is not a unit I know/);
    });
    it('should refuse junk with a plain message', () => {
      expect(messageOf('abc(', 'ohm')).toMatch(/^could not read "abc\("/);
      expect(messageOf('12 apples', 'ohm')).toMatch(/"apples" is not a unit/);
    });
    it('should refuse a decimal comma and say what to type', () => {
      expect(messageOf('4,7 pF', 'farad')).toMatch(/use a point for decimals/);
    });
    it('should refuse anything but arithmetic', () => {
      expect(messageOf('x = 3', 'none')).toMatch(/only numbers, units and arithmetic/);
      expect(messageOf('import({})', 'none')).toMatch(/function "import" is not available/);
      expect(messageOf('[1]', 'none')).toMatch(/only numbers/);
    });
    it('should refuse division by zero as not finite', () => {
      expect(messageOf('1/0', 'ohm')).toBe('the value is not a finite number');
    });
    it('should refuse overly long text', () => {
      expect(messageOf('1+'.repeat(150) + '1', 'none')).toMatch(/under 200 characters/);
    });
    it('should refuse a prefix on a logarithmic kind', () => {
      expect(messageOf('3k', 'dbm')).toMatch(/takes no prefix/);
    });
  });
});
