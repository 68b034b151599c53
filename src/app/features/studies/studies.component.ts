import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  computed,
  effect,
  inject,
  input,
  signal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTabsModule } from '@angular/material/tabs';
import { Router, RouterLink } from '@angular/router';
import type { Subscription } from 'rxjs';
import type { ChainDto } from '../../../../shared/schema/api';
import type { StudyDto, StudySpecInput, StudySummaryDto } from '../../../../shared/schema/studies';
import type {
  BandResult,
  MonteCarloResult,
  OptimiserResult,
} from '../../../../shared/engine/studies';
import { ChainsApi } from '../../core/api/chains.api';
import { describeHttpError } from '../../core/http/error-message';
import { ResultPlotComponent } from '../editor/results/result-plot.component';
import { StudiesApi } from './studies.api';
import { histogramFigure, scatterFigure, trackingFigure } from './study-plots';

const FINISHED = ['done', 'failed', 'cancelled'];
const num = (e: Event) => Number((e.target as HTMLInputElement).value);
const text = (e: Event) => (e.target as HTMLInputElement | HTMLSelectElement).value;

/**
 * Studies of a saved chain: Monte Carlo yield from the stage tolerances, tuning across a band
 * with a ganged capacitor, and the optimiser. Runs go to the study workers; this page follows
 * them live and shows their results.
 */
@Component({
  selector: 'cw-studies',
  imports: [RouterLink, MatButtonModule, MatProgressBarModule, MatTabsModule, ResultPlotComponent],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './studies.component.html',
  styleUrl: './studies.component.scss',
})
export default class StudiesComponent {
  readonly workspaceId = input.required<string>();
  readonly chainId = input.required<string>();

  private readonly api = inject(StudiesApi);
  private readonly chains = inject(ChainsApi);
  private readonly router = inject(Router);
  private readonly destroyRef = inject(DestroyRef);
  private readonly follows = new Map<string, Subscription>();

  protected readonly chain = signal<ChainDto | null>(null);
  protected readonly studies = signal<StudySummaryDto[]>([]);
  protected readonly selected = signal<StudyDto | null>(null);
  protected readonly message = signal('');
  protected readonly num = num;
  protected readonly text = text;

  // Monte Carlo form
  protected readonly distribution = signal<'uniform' | 'normal'>('normal');
  protected readonly trials = signal(1000);
  protected readonly seed = signal(1);
  protected readonly figureIndex = signal(0);
  protected readonly scatterX = signal(0);
  protected readonly scatterY = signal(1);
  // Band form (capacitances in pF, inductance in µH)
  protected readonly gangStage = signal('');
  protected readonly gangKey = signal('c');
  protected readonly gangMinPf = signal(20);
  protected readonly gangMaxPf = signal(400);
  protected readonly positions = signal(41);
  protected readonly oscillator = signal(false);
  protected readonly oscLUh = signal(100);
  protected readonly oscTrimPf = signal(10);
  protected readonly oscPadPf = signal(0);
  // Optimiser form
  protected readonly varStage = signal('');
  protected readonly varKey = signal('c');
  protected readonly varMin = signal(1e-12);
  protected readonly varMax = signal(1e-9);
  protected readonly goalStage = signal('');
  protected readonly goalMHz = signal(1);
  protected readonly saving = signal(false);

  protected readonly tolerances = computed(() =>
    (this.chain()?.document.stages ?? []).flatMap((s) =>
      Object.entries(s.tolerances ?? {})
        .filter(([, t]) => t > 0)
        .map(([k, t]) => `${s.label || s.id} ${k} ±${t} %`),
    ),
  );
  /** Stages with a numeric capacitance or inductance, for the gang and the optimiser. */
  protected readonly tunable = computed(() =>
    (this.chain()?.document.stages ?? [])
      .map((s) => ({
        id: s.id,
        label: s.label || s.id,
        keys: Object.keys(s.values).filter(
          (k) => typeof s.values[k] === 'number' && /^(c|l|cc|l1|l2|c1|c2)$/.test(k),
        ),
      }))
      .filter((s) => s.keys.length > 0),
  );

  protected readonly mc = computed(() =>
    this.selected()?.kind === 'monte-carlo'
      ? (this.selected()!.result as MonteCarloResult | null)
      : null,
  );
  protected readonly band = computed(() =>
    this.selected()?.kind === 'band' ? (this.selected()!.result as BandResult | null) : null,
  );
  protected readonly opt = computed(() =>
    this.selected()?.kind === 'optimiser'
      ? (this.selected()!.result as OptimiserResult | null)
      : null,
  );

  protected readonly histogram = computed(() => {
    const r = this.mc();
    const f = r?.figures[this.figureIndex()];
    return f
      ? histogramFigure(
          f.label,
          f.unit === 'hertz' ? 'Hz' : f.unit === 'db' ? 'dB' : '',
          f.histogram,
        )
      : null;
  });
  protected readonly scatter = computed(() => {
    const r = this.mc();
    if (!r) return null;
    const [i, j] = [this.scatterX(), this.scatterY()];
    return scatterFigure(
      r.figures[i]?.label ?? '',
      r.figures[j]?.label ?? '',
      r.rows.map((row) => row.metrics[i]),
      r.rows.map((row) => row.metrics[j]),
      r.rows.map((row) => row.pass),
    );
  });
  protected readonly tracking = computed(() => {
    const r = this.band();
    if (!r) return null;
    return trackingFigure({
      dialsHz: r.positions.map((p) => p.dialHz),
      circuits: r.circuits.map((c, i) => ({
        label: c.label,
        errorsHz: r.positions.map((p) => p.trackingErrorHz[i]),
        resonancesHz: r.positions.map((p) => p.resonanceHz[i]),
      })),
    });
  });

  constructor() {
    effect(() => {
      const id = this.chainId();
      this.chains.get(id).subscribe((c) => {
        this.chain.set(c);
        const first = this.tunable()[0];
        if (first) {
          this.gangStage.set(first.id);
          this.varStage.set(first.id);
          this.goalStage.set(first.id);
          this.gangKey.set(first.keys.includes('c') ? 'c' : first.keys[0]);
          this.varKey.set(first.keys.includes('c') ? 'c' : first.keys[0]);
        }
        this.goalMHz.set(c.document.settings.f0Hz / 1e6);
      });
      this.refresh();
    });
    this.destroyRef.onDestroy(() => this.follows.forEach((s) => s.unsubscribe()));
  }

  private refresh(): void {
    this.api.list(this.chainId()).subscribe((list) => {
      this.studies.set(list);
      list.filter((s) => !FINISHED.includes(s.status)).forEach((s) => this.follow(s.id));
    });
  }

  private follow(id: string): void {
    if (this.follows.has(id)) return;
    const sub = this.api.follow(this.chainId(), id).subscribe({
      next: (s) => {
        this.studies.update((list) => list.map((x) => (x.id === s.id ? s : x)));
        if (FINISHED.includes(s.status) && 'result' in s && this.selected()?.id === s.id)
          this.selected.set(s);
      },
      complete: () => this.follows.delete(id),
      error: () => this.follows.delete(id),
    });
    this.follows.set(id, sub);
  }

  protected run(spec: StudySpecInput): void {
    this.message.set('');
    this.api.start(this.chainId(), spec).subscribe({
      next: (s) => {
        this.studies.update((list) => [s, ...list]);
        this.follow(s.id);
      },
      error: (err) => this.message.set(describeHttpError(err)),
    });
  }

  protected runMonteCarlo(): void {
    this.run({
      kind: 'monte-carlo',
      distribution: this.distribution(),
      trials: this.trials(),
      seed: this.seed(),
    });
  }

  protected runBand(): void {
    const pf = 1e-12;
    this.run({
      kind: 'band',
      gang: [
        {
          stageId: this.gangStage(),
          key: this.gangKey(),
          min: this.gangMinPf() * pf,
          max: this.gangMaxPf() * pf,
        },
      ],
      positions: this.positions(),
      ...(this.oscillator()
        ? {
            oscillator: {
              l: this.oscLUh() * 1e-6,
              trimmer: this.oscTrimPf() * pf,
              padder: this.oscPadPf() * pf,
            },
          }
        : {}),
    });
  }

  protected runOptimiser(): void {
    this.run({
      kind: 'optimiser',
      variables: [
        { stageId: this.varStage(), key: this.varKey(), min: this.varMin(), max: this.varMax() },
      ],
      goals: [{ kind: 'resonance', stageId: this.goalStage(), targetHz: this.goalMHz() * 1e6 }],
    });
  }

  protected cancel(s: StudySummaryDto): void {
    this.api.cancel(this.chainId(), s.id).subscribe({
      next: (c) => this.studies.update((list) => list.map((x) => (x.id === c.id ? c : x))),
      error: (err) => this.message.set(describeHttpError(err)),
    });
  }

  protected open(s: StudySummaryDto): void {
    this.api.get(this.chainId(), s.id).subscribe((full) => {
      this.figureIndex.set(0);
      this.selected.set(full);
    });
  }

  protected saveVariant(): void {
    const r = this.opt();
    const c = this.chain();
    if (!r || !c) return;
    this.saving.set(true);
    this.api.saveVariant(this.chainId(), r.document, `${c.name} (optimised)`).subscribe({
      next: (v) => void this.router.navigate(['/w', this.workspaceId(), 'chains', v.id]),
      error: (err) => {
        this.saving.set(false);
        this.message.set(describeHttpError(err));
      },
    });
  }

  protected kindLabel(kind: string): string {
    return kind === 'monte-carlo' ? 'Monte Carlo' : kind === 'band' ? 'Band tracking' : 'Optimiser';
  }

  protected pct(v: number | null | undefined): string {
    return v === null || v === undefined ? '—' : `${(v * 100).toFixed(1)} %`;
  }

  protected fmt(v: number | null | undefined, digits = 4): string {
    if (v === null || v === undefined) return '—';
    // Component values (pF, µH) would round to 0 as grouped decimals: show them as 2.16e-10.
    const a = Math.abs(v);
    if (a !== 0 && (a < 1e-3 || a >= 1e12)) return v.toPrecision(digits);
    return Number(v.toPrecision(digits)).toLocaleString('en', { maximumFractionDigits: 6 });
  }
}
