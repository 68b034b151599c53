/**
 * The heading of a unified hover box ("x unified": the frequency above every trace's value)
 * is written by Plotly itself, with d3's SI form: "7.322MHz", no space before the unit and
 * Plotly's own prefixes. Its template can reach only the bare x value, never our text, so
 * once Plotly has drawn the box (it emits `plotly_hover` after drawing) the heading is
 * written again with our formatter: the user's significant figures, a space before the
 * unit ("7.322 MHz"), as every other figure on screen.
 */
import type { UnitKind } from '../../../../../shared/engine/types';
import type { PlotFigure } from './plot-traces';
import { engineering } from './format-quantity';

/** The unit a figure's unified hover heading is written in: its x axis's, or none. */
export function hoverHeadingUnit(figure: PlotFigure): UnitKind | null {
  return figure.layout.hovermode === 'x unified' ? (figure.tickUnits?.xaxis ?? null) : null;
}

/** The heading for a `plotly_hover` event: the first point's x, written as our figures are. */
export function hoverHeadingText(event: Record<string, unknown>, unit: UnitKind): string | null {
  const points = event['points'];
  const x = Array.isArray(points) ? (points[0] as { x?: unknown } | undefined)?.x : undefined;
  return typeof x === 'number' && Number.isFinite(x) ? engineering(x, unit) : null;
}

/**
 * Writes `text` as the heading of the unified hover box drawn in `plot` (Plotly's
 * `.hoverlayer`), widening the box's frame when the heading is now its widest line.
 * False when no box is drawn.
 */
export function writeHoverHeading(plot: Element, text: string): boolean {
  const box = plot.querySelector('.hoverlayer g.legend');
  const title = box?.querySelector('text.legendtitletext');
  if (!box || !title) return false;
  if (title.textContent === text) return true; // ours already (and no change to observe)
  title.textContent = text;
  title.setAttribute('data-unformatted', text);
  const frame = box.querySelector('rect.bg');
  const measure = (title as Partial<SVGTextContentElement>).getComputedTextLength;
  if (frame && typeof measure === 'function') {
    // The text starts `x` in from the frame's left edge: keep as much room on its right.
    const inset = Number(title.getAttribute('x') ?? 0);
    const needed = Math.ceil(measure.call(title) + 2 * inset + 1);
    if (needed > Number(frame.getAttribute('width') ?? 0)) {
      frame.setAttribute('width', String(needed));
    }
  }
  return true;
}

type Handler = (event: Record<string, unknown>) => void;

/**
 * Keeps the unified hover box's heading ours while the pointer is over `plot`. Plotly
 * redraws the box on every pointer move but emits `plotly_hover` only when the points
 * change, so the heading is written on each event and again whenever Plotly redraws the
 * box (a mutation observer, which runs before the browser paints). `heading` gives the
 * text for an event (null: leave Plotly's). Returns the function that stops it.
 */
export function followHoverHeading(
  plot: HTMLElement,
  on: (name: string, handler: Handler) => void,
  heading: (event: Record<string, unknown>) => string | null,
): () => void {
  let wanted: string | null = null;
  const write = () => {
    if (wanted !== null) writeHoverHeading(plot, wanted);
  };
  on('plotly_hover', (event) => {
    wanted = heading(event);
    write();
  });
  on('plotly_unhover', () => (wanted = null));
  const observer = typeof MutationObserver === 'undefined' ? null : new MutationObserver(write);
  observer?.observe(plot, { childList: true, subtree: true, characterData: true });
  return () => observer?.disconnect();
}
