import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { decibels, engineering } from '../results/format-quantity';

/** One trace of a small response plot. */
export interface SparkTrace {
  y: readonly number[];
  /** A CSS class: `a` (solid) or `b` (dashed), coloured by the theme. */
  kind: 'a' | 'b';
  label: string;
}

/**
 * A small response plot drawn as SVG (no plotting library: dozens of these appear in a
 * candidate list, and they must draw at once). Each trace is scaled to the same y range.
 */
@Component({
  selector: 'cw-spark-plot',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <svg
      [attr.viewBox]="'0 0 ' + width + ' ' + height"
      [attr.aria-label]="ariaLabel()"
      role="img"
      preserveAspectRatio="none"
    >
      <line class="axis" x1="0" [attr.y1]="height - 1" [attr.x2]="width" [attr.y2]="height - 1" />
      @if (markerX(); as x) {
        <line class="marker" [attr.x1]="x" y1="0" [attr.x2]="x" [attr.y2]="height" />
      }
      @for (p of paths(); track $index) {
        <polyline [attr.class]="p.kind" [attr.points]="p.points" />
      }
    </svg>
    <div class="range cw-muted">{{ rangeText() }}</div>
  `,
  styles: `
    :host {
      display: block;
    }
    svg {
      width: 100%;
      height: 64px;
      display: block;
      background: var(--mat-sys-surface-container, transparent);
      border-radius: 4px;
    }
    polyline {
      fill: none;
      stroke-width: 1.5;
      vector-effect: non-scaling-stroke;
    }
    .a {
      stroke: var(--cw-plot-1);
    }
    .b {
      stroke: var(--cw-plot-2);
      stroke-dasharray: 4 3;
    }
    .axis {
      stroke: #999;
      stroke-width: 0.5;
    }
    .marker {
      stroke: #777;
      stroke-width: 0.5;
      stroke-dasharray: 2 2;
    }
    .range {
      font-size: 11px;
    }
  `,
})
export class SparkPlotComponent {
  readonly freqsHz = input.required<readonly number[]>();
  readonly traces = input.required<SparkTrace[]>();
  /** A frequency to mark (e.g. f0). */
  readonly markHz = input<number | null>(null);
  readonly ariaLabel = input('Response');

  protected readonly width = 300;
  protected readonly height = 64;

  private readonly yRange = computed(() => {
    const all = this.traces().flatMap((t) => t.y.filter(Number.isFinite));
    const hi = Math.max(...all);
    // Show the top 40 dB: what a designer compares at a glance.
    return { hi, lo: Math.max(Math.min(...all), hi - 40) };
  });

  protected readonly paths = computed(() => {
    const f = this.freqsHz();
    if (f.length < 2) return [];
    const { hi, lo } = this.yRange();
    const fx = (v: number) => ((v - f[0]) / (f[f.length - 1] - f[0])) * this.width;
    const fy = (v: number) =>
      this.height - 2 - ((Math.max(v, lo) - lo) / (hi - lo || 1)) * (this.height - 4);
    return this.traces().map((t) => ({
      kind: t.kind,
      points: t.y.map((v, i) => `${fx(f[i]).toFixed(1)},${fy(v).toFixed(1)}`).join(' '),
    }));
  });

  protected readonly markerX = computed(() => {
    const f = this.freqsHz();
    const m = this.markHz();
    if (m === null || f.length < 2) return null;
    return ((m - f[0]) / (f[f.length - 1] - f[0])) * this.width;
  });

  protected readonly rangeText = computed(() => {
    const f = this.freqsHz();
    if (f.length < 2) return '';
    const { hi, lo } = this.yRange();
    const span = `${engineering(f[0], 'hertz')} to ${engineering(f[f.length - 1], 'hertz')}`;
    return `${span} · ${decibels(lo)} to ${decibels(hi)}`;
  });
}
