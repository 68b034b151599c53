import { HttpContext, HttpErrorResponse } from '@angular/common/http';
import { inject, Injectable, signal } from '@angular/core';
import { MatDialog } from '@angular/material/dialog';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import type { ChainDto } from '../../../../../shared/schema/api';
import { ChainsApi } from '../../../core/api/chains.api';
import { describeHttpError } from '../../../core/http/error-message';
import { SKIP_ERROR_SNACKBAR } from '../../../core/http/http-context';
import { clearDrafts } from '../state/draft-store';
import { EditorStore } from '../state/editor.store';
import {
  ConflictDialogComponent,
  type ConflictChoice,
  type ConflictDialogData,
} from './conflict-dialog.component';

/**
 * Saving with the version check, the conflict choice, restoring revisions and reloading.
 * Every path keeps the user's edits until they chose to drop them.
 */
@Injectable()
export class ChainPersistence {
  private readonly api = inject(ChainsApi);
  private readonly store = inject(EditorStore);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly router = inject(Router);
  private readonly savingState = signal(false);

  readonly saving = this.savingState.asReadonly();

  async save(message: string): Promise<boolean> {
    const chain = this.store.chain();
    if (!chain || this.store.readOnly() || this.savingState()) return false;
    this.savingState.set(true);
    const body = {
      version: chain.version,
      document: this.store.doc(),
      message: message.trim() || undefined,
    };
    try {
      const saved = await firstValueFrom(
        this.api.update(chain.id, body, new HttpContext().set(SKIP_ERROR_SNACKBAR, [409])),
      );
      this.store.markSaved(saved);
      clearDrafts(chain.id);
      this.snackBar.open(`Saved as version ${saved.version}.`, undefined, { duration: 3000 });
      return true;
    } catch (error) {
      if (error instanceof HttpErrorResponse && error.status === 409) {
        await this.resolveConflict(chain, error);
      }
      return false;
    } finally {
      this.savingState.set(false);
    }
  }

  /** Loads the current stored version, dropping unsaved edits. */
  async reload(): Promise<void> {
    const chain = this.store.chain();
    if (!chain) return;
    const fresh = await firstValueFrom(this.api.get(chain.id));
    clearDrafts(chain.id);
    this.store.load(fresh);
  }

  /** Saves an old revision's document as the newest version, then shows it. */
  async restore(revisionVersion: number): Promise<boolean> {
    const chain = this.store.chain();
    if (!chain) return false;
    try {
      // The body carries the version this client last read: a stale one is a conflict.
      const restored = await firstValueFrom(
        this.api.restore(
          chain.id,
          revisionVersion,
          chain.version,
          new HttpContext().set(SKIP_ERROR_SNACKBAR, [409]),
        ),
      );
      clearDrafts(chain.id);
      this.store.load(restored);
      this.snackBar.open(
        `Revision ${revisionVersion} restored as version ${restored.version}.`,
        undefined,
        { duration: 4000 },
      );
      return true;
    } catch (error) {
      if (error instanceof HttpErrorResponse && error.status === 409) {
        this.snackBar.open(
          'Someone saved this chain meanwhile. Reload it, then restore again.',
          'OK',
        );
      }
      return false;
    }
  }

  private async resolveConflict(chain: ChainDto, error: HttpErrorResponse): Promise<void> {
    const details = (error.error as { details?: { currentVersion?: number } } | null)?.details;
    const data: ConflictDialogData = {
      currentVersion: details?.currentVersion ?? null,
      myVersion: chain.version,
    };
    const choice = await firstValueFrom(
      this.dialog
        .open<ConflictDialogComponent, ConflictDialogData, ConflictChoice>(
          ConflictDialogComponent,
          {
            data,
            width: '520px',
          },
        )
        .afterClosed(),
    );
    if (choice === 'reload') await this.reload();
    if (choice === 'variant') await this.keepAsVariant(chain);
  }

  private async keepAsVariant(chain: ChainDto): Promise<void> {
    const document = this.store.doc();
    try {
      const variant = await firstValueFrom(
        this.api.duplicate(chain.id, {
          name: `${document.name} (my edits)`.slice(0, 200),
          asVariant: true,
          document,
        }),
      );
      clearDrafts(chain.id);
      // The variant now holds the edits: the original goes back to its stored state.
      this.store.load(chain);
      this.snackBar.open(`Your edits are saved as the variant “${variant.name}”.`, undefined, {
        duration: 5000,
      });
      await this.router.navigate(['/w', variant.workspaceId, 'chains', variant.id]);
    } catch (e) {
      this.snackBar.open(`The variant was not saved: ${describeHttpError(e)}`, 'OK');
    }
  }
}
