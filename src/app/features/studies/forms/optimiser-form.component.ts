import { ChangeDetectionStrategy, Component, computed, input, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import type { ChainDocument } from '../../../../../shared/schema/chain';
import type { StudySpecInput } from '../../../../../shared/schema/studies';
import { OptimiserGoalRowComponent } from './optimiser-goal-row.component';
import {
  goalRow,
  optimiserSpec,
  variableRow,
  type GoalRow,
  type VariableRow,
} from './optimiser-rows';
import { OptimiserVariableRowComponent } from './optimiser-variable-row.component';
import { fillOnceLoaded, tunableStages } from './tunable';

/**
 * The optimiser's form: several values to vary, each between bounds, and several goals with
 * weights; the spec goes to the study queue as one Levenberg–Marquardt run.
 */
@Component({
  selector: 'cw-optimiser-form',
  imports: [MatButtonModule, OptimiserVariableRowComponent, OptimiserGoalRowComponent],
  changeDetection: ChangeDetectionStrategy.OnPush,
  styleUrl: './study-form.scss',
  template: `
    <div class="form" data-testid="opt-form">
      <p>
        Searches the values you choose, each between its bounds (Levenberg–Marquardt), for the
        smallest weighted sum of squared goal misses. The result can be kept as a variant.
      </p>
      <h3 class="row-head">Values to vary</h3>
      <div class="rows">
        @for (v of variables(); track $index; let i = $index) {
          <cw-optimiser-variable-row
            [row]="v"
            [tunable]="tunable()"
            [removable]="variables().length > 1"
            (edited)="setVar(i, $event)"
            (remove)="removeVar(i)"
          />
        }
      </div>
      <button mat-stroked-button type="button" data-testid="opt-add-variable" (click)="addVar()">
        Add a value
      </button>
      <h3 class="row-head">Goals</h3>
      <div class="rows">
        @for (g of goals(); track $index; let i = $index) {
          <cw-optimiser-goal-row
            [row]="g"
            [stages]="stages()"
            [removable]="goals().length > 1"
            (edited)="setGoal(i, $event)"
            (remove)="removeGoal(i)"
          />
        }
      </div>
      <button mat-stroked-button type="button" data-testid="opt-add-goal" (click)="addGoal()">
        Add a goal
      </button>
      @if (problem(); as p) {
        <p class="cw-error-text" role="alert" data-testid="opt-problem">{{ p }}</p>
      }
      <p>
        <button mat-flat-button type="button" data-testid="run-opt" (click)="submit()">
          Run optimiser
        </button>
      </p>
    </div>
  `,
})
export class OptimiserFormComponent {
  readonly document = input<ChainDocument | undefined>(undefined);
  readonly run = output<StudySpecInput>();

  protected readonly tunable = computed(() => tunableStages(this.document()));
  protected readonly stages = computed(() =>
    (this.document()?.stages ?? []).map((s) => ({ id: s.id, label: s.label || s.id })),
  );
  protected readonly variables = signal<VariableRow[]>([]);
  protected readonly goals = signal<GoalRow[]>([]);
  protected readonly problem = signal('');

  constructor() {
    fillOnceLoaded(this.document, (doc) => this.reset(doc));
  }

  /** Fills one variable and one resonance goal from the chain (called once it has loaded). */
  reset(doc: ChainDocument): void {
    const first = tunableStages(doc)[0];
    this.variables.set(first ? [variableRow(doc, first.id)] : []);
    this.goals.set([goalRow('resonance', doc, first?.id ?? '')]);
    this.problem.set('');
  }

  protected setVar(i: number, change: Partial<VariableRow>): void {
    const doc = this.document();
    this.variables.update((list) =>
      list.map((v, j) => {
        if (j !== i) return v;
        // A new stage or value starts from its own bounds.
        if (change.stageId && doc) return variableRow(doc, change.stageId);
        if (change.key && doc) return variableRow(doc, v.stageId, change.key);
        return { ...v, ...change };
      }),
    );
  }

  protected addVar(): void {
    const doc = this.document();
    const first = this.tunable()[0];
    if (doc && first) this.variables.update((l) => [...l, variableRow(doc, first.id)]);
  }

  protected removeVar(i: number): void {
    this.variables.update((l) => l.filter((_, j) => j !== i));
  }

  protected setGoal(i: number, change: Partial<GoalRow>): void {
    const doc = this.document();
    this.goals.update((list) =>
      list.map((g, j) => {
        if (j !== i) return g;
        // A new kind starts from its own figures.
        if (change.kind && doc) return goalRow(change.kind, doc, g.stageId);
        return { ...g, ...change };
      }),
    );
  }

  protected addGoal(): void {
    const doc = this.document();
    if (doc) this.goals.update((l) => [...l, goalRow('bandwidth', doc, l[0]?.stageId ?? '')]);
  }

  protected removeGoal(i: number): void {
    this.goals.update((l) => l.filter((_, j) => j !== i));
  }

  protected submit(): void {
    try {
      const spec = optimiserSpec(this.variables(), this.goals());
      this.problem.set('');
      this.run.emit(spec);
    } catch (e) {
      this.problem.set((e as Error).message);
    }
  }
}
