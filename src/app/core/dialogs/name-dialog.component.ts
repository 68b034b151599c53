import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';

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
  imports: [
    MatDialogModule,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
    ReactiveFormsModule,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
      <h2 mat-dialog-title>{{ data.title }}</h2>
      <mat-dialog-content>
        <mat-form-field appearance="outline" class="cw-full">
          <mat-label>{{ data.label }}</mat-label>
          <input matInput formControlName="name" cdkFocusInitial [maxlength]="data.maxLength" />
          @if (name.hasError('required') || name.hasError('blank')) {
            <mat-error>Enter a name.</mat-error>
          }
        </mat-form-field>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit">{{ data.submitLabel }}</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .cw-full {
      width: min(360px, 100%);
    }
  `,
})
export class NameDialogComponent {
  protected readonly data = inject<NameDialogData>(MAT_DIALOG_DATA);
  private readonly ref = inject(MatDialogRef<NameDialogComponent, string>);
  protected readonly name = new FormControl(this.data.initial, {
    nonNullable: true,
    validators: [Validators.required, (c) => (String(c.value).trim() ? null : { blank: true })],
  });

  // A form group, not a bare control, so that (ngSubmit) fires.
  protected readonly form = new FormGroup({ name: this.name });

  protected submit(): void {
    this.name.markAsTouched();
    if (this.name.invalid) return;
    this.ref.close(this.name.value.trim());
  }
}
