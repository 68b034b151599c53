import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatRadioModule } from '@angular/material/radio';
import { catchError, map, of } from 'rxjs';
import type { ExampleDto } from '../../../../shared/schema/api';
import { ChainsApi } from '../../core/api/chains.api';

/** What the user chose: a blank chain (needs a name) or an example (name optional). */
export type NewChainChoice =
  { kind: 'blank'; name: string } | { kind: 'example'; key: string; name?: string };

const BLANK = '__blank__';

/** Chooses how a new chain starts: blank, or from one of the server's examples. */
@Component({
  selector: 'cw-new-chain-dialog',
  imports: [
    ReactiveFormsModule,
    MatDialogModule,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
    MatRadioModule,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './new-chain-dialog.component.html',
  styleUrl: './new-chain-dialog.component.scss',
})
export class NewChainDialogComponent {
  private readonly ref = inject(MatDialogRef<NewChainDialogComponent, NewChainChoice>);
  protected readonly blank = BLANK;

  /** null while loading; an empty list when the server has none or failed. */
  protected readonly examples = toSignal(
    inject(ChainsApi)
      .examples()
      .pipe(
        map((list): ExampleDto[] | null => list),
        catchError(() => of([] as ExampleDto[])),
      ),
    { initialValue: null },
  );

  protected readonly form = new FormGroup({
    start: new FormControl(BLANK, { nonNullable: true }),
    name: new FormControl('', { nonNullable: true }),
  });
  private readonly start = toSignal(this.form.controls.start.valueChanges, {
    initialValue: BLANK,
  });
  protected readonly nameRequired = computed(() => this.start() === BLANK);
  protected readonly nameMissing = signal(false);

  protected submit(): void {
    const { start, name } = this.form.getRawValue();
    const trimmed = name.trim();
    if (start === BLANK) {
      this.nameMissing.set(!trimmed);
      if (!trimmed) return;
      this.ref.close({ kind: 'blank', name: trimmed });
      return;
    }
    this.ref.close({ kind: 'example', key: start, name: trimmed || undefined });
  }
}
