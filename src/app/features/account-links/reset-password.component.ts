import { HttpContext } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { passwordResetSchema } from '../../../../shared/schema/api';
import { ColleaguesApi } from '../../core/api/colleagues.api';
import { controlMessage, zodValidator } from '../../core/forms/zod-validator';
import { describeHttpError } from '../../core/http/error-message';
import { SKIP_ERROR_SNACKBAR } from '../../core/http/http-context';

/** Sets a new password with the link from the mail (single use, one hour). */
@Component({
  selector: 'cw-reset-password',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatCardModule,
    MatFormFieldModule,
    MatInputModule,
    MatButtonModule,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="cw-page-narrow">
      <mat-card appearance="outlined" class="cw-auth-card">
        <mat-card-content>
          <h1>Choose a new password</h1>
          @if (done()) {
            <p role="status">
              Your password is changed, and every other sign-in of your account has ended.
            </p>
            <p><a routerLink="/sign-in">Sign in</a></p>
          } @else {
            <form (ngSubmit)="submit()" novalidate>
              <mat-form-field>
                <mat-label>New password</mat-label>
                <input
                  matInput
                  [formControl]="password"
                  type="password"
                  autocomplete="new-password"
                />
                <mat-hint>At least 10 characters; a few unusual words make a strong one.</mat-hint>
                <mat-error>{{ message(password) }}</mat-error>
              </mat-form-field>
              @if (failure(); as text) {
                <p class="cw-form-error" role="alert">{{ text }}</p>
              }
              <div class="cw-actions">
                <button mat-flat-button type="submit" [disabled]="busy()">Set password</button>
                <a routerLink="/forgot-password">Ask for a new link</a>
              </div>
            </form>
          }
        </mat-card-content>
      </mat-card>
    </section>
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
  protected readonly message = controlMessage;
  protected readonly busy = signal(false);
  protected readonly done = signal(false);
  protected readonly failure = signal('');

  protected async submit(): Promise<void> {
    this.password.markAsTouched();
    if (this.password.invalid || this.busy()) return;
    this.busy.set(true);
    this.failure.set('');
    try {
      const context = new HttpContext().set(SKIP_ERROR_SNACKBAR, [404, 422, 429]);
      await firstValueFrom(this.api.resetPassword(this.token(), this.password.value, context));
      this.done.set(true);
    } catch (error) {
      this.failure.set(describeHttpError(error));
    } finally {
      this.busy.set(false);
    }
  }
}
