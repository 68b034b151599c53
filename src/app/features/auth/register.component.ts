import { HttpContext, HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { Router, RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { registerSchema } from '../../../../shared/schema/api';
import { AuthApi } from '../../core/api/auth.api';
import { sentence, zodValidator } from '../../core/forms/zod-validator';
import { apiErrorBody } from '../../core/http/error-message';
import { SKIP_ERROR_SNACKBAR } from '../../core/http/http-context';
import { SessionStore } from '../../core/session/session.store';
import { AuthCardComponent } from './parts/auth-card.component';
import { Submission } from './parts/submission';
import { FormEndComponent } from './parts/form-end.component';
import { NewPasswordFieldComponent } from './parts/new-password-field.component';
import { TextFieldComponent } from './parts/text-field.component';

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
    AuthCardComponent,
    TextFieldComponent,
    NewPasswordFieldComponent,
    FormEndComponent,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <cw-auth-card>
      <h1>Create an account</h1>
      @if (pending(); as text) {
        <p role="status" data-testid="registration-pending">{{ text }}</p>
        <p><a routerLink="/sign-in">Back to sign in</a></p>
      } @else if (closed()) {
        <p class="cw-form-error" role="alert">
          Registration is closed on this site. Ask a site administrator or a workspace owner to set
          up an account for you.
        </p>
        <p><a routerLink="/sign-in">Back to sign in</a></p>
      } @else {
        <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
          <cw-text-field
            label="Display name"
            autocomplete="name"
            [maxlength]="80"
            [control]="form.controls.displayName"
          />
          <cw-text-field
            label="E-mail"
            type="email"
            autocomplete="email"
            [control]="form.controls.email"
          />
          <cw-new-password-field [control]="form.controls.password" />
          <cw-form-end [submission]="submission" label="Create account">
            <a routerLink="/sign-in">I have an account</a>
          </cw-form-end>
        </form>
      }
    </cw-auth-card>
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
  protected readonly submission = new Submission();
  protected readonly closed = signal(false);
  /** Set when the address must be confirmed by mail before the account exists. */
  protected readonly pending = signal('');

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
    if (this.form.invalid) return;
    await this.submission.run(
      async () => {
        const context = new HttpContext().set(SKIP_ERROR_SNACKBAR, [403, 409, 422, 429]);
        const answer = await firstValueFrom(this.auth.register(this.form.getRawValue(), context));
        if ('pending' in answer) {
          this.pending.set(sentence(answer.message));
          return;
        }
        await this.session.startSession(answer);
        await this.router.navigateByUrl('/');
      },
      (error) => {
        if (!isRegistrationClosed(error)) return false;
        this.closed.set(true);
        return true;
      },
    );
  }
}
