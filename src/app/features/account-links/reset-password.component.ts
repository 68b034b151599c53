import { HttpContext } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { passwordResetSchema } from '../../../../shared/schema/api';
import { ColleaguesApi } from '../../core/api/colleagues.api';
import { zodValidator } from '../../core/forms/zod-validator';
import { SKIP_ERROR_SNACKBAR } from '../../core/http/http-context';
import { AuthCardComponent } from '../auth/parts/auth-card.component';
import { Submission } from '../auth/parts/submission';
import { FormEndComponent } from '../auth/parts/form-end.component';
import { NewPasswordFieldComponent } from '../auth/parts/new-password-field.component';

/** Sets a new password with the link from the mail (single use, one hour). */
@Component({
  selector: 'cw-reset-password',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    AuthCardComponent,
    NewPasswordFieldComponent,
    FormEndComponent,
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
          <cw-new-password-field label="New password" [control]="password" />
          <cw-form-end [submission]="submission" label="Set password">
            <a routerLink="/forgot-password">Ask for a new link</a>
          </cw-form-end>
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
