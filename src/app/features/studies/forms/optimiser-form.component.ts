import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  input,
  output,
  signal,
  untracked,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import type { ChainDocument } from '../../../../../shared/schema/chain';
import type { OptimiserGoal, StudySpecInput } from '../../../../../shared/schema/studies';
import { parseQuantity } from '../../../../../shared/units';
import { fieldText } from '../../editor/results/format-quantity';
import { numberOf, textOf, tunableStages, unitOfKey } from './tunable';

type GoalKind = OptimiserGoal['kind'];

interface VariableRow {
  stageId: string;
  key: string;
  min: string;
  max: string;
}

interface GoalRow {
  kind: GoalKind;
  stageId: string;
  node: number;
  /** Target frequency (resonance, bandwidth) or band start (return loss, ripple). */
  hz: string;
  /** Band stop (return loss, ripple). */
  stopHz: string;
  /** Target, minimum or maximum in dB, by kind. */
  db: number;
  weight: number;
}

const GOAL_KINDS: { kind: GoalKind; label: string }[] = [
  { kind: 'resonance', label: 'Resonance at a frequency' },
  { kind: 'bandwidth', label: '−3 dB width at a node' },
  { kind: 'return-loss', label: 'Return loss at the input over a band' },
  { kind: 'noise-figure', label: 'Noise figure at most' },
  { kind: 'gain', label: 'Gain' },
  { kind: 'image-rejection', label: 'Image rejection at least' },
  { kind: 'ripple', label: 'Ripple at a node over a band at most' },
];

/**
 * The optimiser's form: several values to vary, each between bounds, and several goals with
 * weights; the spec goes to the study queue as one Levenberg–Marquardt run.
 */
@Component({
  selector: 'cw-optimiser-form',
  imports: [MatButtonModule],
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
          <div class="row" data-testid="opt-variable">
            <label
              >Stage
              <select data-testid="opt-stage" (change)="setVar(i, { stageId: text($event) })">
                @for (s of tunable(); track s.id) {
                  <option [value]="s.id" [selected]="s.id === v.stageId">{{ s.label }}</option>
                }
              </select>
            </label>
            <label
              >Value
              <select data-testid="opt-key" (change)="setVar(i, { key: text($event) })">
                @for (k of keysOf(v.stageId); track k) {
                  <option [value]="k" [selected]="k === v.key">{{ k }}</option>
                }
              </select>
            </label>
            <label
              >From
              <input
                data-testid="opt-min"
                [value]="v.min"
                (input)="setVar(i, { min: text($event) })"
                size="9"
            /></label>
            <label
              >To
              <input
                data-testid="opt-max"
                [value]="v.max"
                (input)="setVar(i, { max: text($event) })"
                size="9"
            /></label>
            @if (variables().length > 1) {
              <button mat-button type="button" (click)="removeVar(i)">Remove</button>
            }
          </div>
        }
      </div>
      <button mat-stroked-button type="button" data-testid="opt-add-variable" (click)="addVar()">
        Add a value
      </button>
      <h3 class="row-head">Goals</h3>
      <div class="rows">
        @for (g of goals(); track $index; let i = $index) {
          <div class="row" data-testid="opt-goal" [attr.data-kind]="g.kind">
            <label
              >Goal
              <select
                data-testid="opt-goal-kind"
                (change)="setGoal(i, { kind: $any(text($event)) })"
              >
                @for (k of goalKinds; track k.kind) {
                  <option [value]="k.kind" [selected]="k.kind === g.kind">{{ k.label }}</option>
                }
              </select>
            </label>
            @switch (g.kind) {
              @case ('resonance') {
                <label
                  >Tuned circuit of
                  <select
                    data-testid="opt-goal-stage"
                    (change)="setGoal(i, { stageId: text($event) })"
                  >
                    @for (s of stages(); track s.id) {
                      <option [value]="s.id" [selected]="s.id === g.stageId">{{ s.label }}</option>
                    }
                  </select>
                </label>
                <label
                  >at
                  <input
                    data-testid="opt-target"
                    [value]="g.hz"
                    (input)="setGoal(i, { hz: text($event) })"
                    size="9"
                /></label>
              }
              @case ('bandwidth') {
                <label
                  >Node
                  <input
                    type="number"
                    min="0"
                    data-testid="opt-goal-node"
                    [value]="g.node"
                    (input)="setGoal(i, { node: num($event) })"
                /></label>
                <label
                  >Width
                  <input
                    data-testid="opt-target"
                    [value]="g.hz"
                    (input)="setGoal(i, { hz: text($event) })"
                    size="9"
                /></label>
              }
              @case ('ripple') {
                <label
                  >Node
                  <input
                    type="number"
                    min="0"
                    data-testid="opt-goal-node"
                    [value]="g.node"
                    (input)="setGoal(i, { node: num($event) })"
                /></label>
              }
            }
            @if (g.kind === 'return-loss' || g.kind === 'ripple') {
              <label
                >From
                <input
                  data-testid="opt-goal-start"
                  [value]="g.hz"
                  (input)="setGoal(i, { hz: text($event) })"
                  size="9"
              /></label>
              <label
                >To
                <input
                  data-testid="opt-goal-stop"
                  [value]="g.stopHz"
                  (input)="setGoal(i, { stopHz: text($event) })"
                  size="9"
              /></label>
            }
            @if (g.kind !== 'resonance' && g.kind !== 'bandwidth') {
              <label
                >{{ dbLabel(g.kind) }} (dB)
                <input
                  type="number"
                  data-testid="opt-goal-db"
                  [value]="g.db"
                  (input)="setGoal(i, { db: num($event) })"
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
                (input)="setGoal(i, { weight: num($event) })"
            /></label>
            @if (goals().length > 1) {
              <button mat-button type="button" (click)="removeGoal(i)">Remove</button>
            }
          </div>
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

  protected readonly goalKinds = GOAL_KINDS;
  protected readonly text = textOf;
  protected readonly num = numberOf;
  protected readonly tunable = computed(() => tunableStages(this.document()));
  protected readonly stages = computed(() =>
    (this.document()?.stages ?? []).map((s) => ({ id: s.id, label: s.label || s.id })),
  );
  protected readonly variables = signal<VariableRow[]>([]);
  protected readonly goals = signal<GoalRow[]>([]);
  protected readonly problem = signal('');

  constructor() {
    // Fill the form from the chain once it has loaded (not on every later change).
    let filled = false;
    effect(() => {
      const doc = this.document();
      if (doc && !filled) {
        filled = true;
        untracked(() => this.reset(doc));
      }
    });
  }

  /** Fills one variable and one resonance goal from the chain (called once it has loaded). */
  reset(doc: ChainDocument): void {
    const first = tunableStages(doc)[0];
    this.variables.set(first ? [this.variableFor(doc, first.id)] : []);
    this.goals.set([this.goalRow('resonance', doc, first?.id ?? '')]);
    this.problem.set('');
  }

  protected keysOf(stageId: string): string[] {
    return this.tunable().find((s) => s.id === stageId)?.keys ?? [];
  }

  private variableFor(doc: ChainDocument, stageId: string, key?: string): VariableRow {
    const keys = this.tunableOf(doc, stageId);
    const k = key && keys.includes(key) ? key : keys.includes('c') ? 'c' : (keys[0] ?? 'c');
    const v = Number(doc.stages.find((s) => s.id === stageId)?.values[k] ?? 0);
    const unit = unitOfKey(k);
    return {
      stageId,
      key: k,
      min: v > 0 ? fieldText(v / 2, unit) : '',
      max: v > 0 ? fieldText(v * 2, unit) : '',
    };
  }

  private tunableOf(doc: ChainDocument, stageId: string): string[] {
    return tunableStages(doc).find((s) => s.id === stageId)?.keys ?? [];
  }

  private goalRow(kind: GoalKind, doc: ChainDocument, stageId: string): GoalRow {
    const f0 = doc.settings.f0Hz;
    const nodes = doc.stages.length - 2;
    const db: Record<GoalKind, number> = { resonance: 0, bandwidth: 0, 'return-loss': 15, 'noise-figure': 6, gain: 20, 'image-rejection': 40, ripple: 1 }; // prettier-ignore
    const span = kind === 'bandwidth' ? f0 / 20 : f0;
    return {
      kind,
      stageId,
      node: nodes,
      hz: fieldText(kind === 'return-loss' || kind === 'ripple' ? f0 * 0.98 : span, 'hertz'), // prettier-ignore
      stopHz: fieldText(f0 * 1.02, 'hertz'),
      db: db[kind],
      weight: 1,
    };
  }

  protected setVar(i: number, change: Partial<VariableRow>): void {
    const doc = this.document();
    this.variables.update((list) =>
      list.map((v, j) => {
        if (j !== i) return v;
        if (change.stageId && doc) return this.variableFor(doc, change.stageId);
        if (change.key && doc) return this.variableFor(doc, v.stageId, change.key);
        return { ...v, ...change };
      }),
    );
  }

  protected addVar(): void {
    const doc = this.document();
    const first = this.tunable()[0];
    if (doc && first) this.variables.update((l) => [...l, this.variableFor(doc, first.id)]);
  }

  protected removeVar(i: number): void {
    this.variables.update((l) => l.filter((_, j) => j !== i));
  }

  protected setGoal(i: number, change: Partial<GoalRow>): void {
    const doc = this.document();
    this.goals.update((list) =>
      list.map((g, j) => {
        if (j !== i) return g;
        if (change.kind && doc) return this.goalRow(change.kind, doc, g.stageId);
        return { ...g, ...change };
      }),
    );
  }

  protected addGoal(): void {
    const doc = this.document();
    if (doc) this.goals.update((l) => [...l, this.goalRow('bandwidth', doc, l[0]?.stageId ?? '')]);
  }

  protected removeGoal(i: number): void {
    this.goals.update((l) => l.filter((_, j) => j !== i));
  }

  protected dbLabel(kind: GoalKind): string {
    return kind === 'gain' ? 'Target' : kind === 'noise-figure' || kind === 'ripple' ? 'At most' : 'At least'; // prettier-ignore
  }

  protected submit(): void {
    try {
      const variables = this.variables().map((v, i) => ({
        stageId: v.stageId,
        key: v.key,
        min: this.quantity(v.min, unitOfKey(v.key), `value ${i + 1}, from`),
        max: this.quantity(v.max, unitOfKey(v.key), `value ${i + 1}, to`),
      }));
      if (variables.length === 0) throw new Error('Add a value to vary first.');
      const goals = this.goals().map((g, i) => this.goalSpec(g, i + 1));
      this.problem.set('');
      this.run.emit({ kind: 'optimiser', variables, goals });
    } catch (e) {
      this.problem.set((e as Error).message);
    }
  }

  private quantity(text: string, unit: 'farad' | 'henry' | 'hertz', what: string): number {
    const r = parseQuantity(text, unit);
    if (!r.ok) throw new Error(`${what}: ${r.message}`);
    return r.value;
  }

  private goalSpec(g: GoalRow, n: number): OptimiserGoal {
    const weight = g.weight;
    const hz = () => this.quantity(g.hz, 'hertz', `goal ${n}`);
    const band = () => ({
      startHz: this.quantity(g.hz, 'hertz', `goal ${n}, from`),
      stopHz: this.quantity(g.stopHz, 'hertz', `goal ${n}, to`),
    });
    switch (g.kind) {
      case 'resonance':
        return { kind: 'resonance', stageId: g.stageId, targetHz: hz(), weight };
      case 'bandwidth':
        return { kind: 'bandwidth', node: g.node, targetHz: hz(), weight };
      case 'return-loss':
        return { kind: 'return-loss', ...band(), minDb: g.db, weight };
      case 'noise-figure':
        return { kind: 'noise-figure', maxDb: g.db, weight };
      case 'gain':
        return { kind: 'gain', targetDb: g.db, weight };
      case 'image-rejection':
        return { kind: 'image-rejection', minDb: g.db, weight };
      case 'ripple':
        return { kind: 'ripple', node: g.node, ...band(), maxDb: g.db, weight };
    }
  }
}
