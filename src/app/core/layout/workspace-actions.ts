import { inject, Injectable } from '@angular/core';
import { MatDialog } from '@angular/material/dialog';
import { Router } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { WorkspacesApi } from '../api/workspaces.api';
import { NameDialogComponent, NameDialogData } from '../dialogs/name-dialog.component';
import { SessionStore } from '../session/session.store';

/** Creating a workspace, shared by the toolbar and the welcome page. */
@Injectable({ providedIn: 'root' })
export class WorkspaceActions {
  private readonly dialog = inject(MatDialog);
  private readonly api = inject(WorkspacesApi);
  private readonly session = inject(SessionStore);
  private readonly router = inject(Router);

  /** Asks for a name, creates the workspace, and opens its chain list. */
  async createWithDialog(): Promise<void> {
    const ref = this.dialog.open<NameDialogComponent, NameDialogData, string>(NameDialogComponent, {
      data: {
        title: 'New workspace',
        label: 'Workspace name',
        initial: '',
        maxLength: 120,
        submitLabel: 'Create',
      },
    });
    const name = await firstValueFrom(ref.afterClosed());
    if (name) await this.create(name);
  }

  async create(name: string): Promise<void> {
    const created = await firstValueFrom(this.api.create(name));
    await this.session.refresh();
    await this.router.navigate(['/w', created.id, 'chains']);
  }
}
