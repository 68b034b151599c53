import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { DialogFormComponent } from './dialog-form.component';

export interface NameDialogData {
  title: string;
  label: string;
  initial: string;
  maxLength: number;
  submitLabel: string;
}

/** Asks for one name (a workspace, a chain). Closes with the trimmed name, or nothing. */
@Component({
  selector: 'cw-name-dialog',
  imports: [DialogFormComponent, MatFormFieldModule, MatInputModule, ReactiveFormsModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <cw-dialog-form [title]="data.title" [submitLabel]="data.submitLabel" (submitted)="submit()">
      <mat-form-field appearance="outline" class="cw-dialog-field">
        <mat-label>{{ data.label }}</mat-label>
        <input matInput [formControl]="name" cdkFocusInitial [maxlength]="data.maxLength" />
        @if (name.hasError('required') || name.hasError('blank')) {
          <mat-error>Enter a name.</mat-error>
        }
      </mat-form-field>
    </cw-dialog-form>
  `,
})
export class NameDialogComponent {
  protected readonly data = inject<NameDialogData>(MAT_DIALOG_DATA);
  private readonly ref = inject(MatDialogRef<NameDialogComponent, string>);
  protected readonly name = new FormControl(this.data.initial, {
    nonNullable: true,
    validators: [Validators.required, (c) => (String(c.value).trim() ? null : { blank: true })],
  });

  protected submit(): void {
    this.name.markAsTouched();
    if (this.name.invalid) return;
    this.ref.close(this.name.value.trim());
  }
}
