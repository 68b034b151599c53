import { FALLBACK_PALETTE, readPlotPalette, themePalette } from './plot-theme';

describe('plot-theme', () => {
  describe('readPlotPalette', () => {
    it('should fall back to the light colours when nothing is defined', () => {
      expect(readPlotPalette(() => '')).toEqual(FALLBACK_PALETTE);
    });

    it('should take the theme series and status colours when they are defined', () => {
      const theme: Record<string, string> = {
        '--cw-plot-1': ' #76c9c3 ',
        '--cw-plot-6': '#ff9aa8',
        '--cw-warn': '#f2c35e',
        '--mat-sys-on-surface': 'rgb(226, 226, 226)',
      };
      const palette = readPlotPalette((name) => theme[name] ?? '');
      expect(palette.series[0]).toBe('#76c9c3');
      expect(palette.series[5]).toBe('#ff9aa8');
      expect(palette.series[1]).toBe(FALLBACK_PALETTE.series[1]);
      expect(palette.warn).toBe('#f2c35e');
      expect(palette.text).toBe('rgb(226, 226, 226)');
    });
  });

  describe('themePalette', () => {
    afterEach(() => document.documentElement.style.removeProperty('--cw-plot-2'));

    it('should read a property set on the page and keep the fallbacks for the rest', () => {
      document.documentElement.style.setProperty('--cw-plot-2', '#123456');
      const palette = themePalette(document);
      // jsdom does not substitute var() in computed styles, so the declared value comes back.
      expect(palette.series[1]).toBe('#123456');
      expect(palette.series[0]).toBe(FALLBACK_PALETTE.series[0]);
    });

    it('should leave no probe element behind', () => {
      const before = document.body.childElementCount;
      themePalette(document);
      expect(document.body.childElementCount).toBe(before);
    });
  });
});
