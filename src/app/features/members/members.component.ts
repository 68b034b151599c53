import { ChangeDetectionStrategy, Component, effect, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import { MatTooltipModule } from '@angular/material/tooltip';
import { firstValueFrom } from 'rxjs';
import { MemberDto, ROLES, WorkspaceRole } from '../../../../shared/schema/api';
import { WorkspacesApi } from '../../core/api/workspaces.api';
import {
  ConfirmDialogComponent,
  ConfirmDialogData,
} from '../../core/dialogs/confirm-dialog.component';
import { NameDialogComponent, NameDialogData } from '../../core/dialogs/name-dialog.component';
import { ROLE_LABELS } from '../../core/session/roles';
import { SessionStore } from '../../core/session/session.store';
import { InvitationsPanelComponent } from '../invitations/invitations-panel.component';

/** The workspace's members. Everyone can read the list; only owners change it. */
@Component({
  selector: 'cw-members',
  imports: [
    InvitationsPanelComponent,
    MatTableModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    MatButtonModule,
    MatIconModule,
    MatTooltipModule,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './members.component.html',
  styleUrl: './members.component.scss',
})
export default class MembersComponent {
  protected readonly session = inject(SessionStore);
  private readonly api = inject(WorkspacesApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);

  /** From the route. */
  readonly workspaceId = input.required<string>();

  protected readonly roles = ROLES;
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly members = signal<MemberDto[]>([]);

  constructor() {
    effect(() => void this.load(this.workspaceId()));
  }

  /** Table rows are untyped in the template; this narrows the role for the label. */
  protected roleLabel(role: string): string {
    return ROLE_LABELS[role as WorkspaceRole] ?? role;
  }

  protected columns(): string[] {
    return this.session.isOwner()
      ? ['displayName', 'email', 'role', 'actions']
      : ['displayName', 'email', 'role'];
  }

  private async load(workspaceId: string): Promise<void> {
    try {
      this.members.set(await firstValueFrom(this.api.members(workspaceId)));
    } catch {
      this.members.set([]);
    }
  }

  protected async changeRole(member: MemberDto, role: WorkspaceRole): Promise<void> {
    try {
      await firstValueFrom(this.api.changeRole(this.workspaceId(), member.userId, role));
      this.snackBar.open(`${member.displayName} is now ${ROLE_LABELS[role].toLowerCase()}.`, 'OK');
    } finally {
      // Reload either way, so a refused change shows the role the server kept.
      await this.load(this.workspaceId());
      if (member.userId === this.session.user()?.id) await this.session.refresh();
    }
  }

  protected async renameWorkspace(): Promise<void> {
    const current = this.session.currentMembership()?.workspaceName ?? '';
    const ref = this.dialog.open<NameDialogComponent, NameDialogData, string>(NameDialogComponent, {
      data: {
        title: 'Rename workspace',
        label: 'Workspace name',
        initial: current,
        maxLength: 120,
        submitLabel: 'Rename',
      },
    });
    const name = await firstValueFrom(ref.afterClosed());
    if (!name || name === current) return;
    try {
      await firstValueFrom(this.api.rename(this.workspaceId(), name));
      // The toolbar's workspace list and this heading read the memberships.
      await this.session.refresh();
    } catch {
      // The error interceptor said why.
    }
  }

  protected async remove(member: MemberDto): Promise<void> {
    const ref = this.dialog.open<ConfirmDialogComponent, ConfirmDialogData, boolean>(
      ConfirmDialogComponent,
      {
        data: {
          title: 'Remove member',
          message: `Remove ${member.displayName} (${member.email}) from this workspace? Their chains stay here.`,
          confirmLabel: 'Remove',
        },
      },
    );
    if (!(await firstValueFrom(ref.afterClosed()))) return;
    await firstValueFrom(this.api.removeMember(this.workspaceId(), member.userId)).catch(
      () => null,
    );
    await this.load(this.workspaceId());
  }
}
