import { HttpContext } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { passwordResetRequestSchema } from '../../../../shared/schema/api';
import { ColleaguesApi } from '../../core/api/colleagues.api';
import { controlMessage, sentence, zodValidator } from '../../core/forms/zod-validator';
import { describeHttpError } from '../../core/http/error-message';
import { SKIP_ERROR_SNACKBAR } from '../../core/http/http-context';

/** Asks for a password link by mail; the answer is the same whether the address is known. */
@Component({
  selector: 'cw-forgot-password',
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
          @if (done(); as text) {
            <p role="status" data-testid="reset-requested">{{ text }}</p>
            <p><a routerLink="/sign-in">Back to sign in</a></p>
          } @else {
            <p class="cw-muted">We mail a link to the address of your account.</p>
            <form (ngSubmit)="submit()" novalidate>
              <mat-form-field>
                <mat-label>E-mail</mat-label>
                <input matInput [formControl]="email" type="email" autocomplete="email" />
                <mat-error>{{ message(email) }}</mat-error>
              </mat-form-field>
              @if (failure(); as text) {
                <p class="cw-form-error" role="alert">{{ text }}</p>
              }
              <div class="cw-actions">
                <button mat-flat-button type="submit" [disabled]="busy()">Mail me a link</button>
                <a routerLink="/sign-in">Back to sign in</a>
              </div>
            </form>
          }
        </mat-card-content>
      </mat-card>
    </section>
  `,
  styleUrl: '../auth/auth-page.scss',
})
export default class ForgotPasswordComponent {
  private readonly api = inject(ColleaguesApi);
  protected readonly email = new FormControl('', {
    nonNullable: true,
    validators: [zodValidator(passwordResetRequestSchema.shape.email)],
  });
  protected readonly message = controlMessage;
  protected readonly busy = signal(false);
  protected readonly done = signal('');
  protected readonly failure = signal('');

  protected async submit(): Promise<void> {
    this.email.markAsTouched();
    if (this.email.invalid || this.busy()) return;
    this.busy.set(true);
    this.failure.set('');
    try {
      const context = new HttpContext().set(SKIP_ERROR_SNACKBAR, [422, 429]);
      const answer = await firstValueFrom(this.api.requestPasswordReset(this.email.value, context));
      this.done.set(sentence(answer.message));
    } catch (error) {
      this.failure.set(describeHttpError(error));
    } finally {
      this.busy.set(false);
    }
  }
}
