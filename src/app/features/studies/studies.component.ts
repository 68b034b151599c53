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
import { catchError, map, of, type Subscription } from 'rxjs';
import { toSignal } from '@angular/core/rxjs-interop';
import type { UnitKind } from '../../../../shared/engine/types';
import { AnalysisApi } from '../editor/state/analysis-api';
import type { ChainDto } from '../../../../shared/schema/api';
import type { StudyDto, StudySpecInput, StudySummaryDto } from '../../../../shared/schema/studies';
import type {
  BandResult,
  MonteCarloResult,
  OptimiserResult,
} from '../../../../shared/engine/studies';
import { ChainsApi } from '../../core/api/chains.api';
import { describeHttpError } from '../../core/http/error-message';
import { BandFormComponent } from './forms/band-form.component';
import { MonteCarloFormComponent } from './forms/monte-carlo-form.component';
import { OptimiserFormComponent } from './forms/optimiser-form.component';
import { BandResultComponent } from './results/band-result.component';
import { MonteCarloResultComponent } from './results/monte-carlo-result.component';
import { OptimiserResultComponent } from './results/optimiser-result.component';
import { chainReferenceOhm, exportFileName } from '../../../../shared/io/export-name';
import { StudiesApi } from './studies.api';

const FINISHED = ['done', 'failed', 'cancelled'];

/**
 * Studies of a saved chain: Monte Carlo yield from the stage tolerances, tuning across a band
 * with a ganged capacitor, and the optimiser. Runs go to the study workers; this page follows
 * them live and shows their results.
 */
@Component({
  selector: 'cw-studies',
  imports: [
    RouterLink,
    MatButtonModule,
    MatProgressBarModule,
    MatTabsModule,
    MonteCarloFormComponent,
    BandFormComponent,
    OptimiserFormComponent,
    MonteCarloResultComponent,
    BandResultComponent,
    OptimiserResultComponent,
  ],
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
  /** Names a study CSV after the chain and its reference impedance. */
  protected readonly csvName = (content: string): string => {
    const c = this.chain();
    return exportFileName({
      chainName: c?.name ?? 'chain',
      referenceOhm: c ? chainReferenceOhm(c.document.settings) : undefined,
      content,
      extension: 'csv',
    });
  };
  protected readonly studies = signal<StudySummaryDto[]>([]);
  protected readonly selected = signal<StudyDto | null>(null);
  protected readonly message = signal('');

  protected readonly saving = signal(false);

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

  /** Parameter units by stage type and key, from the catalogue (fetched once per page). */
  private readonly units = toSignal(
    inject(AnalysisApi)
      .catalogue()
      .pipe(
        map((types) => new Map(types.flatMap((t) => t.params.map((p) => [`${t.type}/${p.key}`, p.unit] as const)))), // prettier-ignore
        catchError(() => of(new Map<string, UnitKind>())),
      ),
    { initialValue: new Map<string, UnitKind>() },
  );
  /** The unit of a stage's value in this chain, so the optimiser's values carry it. */
  protected readonly unitOf = computed(() => {
    const stages = this.chain()?.document.stages ?? [];
    const units = this.units();
    return (stageId: string, key: string): UnitKind | undefined => {
      const type = stages.find((s) => s.id === stageId)?.type;
      return type === undefined ? undefined : units.get(`${type}/${key}`);
    };
  });
  /** The goals the shown optimiser run was asked for. */
  protected readonly goals = computed(() => {
    const spec = this.selected()?.spec;
    return spec?.kind === 'optimiser' ? spec.goals : [];
  });

  constructor() {
    effect(() => {
      const id = this.chainId();
      this.chains.get(id).subscribe((c) => this.chain.set(c));
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

  protected cancel(s: StudySummaryDto): void {
    this.api.cancel(this.chainId(), s.id).subscribe({
      next: (c) => this.studies.update((list) => list.map((x) => (x.id === c.id ? c : x))),
      error: (err) => this.message.set(describeHttpError(err)),
    });
  }

  protected open(s: StudySummaryDto): void {
    this.api.get(this.chainId(), s.id).subscribe((full) => this.selected.set(full));
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
}
