import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import {
  MAX_SIGNIFICANT_FIGURES,
  MIN_SIGNIFICANT_FIGURES,
  NumberFormatStore,
} from '../../core/format/number-format';
import { engineering } from '../editor/results/format-quantity';

/**
 * The user's number format (significant figures, used by every table, card and plot label)
 * and the Smith chart's reference resistance. Both are kept in this browser per account.
 */
@Component({
  selector: 'cw-number-format-card',
  imports: [MatCardModule, MatFormFieldModule, MatInputModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <mat-card appearance="outlined">
      <mat-card-header>
        <h2 mat-card-title>Number format</h2>
      </mat-card-header>
      <mat-card-content>
        <p class="cw-muted">
          Every figure on screen is written with engineering prefixes and its unit, to the number of
          significant figures chosen here.
        </p>
        <mat-form-field>
          <mat-label>Significant figures</mat-label>
          <select
            matNativeControl
            data-testid="significant-figures"
            (change)="chooseFigures($event)"
          >
            <!-- Selected per option: a value bound on the select lands before its options. -->
            @for (n of figureChoices; track n) {
              <option [value]="n" [selected]="n === format.figures()">{{ n }}</option>
            }
          </select>
        </mat-form-field>
        <p class="example" aria-live="polite">
          For example <span class="cw-num">{{ examples() }}</span>
        </p>
        <mat-form-field>
          <mat-label>Smith chart reference</mat-label>
          <input
            matInput
            type="number"
            min="0.001"
            step="any"
            inputmode="decimal"
            data-testid="smith-reference"
            [value]="format.smithReference()"
            (change)="chooseReference($event)"
          />
          <span matTextSuffix>Ω</span>
          <mat-hint
            >The chart is drawn normalised to this resistance (50 Ω unless you choose).</mat-hint
          >
        </mat-form-field>
        @if (referenceError(); as text) {
          <p class="cw-error-text" role="alert">{{ text }}</p>
        }
      </mat-card-content>
    </mat-card>
  `,
  styles: `
    h2[mat-card-title] {
      font: var(--mat-sys-title-medium);
      margin: 0;
    }
    mat-form-field {
      width: 100%;
    }
    .example {
      margin: 0 0 16px;
    }
  `,
})
export class NumberFormatCardComponent {
  protected readonly format = inject(NumberFormatStore);
  protected readonly figureChoices = Array.from(
    { length: MAX_SIGNIFICANT_FIGURES - MIN_SIGNIFICANT_FIGURES + 1 },
    (_, i) => MIN_SIGNIFICANT_FIGURES + i,
  );
  protected readonly referenceError = signal<string | null>(null);
  protected readonly examples = computed(() => {
    this.format.figures();
    return [
      engineering(7_234_567, 'hertz'),
      engineering(2.2e-6, 'henry'),
      engineering(56.78e-12, 'farad'),
      engineering(10_470, 'ohm'),
    ].join(', ');
  });

  protected chooseFigures(event: Event): void {
    this.format.setFigures(Number((event.target as HTMLSelectElement).value));
  }

  protected chooseReference(event: Event): void {
    const input = event.target as HTMLInputElement;
    const ohm = Number(input.value);
    if (this.format.setSmithReference(ohm)) {
      this.referenceError.set(null);
    } else {
      this.referenceError.set(
        `"${input.value}" is not a resistance: enter ohms above 0, e.g. 50 or 75.`,
      );
    }
  }
}
