import { applySignificantFigures } from '../../../core/format/number-format';
import {
  NO_VALUE,
  decibels,
  degrees,
  engineering,
  figures,
  impedancePolar,
  impedanceRect,
  nominal,
  nominalDecibels,
  nominalEngineering,
  percent,
  plain,
  times,
} from './format-quantity';

describe('format-quantity', () => {
  describe('engineering', () => {
    it('should show a missing value as a dash', () => {
      expect(engineering(null, 'hertz')).toBe(NO_VALUE);
      expect(engineering(undefined, 'hertz')).toBe(NO_VALUE);
      expect(engineering(Number.NaN, 'hertz')).toBe(NO_VALUE);
    });

    it('should pick the prefix for the value', () => {
      expect(engineering(10e6, 'hertz')).toBe('10.00 MHz');
      expect(engineering(455e3, 'hertz', 4)).toBe('455.0 kHz');
      expect(engineering(10e-6, 'volt')).toBe('10.00 µV');
      expect(engineering(2400, 'ohm')).toBe('2.400 kΩ');
    });

    it("should write the user's number of significant figures, 4 unless chosen", () => {
      expect(engineering(54_551.2, 'hertz')).toBe('54.55 kHz');
      expect(engineering(28_700.4, 'hertz')).toBe('28.70 kHz');
      applySignificantFigures(3);
      try {
        expect(engineering(54_551.2, 'hertz')).toBe('54.6 kHz');
        expect(times(7.0466)).toBe('×7.05');
      } finally {
        applySignificantFigures(4);
      }
    });

    it('should keep the figure count inside 2 to 8', () => {
      applySignificantFigures(40);
      try {
        expect(engineering(1 / 3, 'volt')).toBe('333.33333 mV');
      } finally {
        applySignificantFigures(4);
      }
    });
  });

  describe('decibels', () => {
    it("should write the user's figures counted from the units digit", () => {
      expect(decibels(-3.01234)).toBe('-3.012 dB');
      expect(decibels(-120.66, 'dBm')).toBe('-120.7 dBm');
      expect(decibels(-0.01234)).toBe('-0.012 dB');
      expect(decibels(-3)).toBe('-3.000 dB');
      applySignificantFigures(6);
      try {
        expect(decibels(-3.01234)).toBe('-3.01234 dB');
        expect(decibels(-120.66, 'dBm')).toBe('-120.660 dBm');
      } finally {
        applySignificantFigures(4);
      }
    });

    it('should not print a negative zero', () => {
      expect(decibels(-0.0001)).toBe('0.000 dB');
    });

    it('should show infinities and missing values', () => {
      expect(decibels(Number.POSITIVE_INFINITY)).toBe('∞ dB');
      expect(decibels(null, 'dBm')).toBe(NO_VALUE);
    });
  });

  describe('stated values', () => {
    it('should round a value the user states but write no padding zeros', () => {
      expect(nominalDecibels(20)).toBe('20 dB');
      expect(nominalDecibels(0, 'dBm')).toBe('0 dBm');
      expect(nominalDecibels(-13.5, 'dBm')).toBe('-13.5 dBm');
      expect(nominalDecibels(-3.14159)).toBe('-3.142 dB');
      expect(nominalEngineering(50, 'ohm')).toBe('50 Ω');
      expect(nominalEngineering(77_500, 'hertz')).toBe('77.5 kHz');
      expect(nominal(120)).toBe('120');
      expect(nominalDecibels(null)).toBe(NO_VALUE);
    });

    it("should round a stated value to the user's figures", () => {
      applySignificantFigures(2);
      try {
        expect(nominalDecibels(-13.46, 'dBm')).toBe('-13 dBm');
        expect(nominalEngineering(1234, 'hertz')).toBe('1.2 kHz');
      } finally {
        applySignificantFigures(4);
      }
    });
  });

  describe('ratios', () => {
    it('should show step-up as a multiplier without milli prefixes', () => {
      expect(times(7.05)).toBe('×7.050');
      expect(times(0.05)).toBe('×0.05000');
      expect(times(7.04961)).toBe('×7.050');
      expect(times(7.04661)).toBe('×7.047');
      expect(times(1410.4)).toBe('×1410');
      expect(times(2.5e7)).toBe('×2.500e7');
    });

    it("should show plain numbers and percentages to the user's figures", () => {
      expect(plain(25.04)).toBe('25.04');
      expect(plain(25.0449)).toBe('25.04');
      expect(plain(1e12)).toBe('1.000e12');
      expect(plain(null)).toBe(NO_VALUE);
      expect(percent(0.72)).toBe('72.00 %');
      expect(percent(0.123456)).toBe('12.35 %');
      applySignificantFigures(3);
      try {
        expect(plain(25.0449)).toBe('25.0');
        expect(percent(0.123456)).toBe('12.3 %');
      } finally {
        applySignificantFigures(4);
      }
    });

    it('should never print a negative zero or lose an infinity', () => {
      expect(figures(-0.00001, 2, true)).toBe('0.0');
      expect(figures(Number.POSITIVE_INFINITY)).toBe('∞');
      expect(figures(Number.NEGATIVE_INFINITY)).toBe('-∞');
    });
  });

  describe('degrees', () => {
    it('should not print a negative zero angle', () => {
      expect(degrees(-0.0001)).toBe('0.000°');
      expect(degrees(-28.46)).toBe('-28.46°');
      expect(degrees(-28.46, 3)).toBe('-28.5°');
    });
  });

  describe('impedance', () => {
    it('should write the rectangular form with the sign of the reactance', () => {
      expect(impedanceRect({ re: 50, im: 12 })).toBe('50.00 Ω + j12.00 Ω');
      expect(impedanceRect({ re: 2150, im: -80 })).toBe('2.150 kΩ - j80.00 Ω');
    });

    it('should write the polar form with magnitude and angle', () => {
      expect(impedancePolar({ re: 3, im: 4 })).toBe('5.000 Ω ∠53.13°');
      expect(impedancePolar({ re: 0, im: -100 })).toBe('100.0 Ω ∠-90.00°');
      expect(impedancePolar({ re: 10e6, im: -1e-9 })).toBe('10.00 MΩ ∠0.000°');
    });

    it('should show cascade rounding left in a part as zero', () => {
      expect(impedanceRect({ re: 1500, im: 8.3e-16 })).toBe('1.500 kΩ + j0 Ω');
      expect(impedanceRect({ re: 0.1, im: 3e-9 })).toBe('100.0 mΩ + j3.000 nΩ');
    });

    it('should show a dash when a part is missing', () => {
      expect(impedanceRect({ re: Number.NaN, im: 1 })).toBe(NO_VALUE);
    });
  });
});
