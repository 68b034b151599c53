import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { FormControl, ReactiveFormsModule, type ValidatorFn } from '@angular/forms';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { DialogFormComponent } from './dialog-form.component';
import type { UnitKind } from '../../../../shared/engine/types';
import { parseQuantity } from '../../../../shared/units/parse';

export interface ValueDialogData {
  title: string;
  /** What the value is, as the field's label: "Reference resistance". */
  label: string;
  /** One sentence under the field saying what the value is used for. */
  hint?: string;
  kind: UnitKind;
  /** The text the field starts with, e.g. "75 Ω". */
  initial: string;
  submitLabel: string;
  /** A further rule on the parsed value: a message saying what to fix, or null. */
  check?: (value: number) => string | null;
}

/**
 * Asks for one quantity (a resistance, a frequency) typed as people write it: "75", "75 Ω",
 * "1k". Closes with the SI number, or nothing when cancelled; a value it cannot read keeps
 * the dialog open with the reason under the field.
 */
@Component({
  selector: 'cw-value-dialog',
  imports: [DialogFormComponent, MatFormFieldModule, MatInputModule, ReactiveFormsModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <cw-dialog-form [title]="data.title" [submitLabel]="data.submitLabel" (submitted)="submit()">
      <mat-form-field appearance="outline" class="cw-dialog-field">
        <mat-label>{{ data.label }}</mat-label>
        <input matInput [formControl]="value" cdkFocusInitial autocomplete="off" />
        @if (data.hint) {
          <mat-hint>{{ data.hint }}</mat-hint>
        }
        @if (value.errors?.['unreadable']; as reason) {
          <mat-error data-testid="value-error">{{ reason }}</mat-error>
        }
      </mat-form-field>
    </cw-dialog-form>
  `,
})
export class ValueDialogComponent {
  protected readonly data = inject<ValueDialogData>(MAT_DIALOG_DATA);
  private readonly ref = inject(MatDialogRef<ValueDialogComponent, number>);
  private readonly readable: ValidatorFn = (control) => {
    const parsed = this.read(String(control.value));
    return typeof parsed === 'number' ? null : { unreadable: parsed };
  };
  protected readonly value = new FormControl(this.data.initial, {
    nonNullable: true,
    validators: [this.readable],
  });

  protected submit(): void {
    this.value.markAsTouched();
    const parsed = this.read(this.value.value);
    if (typeof parsed === 'number') this.ref.close(parsed);
  }

  /** The SI value, or the sentence saying what to fix (capitalised, as under a field). */
  private read(text: string): number | string {
    const parsed = parseQuantity(text, this.data.kind);
    const problem = parsed.ok ? (this.data.check?.(parsed.value) ?? null) : parsed.message;
    if (problem !== null || !parsed.ok) {
      const sentence = problem ?? 'enter a value';
      return sentence.charAt(0).toUpperCase() + sentence.slice(1) + '.';
    }
    return parsed.value;
  }
}
