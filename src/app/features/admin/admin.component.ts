import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatCardModule } from '@angular/material/card';
import { MatSlideToggleChange, MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import { firstValueFrom } from 'rxjs';
import { AdminApi, AdminUserRow } from '../../core/api/admin.api';

/** Site administration: who has an account, and whether anyone may create one. */
@Component({
  selector: 'cw-admin',
  imports: [MatCardModule, MatSlideToggleModule, MatTableModule, DatePipe],
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
            <td mat-cell *matCellDef="let u">{{ u.email }}</td>
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
          <tr mat-header-row *matHeaderRowDef="columns()"></tr>
          <tr mat-row *matRowDef="let row; columns: columns()"></tr>
        </table>
      </div>
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
  `,
})
export default class AdminComponent {
  private readonly api = inject(AdminApi);
  private readonly snackBar = inject(MatSnackBar);

  protected readonly users = signal<AdminUserRow[]>([]);
  /** "Since" only when the server sends account dates; a column of dashes says nothing. */
  protected readonly columns = computed(() =>
    this.users().some((u) => u.createdAt)
      ? ['displayName', 'email', 'siteRole', 'createdAt']
      : ['displayName', 'email', 'siteRole'],
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
