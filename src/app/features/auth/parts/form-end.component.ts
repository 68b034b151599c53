import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import type { Submission } from './submission';

/**
 * The end of an account form: why the last submission failed (when it did), the submitting
 * button (idle while a submission runs), and the page's links beside it (projected).
 */
@Component({
  selector: 'cw-form-end',
  imports: [MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (submission().failure(); as text) {
      <p class="cw-form-error" role="alert">{{ text }}</p>
    }
    <div class="cw-actions">
      <button mat-flat-button type="submit" [disabled]="submission().busy()">{{ label() }}</button>
      <ng-content />
    </div>
  `,
  styles: `
    :host {
      display: flex;
      flex-direction: column;
      gap: 4px;
    }
    // On a phone the links wrap under the button rather than squeezing it onto two lines.
    .cw-actions {
      display: flex;
      flex-wrap: wrap;
      align-items: center;
      gap: 16px;
      margin-top: 8px;
    }
    .cw-actions button {
      flex-shrink: 0;
    }
  `,
})
export class FormEndComponent {
  readonly submission = input.required<Submission>();
  /** The button's words: what submitting does ("Sign in", "Set password"). */
  readonly label = input.required<string>();
}
