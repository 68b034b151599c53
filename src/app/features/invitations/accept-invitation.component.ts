import { HttpContext } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, effect, inject, input, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { Router, RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import {
  passwordResetSchema,
  registerSchema,
  type InvitationPreviewDto,
} from '../../../../shared/schema/api';
import { ColleaguesApi } from '../../core/api/colleagues.api';
import { controlMessage, zodValidator } from '../../core/forms/zod-validator';
import { describeHttpError } from '../../core/http/error-message';
import { SKIP_ERROR_SNACKBAR } from '../../core/http/http-context';
import { ROLE_LABELS } from '../../core/session/roles';
import { SessionStore } from '../../core/session/session.store';

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
                <mat-form-field>
                  <mat-label>Password of {{ p.email }}</mat-label>
                  <input
                    matInput
                    formControlName="password"
                    type="password"
                    autocomplete="current-password"
                  />
                </mat-form-field>
                <p class="cw-muted"><a routerLink="/forgot-password">Forgot it?</a></p>
              } @else {
                <mat-form-field>
                  <mat-label>Your name, as colleagues will see it</mat-label>
                  <input
                    matInput
                    formControlName="displayName"
                    autocomplete="name"
                    maxlength="80"
                  />
                  <mat-error>{{ message(form.controls.displayName) }}</mat-error>
                </mat-form-field>
                <mat-form-field>
                  <mat-label>Choose a password</mat-label>
                  <input
                    matInput
                    formControlName="password"
                    type="password"
                    autocomplete="new-password"
                  />
                  <mat-hint
                    >At least 10 characters; a few unusual words make a strong one.</mat-hint
                  >
                  <mat-error>{{ message(form.controls.password) }}</mat-error>
                </mat-form-field>
              }
              @if (failure(); as text) {
                <p class="cw-form-error" role="alert">{{ text }}</p>
              }
              <div class="cw-actions">
                <button mat-flat-button type="submit" [disabled]="busy()">
                  {{
                    p.hasAccount || signedInAs() ? 'Join the workspace' : 'Create account and join'
                  }}
                </button>
              </div>
            </form>
          } @else {
            <p class="cw-muted">Reading the invitation…</p>
          }
        </mat-card-content>
      </mat-card>
    </section>
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
  protected readonly failure = signal('');
  protected readonly busy = signal(false);
  protected readonly signedInAs = signal<string | null>(null);
  protected readonly message = controlMessage;
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
    if (this.form.invalid || this.busy()) return;
    this.busy.set(true);
    this.failure.set('');
    const { displayName, password } = this.form.getRawValue();
    const body = this.signedInAs() ? {} : p.hasAccount ? { password } : { displayName, password };
    try {
      const context = new HttpContext().set(SKIP_ERROR_SNACKBAR, [409, 410, 422]);
      const answer = await firstValueFrom(this.api.acceptInvitation(this.token(), body, context));
      await this.session.startSession(answer);
      await this.router.navigate(['/w', answer.workspaceId, 'chains']);
    } catch (error) {
      this.failure.set(describeHttpError(error));
    } finally {
      this.busy.set(false);
    }
  }
}
