import { inject, Injectable } from '@angular/core';
import { MatDialog } from '@angular/material/dialog';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import type { ChainDto, ChainSummaryDto } from '../../../../shared/schema/api';
import { ChainsApi } from '../../core/api/chains.api';
import {
  ConfirmDialogComponent,
  ConfirmDialogData,
} from '../../core/dialogs/confirm-dialog.component';
import { Ask } from '../../core/dialogs/ask';
import { NameDialogComponent, NameDialogData } from '../../core/dialogs/name-dialog.component';
import { variantNameQuestion } from './variant-name';
import { blankChainDocument, catalogueEntries } from './blank-chain';
import { NewChainChoice, NewChainDialogComponent } from './new-chain-dialog.component';

/**
 * The chain list's actions, each a dialog and a request. Each resolves to whether the
 * list changed; failures were already shown by the error interceptor.
 */
@Injectable({ providedIn: 'root' })
export class ChainActions {
  private readonly api = inject(ChainsApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly router = inject(Router);
  private readonly ask = inject(Ask);

  async createWithDialog(workspaceId: string): Promise<ChainDto | null> {
    const ref = this.dialog.open<NewChainDialogComponent, void, NewChainChoice>(
      NewChainDialogComponent,
      { width: '560px' },
    );
    const choice = await firstValueFrom(ref.afterClosed());
    if (!choice) return null;
    try {
      const created = await firstValueFrom(
        choice.kind === 'blank'
          ? this.api.create(workspaceId, {
              document: blankChainDocument(
                choice.name,
                catalogueEntries(await firstValueFrom(this.api.catalogue())),
              ),
              message: 'New blank chain',
            })
          : this.api.create(workspaceId, {
              fromExample: choice.key,
              name: choice.name,
              message: 'New chain from an example',
            }),
      );
      // A new chain is made to be worked on: open it in the editor at once.
      await this.router.navigate(['/w', workspaceId, 'chains', created.id]);
      return created;
    } catch (error) {
      // A catalogue without the needed types is our own message; HTTP errors were shown.
      if (error instanceof Error) this.snackBar.open(error.message, 'Dismiss');
      return null;
    }
  }

  async rename(chain: ChainSummaryDto): Promise<boolean> {
    const ref = this.dialog.open<NameDialogComponent, NameDialogData, string>(NameDialogComponent, {
      data: {
        title: 'Rename chain',
        label: 'Chain name',
        initial: chain.name,
        maxLength: 200,
        submitLabel: 'Rename',
      },
    });
    const name = await firstValueFrom(ref.afterClosed());
    if (!name || name === chain.name) return false;
    try {
      // Renaming is a save of the stored document with a new name, at its current version.
      const stored = await firstValueFrom(this.api.get(chain.id));
      await firstValueFrom(
        this.api.update(chain.id, {
          version: stored.version,
          document: { ...stored.document, name },
          message: `Renamed from “${chain.name}”`,
        }),
      );
      return true;
    } catch {
      return false;
    }
  }

  async duplicate(chain: ChainSummaryDto): Promise<boolean> {
    try {
      const name = `${chain.name} (copy)`.slice(0, 200);
      await firstValueFrom(this.api.duplicate(chain.id, { name }));
      this.snackBar.open(`Duplicated as “${name}”.`, 'OK', { duration: 4000 });
      return true;
    } catch {
      return false;
    }
  }

  /** A named copy linked to its parent: listed under it and offered for comparison. */
  async saveAsVariant(chain: ChainSummaryDto): Promise<boolean> {
    const name = await this.ask.name(variantNameQuestion(chain.name));
    if (!name) return false;
    try {
      await firstValueFrom(this.api.duplicate(chain.id, { name, asVariant: true }));
      this.snackBar.open(`Saved as the variant “${name}”.`, 'OK', { duration: 4000 });
      return true;
    } catch {
      return false;
    }
  }

  async remove(chain: ChainSummaryDto): Promise<boolean> {
    const ref = this.dialog.open<ConfirmDialogComponent, ConfirmDialogData, boolean>(
      ConfirmDialogComponent,
      {
        data: {
          title: 'Delete chain',
          message: `Delete “${chain.name}” and its revision history? This cannot be undone.`,
          confirmLabel: 'Delete',
        },
      },
    );
    if (!(await firstValueFrom(ref.afterClosed()))) return false;
    try {
      await firstValueFrom(this.api.delete(chain.id));
      return true;
    } catch {
      return false;
    }
  }
}
