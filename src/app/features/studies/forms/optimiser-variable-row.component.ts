import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import type { VariableRow } from './optimiser-rows';
import { textOf, type TunableStage } from './tunable';

/** One value the optimiser varies: the stage, which of its values, and the bounds. */
@Component({
  selector: 'cw-optimiser-variable-row',
  imports: [MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  styleUrl: './study-row.scss',
  template: `
    <div class="row" data-testid="opt-variable">
      <label
        >Stage
        <select data-testid="opt-stage" (change)="edited.emit({ stageId: text($event) })">
          @for (s of tunable(); track s.id) {
            <option [value]="s.id" [selected]="s.id === row().stageId">{{ s.label }}</option>
          }
        </select>
      </label>
      <label
        >Value
        <select data-testid="opt-key" (change)="edited.emit({ key: text($event) })">
          @for (k of keys(); track k) {
            <option [value]="k" [selected]="k === row().key">{{ k }}</option>
          }
        </select>
      </label>
      <label
        >From
        <input
          data-testid="opt-min"
          [value]="row().min"
          (input)="edited.emit({ min: text($event) })"
          size="9"
      /></label>
      <label
        >To
        <input
          data-testid="opt-max"
          [value]="row().max"
          (input)="edited.emit({ max: text($event) })"
          size="9"
      /></label>
      @if (removable()) {
        <button mat-button type="button" (click)="remove.emit()">Remove</button>
      }
    </div>
  `,
})
export class OptimiserVariableRowComponent {
  readonly row = input.required<VariableRow>();
  /** The chain's stages with values to turn. */
  readonly tunable = input.required<TunableStage[]>();
  readonly removable = input(false);
  readonly edited = output<Partial<VariableRow>>();
  readonly remove = output<void>();

  protected readonly text = textOf;

  protected keys(): string[] {
    return this.tunable().find((s) => s.id === this.row().stageId)?.keys ?? [];
  }
}
