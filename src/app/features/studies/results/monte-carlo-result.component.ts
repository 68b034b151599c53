import { ChangeDetectionStrategy, Component, computed, input, signal } from '@angular/core';
import {
  monteCarloFiguresCsv,
  monteCarloSensitivityCsv,
  monteCarloTrialsCsv,
} from '../../../../../shared/io/study-csv';
import { CsvButtonComponent } from '../../report/csv-button.component';
import type { MonteCarloResult } from '../../../../../shared/engine/studies';
import { ResultPlotComponent } from '../../editor/results/result-plot.component';
import { numberOf } from '../forms/tunable';
import { histogramFigure, scatterFigure } from '../study-plots';
import { pct } from './study-format';
import { nominal } from '../../editor/results/format-quantity';

/** A Monte Carlo run: yield against the chain's targets, histograms, scatter, sensitivity. */
@Component({
  selector: 'cw-monte-carlo-result',
  imports: [ResultPlotComponent, CsvButtonComponent],
  changeDetection: ChangeDetectionStrategy.OnPush,
  styleUrl: './result.scss',
  template: `
    @let r = result();
    <section class="result" data-testid="mc-result">
      <h2>
        Monte Carlo: {{ r.trials }} trials,
        {{ r.distribution === 'normal' ? 'normal (± % as 3σ)' : 'uniform' }}, seed {{ r.seed }}
      </h2>
      <div class="csv-row">
        <cw-csv-button
          what="Monte Carlo figures"
          label="Figures CSV"
          [tables]="csv.figures"
          [fileName]="csvName()('monte-carlo-figures')"
        />
        <cw-csv-button
          what="every Monte Carlo trial"
          label="Trials CSV"
          [tables]="csv.trials"
          [fileName]="csvName()('monte-carlo-trials')"
        />
        <cw-csv-button
          what="what drives the losses"
          label="Sensitivity CSV"
          [tables]="csv.sensitivity"
          [fileName]="csvName()('monte-carlo-sensitivity')"
        />
      </div>
      @if (r.yield; as y) {
        <p class="yield" data-testid="mc-yield">
          Yield: <strong>{{ pct(y.fraction) }}</strong> ({{ y.passed }} of {{ r.trials }} meet every
          target)
        </p>
        <ul>
          @for (t of y.targets; track t.key) {
            <li>{{ t.label }}: {{ t.failures }} miss</li>
          }
        </ul>
      } @else {
        <p class="cw-muted">
          The chain states no targets, so no yield: add them in the editor's Settings.
        </p>
      }
      <label
        >Histogram of
        <select
          data-testid="mc-figure"
          [value]="figureIndex()"
          (change)="figureIndex.set(num($event))"
        >
          @for (f of r.figures; track f.key; let i = $index) {
            <option [value]="i">{{ f.label }}</option>
          }
        </select>
      </label>
      @if (histogram(); as h) {
        <cw-result-plot
          [figure]="h"
          label="Histogram"
          hint="Trials per bin"
          fileName="monte-carlo-histogram"
        />
      }
      <label
        >Scatter
        <select [value]="scatterX()" (change)="scatterX.set(num($event))">
          @for (f of r.figures; track f.key; let i = $index) {
            <option [value]="i">{{ f.label }}</option>
          }
        </select>
        against
        <select [value]="scatterY()" (change)="scatterY.set(num($event))">
          @for (f of r.figures; track f.key; let i = $index) {
            <option [value]="i">{{ f.label }}</option>
          }
        </select>
      </label>
      @if (scatter(); as sc) {
        <cw-result-plot
          [figure]="sc"
          label="Scatter of two figures"
          hint="One point per trial"
          fileName="monte-carlo-scatter"
        />
      }
      <h3>What drives the losses</h3>
      <table class="runs" data-testid="mc-sensitivity">
        <thead>
          <tr>
            <th>Value</th>
            <th>±</th>
            <th>Yield, small draws</th>
            <th>Yield, wide draws</th>
            <th>Drop</th>
          </tr>
        </thead>
        <tbody>
          @for (s of r.sensitivity; track s.label) {
            <tr>
              <td>{{ s.label }}</td>
              <td>{{ nominalNum(s.tolerancePct) }} %</td>
              <td>{{ pct(s.yieldInner) }}</td>
              <td>{{ pct(s.yieldOuter) }}</td>
              <td>{{ pct(s.yieldDrop) }}</td>
            </tr>
          }
        </tbody>
      </table>
    </section>
  `,
})
export class MonteCarloResultComponent {
  readonly result = input.required<MonteCarloResult>();
  /** Names a CSV file from what it holds (chain, reference impedance, table). */
  readonly csvName = input<(content: string) => string>((content) => `${content}.csv`);
  /** The run's tables as CSV, built when a button is pressed. */
  protected readonly csv = {
    figures: () => [monteCarloFiguresCsv(this.result())],
    trials: () => [monteCarloTrialsCsv(this.result())],
    sensitivity: () => [monteCarloSensitivityCsv(this.result())],
  };

  protected readonly pct = pct;
  protected readonly nominalNum = nominal;
  protected readonly num = numberOf;
  protected readonly figureIndex = signal(0);
  protected readonly scatterX = signal(0);
  protected readonly scatterY = signal(1);

  protected readonly histogram = computed(() => {
    const f = this.result().figures[this.figureIndex()];
    return f ? histogramFigure(f.label, f.unit, f.histogram) : null;
  });
  protected readonly scatter = computed(() => {
    const r = this.result();
    const [i, j] = [this.scatterX(), this.scatterY()];
    return scatterFigure(
      { label: r.figures[i]?.label ?? '', unit: r.figures[i]?.unit },
      { label: r.figures[j]?.label ?? '', unit: r.figures[j]?.unit },
      r.rows.map((row) => row.metrics[i]),
      r.rows.map((row) => row.metrics[j]),
      r.rows.map((row) => row.pass),
    );
  });
}
