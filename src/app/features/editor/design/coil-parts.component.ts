import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { firstValueFrom } from 'rxjs';
import { describeHttpError } from '../../../core/http/error-message';
import { EditorStore } from '../state/editor.store';
import { CoilFormStore } from './coil-form.store';
import { DesignApi } from './design-api';

/**
 * The coil form the editor winds inductors on, and the selected stage's parts list with
 * turns (from the server, the same rows the CLI prints) as a CSV download.
 */
@Component({
  selector: 'cw-coil-parts',
  imports: [MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <p class="cw-muted note">
      Air-core single-layer coils, turns by Wheeler's formula (Proc. IRE, 1928), good to about 1 %
      when the winding is longer than 0.4 diameters. Turns show beside every inductance.
    </p>
    <div class="grid">
      <label>
        Former diameter, mm
        <input
          type="number"
          min="1"
          step="0.5"
          [value]="formerMm()"
          (change)="set('former', $event)"
        />
      </label>
      <label>
        Wire diameter, mm
        <input
          type="number"
          min="0.05"
          step="0.05"
          [value]="wireMm()"
          (change)="set('wire', $event)"
        />
      </label>
      <label>
        Pitch, mm
        <input
          type="number"
          min="0.05"
          step="0.05"
          [value]="pitchMm()"
          (change)="set('pitch', $event)"
        />
      </label>
    </div>
    @if (formError(); as e) {
      <p class="cw-error-text" role="alert">{{ e }}</p>
    }
    <button
      mat-stroked-button
      type="button"
      data-testid="parts-export"
      [disabled]="!store.selectedId()"
      (click)="download()"
    >
      Parts of the selected stage (CSV)
    </button>
  `,
  styles: `
    .note {
      font-size: 0.8rem;
    }
    .grid {
      display: grid;
      grid-template-columns: 1fr 1fr 1fr;
      gap: 0.5rem;
      font-size: 0.85rem;
    }
    input {
      width: 100%;
      box-sizing: border-box;
    }
    button {
      margin-top: 0.5rem;
    }
  `,
})
export class CoilPartsComponent {
  protected readonly store = inject(EditorStore);
  private readonly coil = inject(CoilFormStore);
  private readonly api = inject(DesignApi);
  protected readonly formError = signal<string | null>(null);

  private readonly parts = computed(() => {
    const f = this.coil.form();
    return 'pitchM' in f ? f : { ...f, wireDiameterM: 0.0005, pitchM: 0.001 };
  });
  protected readonly formerMm = computed(() => this.parts().formerDiameterM * 1e3);
  protected readonly wireMm = computed(() => this.parts().wireDiameterM * 1e3);
  protected readonly pitchMm = computed(() => this.parts().pitchM * 1e3);

  protected set(which: 'former' | 'wire' | 'pitch', event: Event): void {
    const mm = Number((event.target as HTMLInputElement).value);
    if (!(mm > 0)) {
      this.formError.set('Each dimension must be above 0 mm.');
      return;
    }
    const p = { ...this.parts() };
    if (which === 'former') p.formerDiameterM = mm / 1e3;
    if (which === 'wire') p.wireDiameterM = mm / 1e3;
    if (which === 'pitch') p.pitchM = mm / 1e3;
    if (p.pitchM < p.wireDiameterM) {
      this.formError.set('The pitch cannot be less than the wire diameter (turns would overlap).');
      return;
    }
    this.formError.set(null);
    this.coil.form.set(p);
  }

  protected async download(): Promise<void> {
    const id = this.store.selectedId();
    if (!id) return;
    try {
      const answer = await firstValueFrom(
        this.api.parts(this.store.doc(), id, this.coil.form(), this.store.chain()?.workspaceId),
      );
      const blob = new Blob([answer.csv], { type: 'text/csv' });
      const a = document.createElement('a');
      a.href = URL.createObjectURL(blob);
      a.download = `${id}-parts.csv`;
      a.click();
      URL.revokeObjectURL(a.href);
      this.formError.set(null);
    } catch (e) {
      this.formError.set(describeHttpError(e));
    }
  }
}
