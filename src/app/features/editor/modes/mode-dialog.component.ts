import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { DialogFormComponent } from '../../../core/dialogs/dialog-form.component';
import { MODE_KIND_WORDS, MODE_KINDS, type ModeKind } from './mode-types';

export interface ModeDialogData {
  title: string;
  submitLabel: string;
  name: string;
  kind: ModeKind;
}

export interface ModeDialogAnswer {
  name: string;
  kind: ModeKind;
}

/** Asks for a mode's name and kind (new mode, or renaming one). */
@Component({
  selector: 'cw-mode-dialog',
  imports: [
    DialogFormComponent,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    ReactiveFormsModule,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <cw-dialog-form [title]="data.title" [submitLabel]="data.submitLabel" (submitted)="submit()">
      <mat-form-field appearance="outline" class="cw-dialog-field">
        <mat-label>Name</mat-label>
        <input
          matInput
          [formControl]="form.controls.name"
          cdkFocusInitial
          maxlength="80"
          data-testid="mode-name"
        />
        @if (form.controls.name.invalid) {
          <mat-error>Enter a name, e.g. “transmit” or “band 2”.</mat-error>
        }
      </mat-form-field>
      <mat-form-field appearance="outline" class="cw-dialog-field">
        <mat-label>Kind</mat-label>
        <mat-select [formControl]="form.controls.kind" data-testid="mode-kind">
          @for (kind of kinds; track kind) {
            <mat-option [value]="kind">{{ words[kind] }}</mat-option>
          }
        </mat-select>
        <mat-hint>A transmit mode brings the transmit caution to the chain.</mat-hint>
      </mat-form-field>
    </cw-dialog-form>
  `,
})
export class ModeDialogComponent {
  protected readonly data = inject<ModeDialogData>(MAT_DIALOG_DATA);
  private readonly ref = inject(MatDialogRef<ModeDialogComponent, ModeDialogAnswer>);
  protected readonly kinds = MODE_KINDS;
  protected readonly words = MODE_KIND_WORDS;
  protected readonly form = new FormGroup({
    name: new FormControl(this.data.name, {
      nonNullable: true,
      validators: [Validators.required, (c) => (String(c.value).trim() ? null : { blank: true })],
    }),
    kind: new FormControl<ModeKind>(this.data.kind, { nonNullable: true }),
  });

  protected submit(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { name, kind } = this.form.getRawValue();
    this.ref.close({ name: name.trim(), kind });
  }
}
