import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import type { FormControl } from '@angular/forms';
import { TextFieldComponent } from './text-field.component';

/** What a new password should be like, said under every field that sets one. */
export const NEW_PASSWORD_HINT = 'At least 10 characters; a few unusual words make a strong one.';

/**
 * The field where someone chooses a password (registering, joining by invitation, resetting
 * it): the browser offers to generate and keep one, and the hint says what a strong one is.
 */
@Component({
  selector: 'cw-new-password-field',
  imports: [TextFieldComponent],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <cw-text-field
      [label]="label()"
      type="password"
      autocomplete="new-password"
      [hint]="hint"
      [control]="control()"
    />
  `,
  styles: `
    :host {
      display: block;
    }
  `,
})
export class NewPasswordFieldComponent {
  readonly control = input.required<FormControl<string>>();
  readonly label = input('Password');
  protected readonly hint = NEW_PASSWORD_HINT;
}
