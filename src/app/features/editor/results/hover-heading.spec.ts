import { applySignificantFigures } from '../../../core/format/number-format';
import {
  followHoverHeading,
  hoverHeadingText,
  hoverHeadingUnit,
  writeHoverHeading,
} from './hover-heading';
import type { PlotFigure } from './plot-traces';

const SVG = 'http://www.w3.org/2000/svg';

/** The unified hover box as Plotly 3/4 draws it: a legend in the hover layer, its title. */
function drawnBox(title: string): HTMLElement {
  const plot = document.createElement('div');
  const svg = document.createElementNS(SVG, 'svg');
  const layer = document.createElementNS(SVG, 'g');
  layer.setAttribute('class', 'hoverlayer');
  const legend = document.createElementNS(SVG, 'g');
  legend.setAttribute('class', 'legend');
  const frame = document.createElementNS(SVG, 'rect');
  frame.setAttribute('class', 'bg');
  frame.setAttribute('width', '40');
  const text = document.createElementNS(SVG, 'text');
  text.setAttribute('class', 'legendtitletext');
  text.setAttribute('x', '3');
  text.textContent = title;
  legend.append(frame, text);
  layer.append(legend);
  svg.append(layer);
  plot.append(svg);
  return plot;
}

describe('hover heading', () => {
  afterEach(() => applySignificantFigures(4));

  it('should write the hovered frequency with a space before the unit, at the chosen figures', () => {
    const event = { points: [{ x: 7_321_987 }, { x: 7_321_987 }] };
    expect(hoverHeadingText(event, 'hertz')).toBe('7.322 MHz');
    applySignificantFigures(6);
    expect(hoverHeadingText(event, 'hertz')).toBe('7.32199 MHz');
    expect(hoverHeadingText({ points: [{ x: 7e6 }] }, 'hertz')).toBe('7.00000 MHz');
  });

  it('should give no heading for an event without a numeric x', () => {
    expect(hoverHeadingText({}, 'hertz')).toBeNull();
    expect(hoverHeadingText({ points: [] }, 'hertz')).toBeNull();
    expect(hoverHeadingText({ points: [{ x: 'a' }] }, 'hertz')).toBeNull();
  });

  it('should rewrite the heading of the box Plotly drew, and widen its frame when needed', () => {
    const plot = drawnBox('7.322MHz');
    const title = plot.querySelector('text.legendtitletext') as SVGTextElement;
    // jsdom lays out no text: stand in for the measured width of the new heading.
    Object.assign(title, { getComputedTextLength: () => 60 });
    expect(writeHoverHeading(plot, '7.322 MHz')).toBe(true);
    expect(title.textContent).toBe('7.322 MHz');
    expect(title.getAttribute('data-unformatted')).toBe('7.322 MHz');
    expect(plot.querySelector('rect.bg')!.getAttribute('width')).toBe('67');
  });

  it('should keep the heading ours when Plotly redraws the box without a new event', async () => {
    const plot = drawnBox('7.322MHz');
    const handlers = new Map<string, (event: Record<string, unknown>) => void>();
    const stop = followHoverHeading(
      plot,
      (name, handler) => handlers.set(name, handler),
      (event) => hoverHeadingText(event, 'hertz'),
    );
    const title = () => plot.querySelector('text.legendtitletext')!;
    const settle = () => new Promise((resolve) => setTimeout(resolve, 0));
    handlers.get('plotly_hover')!({ points: [{ x: 7_321_987 }] });
    expect(title().textContent).toBe('7.322 MHz');
    title().textContent = '7.322MHz'; // the pointer moved on the same point: Plotly redraws
    await settle();
    expect(title().textContent).toBe('7.322 MHz');
    handlers.get('plotly_unhover')!({});
    title().textContent = '7.4MHz';
    await settle();
    expect(title().textContent).toBe('7.4MHz'); // nothing hovered: nothing to write
    stop();
  });

  it('should leave a plot without a hover box alone', () => {
    expect(writeHoverHeading(document.createElement('div'), '7.322 MHz')).toBe(false);
  });

  it('should write headings only for unified hover over an axis with units', () => {
    const figure = (hovermode: string, xaxis?: 'hertz'): PlotFigure => ({
      data: [],
      layout: { hovermode: hovermode as 'x unified' },
      ...(xaxis ? { tickUnits: { xaxis } } : {}),
    });
    expect(hoverHeadingUnit(figure('x unified', 'hertz'))).toBe('hertz');
    expect(hoverHeadingUnit(figure('closest', 'hertz'))).toBeNull();
    expect(hoverHeadingUnit(figure('x unified'))).toBeNull();
  });
});
