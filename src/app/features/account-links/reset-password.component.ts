import { HttpContext } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { passwordResetSchema } from '../../../../shared/schema/api';
import { ColleaguesApi } from '../../core/api/colleagues.api';
import { zodValidator } from '../../core/forms/zod-validator';
import { SKIP_ERROR_SNACKBAR } from '../../core/http/http-context';
import { AuthCardComponent } from '../auth/parts/auth-card.component';
import { Submission } from '../auth/parts/submission';
import { NEW_PASSWORD_HINT, TextFieldComponent } from '../auth/parts/text-field.component';

/** Sets a new password with the link from the mail (single use, one hour). */
@Component({
  selector: 'cw-reset-password',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    AuthCardComponent,
    TextFieldComponent,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <cw-auth-card>
      <h1>Choose a new password</h1>
      @if (done()) {
        <p role="status">
          Your password is changed, and every other sign-in of your account has ended.
        </p>
        <p><a routerLink="/sign-in">Sign in</a></p>
      } @else {
        <form (ngSubmit)="submit()" novalidate>
          <cw-text-field
            label="New password"
            type="password"
            autocomplete="new-password"
            [hint]="passwordHint"
            [control]="password"
          />
          @if (submission.failure(); as text) {
            <p class="cw-form-error" role="alert">{{ text }}</p>
          }
          <div class="cw-actions">
            <button mat-flat-button type="submit" [disabled]="submission.busy()">
              Set password
            </button>
            <a routerLink="/forgot-password">Ask for a new link</a>
          </div>
        </form>
      }
    </cw-auth-card>
  `,
  styleUrl: '../auth/auth-page.scss',
})
export default class ResetPasswordComponent {
  private readonly api = inject(ColleaguesApi);
  /** From the route. */
  readonly token = input.required<string>();
  protected readonly password = new FormControl('', {
    nonNullable: true,
    validators: [zodValidator(passwordResetSchema.shape.password)],
  });
  protected readonly submission = new Submission();
  protected readonly passwordHint = NEW_PASSWORD_HINT;
  protected readonly done = signal(false);

  protected async submit(): Promise<void> {
    this.password.markAsTouched();
    if (this.password.invalid) return;
    await this.submission.run(async () => {
      const context = new HttpContext().set(SKIP_ERROR_SNACKBAR, [404, 422, 429]);
      await firstValueFrom(this.api.resetPassword(this.token(), this.password.value, context));
      this.done.set(true);
    });
  }
}
