import { HttpContext } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { passwordResetRequestSchema } from '../../../../shared/schema/api';
import { ColleaguesApi } from '../../core/api/colleagues.api';
import { sentence, zodValidator } from '../../core/forms/zod-validator';
import { SKIP_ERROR_SNACKBAR } from '../../core/http/http-context';
import { AuthCardComponent } from '../auth/parts/auth-card.component';
import { Submission } from '../auth/parts/submission';
import { FormEndComponent } from '../auth/parts/form-end.component';
import { TextFieldComponent } from '../auth/parts/text-field.component';

/** Asks for a password link by mail; the answer is the same whether the address is known. */
@Component({
  selector: 'cw-forgot-password',
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
      <h1>Choose a new password</h1>
      @if (done(); as text) {
        <p role="status" data-testid="reset-requested">{{ text }}</p>
        <p><a routerLink="/sign-in">Back to sign in</a></p>
      } @else {
        <p class="cw-muted">We mail a link to the address of your account.</p>
        <form (ngSubmit)="submit()" novalidate>
          <cw-text-field label="E-mail" type="email" autocomplete="email" [control]="email" />
          <cw-form-end [submission]="submission" label="Mail me a link">
            <a routerLink="/sign-in">Back to sign in</a>
          </cw-form-end>
        </form>
      }
    </cw-auth-card>
  `,
  styleUrl: '../auth/auth-page.scss',
})
export default class ForgotPasswordComponent {
  private readonly api = inject(ColleaguesApi);
  protected readonly email = new FormControl('', {
    nonNullable: true,
    validators: [zodValidator(passwordResetRequestSchema.shape.email)],
  });
  protected readonly submission = new Submission();
  protected readonly done = signal('');

  protected async submit(): Promise<void> {
    this.email.markAsTouched();
    if (this.email.invalid) return;
    await this.submission.run(async () => {
      const context = new HttpContext().set(SKIP_ERROR_SNACKBAR, [422, 429]);
      const answer = await firstValueFrom(this.api.requestPasswordReset(this.email.value, context));
      this.done.set(sentence(answer.message));
    });
  }
}
