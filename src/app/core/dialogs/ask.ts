import { inject, Injectable } from '@angular/core';
import { MatDialog } from '@angular/material/dialog';
import { firstValueFrom } from 'rxjs';
import { ConfirmDialogComponent, type ConfirmDialogData } from './confirm-dialog.component';
import { NameDialogComponent, type NameDialogData } from './name-dialog.component';
import type { ValueDialogData } from './value-dialog.component';

/**
 * The app's questions to the user, each a Material dialog (never the browser's own boxes):
 * the dialog traps focus while open and gives it back to what had it when it closes.
 */
@Injectable({ providedIn: 'root' })
export class Ask {
  private readonly dialog = inject(MatDialog);

  /** True when the user confirms; false when they cancel, press Escape or click outside. */
  async confirm(data: ConfirmDialogData): Promise<boolean> {
    const ref = this.dialog.open<ConfirmDialogComponent, ConfirmDialogData, boolean>(
      ConfirmDialogComponent,
      { data, restoreFocus: true, autoFocus: 'first-tabbable' },
    );
    return (await firstValueFrom(ref.afterClosed())) === true;
  }

  /** The trimmed name entered, or null when cancelled. */
  async name(data: NameDialogData): Promise<string | null> {
    const ref = this.dialog.open<NameDialogComponent, NameDialogData, string>(NameDialogComponent, {
      data,
      restoreFocus: true,
    });
    return (await firstValueFrom(ref.afterClosed())) ?? null;
  }

  /**
   * The SI value entered, or null when cancelled. The dialog (and the unit parser it reads
   * with) loads on first use, so pages that never ask for a value do not carry it.
   */
  async value(data: ValueDialogData): Promise<number | null> {
    const { ValueDialogComponent } = await import('./value-dialog.component');
    const ref = this.dialog.open<
      InstanceType<typeof ValueDialogComponent>,
      ValueDialogData,
      number
    >(ValueDialogComponent, { data, restoreFocus: true });
    const answer = await firstValueFrom(ref.afterClosed());
    return typeof answer === 'number' ? answer : null;
  }
}
