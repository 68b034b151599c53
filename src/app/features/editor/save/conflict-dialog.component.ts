import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';

export interface ConflictDialogData {
  currentVersion: number | null;
  myVersion: number;
}

/** What the user chose when someone else saved first. */
export type ConflictChoice = 'reload' | 'variant';

/** Someone saved the chain since it was loaded: nothing is lost either way. */
@Component({
  selector: 'cw-conflict-dialog',
  imports: [MatDialogModule, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>Someone saved this chain first</h2>
    <mat-dialog-content>
      <p>
        You started from version {{ data.myVersion }}; the chain is now at version
        {{ data.currentVersion ?? 'a newer one' }}. Your edits are not saved yet.
      </p>
      <ul>
        <li><strong>Reload theirs</strong> drops your edits and opens the current version.</li>
        <li>
          <strong>Keep mine as a variant</strong> saves your edits as a new variant linked to this
          chain, so both are kept.
        </li>
      </ul>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" mat-dialog-close>Not now</button>
      <button mat-stroked-button type="button" [mat-dialog-close]="'reload'">Reload theirs</button>
      <button mat-flat-button type="button" [mat-dialog-close]="'variant'">
        Keep mine as a variant
      </button>
    </mat-dialog-actions>
  `,
})
export class ConflictDialogComponent {
  protected readonly data = inject<ConflictDialogData>(MAT_DIALOG_DATA);
}
