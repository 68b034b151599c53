import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatDialog } from '@angular/material/dialog';
import { MatSlideToggleChange, MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import { firstValueFrom } from 'rxjs';
import type { AccountDeletedDto } from '../../../../shared/schema/api';
import { AdminApi, AdminUserRow } from '../../core/api/admin.api';
import {
  ConfirmDialogComponent,
  ConfirmDialogData,
} from '../../core/dialogs/confirm-dialog.component';
import { SessionStore } from '../../core/session/session.store';

/**
 * Site administration: who has an account, whether anyone may create one, and deactivating
 * or deleting accounts.
 */
@Component({
  selector: 'cw-admin',
  imports: [MatButtonModule, MatCardModule, MatSlideToggleModule, MatTableModule, DatePipe],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="cw-page">
      <h1>Site administration</h1>
      <mat-card appearance="outlined" class="cw-block">
        <mat-card-content>
          <mat-slide-toggle
            [checked]="openRegistration()"
            [disabled]="openRegistration() === null || saving()"
            (change)="setOpenRegistration($event)"
          >
            Open registration
          </mat-slide-toggle>
          <p class="cw-muted">
            When on, anyone who reaches this site can create an account. When off, only accounts
            that already exist can sign in.
          </p>
        </mat-card-content>
      </mat-card>

      <h2>Accounts ({{ users().length }})</h2>
      <div class="cw-table-scroll">
        <table mat-table [dataSource]="users()" class="cw-table">
          <caption class="cw-visually-hidden">
            All accounts on this site
          </caption>
          <ng-container matColumnDef="displayName">
            <th mat-header-cell *matHeaderCellDef scope="col">Name</th>
            <td mat-cell *matCellDef="let u">{{ u.displayName }}</td>
          </ng-container>
          <ng-container matColumnDef="email">
            <th mat-header-cell *matHeaderCellDef scope="col">E-mail</th>
            <!-- A deleted account's address is erased: no placeholder address to read. -->
            <td mat-cell *matCellDef="let u">{{ u.deleted ? '—' : u.email }}</td>
          </ng-container>
          <ng-container matColumnDef="siteRole">
            <th mat-header-cell *matHeaderCellDef scope="col">Site role</th>
            <td mat-cell *matCellDef="let u">
              {{ u.siteRole === 'admin' ? 'Administrator' : 'User' }}
            </td>
          </ng-container>
          <ng-container matColumnDef="createdAt">
            <th mat-header-cell *matHeaderCellDef scope="col">Since</th>
            <td mat-cell *matCellDef="let u">
              {{ u.createdAt ? (u.createdAt | date: 'mediumDate') : '—' }}
            </td>
          </ng-container>
          <ng-container matColumnDef="state">
            <th mat-header-cell *matHeaderCellDef scope="col">State</th>
            <td mat-cell *matCellDef="let u" [class.cw-muted]="u.active === false">
              {{ u.deleted ? 'Deleted' : u.active === false ? 'Deactivated' : 'Active' }}
            </td>
          </ng-container>
          <ng-container matColumnDef="actions">
            <th mat-header-cell *matHeaderCellDef scope="col">
              <span class="cw-visually-hidden">Actions</span>
            </th>
            <td mat-cell *matCellDef="let u" class="cw-actions">
              @if (!u.deleted && u.id !== myId()) {
                <button
                  mat-stroked-button
                  type="button"
                  [disabled]="busy() === u.id"
                  (click)="setActive(u, u.active === false)"
                >
                  {{ u.active === false ? 'Reactivate' : 'Deactivate' }}
                </button>
                <button
                  mat-button
                  type="button"
                  class="cw-danger-text"
                  [disabled]="busy() === u.id"
                  (click)="remove(u)"
                >
                  Delete
                </button>
              }
            </td>
          </ng-container>
          <tr mat-header-row *matHeaderRowDef="columns()"></tr>
          <tr mat-row *matRowDef="let row; columns: columns()"></tr>
        </table>
      </div>
      <p class="cw-muted">
        A deactivated account cannot sign in and is signed out at once; its workspaces and chains
        stay as they are. Deleting an account erases its address, name and password: workspaces it
        was the only member of are deleted with their chains, and in shared workspaces its chains
        stay, shown as written by "Deleted account".
      </p>
    </section>
  `,
  styles: `
    .cw-block {
      margin-bottom: 24px;
    }
    .cw-table {
      width: 100%;
    }
    h2 {
      font: var(--mat-sys-title-large);
    }
    .cw-actions {
      white-space: nowrap;
      text-align: end;
    }
    .cw-actions button + button {
      margin-inline-start: 8px;
    }
    .cw-danger-text {
      --mat-button-text-label-text-color: var(--mat-sys-error);
    }
  `,
})
export default class AdminComponent {
  private readonly api = inject(AdminApi);
  private readonly snackBar = inject(MatSnackBar);
  private readonly dialog = inject(MatDialog);
  private readonly session = inject(SessionStore);

  /** The signed-in admin: their own row offers no actions. */
  protected readonly myId = computed(() => this.session.user()?.id ?? null);
  /** The account an action is running on, or null. */
  protected readonly busy = signal<string | null>(null);

  protected readonly users = signal<AdminUserRow[]>([]);
  /** "Since" only when the server sends account dates; a column of dashes says nothing. */
  protected readonly columns = computed(() =>
    this.users().some((u) => u.createdAt)
      ? ['displayName', 'email', 'siteRole', 'state', 'createdAt', 'actions']
      : ['displayName', 'email', 'siteRole', 'state', 'actions'],
  );
  /** null until the server has said. */
  protected readonly openRegistration = signal<boolean | null>(null);
  protected readonly saving = signal(false);

  constructor() {
    void this.load();
  }

  private async load(): Promise<void> {
    const [users, settings] = await Promise.all([
      firstValueFrom(this.api.users()),
      firstValueFrom(this.api.settings()),
    ]).catch(() => [[], null] as const);
    this.users.set([...users]);
    this.openRegistration.set(settings?.openRegistration ?? null);
  }

  protected async setActive(user: AdminUserRow, active: boolean): Promise<void> {
    this.busy.set(user.id);
    try {
      const saved = await firstValueFrom(this.api.setActive(user.id, active));
      this.users.update((rows) => rows.map((r) => (r.id === saved.id ? saved : r)));
      this.snackBar.open(
        active
          ? `${saved.displayName} can sign in again.`
          : `${saved.displayName} is deactivated and signed out.`,
        'OK',
        { duration: 4000 },
      );
    } catch {
      // The error interceptor said why.
    } finally {
      this.busy.set(null);
    }
  }

  protected async remove(user: AdminUserRow): Promise<void> {
    const ref = this.dialog.open<ConfirmDialogComponent, ConfirmDialogData, boolean>(
      ConfirmDialogComponent,
      {
        data: {
          title: 'Delete account',
          message:
            `Delete the account of ${user.displayName} (${user.email})? Workspaces where they ` +
            'are the only member are deleted with their chains and data files. In shared ' +
            'workspaces their chains stay, shown as written by "Deleted account". ' +
            'This cannot be undone.',
          confirmLabel: 'Delete account',
        },
      },
    );
    if (!(await firstValueFrom(ref.afterClosed()))) return;
    this.busy.set(user.id);
    try {
      const report = await firstValueFrom(this.api.deleteUser(user.id));
      this.snackBar.open(deletionSummary(user, report), 'OK', { duration: 8000 });
      await this.load();
    } catch {
      // The error interceptor said why (e.g. the last owner of a shared workspace).
    } finally {
      this.busy.set(null);
    }
  }

  protected async setOpenRegistration(change: MatSlideToggleChange): Promise<void> {
    this.saving.set(true);
    try {
      const saved = await firstValueFrom(
        this.api.updateSettings({ openRegistration: change.checked }),
      );
      this.openRegistration.set(saved.openRegistration);
      this.snackBar.open(
        saved.openRegistration ? 'Registration is open.' : 'Registration is closed.',
        'OK',
        { duration: 4000 },
      );
    } catch {
      // Put the switch back to what the server holds; the interceptor said why.
      change.source.checked = !change.checked;
    } finally {
      this.saving.set(false);
    }
  }
}

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/** What a deletion did, in one sentence for the snack bar. */
function deletionSummary(user: AdminUserRow, report: AccountDeletedDto): string {
  const parts: string[] = [];
  if (report.deletedWorkspaces.length) {
    const chains = report.deletedWorkspaces.reduce((n, w) => n + w.chainCount, 0);
    parts.push(
      `${plural(report.deletedWorkspaces.length, 'own workspace')} deleted with ${plural(chains, 'chain')}`,
    );
  }
  if (report.leftWorkspaces.length) {
    const chains = report.leftWorkspaces.reduce((n, w) => n + w.chainCount, 0);
    parts.push(
      `left ${plural(report.leftWorkspaces.length, 'shared workspace')}, whose ${plural(chains, 'chain')} stay`,
    );
  }
  return `${user.displayName}'s account is deleted${parts.length ? `: ${parts.join('; ')}` : ''}.`;
}
