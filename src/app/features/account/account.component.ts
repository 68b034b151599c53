import { HttpContext } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSnackBar } from '@angular/material/snack-bar';
import { firstValueFrom } from 'rxjs';
import { changePasswordSchema } from '../../../../shared/schema/api';
import { AuthApi } from '../../core/api/auth.api';
import { controlMessage, zodValidator } from '../../core/forms/zod-validator';
import { describeHttpError } from '../../core/http/error-message';
import { SKIP_ERROR_SNACKBAR } from '../../core/http/http-context';
import { ROLE_LABELS } from '../../core/session/roles';
import { SessionStore } from '../../core/session/session.store';
import { NumberFormatCardComponent } from './number-format-card.component';

/** Who the user is, their workspaces, a password change, and how figures are written. */
@Component({
  selector: 'cw-account',
  imports: [
    ReactiveFormsModule,
    MatCardModule,
    MatFormFieldModule,
    MatInputModule,
    MatButtonModule,
    NumberFormatCardComponent,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './account.component.html',
  styleUrl: './account.component.scss',
})
export default class AccountComponent {
  protected readonly session = inject(SessionStore);
  private readonly auth = inject(AuthApi);
  private readonly snackBar = inject(MatSnackBar);

  protected readonly roleLabels = ROLE_LABELS;
  protected readonly message = controlMessage;
  protected readonly busy = signal(false);
  protected readonly failure = signal('');

  protected readonly form = new FormGroup({
    currentPassword: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
    newPassword: new FormControl('', {
      nonNullable: true,
      validators: [zodValidator(changePasswordSchema.shape.newPassword)],
    }),
  });

  protected async changePassword(): Promise<void> {
    this.form.markAllAsTouched();
    if (this.form.invalid || this.busy()) return;
    this.busy.set(true);
    this.failure.set('');
    try {
      // A wrong current password is shown next to the form, not in a snackbar.
      const context = new HttpContext().set(SKIP_ERROR_SNACKBAR, [400, 403, 422, 429]);
      await firstValueFrom(this.auth.changePassword(this.form.getRawValue(), context));
      this.form.reset();
      this.snackBar.open('Password changed.', 'OK', { duration: 4000 });
    } catch (error) {
      this.failure.set(describeHttpError(error));
    } finally {
      this.busy.set(false);
    }
  }
}
