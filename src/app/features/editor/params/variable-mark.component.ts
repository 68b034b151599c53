import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import {
  MAIN_GANG,
  variableMarkSchema,
  type VariableMark,
} from '../../../../../shared/schema/chain';
import { parseQuantity } from '../../../../../shared/units';
import { fieldText } from '../results/format-quantity';
import { EditorStore } from '../state/editor.store';

/**
 * Marks a capacitance or inductance as variable (a tuning capacitor, a variometer) with its
 * range and gang, in the chain's settings (`settings.variables`). Band studies and the
 * receiver plan's spur chart turn the chain by these marks.
 */
@Component({
  selector: 'cw-variable-mark',
  changeDetection: ChangeDetectionStrategy.OnPush,
  styleUrl: './field.scss',
  template: `
    <div class="variable" [attr.data-variable]="paramKey()">
      <label class="check">
        <input
          type="checkbox"
          data-testid="variable-toggle"
          [checked]="mark() !== null"
          [disabled]="readOnly()"
          (change)="toggle($event)"
        />
        Variable (tuned across a band)
      </label>
      @if (mark(); as m) {
        <div class="variable-range">
          <label
            >From
            <input
              type="text"
              size="8"
              data-testid="variable-min"
              [value]="fmt(m.min)"
              [disabled]="readOnly()"
              (change)="edit('min', $event)"
          /></label>
          <label
            >to
            <input
              type="text"
              size="8"
              data-testid="variable-max"
              [value]="fmt(m.max)"
              [disabled]="readOnly()"
              (change)="edit('max', $event)"
          /></label>
          <label
            >gang
            <input
              type="text"
              size="8"
              maxlength="40"
              data-testid="variable-gang"
              [value]="m.gang ?? main"
              [disabled]="readOnly()"
              (change)="edit('gang', $event)"
          /></label>
        </div>
        @if (problem(); as p) {
          <span class="note cw-error-text" role="alert">{{ p }}</span>
        } @else {
          <span class="note cw-muted">Values with the same gang turn together on one dial.</span>
        }
      }
    </div>
  `,
})
export class VariableMarkComponent {
  readonly stageId = input.required<string>();
  readonly paramKey = input.required<string>();
  readonly unit = input.required<'farad' | 'henry'>();
  /** The value now: the range offered when the mark is first set (÷3 … ×3). */
  readonly value = input<number | null>(null);
  readonly readOnly = input(false);

  private readonly store = inject(EditorStore);
  protected readonly main = MAIN_GANG;
  protected readonly problem = signal<string | null>(null);
  private readonly marks = computed(() => this.store.doc().settings.variables ?? []);
  protected readonly mark = computed(
    () => this.marks().find((m) => m.stageId === this.stageId() && m.key === this.paramKey()) ?? null, // prettier-ignore
  );

  protected fmt(v: number): string {
    return fieldText(v, this.unit());
  }

  protected toggle(event: Event): void {
    const on = (event.target as HTMLInputElement).checked;
    const v = this.value();
    if (on) {
      const base = v && v > 0 ? v : this.unit() === 'farad' ? 100e-12 : 10e-6;
      this.write({ stageId: this.stageId(), key: this.paramKey(), min: base / 3, max: base * 3 });
    } else {
      this.write(null);
    }
  }

  protected edit(field: 'min' | 'max' | 'gang', event: Event): void {
    const current = this.mark();
    if (!current) return;
    const text = (event.target as HTMLInputElement).value.trim();
    const next: VariableMark = { ...current };
    if (field === 'gang') {
      if (text === '' || text === MAIN_GANG) delete next.gang;
      else next.gang = text;
    } else {
      const parsed = parseQuantity(text, this.unit());
      if (!parsed.ok) return this.problem.set(`${field === 'min' ? 'From' : 'To'}: ${parsed.message}`); // prettier-ignore
      next[field] = parsed.value;
    }
    const checked = variableMarkSchema.safeParse(next);
    if (!checked.success) return this.problem.set(checked.error.issues[0].message);
    this.write(checked.data);
  }

  private write(mark: VariableMark | null): void {
    this.problem.set(null);
    const others = this.marks().filter(
      (m) => !(m.stageId === this.stageId() && m.key === this.paramKey()),
    );
    const variables = mark ? [...others, mark] : others;
    const { variables: _old, ...rest } = this.store.doc().settings;
    this.store.updateSettings(variables.length ? { ...rest, variables } : rest);
  }
}
