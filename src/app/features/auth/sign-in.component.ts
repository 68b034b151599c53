import { HttpContext } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { Router, RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { loginSchema } from '../../../../shared/schema/api';
import { AuthApi } from '../../core/api/auth.api';
import { zodValidator } from '../../core/forms/zod-validator';
import { SKIP_ERROR_SNACKBAR } from '../../core/http/http-context';
import { SessionStore } from '../../core/session/session.store';
import { AuthCardComponent } from './parts/auth-card.component';
import { Submission } from './parts/submission';
import { TextFieldComponent } from './parts/text-field.component';
import { FormEndComponent } from './parts/form-end.component';
import { safeReturnUrl } from './return-url';

/** Sign in with e-mail and password, then go back where the user was heading. */
@Component({
  selector: 'cw-sign-in',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    AuthCardComponent,
    TextFieldComponent,
    FormEndComponent,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <cw-auth-card>
      <p class="cw-pitch" data-testid="product-sentence">
        Chainwright follows a signal through a radio receiver front end, stage by stage, and shows
        where impedance, voltage step-up, loaded Q, noise and linearity go wrong.
      </p>
      <h1>Sign in</h1>
      <p class="cw-muted">Open your workspaces and chains.</p>
      <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
        <cw-text-field
          label="E-mail"
          type="email"
          autocomplete="username"
          [control]="form.controls.email"
        />
        <cw-text-field
          label="Password"
          type="password"
          autocomplete="current-password"
          [control]="form.controls.password"
        />
        <cw-form-end [submission]="submission" label="Sign in">
          <a routerLink="/forgot-password">Forgot your password?</a>
          @if (registrationOpen()) {
            <a routerLink="/register">Create an account</a>
          }
        </cw-form-end>
      </form>
    </cw-auth-card>
  `,
  styleUrl: './auth-page.scss',
})
export default class SignInComponent {
  private readonly auth = inject(AuthApi);
  private readonly session = inject(SessionStore);
  private readonly router = inject(Router);

  /** Where to go after signing in (a path inside the app), from `?next=`. */
  readonly next = input<string>();

  protected readonly form = new FormGroup({
    email: new FormControl('', {
      nonNullable: true,
      validators: [zodValidator(loginSchema.shape.email)],
    }),
    password: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
  });
  protected readonly submission = new Submission();
  /** Offer registration unless the site says it is closed. */
  protected readonly registrationOpen = signal(true);

  constructor() {
    const quiet = new HttpContext().set(SKIP_ERROR_SNACKBAR, true);
    this.auth.registration(quiet).subscribe({
      next: (answer) => this.registrationOpen.set(answer.openRegistration),
      error: () => undefined,
    });
  }

  protected async submit(): Promise<void> {
    this.form.markAllAsTouched();
    if (this.form.invalid) return;
    await this.submission.run(async () => {
      // Wrong password (401), bad fields (422) and throttling (429) are shown in the form.
      const context = new HttpContext().set(SKIP_ERROR_SNACKBAR, [401, 403, 422, 429]);
      const answer = await firstValueFrom(this.auth.login(this.form.getRawValue(), context));
      await this.session.startSession(answer);
      await this.router.navigateByUrl(safeReturnUrl(this.next()) ?? '/');
    });
  }
}
