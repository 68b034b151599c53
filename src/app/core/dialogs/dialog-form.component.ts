import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule } from '@angular/material/dialog';

/**
 * The frame of a dialog that asks for a few fields: a title, the fields (projected), Cancel and
 * a submitting button. Enter in a field or the button emits `submitted`; Cancel, Escape and a
 * click outside close the dialog with nothing. Bind the fields with `[formControl]`: they sit
 * in the asking dialog's template, outside this form's directives.
 */
@Component({
  selector: 'cw-dialog-form',
  imports: [MatDialogModule, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <form (submit)="submit($event)" novalidate>
      <h2 mat-dialog-title>{{ title() }}</h2>
      <mat-dialog-content>
        <ng-content />
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <!-- Closed with nothing, as Escape closes it (a bare mat-dialog-close gives ""). -->
        <button mat-button type="button" [mat-dialog-close]="undefined">Cancel</button>
        <button mat-flat-button type="submit">{{ submitLabel() }}</button>
      </mat-dialog-actions>
    </form>
  `,
})
export class DialogFormComponent {
  readonly title = input.required<string>();
  readonly submitLabel = input.required<string>();
  readonly submitted = output<void>();

  protected submit(event: Event): void {
    // The page never reloads: the dialog reads the fields and closes itself.
    event.preventDefault();
    this.submitted.emit();
  }
}
