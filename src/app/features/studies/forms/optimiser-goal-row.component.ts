import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import {
  dbLabel,
  GOAL_KINDS,
  hasBand,
  hasDb,
  hasNode,
  type GoalKind,
  type GoalRow,
} from './optimiser-rows';
import { numberOf, textOf } from './tunable';

/** One optimiser goal: its kind, the fields that kind reads, and its weight. */
@Component({
  selector: 'cw-optimiser-goal-row',
  imports: [MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  styleUrl: './study-row.scss',
  template: `
    @let g = row();
    <div class="row" data-testid="opt-goal" [attr.data-kind]="g.kind">
      <label
        >Goal
        <select data-testid="opt-goal-kind" (change)="edited.emit({ kind: kindOf($event) })">
          @for (k of goalKinds; track k.kind) {
            <option [value]="k.kind" [selected]="k.kind === g.kind">{{ k.label }}</option>
          }
        </select>
      </label>
      @if (g.kind === 'resonance') {
        <label
          >Tuned circuit of
          <select data-testid="opt-goal-stage" (change)="edited.emit({ stageId: text($event) })">
            @for (s of stages(); track s.id) {
              <option [value]="s.id" [selected]="s.id === g.stageId">{{ s.label }}</option>
            }
          </select>
        </label>
      }
      @if (hasNode(g.kind)) {
        <label
          >Node
          <input
            type="number"
            min="0"
            data-testid="opt-goal-node"
            [value]="g.node"
            (input)="edited.emit({ node: num($event) })"
        /></label>
      }
      @if (g.kind === 'resonance' || g.kind === 'bandwidth') {
        <label
          >{{ g.kind === 'resonance' ? 'at' : 'Width' }}
          <input
            data-testid="opt-target"
            [value]="g.hz"
            (input)="edited.emit({ hz: text($event) })"
            size="9"
        /></label>
      }
      @if (hasBand(g.kind)) {
        <label
          >From
          <input
            data-testid="opt-goal-start"
            [value]="g.hz"
            (input)="edited.emit({ hz: text($event) })"
            size="9"
        /></label>
        <label
          >To
          <input
            data-testid="opt-goal-stop"
            [value]="g.stopHz"
            (input)="edited.emit({ stopHz: text($event) })"
            size="9"
        /></label>
      }
      @if (hasDb(g.kind)) {
        <label
          >{{ dbLabel(g.kind) }} (dB)
          <input
            type="number"
            data-testid="opt-goal-db"
            [value]="g.db"
            (input)="edited.emit({ db: num($event) })"
        /></label>
      }
      <label
        >Weight
        <input
          type="number"
          min="0.001"
          step="0.5"
          data-testid="opt-goal-weight"
          [value]="g.weight"
          (input)="edited.emit({ weight: num($event) })"
      /></label>
      @if (removable()) {
        <button mat-button type="button" (click)="remove.emit()">Remove</button>
      }
    </div>
  `,
})
export class OptimiserGoalRowComponent {
  readonly row = input.required<GoalRow>();
  /** Every stage of the chain, for a resonance goal's tuned circuit. */
  readonly stages = input.required<{ id: string; label: string }[]>();
  readonly removable = input(false);
  readonly edited = output<Partial<GoalRow>>();
  readonly remove = output<void>();

  protected readonly goalKinds = GOAL_KINDS;
  protected readonly text = textOf;
  protected readonly num = numberOf;
  protected readonly hasNode = hasNode;
  protected readonly hasBand = hasBand;
  protected readonly hasDb = hasDb;
  protected readonly dbLabel = dbLabel;

  protected kindOf(event: Event): GoalKind {
    return textOf(event) as GoalKind;
  }
}
