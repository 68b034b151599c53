/**
 * Plot colours from the theme's CSS custom properties (`--cw-plot-1..6`, `--cw-warn`,
 * Material system tokens), read when a figure is built so light and dark both apply.
 * The fallbacks are the light theme's values, used when a property is not defined.
 */

export interface PlotPalette {
  series: string[];
  /** Plot background: the surface colour, so a downloaded PNG keeps its contrast. */
  background: string;
  text: string;
  grid: string;
  axis: string;
  /** f0 and image marker lines. */
  marker: string;
  warn: string;
  fontFamily: string;
}

const FALLBACK_SERIES = ['#0f5a57', '#a8612a', '#3558a8', '#8a3f8f', '#4f7a1f', '#b3304a'];

export const FALLBACK_PALETTE: PlotPalette = {
  series: FALLBACK_SERIES,
  background: '#fafaf9',
  text: '#1b1c1c',
  grid: '#c4c7c6',
  axis: '#747877',
  marker: '#5a5e5d',
  warn: '#8a5a00',
  fontFamily: 'Atkinson Hyperlegible, system-ui, sans-serif',
};

/**
 * Reads one colour property as a value Plotly understands (e.g. "rgb(15, 90, 87)"), or
 * "" when it is not set. In the app this resolves `var(--name)` on a probe element,
 * because Material tokens may be written as `light-dark(…)`, which Plotly cannot parse.
 */
export type PropertyReader = (name: string) => string;

export function readPlotPalette(read: PropertyReader): PlotPalette {
  const value = (name: string, fallback: string) => read(name).trim() || fallback;
  return {
    series: FALLBACK_SERIES.map((fallback, i) => value(`--cw-plot-${i + 1}`, fallback)),
    background: value('--mat-sys-surface', FALLBACK_PALETTE.background),
    text: value('--mat-sys-on-surface', FALLBACK_PALETTE.text),
    grid: value('--mat-sys-outline-variant', FALLBACK_PALETTE.grid),
    axis: value('--mat-sys-outline', FALLBACK_PALETTE.axis),
    marker: value('--mat-sys-on-surface-variant', FALLBACK_PALETTE.marker),
    warn: value('--cw-warn', FALLBACK_PALETTE.warn),
    fontFamily: FALLBACK_PALETTE.fontFamily,
  };
}

/** The palette of the page's current theme, each colour resolved through a probe element. */
export function themePalette(doc: Document): PlotPalette {
  const view = doc.defaultView;
  if (!view) return FALLBACK_PALETTE;
  const probe = doc.createElement('span');
  probe.style.display = 'none';
  doc.body.appendChild(probe);
  try {
    const rootStyle = view.getComputedStyle(doc.documentElement);
    const palette = readPlotPalette((name) => {
      // An undefined property would leave the probe at its inherited colour: report unset.
      const declared = rootStyle.getPropertyValue(name).trim();
      if (!declared) return '';
      probe.style.color = `var(${name})`;
      const resolved = view.getComputedStyle(probe).color;
      // Engines that do not substitute var() in computed styles (jsdom) hand it back as is.
      return resolved && !resolved.includes('var(') ? resolved : declared;
    });
    const bodyFont = view.getComputedStyle(doc.body).fontFamily;
    return { ...palette, fontFamily: bodyFont || palette.fontFamily };
  } finally {
    probe.remove();
  }
}
