import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { controlMessage } from '../../../core/forms/zod-validator';

/**
 * One labelled text input of an account form, bound to a control of the page's form, with
 * the control's schema message under it when it is wrong.
 */
@Component({
  selector: 'cw-text-field',
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <!-- A hint may wrap to two lines: let the space under the field grow with it. -->
    <mat-form-field [subscriptSizing]="hint() ? 'dynamic' : 'fixed'">
      <mat-label>{{ label() }}</mat-label>
      <input
        matInput
        [formControl]="control()"
        [type]="type()"
        [attr.autocomplete]="autocomplete()"
        [attr.maxlength]="maxlength()"
      />
      @if (hint(); as text) {
        <mat-hint>{{ text }}</mat-hint>
      }
      <mat-error>{{ message(control()) }}</mat-error>
    </mat-form-field>
  `,
  styles: `
    :host {
      display: block;
    }
    mat-form-field {
      width: 100%;
    }
  `,
})
export class TextFieldComponent {
  readonly control = input.required<FormControl<string>>();
  readonly label = input.required<string>();
  readonly type = input<'text' | 'email' | 'password'>('text');
  /** The browser's autofill purpose (username, new-password, …). */
  readonly autocomplete = input<string | null>(null);
  readonly maxlength = input<number | null>(null);
  readonly hint = input<string | null>(null);
  protected readonly message = controlMessage;
}
