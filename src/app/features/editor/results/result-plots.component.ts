import {
  ChangeDetectionStrategy,
  Component,
  DOCUMENT,
  DestroyRef,
  computed,
  inject,
  input,
  linkedSignal,
  signal,
} from '@angular/core';
import { MatCheckboxModule } from '@angular/material/checkbox';
import type { ChainDocument } from '../../../../../shared/schema/chain';
import type { AnalysisResult } from '../../../../../shared/engine/types';
import { chainReferenceOhm, exportFileName } from '../../../../../shared/io/export-name';
import { significantFigures, smithReferenceOhm } from '../../../core/format/number-format';
import { nominalEngineering } from './format-quantity';
import {
  type PlotContext,
  type PlotFigure,
  defaultPlotNodes,
  imageFrequency,
  impedanceChartFigure,
  impedanceFigure,
  returnLossFigure,
  stepUpFigure,
} from './plot-traces';
import { themePalette } from './plot-theme';
import { ResultPlotComponent } from './result-plot.component';

/** The sweep plots: step-up at chosen nodes, input impedance, return loss and its chart. */
@Component({
  selector: 'cw-result-plots',
  imports: [MatCheckboxModule, ResultPlotComponent],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (context()) {
      <fieldset class="nodes">
        <legend>Nodes on the step-up plot</legend>
        @for (node of result().nodes; track node.index) {
          <mat-checkbox
            [checked]="chosen().includes(node.index)"
            (change)="toggleNode(node.index, $event.checked)"
          >
            {{ nodeName(node.index) }}
          </mat-checkbox>
        }
      </fieldset>
      <div class="plots">
        <cw-result-plot
          [figure]="stepUpPlot()!"
          label="Voltage step-up versus frequency"
          hint="◇ marks each node's −3 dB points. Step-up is |V| relative to the source EMF."
          [fileName]="fileStem() + '_step-up'"
        />
        <cw-result-plot
          [figure]="impedancePlot()!"
          label="Input impedance, magnitude and phase"
          hint="The impedance the source sees: |Z| on the left scale, phase on the right."
          [fileName]="fileStem() + '_input-impedance'"
        />
        <cw-result-plot
          [figure]="returnLossPlot()!"
          label="Return loss at the input"
          hint="Against the conjugate of the source impedance; the dotted line is the chain's match target."
          [fileName]="fileStem() + '_return-loss'"
        />
        <cw-result-plot
          [figure]="chartPlot()!"
          label="Input impedance chart"
          [hint]="chartHint()"
          [fileName]="fileStem() + '_impedance-chart'"
        />
      </div>
    } @else {
      <p class="cw-muted">
        This analysis has no frequency sweep. Set a sweep with more than one point in the chain
        settings to see the plots.
      </p>
    }
  `,
  styles: `
    .nodes {
      display: flex;
      flex-wrap: wrap;
      gap: 0 16px;
      border: none;
      padding: 0;
      margin: 0 0 12px;
    }
    .nodes legend {
      font: var(--mat-sys-title-small);
      padding: 0;
    }
    .plots {
      display: grid;
      // minmax(0, …) lets the plots shrink below their drawn width when the window narrows.
      grid-template-columns: minmax(0, 1fr);
      gap: 16px;
    }
  `,
})
export class ResultPlotsComponent {
  readonly result = input.required<AnalysisResult>();
  readonly document = input.required<ChainDocument>();

  private readonly page = inject(DOCUMENT);
  /** Bumped when the page switches theme, so colours are read again. */
  private readonly themeRevision = signal(0);

  /** Chosen nodes; reset to the defaults when the chain's node count changes. */
  protected readonly chosen = linkedSignal<number, number[]>({
    source: () => this.result().nodes.length,
    computation: () => defaultPlotNodes(this.result()),
  });

  /** File names of the plot images: chain, reference impedance, then the plot. */
  protected readonly fileStem = computed(() => {
    const doc = this.document();
    const name = exportFileName({
      chainName: doc.name,
      referenceOhm: chainReferenceOhm(doc.settings),
      extension: 'x',
    });
    return name.slice(0, -'.x'.length);
  });

  private readonly nodeNames = computed(
    () => new Map(this.result().nodes.map((n) => [n.index, `Node ${n.index} · ${n.after}`])),
  );

  /** The settings the plots read from the document: an edit elsewhere redraws nothing. */
  private readonly scale = computed(() => this.document().settings.sweep.scale);
  private readonly matchTargetDb = computed(
    () => this.document().settings.thresholds.matchReturnLossDb,
  );

  /** Read from the page's styles once per theme, not for every result. */
  private readonly palette = computed(() => {
    this.themeRevision();
    return themePalette(this.page);
  });

  protected readonly context = computed((): PlotContext | null => {
    // Every figure writes its numbers to the user's significant figures.
    significantFigures();
    const result = this.result();
    const sweep = result.sweep;
    if (!sweep || sweep.freqsHz.length < 2) return null;
    return {
      sweep,
      scale: this.scale(),
      f0Hz: result.f0Hz,
      imageHz: imageFrequency(result),
      palette: this.palette(),
      nodeNames: this.nodeNames(),
    };
  });

  // Each plot gets a builder, run when its turn to draw comes (plots below the fold wait for
  // an idle moment), and a new builder when what its figure is made from changes. The
  // step-up plot's own, so ticking a node redraws only that plot.
  protected readonly stepUpPlot = this.builder(this.chosen, stepUpFigure);
  protected readonly impedancePlot = this.builder(() => null, impedanceFigure);
  protected readonly returnLossPlot = this.builder(this.matchTargetDb, returnLossFigure);
  // Normalised to the reference the user chose (Account, default 50 Ω), not the source's
  // resistance: a 10 MΩ loop would crowd the whole sweep into one corner of the chart.
  protected readonly chartPlot = this.builder(smithReferenceOhm, impedanceChartFigure);

  protected readonly chartHint = computed(
    () =>
      `Normalised to ${nominalEngineering(smithReferenceOhm(), 'ohm')} (choose another reference under Account); ○ marks f0.`,
  );

  constructor() {
    // The shell switches themes with a class on <html>; follow it.
    const view = this.page.defaultView;
    if (view && 'MutationObserver' in view) {
      const observer = new view.MutationObserver(() => this.themeRevision.update((n) => n + 1));
      observer.observe(this.page.documentElement, { attributes: true, attributeFilter: ['class'] });
      inject(DestroyRef).onDestroy(() => observer.disconnect());
    }
  }

  /**
   * A builder of one figure from the context and `input` (both read here, so a change of
   * either makes a new builder and the plot draws again); the figure is built when called.
   */
  private builder<T>(input: () => T, build: (ctx: PlotContext, input: T) => PlotFigure) {
    return computed((): (() => PlotFigure) | null => {
      const ctx = this.context();
      const value = input();
      return ctx ? () => build(ctx, value) : null;
    });
  }

  protected nodeName(index: number): string {
    return this.nodeNames().get(index) ?? `Node ${index}`;
  }

  protected toggleNode(index: number, checked: boolean): void {
    this.chosen.update((nodes) => {
      const rest = nodes.filter((n) => n !== index);
      return checked ? [...rest, index].sort((a, b) => a - b) : rest;
    });
  }
}
