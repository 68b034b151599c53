import { AbstractControl, ValidationErrors, ValidatorFn } from '@angular/forms';
import type { z } from 'zod';

/**
 * An Angular validator from one field of an API schema, so a form shows the very
 * message the server would answer with. The error is `{ schema: 'Message.' }`.
 */
export function zodValidator(schema: z.ZodType): ValidatorFn {
  return (control: AbstractControl): ValidationErrors | null => {
    const result = schema.safeParse(control.value);
    if (result.success) return null;
    return { schema: sentence(result.error.issues[0]?.message ?? 'This value is not valid') };
  };
}

/** The schema's messages are lower-case fragments; a form shows them as sentences. */
export function sentence(message: string): string {
  const text = message.trim();
  if (!text) return text;
  const capital = text[0].toUpperCase() + text.slice(1);
  return /[.!?]$/.test(capital) ? capital : `${capital}.`;
}

/** The first error message of a control for <mat-error>, or '' when valid. */
export function controlMessage(control: AbstractControl): string {
  const errors = control.errors;
  if (!errors) return '';
  if (typeof errors['schema'] === 'string') return errors['schema'];
  if (errors['required']) return 'This field is required.';
  if (errors['mismatch']) return 'The two passwords differ.';
  return 'This value is not valid.';
}
