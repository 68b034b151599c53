import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { workspaceNameSchema } from '../../../../shared/schema/api';
import { controlMessage, zodValidator } from '../../core/forms/zod-validator';
import { WorkspaceActions } from '../../core/layout/workspace-actions';
import { SessionStore } from '../../core/session/session.store';

/** For a user with no workspace yet: create the first one, or wait for an invitation. */
@Component({
  selector: 'cw-welcome',
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="cw-page-narrow">
      <h1>Welcome, {{ session.user()?.displayName }}</h1>
      <p>
        Chains live in workspaces, which you share with colleagues. Create one for yourself or your
        team, or ask a workspace owner to add you to theirs.
      </p>
      <form [formGroup]="form" (ngSubmit)="create()" class="cw-stack" novalidate>
        <mat-form-field>
          <mat-label>Workspace name</mat-label>
          <input matInput formControlName="name" maxlength="120" />
          <mat-error>{{ message(name) }}</mat-error>
        </mat-form-field>
        <div>
          <button mat-flat-button type="submit" [disabled]="busy()">Create workspace</button>
        </div>
      </form>
    </section>
  `,
})
export default class WelcomeComponent {
  protected readonly session = inject(SessionStore);
  private readonly workspaces = inject(WorkspaceActions);
  protected readonly name = new FormControl('', {
    nonNullable: true,
    validators: [zodValidator(workspaceNameSchema.shape.name)],
  });
  // A form group, not a bare control, so that (ngSubmit) fires.
  protected readonly form = new FormGroup({ name: this.name });
  protected readonly busy = signal(false);
  protected readonly message = controlMessage;

  protected async create(): Promise<void> {
    this.name.markAsTouched();
    if (this.name.invalid || this.busy()) return;
    this.busy.set(true);
    try {
      await this.workspaces.create(this.name.value.trim());
    } catch {
      // The error interceptor has shown why; the form stays for another try.
    } finally {
      this.busy.set(false);
    }
  }
}
