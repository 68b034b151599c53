import { DOCUMENT } from '@angular/common';
import { HttpContext } from '@angular/common/http';
import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  computed,
  inject,
  input,
  signal,
} from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { Router, RouterLink } from '@angular/router';
import { catchError, forkJoin, map, of, startWith, switchMap } from 'rxjs';
import type { AnalysisResult, UnitKind } from '../../../../shared/engine/types';
import { AnalysisApi } from '../editor/state/analysis-api';
import type { ChainDto, ChainSummaryDto } from '../../../../shared/schema/api';
import { ChainsApi } from '../../core/api/chains.api';
import { describeHttpError } from '../../core/http/error-message';
import { SKIP_ERROR_SNACKBAR } from '../../core/http/http-context';
import { themePalette } from '../editor/results/plot-theme';
import { ResultPlotComponent } from '../editor/results/result-plot.component';
import { compareRows, type CompareVariant } from './compare-rows';
import { returnLossOverlay, stepUpOverlay } from './compare-traces';
import { entryKey, parseChainIds, parseEntry, MAX_COMPARED } from './compare-ids';
import { documentForResults, findMode } from '../editor/modes/mode-edits';
import { compareFiguresCsv, stageDiffCsv } from './compare-csv';
import { chainReferenceOhm, exportFileName } from '../../../../shared/io/export-name';
import { CsvButtonComponent } from '../report/csv-button.component';

/** One loaded variant (a chain, or one mode of it): the chain and its analysis, or why either failed. */
interface Loaded {
  /** The column's key: the chain id, or `<chain id>:<mode id>`. */
  id: string;
  chainId: string;
  modeId: string | null;
  chain: ChainDto | null;
  result: AnalysisResult | null;
  failure: string;
}

/**
 * Variants of one chain side by side: a table of the key figures with the best value of
 * each row marked, and overlaid step-up and return-loss plots. Read only, for viewers too.
 */
import { stageDiffRows } from './stage-diff';
@Component({
  selector: 'cw-compare',
  imports: [
    RouterLink,
    MatButtonModule,
    MatFormFieldModule,
    MatSelectModule,
    MatProgressBarModule,
    ResultPlotComponent,
    CsvButtonComponent,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './compare.component.html',
  styleUrl: './compare.component.scss',
})
export default class CompareComponent {
  /** From the route. */
  readonly workspaceId = input.required<string>();
  /** From the query string: `chains=<id>,<id>,…`. */
  readonly chains = input<string | undefined>();

  private readonly api = inject(ChainsApi);
  private readonly router = inject(Router);
  private readonly page = inject(DOCUMENT);
  /** Parameter units by stage type and key, so differing values are written with them. */
  private readonly units = toSignal(
    inject(AnalysisApi)
      .catalogue()
      .pipe(
        map((types) => new Map(types.flatMap((t) => t.params.map((p) => [`${t.type}/${p.key}`, p.unit] as const)))), // prettier-ignore
        catchError(() => of(new Map<string, UnitKind>())),
      ),
    { initialValue: new Map<string, UnitKind>() },
  );

  protected readonly maxCompared = MAX_COMPARED;
  protected readonly ids = computed(() => parseChainIds(this.chains()));
  /** Bumped when the page switches theme, so plot colours are read again. */
  private readonly themeRevision = signal(0);

  /** The family of the first chain named: what the picker offers. */
  protected readonly family = toSignal(
    toObservable(computed(() => (this.ids()[0] ? parseEntry(this.ids()[0]).chainId : null))).pipe(
      switchMap((id) =>
        id
          ? this.api.family(id).pipe(catchError(() => of<ChainSummaryDto[]>([])))
          : of<ChainSummaryDto[]>([]),
      ),
    ),
    { initialValue: [] as ChainSummaryDto[] },
  );

  private readonly loadState = toSignal(
    toObservable(this.ids).pipe(
      switchMap((ids) =>
        (ids.length ? forkJoin(ids.map((id) => this.load(id))) : of<Loaded[]>([])).pipe(
          map((loaded) => ({ loaded, loading: false })),
          startWith({ loaded: null as Loaded[] | null, loading: true }),
        ),
      ),
    ),
    { initialValue: { loaded: null as Loaded[] | null, loading: true } },
  );

  // Keep the last table on screen while a changed selection loads.
  private last: Loaded[] = [];
  protected readonly loaded = computed(() => {
    const state = this.loadState();
    if (state.loaded) this.last = state.loaded;
    return this.last;
  });
  protected readonly loading = computed(() => this.loadState().loading);

  protected readonly variants = computed((): CompareVariant[] =>
    this.loaded().map((l) => ({
      id: l.id,
      name: columnName(l),
      result: l.result,
    })),
  );
  protected readonly anyMode = computed(() => this.ids().some((id) => parseEntry(id).modeId));
  /** What the picker offers: each family member, and each mode of the chains shown. */
  protected readonly choices = computed(() => {
    const shown = new Map(this.loaded().map((l) => [l.chainId, l.chain]));
    return this.family().flatMap((member) => {
      const modes = shown.get(member.id)?.document.modes ?? [];
      return [
        { key: member.id, name: member.name, mode: false },
        ...modes.map((m) => ({
          key: entryKey({ chainId: member.id, modeId: m.id }),
          name: `${member.name} · ${m.name}`,
          mode: true,
        })),
      ];
    });
  });
  protected readonly rows = computed(() => compareRows(this.variants()));
  /** Which stages and values differ between the variants, against the first. */
  protected readonly stageDiffs = computed(() =>
    stageDiffRows(
      this.loaded().map((l) =>
        l.chain ? documentForResults(l.chain.document, findMode(l.chain.document, l.modeId)) : null,
      ),
      (type, key) => this.units().get(`${type}/${key}`),
    ),
  );
  protected readonly failures = computed(() =>
    this.loaded().flatMap((l) =>
      l.failure ? [{ id: l.id, name: l.chain ? columnName(l) : l.id, text: l.failure }] : [],
    ),
  );
  protected readonly rootName = computed(() => this.family()[0]?.name ?? '');

  private readonly plotOptions = computed(() => {
    this.themeRevision();
    const first = this.loaded().find((l) => l.chain)?.chain;
    return {
      palette: themePalette(this.page),
      scale: first?.document.settings.sweep.scale ?? ('lin' as const),
    };
  });
  protected readonly stepUpPlot = computed(() =>
    stepUpOverlay(this.variants(), this.plotOptions()),
  );
  protected readonly returnLossPlot = computed(() =>
    returnLossOverlay(this.variants(), this.plotOptions()),
  );
  /** CSV of the key figures and of the differing stages, run when a button is pressed. */
  protected readonly csv = {
    figures: () => [compareFiguresCsv(this.variants(), this.rows())],
    stages: () => [stageDiffCsv(this.variants(), this.stageDiffs())],
  };
  protected csvName(content: string): string {
    const first = this.loaded().find((l) => l.chain)?.chain;
    return exportFileName({
      chainName: this.rootName() || first?.name || 'chain',
      referenceOhm: first ? chainReferenceOhm(first.document.settings) : undefined,
      content,
      extension: 'csv',
    });
  }

  protected readonly fileStem = computed(() =>
    (this.rootName() || 'chain')
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-|-$/g, '')
      .slice(0, 60),
  );

  constructor() {
    const view = this.page.defaultView;
    if (view?.MutationObserver) {
      const observer = new view.MutationObserver(() => this.themeRevision.update((n) => n + 1));
      observer.observe(this.page.documentElement, { attributes: true, attributeFilter: ['class'] });
      inject(DestroyRef).onDestroy(() => observer.disconnect());
    }
  }

  /** The last variant shown cannot be unticked, and a seventh cannot be ticked. */
  protected locked(id: string): boolean {
    const ids = this.ids();
    return ids.includes(id) ? ids.length === 1 : ids.length >= MAX_COMPARED;
  }

  /** The picker's choice, in the picker's order so columns stay in a stable order. */
  protected choose(selected: string[]): void {
    const order = this.choices().map((c) => c.key);
    const rank = (key: string) => (order.includes(key) ? order.indexOf(key) : order.length);
    this.show([...selected].sort((a, b) => rank(a) - rank(b)));
  }

  protected chainOf(key: string): string {
    return parseEntry(key).chainId;
  }

  protected remove(id: string): void {
    this.show(this.ids().filter((i) => i !== id));
  }

  private show(ids: string[]): void {
    void this.router.navigate(['/w', this.workspaceId(), 'compare'], {
      queryParams: { chains: ids.slice(0, MAX_COMPARED).join(',') || null },
    });
  }

  private load(id: string) {
    const { chainId, modeId } = parseEntry(id);
    return forkJoin({
      chain: this.api.get(chainId),
      // A chain the engine refuses (422) is shown in place, not in a snackbar.
      result: this.api
        .analysis(chainId, new HttpContext().set(SKIP_ERROR_SNACKBAR, [422]), modeId ?? undefined)
        .pipe(catchError(() => of(null))),
    }).pipe(
      map(({ chain, result }): Loaded => ({
        id,
        chainId,
        modeId,
        chain,
        result,
        failure: result
          ? ''
          : modeId
            ? `the engine could not analyse this chain in the mode "${modeId}"`
            : 'the engine could not analyse this chain',
      })),
      catchError((error: unknown) =>
        of<Loaded>({
          id,
          chainId,
          modeId,
          chain: null,
          result: null,
          failure: describeHttpError(error),
        }),
      ),
    );
  }
}

/** A column's heading: the chain's name, and the mode's when the column is one mode. */
function columnName(l: Loaded): string {
  if (!l.chain) return 'Chain not found';
  if (!l.modeId) return l.chain.name;
  const mode = findMode(l.chain.document, l.modeId);
  return `${l.chain.name} · ${mode?.name ?? `no mode “${l.modeId}”`}`;
}
