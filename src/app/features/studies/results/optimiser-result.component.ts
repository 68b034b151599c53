import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { optimiserCsv } from '../../../../../shared/io/study-csv';
import { CsvButtonComponent } from '../../report/csv-button.component';
import { MatButtonModule } from '@angular/material/button';
import type { OptimiserResult } from '../../../../../shared/engine/studies';
import type { UnitKind } from '../../../../../shared/engine/types';
import type { OptimiserGoal } from '../../../../../shared/schema/studies';
import { plain } from '../../editor/results/format-quantity';
import { goalText, goalUnit, withUnit } from './study-format';

/** An optimiser run: each value and each goal before and after, and "save as a variant". */
@Component({
  selector: 'cw-optimiser-result',
  imports: [MatButtonModule, CsvButtonComponent],
  changeDetection: ChangeDetectionStrategy.OnPush,
  styleUrl: './result.scss',
  template: `
    @let r = result();
    <section class="result" data-testid="opt-result">
      <h2>Optimiser: {{ r.iterations }} iterations, {{ r.evaluations }} analyses</h2>
      <cw-csv-button
        what="optimiser values and goals"
        [tables]="csv"
        [fileName]="csvName()('optimiser')"
      />
      <table class="runs" data-testid="opt-compare">
        <thead>
          <tr>
            <th>Value or goal</th>
            <th>Before</th>
            <th>After</th>
          </tr>
        </thead>
        <tbody>
          @for (v of r.variables; track v.stageId + v.key) {
            <tr>
              <td>
                {{ v.stageId }} {{ v.key }}
                <span class="cw-muted">({{ value(v, v.min) }} to {{ value(v, v.max) }})</span>
              </td>
              <td>{{ value(v, v.before) }}</td>
              <td data-testid="opt-after">{{ value(v, v.after) }}</td>
            </tr>
          }
          @for (g of r.after.goals; track $index; let i = $index) {
            <tr data-testid="opt-goal-row">
              <td>{{ goalLabel(i, g.label) }}</td>
              <td>{{ goalValue(i, r.before.goals[i].value) }}</td>
              <td>{{ goalValue(i, g.value) }}</td>
            </tr>
          }
          <tr>
            <td>Cost (weighted sum of squared goal misses)</td>
            <td>{{ num(r.before.cost) }}</td>
            <td data-testid="opt-cost-after">{{ num(r.after.cost) }}</td>
          </tr>
        </tbody>
      </table>
      <button
        mat-flat-button
        type="button"
        data-testid="save-variant"
        [disabled]="saving()"
        (click)="save.emit()"
      >
        Save as a variant
      </button>
    </section>
  `,
})
export class OptimiserResultComponent {
  readonly result = input.required<OptimiserResult>();
  /** Names a CSV file from what it holds (chain, reference impedance, table). */
  readonly csvName = input<(content: string) => string>((content) => `${content}.csv`);
  /** The values and goals before and after as CSV, built when the button is pressed. */
  protected readonly csv = () => [optimiserCsv(this.result())];
  readonly saving = input(false);
  readonly save = output<void>();

  /** The unit of a stage's value (from the catalogue); undefined writes it plainly. */
  readonly unitOf = input<(stageId: string, key: string) => UnitKind | undefined>(() => undefined);
  /** The goals the run was asked for, in the result's order: their units and wording. */
  readonly goals = input<readonly OptimiserGoal[]>([]);

  protected readonly num = plain;
  protected value(v: { stageId: string; key: string }, x: number): string {
    return withUnit(x, this.unitOf()(v.stageId, v.key));
  }
  protected goalValue(i: number, x: number | null): string {
    return withUnit(x, goalUnit(this.goals()[i]));
  }
  protected goalLabel(i: number, fallback: string): string {
    const goal = this.goals()[i];
    return goal ? goalText(goal) : fallback;
  }
}
