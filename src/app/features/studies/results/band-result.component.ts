import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { bandCsv } from '../../../../../shared/io/study-csv';
import { CsvButtonComponent } from '../../report/csv-button.component';
import type { BandResult } from '../../../../../shared/engine/studies';
import { ResultPlotComponent } from '../../editor/results/result-plot.component';
import { trackingFigure } from '../study-plots';
import { engineering } from '../../editor/results/format-quantity';

/** A band study: how many positions mistrack, the worst error, and tracking against the dial. */
@Component({
  selector: 'cw-band-result',
  imports: [ResultPlotComponent, CsvButtonComponent],
  changeDetection: ChangeDetectionStrategy.OnPush,
  styleUrl: './result.scss',
  template: `
    @let r = result();
    <section class="result" data-testid="band-result">
      <h2>Band tracking: {{ r.positions.length }} dial positions</h2>
      <cw-csv-button
        what="band tracking per dial position"
        [tables]="csv"
        [fileName]="csvName()('band-tracking')"
      />
      <p data-testid="band-summary">
        {{ r.mistrackedPositions }} position(s) where a ganged circuit is off the dial by more than
        {{ r.mistrackFraction }} of its bandwidth; worst tracking error
        {{ hz(r.worstTrackingErrorHz) }}.
      </p>
      <cw-result-plot
        [figure]="tracking()"
        label="Tracking against the dial"
        hint="Solid: tracking error; dotted: resonance"
        fileName="band-tracking"
      />
    </section>
  `,
})
export class BandResultComponent {
  readonly result = input.required<BandResult>();
  /** Names a CSV file from what it holds (chain, reference impedance, table). */
  readonly csvName = input<(content: string) => string>((content) => `${content}.csv`);
  /** Every dial position as CSV, built when the button is pressed. */
  protected readonly csv = () => [bandCsv(this.result())];

  protected hz(v: number | null | undefined): string {
    return v === null || v === undefined ? '—' : engineering(v, 'hertz');
  }
  protected readonly tracking = computed(() => {
    const r = this.result();
    return trackingFigure({
      dialsHz: r.positions.map((p) => p.dialHz),
      circuits: r.circuits.map((c, i) => ({
        label: c.label,
        errorsHz: r.positions.map((p) => p.trackingErrorHz[i]),
        resonancesHz: r.positions.map((p) => p.resonanceHz[i]),
      })),
    });
  });
}
