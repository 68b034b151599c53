import { HttpContext } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, effect, inject, input, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { Router, RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import {
  passwordResetSchema,
  registerSchema,
  type InvitationPreviewDto,
} from '../../../../shared/schema/api';
import { ColleaguesApi } from '../../core/api/colleagues.api';
import { zodValidator } from '../../core/forms/zod-validator';
import { describeHttpError } from '../../core/http/error-message';
import { SKIP_ERROR_SNACKBAR } from '../../core/http/http-context';
import { ROLE_LABELS } from '../../core/session/roles';
import { SessionStore } from '../../core/session/session.store';
import { AuthCardComponent } from '../auth/parts/auth-card.component';
import { Submission } from '../auth/parts/submission';
import { FormEndComponent } from '../auth/parts/form-end.component';
import { NewPasswordFieldComponent } from '../auth/parts/new-password-field.component';
import { TextFieldComponent } from '../auth/parts/text-field.component';

/**
 * The page an invitation mail links to: what the invitation offers, and accepting it. A
 * person without an account chooses a name and a password here; one with an account enters
 * its password (or is signed in already).
 */
@Component({
  selector: 'cw-accept-invitation',
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
      <h1>Join a workspace</h1>
      @if (gone(); as text) {
        <p class="cw-form-error" role="alert">{{ text }}</p>
        <p><a routerLink="/sign-in">Sign in</a></p>
      } @else if (preview(); as p) {
        <p data-testid="invitation-summary">
          {{ p.invitedBy }} invites <strong>{{ p.email }}</strong> to the workspace
          <strong>{{ p.workspaceName }}</strong> as {{ roleLabel(p) }}.
        </p>
        <form [formGroup]="form" (ngSubmit)="accept(p)" novalidate>
          @if (signedInAs(); as who) {
            <p class="cw-muted">You are signed in as {{ who }}.</p>
          } @else if (p.hasAccount) {
            <cw-text-field
              [label]="'Password of ' + p.email"
              type="password"
              autocomplete="current-password"
              [control]="form.controls.password"
            />
            <p class="cw-muted"><a routerLink="/forgot-password">Forgot it?</a></p>
          } @else {
            <cw-text-field
              label="Your name, as colleagues will see it"
              autocomplete="name"
              [maxlength]="80"
              [control]="form.controls.displayName"
            />
            <cw-new-password-field label="Choose a password" [control]="form.controls.password" />
          }
          <cw-form-end
            [submission]="submission"
            [label]="
              p.hasAccount || signedInAs() ? 'Join the workspace' : 'Create account and join'
            "
          />
        </form>
      } @else {
        <p class="cw-muted">Reading the invitation…</p>
      }
    </cw-auth-card>
  `,
  styleUrl: '../auth/auth-page.scss',
})
export default class AcceptInvitationComponent {
  private readonly api = inject(ColleaguesApi);
  private readonly session = inject(SessionStore);
  private readonly router = inject(Router);
  /** From the route. */
  readonly token = input.required<string>();

  protected readonly preview = signal<InvitationPreviewDto | null>(null);
  protected readonly gone = signal('');
  protected readonly submission = new Submission();
  protected readonly signedInAs = signal<string | null>(null);
  protected readonly form = new FormGroup({
    displayName: new FormControl('', {
      nonNullable: true,
      validators: [zodValidator(registerSchema.shape.displayName)],
    }),
    password: new FormControl('', { nonNullable: true }),
  });

  constructor() {
    effect(() => void this.load(this.token()));
  }

  protected roleLabel(p: InvitationPreviewDto): string {
    return ROLE_LABELS[p.role].toLowerCase();
  }

  private async load(token: string): Promise<void> {
    try {
      const me = await this.session.ensureLoaded();
      this.signedInAs.set(me?.user.email ?? null);
      const context = new HttpContext().set(SKIP_ERROR_SNACKBAR, [404, 410]);
      const preview = await firstValueFrom(this.api.previewInvitation(token, context));
      this.preview.set(preview);
      const needsAccount = !preview.hasAccount && !me;
      const { displayName, password } = this.form.controls;
      displayName.setValidators(
        needsAccount ? [zodValidator(registerSchema.shape.displayName)] : [],
      );
      password.setValidators(
        needsAccount ? [zodValidator(passwordResetSchema.shape.password)] : [],
      );
      displayName.updateValueAndValidity();
      password.updateValueAndValidity();
    } catch (error) {
      this.gone.set(describeHttpError(error));
    }
  }

  protected async accept(p: InvitationPreviewDto): Promise<void> {
    this.form.markAllAsTouched();
    if (this.form.invalid) return;
    const { displayName, password } = this.form.getRawValue();
    const body = this.signedInAs() ? {} : p.hasAccount ? { password } : { displayName, password };
    await this.submission.run(async () => {
      const context = new HttpContext().set(SKIP_ERROR_SNACKBAR, [403, 409, 410, 422, 429]);
      const answer = await firstValueFrom(this.api.acceptInvitation(this.token(), body, context));
      await this.session.startSession(answer);
      await this.router.navigate(['/w', answer.workspaceId, 'chains']);
    });
  }
}
