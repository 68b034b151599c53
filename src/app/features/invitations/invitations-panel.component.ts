import { HttpContext } from '@angular/common/http';
import {
  ChangeDetectionStrategy,
  Component,
  effect,
  inject,
  input,
  signal,
  viewChild,
} from '@angular/core';
import { FormControl, FormGroup, FormGroupDirective, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { firstValueFrom } from 'rxjs';
import {
  invitationSchema,
  ROLES,
  type InvitationDto,
  type WorkspaceRole,
} from '../../../../shared/schema/api';
import { ColleaguesApi } from '../../core/api/colleagues.api';
import { controlMessage, sentence, zodValidator } from '../../core/forms/zod-validator';
import { describeHttpError } from '../../core/http/error-message';
import { SKIP_ERROR_SNACKBAR } from '../../core/http/http-context';
import { ROLE_LABELS } from '../../core/session/roles';

/** Owners invite people by address, and see and withdraw the invitations not yet accepted. */
@Component({
  selector: 'cw-invitations-panel',
  imports: [
    ReactiveFormsModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    MatButtonModule,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2>Invite a colleague</h2>
    <p class="cw-muted">
      We mail them a link that works once, for 7 days. Someone without an account creates one when
      accepting.
    </p>
    <form [formGroup]="form" (ngSubmit)="invite()" class="cw-row invite" novalidate>
      <mat-form-field class="email">
        <mat-label>E-mail</mat-label>
        <input matInput type="email" formControlName="email" autocomplete="off" />
        <mat-error>{{ message(form.controls.email) }}</mat-error>
      </mat-form-field>
      <mat-form-field class="role">
        <mat-label>Role</mat-label>
        <mat-select formControlName="role">
          @for (r of roles; track r) {
            <mat-option [value]="r">{{ roleLabels[r] }}</mat-option>
          }
        </mat-select>
      </mat-form-field>
      <button mat-flat-button type="submit" [disabled]="busy()">Send invitation</button>
    </form>
    @if (notice(); as text) {
      <p role="status" data-testid="invite-notice">{{ text }}</p>
    }
    @if (failure(); as text) {
      <p class="cw-error-text" role="alert">{{ text }}</p>
    }

    <h3>Waiting for an answer</h3>
    @if (pending().length === 0) {
      <p class="cw-muted">No open invitations.</p>
    } @else {
      <ul class="pending" aria-label="Open invitations">
        @for (i of pending(); track i.id) {
          <li>
            <span class="who">{{ i.email }}</span>
            <span class="cw-muted">
              as {{ roleLabels[i.role].toLowerCase() }} · by {{ i.invitedBy }} · until
              {{ i.expiresAt.slice(0, 10) }}
            </span>
            <button mat-button type="button" (click)="revoke(i)">Withdraw</button>
          </li>
        }
      </ul>
    }
  `,
  styles: `
    h2 {
      font: var(--mat-sys-title-large);
    }
    h3 {
      font: var(--mat-sys-title-medium);
      margin-top: 24px;
    }
    .invite {
      align-items: flex-start;
    }
    .email {
      flex: 1 1 280px;
    }
    .role {
      width: 160px;
    }
    .invite button {
      margin-top: 8px;
    }
    .pending {
      list-style: none;
      padding: 0;
      margin: 0;
    }
    .pending li {
      display: flex;
      align-items: center;
      gap: 12px;
      flex-wrap: wrap;
      padding: 6px 0;
      border-bottom: 1px solid var(--mat-sys-outline-variant);
    }
    .who {
      font-weight: 600;
    }
  `,
})
export class InvitationsPanelComponent {
  private readonly api = inject(ColleaguesApi);
  readonly workspaceId = input.required<string>();

  protected readonly roles = ROLES;
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly message = controlMessage;
  protected readonly pending = signal<InvitationDto[]>([]);
  protected readonly busy = signal(false);
  protected readonly notice = signal('');
  protected readonly failure = signal('');
  /** The form's directive: resetting through it also clears its "submitted" state. */
  private readonly formDirective = viewChild(FormGroupDirective);
  protected readonly form = new FormGroup({
    email: new FormControl('', {
      nonNullable: true,
      validators: [zodValidator(invitationSchema.shape.email)],
    }),
    role: new FormControl<WorkspaceRole>('editor', { nonNullable: true }),
  });

  constructor() {
    effect(() => void this.load(this.workspaceId()));
  }

  private async load(workspaceId: string): Promise<void> {
    try {
      this.pending.set(await firstValueFrom(this.api.invitations(workspaceId)));
    } catch {
      this.pending.set([]);
    }
  }

  protected async invite(): Promise<void> {
    this.form.markAllAsTouched();
    if (this.form.invalid || this.busy()) return;
    this.busy.set(true);
    this.failure.set('');
    this.notice.set('');
    const { email, role } = this.form.getRawValue();
    try {
      const context = new HttpContext().set(SKIP_ERROR_SNACKBAR, [409, 422]);
      const answer = await firstValueFrom(
        this.api.invite(this.workspaceId(), email, role, context),
      );
      // The invitation stands even when the mail did not go; say so and that it is retried.
      this.notice.set(
        answer.mail?.sent === false
          ? sentence(answer.mail.message ?? 'the mail could not be sent yet; it is retried')
          : `Invitation sent to ${answer.email}.`,
      );
      // Through the directive: a plain reset leaves the form "submitted", and Material then
      // shows the emptied address field in red as if the user had left it wrong.
      const next = { email: '', role };
      const directive = this.formDirective();
      if (directive) directive.resetForm(next);
      else this.form.reset(next);
      await this.load(this.workspaceId());
    } catch (error) {
      this.failure.set(describeHttpError(error));
    } finally {
      this.busy.set(false);
    }
  }

  protected async revoke(invitation: InvitationDto): Promise<void> {
    try {
      await firstValueFrom(this.api.revokeInvitation(this.workspaceId(), invitation.id));
      this.notice.set(`The invitation to ${invitation.email} no longer works.`);
    } finally {
      await this.load(this.workspaceId());
    }
  }
}
