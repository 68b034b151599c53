import {
  ChangeDetectionStrategy,
  Component,
  computed,
  input,
  linkedSignal,
  output,
} from '@angular/core';
import type { ParamSpec, UnitKind } from '../../../../../shared/engine/types';
import { checkRange, parseQuantity } from '../../../../../shared/units';
import { nominalEngineering } from '../results/format-quantity';

let nextId = 0;

/** A value the user typed that reads as a quantity in range. */
export interface QuantityEdit {
  value: number;
  text: string;
}

/**
 * A text field for one quantity: takes units and expressions ("22 uH", "2.2k", "4p7"),
 * shows the value it read beside it, and says plainly what is wrong while keeping the
 * typed text. Emits only values that read and are in range.
 */
@Component({
  selector: 'cw-quantity-field',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <label class="label" [for]="inputId">{{ label() }}</label>
    <div class="row">
      <input
        [id]="inputId"
        type="text"
        autocomplete="off"
        spellcheck="false"
        [value]="draft()"
        [disabled]="disabled()"
        [attr.aria-invalid]="error() ? 'true' : null"
        [class.unusual]="!error() && warning()"
        [attr.aria-describedby]="inputId + '-note'"
        [attr.data-param]="paramKey()"
        (input)="onInput($event)"
      />
      @if (!error() && readBack(); as shown) {
        <output class="read cw-num" [for]="inputId">= {{ shown }}</output>
      }
    </div>
    <div class="note" [id]="inputId + '-note'" [attr.role]="error() ? 'alert' : null">
      @if (error(); as message) {
        <span class="cw-error-text">{{ message }}</span>
      } @else if (warning(); as message) {
        <span class="warning-text" role="status">⚠ {{ message }}</span>
      } @else if (help()) {
        <span class="cw-muted">{{ help() }}</span>
      }
    </div>
  `,
  styleUrl: './field.scss',
})
export class QuantityFieldComponent {
  readonly label = input.required<string>();
  readonly unit = input.required<UnitKind>();
  /** The stored text (what was typed last time, or the value written out). */
  readonly text = input.required<string>();
  readonly range = input<Pick<ParamSpec, 'min' | 'max' | 'exclusiveMin'>>({});
  /** The typical range: a value outside it is accepted with a warning (a likely slip). */
  readonly typical = input<ParamSpec['typical']>(undefined);
  readonly help = input<string | undefined>(undefined);
  readonly disabled = input(false);
  /** Parameter key, exposed as data-param for tests and for marking server refusals. */
  readonly paramKey = input('');
  /** A message from outside (the server refused this field). */
  readonly externalError = input<string | null>(null);
  /** Whether an empty box is allowed (it emits an empty text and clears the value). */
  readonly optional = input(false);

  readonly edited = output<QuantityEdit>();

  protected readonly inputId = `cw-q-${nextId++}`;
  /** What is in the box: follows the stored text until the user types something else. */
  protected readonly draft = linkedSignal(() => this.text());
  private readonly parsed = computed(() => {
    if (this.optional() && this.draft().trim() === '') return { ok: true as const, value: NaN };
    const r = parseQuantity(this.draft(), this.unit());
    if (!r.ok) return r;
    const outOfRange = checkRange(r.value, { ...this.range(), unit: this.unit() });
    return outOfRange ? { ok: false as const, message: outOfRange } : r;
  });
  protected readonly error = computed(() => {
    const p = this.parsed();
    return p.ok ? this.externalError() : p.message;
  });
  protected readonly warning = computed(() => {
    const p = this.parsed();
    const t = this.typical();
    if (!p.ok || Number.isNaN(p.value) || !t) return null;
    const low = t.min !== undefined && p.value < t.min;
    const high = t.max !== undefined && p.value > t.max;
    if (!low && !high) return null;
    const f = (v: number) => nominalEngineering(v, this.unit());
    const range =
      t.min !== undefined && t.max !== undefined
        ? `${f(t.min)} to ${f(t.max)}`
        : t.min !== undefined
          ? `at least ${f(t.min)}`
          : `at most ${f(t.max!)}`;
    return `unusual: typical is ${range}; check the unit prefix`;
  });
  protected readonly readBack = computed(() => {
    const p = this.parsed();
    // What was typed, as parsed: a stated value, so rounded to the chosen figures but not
    // padded with zeros it never had ("= 22 µH", "= 1.151 nF" for an expression).
    return p.ok && !Number.isNaN(p.value) ? nominalEngineering(p.value, this.unit()) : null;
  });

  protected onInput(event: Event): void {
    const text = (event.target as HTMLInputElement).value;
    this.draft.set(text);
    const p = this.parsed();
    if (p.ok) this.edited.emit({ value: p.value, text });
  }
}
