import { inject, Injectable } from '@angular/core';
import { MatSnackBar } from '@angular/material/snack-bar';
import type { EditOutcome } from './editor.store';

/** Tells the user why an edit was refused, or what an edit did beyond the obvious. */
@Injectable()
export class EditFeedback {
  private readonly snackBar = inject(MatSnackBar);

  report(outcome: EditOutcome): void {
    if (!outcome.ok) this.snackBar.open(outcome.reason, 'OK', { duration: 5000 });
    else if (outcome.message) this.snackBar.open(outcome.message, undefined, { duration: 3000 });
  }
}
