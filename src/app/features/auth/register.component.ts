import { HttpContext, HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { Router, RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { registerSchema } from '../../../../shared/schema/api';
import { AuthApi } from '../../core/api/auth.api';
import { controlMessage, sentence, zodValidator } from '../../core/forms/zod-validator';
import { apiErrorBody, describeHttpError } from '../../core/http/error-message';
import { SKIP_ERROR_SNACKBAR } from '../../core/http/http-context';
import { SessionStore } from '../../core/session/session.store';

/** Whether a failed registration means the site takes no new accounts. */
export function isRegistrationClosed(error: unknown): boolean {
  if (!(error instanceof HttpErrorResponse) || error.status !== 403) return false;
  const code = apiErrorBody(error)?.error ?? '';
  return code === '' || /regist|closed/i.test(code);
}

/** Create an account; the server may have registration switched off. */
@Component({
  selector: 'cw-register',
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
          <h1>Create an account</h1>
          @if (pending(); as text) {
            <p role="status" data-testid="registration-pending">{{ text }}</p>
            <p><a routerLink="/sign-in">Back to sign in</a></p>
          } @else if (closed()) {
            <p class="cw-form-error" role="alert">
              Registration is closed on this site. Ask a site administrator or a workspace owner to
              set up an account for you.
            </p>
            <p><a routerLink="/sign-in">Back to sign in</a></p>
          } @else {
            <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
              <mat-form-field>
                <mat-label>Display name</mat-label>
                <input matInput formControlName="displayName" autocomplete="name" maxlength="80" />
                <mat-error>{{ message(form.controls.displayName) }}</mat-error>
              </mat-form-field>
              <mat-form-field>
                <mat-label>E-mail</mat-label>
                <input matInput formControlName="email" type="email" autocomplete="email" />
                <mat-error>{{ message(form.controls.email) }}</mat-error>
              </mat-form-field>
              <mat-form-field>
                <mat-label>Password</mat-label>
                <input
                  matInput
                  formControlName="password"
                  type="password"
                  autocomplete="new-password"
                />
                <mat-hint>At least 10 characters; a few unusual words make a strong one.</mat-hint>
                <mat-error>{{ message(form.controls.password) }}</mat-error>
              </mat-form-field>
              @if (failure(); as text) {
                <p class="cw-form-error" role="alert">{{ text }}</p>
              }
              <div class="cw-actions">
                <button mat-flat-button type="submit" [disabled]="busy()">Create account</button>
                <a routerLink="/sign-in">I have an account</a>
              </div>
            </form>
          }
        </mat-card-content>
      </mat-card>
    </section>
  `,
  styleUrl: './auth-page.scss',
})
export default class RegisterComponent {
  private readonly auth = inject(AuthApi);
  private readonly session = inject(SessionStore);
  private readonly router = inject(Router);

  protected readonly form = new FormGroup({
    displayName: new FormControl('', {
      nonNullable: true,
      validators: [zodValidator(registerSchema.shape.displayName)],
    }),
    email: new FormControl('', {
      nonNullable: true,
      validators: [zodValidator(registerSchema.shape.email)],
    }),
    password: new FormControl('', {
      nonNullable: true,
      validators: [zodValidator(registerSchema.shape.password)],
    }),
  });
  protected readonly busy = signal(false);
  protected readonly failure = signal('');
  protected readonly closed = signal(false);
  /** Set when the address must be confirmed by mail before the account exists. */
  protected readonly pending = signal('');
  protected readonly message = controlMessage;

  constructor() {
    // Ask up front so nobody fills the form in vain; the answer to POST decides anyway.
    const context = new HttpContext().set(SKIP_ERROR_SNACKBAR, true);
    this.auth.registration(context).subscribe({
      next: (answer) => this.closed.set(!answer.openRegistration),
      error: () => undefined,
    });
  }

  protected async submit(): Promise<void> {
    this.form.markAllAsTouched();
    if (this.form.invalid || this.busy()) return;
    this.busy.set(true);
    this.failure.set('');
    try {
      const context = new HttpContext().set(SKIP_ERROR_SNACKBAR, [403, 409, 422, 429]);
      const answer = await firstValueFrom(this.auth.register(this.form.getRawValue(), context));
      if ('pending' in answer) {
        this.pending.set(sentence(answer.message));
        return;
      }
      await this.session.startSession(answer);
      await this.router.navigateByUrl('/');
    } catch (error) {
      if (isRegistrationClosed(error)) this.closed.set(true);
      else this.failure.set(describeHttpError(error));
    } finally {
      this.busy.set(false);
    }
  }
}
