import { ChangeDetectionStrategy, Component, computed, input, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import type { ChainDocument } from '../../../../../shared/schema/chain';
import type { StudySpecInput } from '../../../../../shared/schema/studies';
import { numberOf, textOf } from './tunable';

/** The Monte Carlo form: distribution, trials and seed over the stages' tolerances. */
@Component({
  selector: 'cw-monte-carlo-form',
  imports: [MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  styleUrl: './study-form.scss',
  template: `
    <div class="form" data-testid="mc-form">
      <p>
        Draws every stage value that has a tolerance
        @if (tolerances().length) {
          ({{ tolerances().join(', ') }})
        } @else {
          <strong>(none yet: give values a ± % in the editor)</strong>
        }
        and judges each trial against the chain's targets (set them in the editor's Settings).
      </p>
      <label
        >Distribution
        <select
          data-testid="mc-distribution"
          [value]="distribution()"
          (change)="distribution.set($any(text($event)))"
        >
          <option value="normal">Normal (the ± % is 3σ)</option>
          <option value="uniform">Uniform (the ± % is the half-range)</option>
        </select>
      </label>
      <label
        >Trials
        <input
          data-testid="mc-trials"
          type="number"
          min="2"
          max="10000"
          [value]="trials()"
          (input)="trials.set(num($event))"
      /></label>
      <label
        >Seed
        <input
          data-testid="mc-seed"
          type="number"
          min="0"
          [value]="seed()"
          (input)="seed.set(num($event))"
      /></label>
      <button mat-flat-button type="button" data-testid="run-mc" (click)="submit()">
        Run Monte Carlo
      </button>
    </div>
  `,
})
export class MonteCarloFormComponent {
  readonly document = input<ChainDocument | undefined>(undefined);
  readonly run = output<StudySpecInput>();

  protected readonly text = textOf;
  protected readonly num = numberOf;
  protected readonly distribution = signal<'uniform' | 'normal'>('normal');
  protected readonly trials = signal(1000);
  protected readonly seed = signal(1);
  protected readonly tolerances = computed(() =>
    (this.document()?.stages ?? []).flatMap((s) =>
      Object.entries(s.tolerances ?? {})
        .filter(([, t]) => t > 0)
        .map(([k, t]) => `${s.label || s.id} ${k} ±${t} %`),
    ),
  );

  protected submit(): void {
    this.run.emit({
      kind: 'monte-carlo',
      distribution: this.distribution(),
      trials: this.trials(),
      seed: this.seed(),
    });
  }
}
