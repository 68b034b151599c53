import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  ElementRef,
  PendingTasks,
  afterNextRender,
  effect,
  inject,
  input,
  signal,
  viewChild,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import type { Config, Layout } from 'plotly.js-dist-min';
import { PLOTLY_LOADER, type PlotlyApi } from './plotly-loader';
import { PlotDrawQueue } from './plot-draw-queue';
import { retickUpdate } from './plot-axes';
import { followHoverHeading, hoverHeadingText, hoverHeadingUnit } from './hover-heading';
import type { PlotFigure } from './plot-traces';

/** A figure, or a function that builds it when the plot's turn to draw comes. */
export type PlotSource = PlotFigure | (() => PlotFigure);

/** Plot heights are fixed so the page does not jump while Plotly loads. */
const PLOT_HEIGHT_PX = 380;

/** Font of downloaded PNGs: one every system has, see `downloadPng`. */
const EXPORT_FONT = 'Arial, Helvetica, "Liberation Sans", "DejaVu Sans", sans-serif';

const PLOT_CONFIG: Partial<Config> = {
  displaylogo: false,
  // Our own PNG button names the file after the chain; resizing is ours too.
  modeBarButtonsToRemove: ['toImage', 'select2d', 'lasso2d'],
  responsive: false,
};

/**
 * One Plotly figure. Plotly is loaded on first render; each new figure is applied with
 * `Plotly.react`, which diffs against the plot on screen instead of rebuilding it. Drawings
 * take turns through the page's `PlotDrawQueue`, plots in view first, and a figure given as
 * a function is built only when its turn comes. The plot is `aria-busy` from the moment it
 * has a figure to draw until that figure (the newest) is on screen.
 */
@Component({
  selector: 'cw-result-plot',
  imports: [MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <figure class="frame">
      <div
        #canvas
        class="canvas"
        role="group"
        [attr.aria-label]="label()"
        [attr.aria-busy]="busy() || null"
        [style.height.px]="height"
      ></div>
      @if (state() === 'loading') {
        <p class="status cw-muted" aria-live="polite">Loading the plotting library…</p>
      } @else if (state() === 'failed') {
        <p class="status cw-error-text" role="alert">
          The plot could not be drawn: {{ failure() }}
        </p>
      }
      <figcaption class="caption">
        <span class="cw-muted">{{ hint() }}</span>
        <button
          mat-stroked-button
          type="button"
          [disabled]="state() !== 'ready'"
          (click)="downloadPng()"
        >
          Save PNG
        </button>
      </figcaption>
    </figure>
  `,
  styles: `
    :host {
      display: block;
      min-width: 0;
    }
    .frame {
      margin: 0;
      position: relative;
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: 12px;
      padding: 8px;
    }
    .canvas {
      width: 100%;
      // Lets the plot shrink with its container, so the resize observer sees a change.
      overflow: hidden;
    }
    .status {
      position: absolute;
      inset: 40% 0 auto;
      text-align: center;
    }
    .caption {
      display: flex;
      align-items: center;
      justify-content: space-between;
      gap: 12px;
      padding: 4px 8px 0;
    }
    .caption button {
      flex-shrink: 0;
      white-space: nowrap;
    }
  `,
})
export class ResultPlotComponent {
  /**
   * Traces and layout to show, or a function building them; a new object (or function)
   * redraws through `Plotly.react`.
   */
  readonly figure = input.required<PlotSource>();
  /** Accessible name of the plot (the figure's own title is drawn inside the plot). */
  readonly label = input.required<string>();
  /** How to read the plot, shown under it. */
  readonly hint = input('');
  /** PNG file name without extension. */
  readonly fileName = input.required<string>();

  protected readonly height = PLOT_HEIGHT_PX;
  private readonly canvas = viewChild.required<ElementRef<HTMLDivElement>>('canvas');
  private readonly loader = inject(PLOTLY_LOADER);
  // Loading and drawing count as pending work, so the app (and a test) is stable only
  // once the plot is on screen.
  private readonly pendingTasks = inject(PendingTasks);
  private readonly queue = inject(PlotDrawQueue);
  private readonly plotly = signal<PlotlyApi | null>(null);
  /** The figure last drawn (for the PNG and re-ticking), built from the source once. */
  private drawnFigure: PlotFigure | null = null;
  private readonly failureText = signal('');
  protected readonly failure = this.failureText.asReadonly();
  protected readonly state = signal<'loading' | 'ready' | 'failed'>('loading');
  /** A figure is waiting for its turn or being drawn. */
  protected readonly busy = signal(true);
  private stopHoverHeading: (() => void) | null = null;

  constructor() {
    const destroyRef = inject(DestroyRef);
    let resizeObserver: ResizeObserver | undefined;

    afterNextRender(() => {
      const loaded = this.pendingTasks.add();
      this.loader()
        .then(
          (plotly) => {
            if (destroyRef.destroyed) return;
            this.plotly.set(plotly);
            const element = this.canvas().nativeElement;
            if (typeof ResizeObserver !== 'undefined') {
              resizeObserver = new ResizeObserver(() => plotly.Plots.resize(element));
              resizeObserver.observe(element);
            }
          },
          (error: unknown) => {
            this.failureText.set(error instanceof Error ? error.message : String(error));
            this.state.set('failed');
            this.busy.set(false);
          },
        )
        .finally(loaded);
    });

    let listening = false;
    // A pending task while a drawing waits for its turn (one, however often it is replaced),
    // handed to the drawing when it starts.
    let waiting: (() => void) | null = null;
    // The pending task of the drawing under way, ended on destroy too: Plotly's promise for
    // a purged element may never settle.
    let inFlight: (() => void) | null = null;
    effect(() => {
      const plotly = this.plotly();
      const source = this.figure();
      if (!plotly) return;
      waiting ??= this.pendingTasks.add();
      this.busy.set(true);
      const element = this.canvas().nativeElement;
      this.queue.schedule(this, {
        element,
        draw: () => {
          const drawn = waiting ?? (() => undefined);
          waiting = null;
          inFlight = drawn;
          const figure = typeof source === 'function' ? source() : source;
          this.drawnFigure = figure;
          // Plotly writes later changes (zoomed ticks) into the axis objects it is given:
          // copies, so the figure keeps the data's own ticks for a reset.
          const { xaxis, yaxis } = figure.layout;
          const layout = { ...figure.layout, xaxis: { ...xaxis }, yaxis: { ...yaxis }, height: PLOT_HEIGHT_PX }; // prettier-ignore
          return plotly
            .react(element, figure.data, layout, PLOT_CONFIG)
            .then(
              () => {
                listening ||= this.listen(plotly, element);
                this.retickKeptZoom(plotly, element, figure);
                this.state.set('ready');
              },
              (error: unknown) => {
                this.failureText.set(error instanceof Error ? error.message : String(error));
                this.state.set('failed');
              },
            )
            .finally(() => {
              // Still busy when a newer figure came in meanwhile.
              if (waiting === null) this.busy.set(false);
              drawn();
            });
        },
      });
    });

    destroyRef.onDestroy(() => {
      this.queue.cancel(this);
      waiting?.();
      inFlight?.();
      resizeObserver?.disconnect();
      this.stopHoverHeading?.();
      this.plotly()?.purge(this.canvas().nativeElement);
    });
  }

  /**
   * Our tick labels are a fixed list, so after a zoom or pan they are worked out again for
   * the range shown, and a double-click reset brings back the data's own. A unified hover
   * box's heading is written again with our formatter (`hover-heading.ts`). Plotly adds `on`
   * to the element with its first drawing (the specs' stand-in never does): false until then.
   */
  private listen(plotly: PlotlyApi, element: HTMLElement): boolean {
    type Handler = (event: Record<string, unknown>) => void;
    const host = element as HTMLElement & { on?: (name: string, handler: Handler) => void };
    if (typeof host.on !== 'function') return false;
    host.on('plotly_relayout', (event) => {
      const figure = this.drawnFigure;
      const tickUnits = figure?.tickUnits;
      const update = figure && tickUnits ? retickUpdate(event, tickUnits, figure.layout) : null;
      // Plotly takes dotted attribute paths here, which its types do not describe.
      if (update) void plotly.relayout(element, update as Partial<Layout>);
    });
    this.stopHoverHeading = followHoverHeading(element, host.on.bind(host), (event) => {
      const unit = this.drawnFigure ? hoverHeadingUnit(this.drawnFigure) : null;
      return unit ? hoverHeadingText(event, unit) : null;
    });
    return true;
  }

  /**
   * A redraw keeps a zoom or pan the user made (the figures' `uirevision`) but brings the
   * data's own ticks, written for the whole sweep: tick the range still shown again.
   */
  private retickKeptZoom(plotly: PlotlyApi, element: HTMLElement, figure: PlotFigure): void {
    const units = figure.tickUnits;
    type ShownAxis = { autorange?: unknown; range?: unknown };
    const shown = (element as HTMLElement & { layout?: Record<string, ShownAxis | undefined> })
      .layout;
    if (!units || !shown) return;
    const kept: Record<string, unknown> = {};
    for (const axis of ['xaxis', 'yaxis'] as const) {
      const range = shown[axis]?.range;
      if (units[axis] && shown[axis]?.autorange === false && Array.isArray(range)) {
        kept[`${axis}.range`] = range;
      }
    }
    const update = retickUpdate(kept, units, figure.layout);
    if (update) void plotly.relayout(element, update as Partial<Layout>);
  }

  protected downloadPng(): void {
    const plotly = this.plotly();
    const figure = this.drawnFigure;
    if (!plotly || !figure) return;
    const element = this.canvas().nativeElement;
    // The image is drawn from serialised SVG, which cannot use the page's web font; with
    // a system font both the layout and the picture use the same glyph widths, so the
    // legend entries do not overlap.
    const layout = {
      ...figure.layout,
      height: PLOT_HEIGHT_PX,
      font: { ...figure.layout.font, family: EXPORT_FONT },
    };
    void plotly.downloadImage(
      { data: figure.data, layout, config: PLOT_CONFIG },
      {
        format: 'png',
        filename: this.fileName(),
        width: Math.max(element.clientWidth, 640),
        height: PLOT_HEIGHT_PX,
        scale: 2,
      },
    );
  }
}
