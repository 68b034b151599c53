import { DatePipe } from '@angular/common';
import { HttpContext, HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatMenuModule } from '@angular/material/menu';
import { MatPaginatorModule, PageEvent } from '@angular/material/paginator';
import { MatSortModule, Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { MatTooltipModule } from '@angular/material/tooltip';
import { Router, RouterLink } from '@angular/router';
import {
  catchError,
  debounceTime,
  distinctUntilChanged,
  map,
  of,
  firstValueFrom,
  startWith,
  switchMap,
  tap,
} from 'rxjs';
import type { ChainListDto, ChainSummaryDto } from '../../../../shared/schema/api';
import { ChainsApi } from '../../core/api/chains.api';
import { describeHttpError } from '../../core/http/error-message';
import { SKIP_ERROR_SNACKBAR } from '../../core/http/http-context';
import { SessionStore } from '../../core/session/session.store';
import { compareQueryOf, inFamily } from '../compare/compare-entry';
import { ChainActions } from './chain-actions';
import { underParents } from './variant-order';
import { nominalEngineering } from '../editor/results/format-quantity';

export type ChainSortKey = 'name' | 'f0Hz' | 'stageCount' | 'flagCount' | 'updatedAt';
const SORT_KEYS: readonly string[] = ['name', 'f0Hz', 'stageCount', 'flagCount', 'updatedAt'];

/** How long typing in the filter must pause before the list is asked again. */
export const FILTER_DEBOUNCE_MS = 300;

interface ListState {
  list: ChainListDto | null;
  failure: string;
  loading: boolean;
}

/** The chains of one workspace: server-side filter, sort and paging. */
@Component({
  selector: 'cw-chain-list',
  imports: [
    DatePipe,
    ReactiveFormsModule,
    RouterLink,
    MatTableModule,
    MatSortModule,
    MatPaginatorModule,
    MatFormFieldModule,
    MatInputModule,
    MatButtonModule,
    MatIconModule,
    MatTooltipModule,
    MatMenuModule,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './chain-list.component.html',
  styleUrl: './chain-list.component.scss',
})
export default class ChainListComponent {
  protected readonly session = inject(SessionStore);
  private readonly api = inject(ChainsApi);
  private readonly router = inject(Router);
  private readonly actions = inject(ChainActions);

  /** From the route. */
  readonly workspaceId = input.required<string>();

  protected readonly pageSizeOptions = [10, 25, 50, 100];
  protected readonly filter = new FormControl('', { nonNullable: true });
  protected readonly page = signal({ index: 0, size: 25 });
  protected readonly sort = signal<{ key: ChainSortKey; dir: 'asc' | 'desc' }>({
    key: 'updatedAt',
    dir: 'desc',
  });
  private readonly reloads = signal(0);

  private readonly q = toSignal(
    this.filter.valueChanges.pipe(
      debounceTime(FILTER_DEBOUNCE_MS),
      map((text) => text.trim()),
      distinctUntilChanged(),
      // A new filter starts again at the first page.
      tap(() => this.page.update((p) => ({ ...p, index: 0 }))),
    ),
    { initialValue: '' },
  );

  private readonly request = computed(() => ({
    workspaceId: this.workspaceId(),
    query: {
      q: this.q(),
      page: this.page().index,
      pageSize: this.page().size,
      sort: this.sort().key,
      dir: this.sort().dir,
    },
    reload: this.reloads(),
  }));

  private readonly state = toSignal(
    toObservable(this.request).pipe(
      switchMap(({ workspaceId, query }) =>
        this.api.list(workspaceId, query).pipe(
          map((list): ListState => ({ list, failure: '', loading: false })),
          catchError((error: unknown) =>
            of<ListState>({ list: null, failure: describeHttpError(error), loading: false }),
          ),
          startWith<ListState>({ list: null, failure: '', loading: true }),
        ),
      ),
    ),
    { initialValue: { list: null, failure: '', loading: true } satisfies ListState },
  );

  // Keep the last rows on screen while the next page loads, so the table does not flicker.
  private lastList: ChainListDto | null = null;
  protected readonly list = computed(() => {
    const state = this.state();
    if (state.list || !state.loading) this.lastList = state.list;
    return this.lastList;
  });
  protected readonly loading = computed(() => this.state().loading);
  protected readonly failure = computed(() => this.state().failure);
  // Variants follow their parent on the page, indented.
  protected readonly rows = computed(() =>
    underParents(this.list()?.items ?? []).map(({ item: chain, nested }) => ({
      chain,
      nested,
      f0: nominalEngineering(chain.f0Hz, 'hertz'), // the design frequency, as stated
      comparable: inFamily(chain),
    })),
  );
  // Viewers get the column too when a row can be compared (comparing is read only).
  protected readonly columns = computed(() => {
    const base = ['name', 'f0Hz', 'stageCount', 'flagCount', 'updatedAt', 'createdBy'];
    const any = this.session.canEdit() || this.rows().some((r) => r.comparable);
    return any ? [...base, 'actions'] : base;
  });
  protected readonly filtered = computed(() => this.q() !== '');

  /** Rows are rebuilt on every answer; keep the DOM of chains that are still listed. */
  protected readonly trackRow = (_index: number, row: { chain: ChainSummaryDto }) => row.chain.id;

  protected onSort(sort: Sort): void {
    const key = SORT_KEYS.includes(sort.active) ? (sort.active as ChainSortKey) : 'updatedAt';
    // Clearing the sort falls back to the server's default, newest change first.
    this.sort.set(
      sort.direction ? { key, dir: sort.direction } : { key: 'updatedAt', dir: 'desc' },
    );
    this.page.update((p) => ({ ...p, index: 0 }));
  }

  protected onPage(event: PageEvent): void {
    this.page.set({ index: event.pageIndex, size: event.pageSize });
  }

  protected open(chain: ChainSummaryDto): void {
    void this.router.navigate(['/w', chain.workspaceId, 'chains', chain.id]);
  }

  /** Why the last chain file was refused (its line and column or field), or ''. */
  protected readonly importRefusal = signal('');

  /** Imports an exported `.chain.json` and opens the new chain. */
  protected async importFile(event: Event): Promise<void> {
    const inputEl = event.target as HTMLInputElement;
    const file = inputEl.files?.[0];
    inputEl.value = '';
    if (!file) return;
    this.importRefusal.set('');
    try {
      const text = await file.text();
      const context = new HttpContext().set(SKIP_ERROR_SNACKBAR, [413, 422]);
      const done = await firstValueFrom(
        this.api.importFile(this.workspaceId(), text, file.name, context),
      );
      void this.router.navigate(['/w', done.chain.workspaceId, 'chains', done.chain.id]);
    } catch (err) {
      const message =
        err instanceof HttpErrorResponse && typeof err.error?.message === 'string'
          ? (err.error.message as string)
          : describeHttpError(err);
      this.importRefusal.set(`The chain file was not imported: ${message}`);
    }
  }

  protected async create(): Promise<void> {
    if (await this.actions.createWithDialog(this.workspaceId())) this.reload();
  }

  // The row actions live in a menu (an overlay, outside the row): their clicks never reach
  // the row, and must reach the menu, which closes on them.
  protected async rename(chain: ChainSummaryDto): Promise<void> {
    if (await this.actions.rename(chain)) this.reload();
  }

  protected async duplicate(chain: ChainSummaryDto): Promise<void> {
    if (await this.actions.duplicate(chain)) this.reload();
  }

  protected async saveAsVariant(chain: ChainSummaryDto): Promise<void> {
    if (await this.actions.saveAsVariant(chain)) this.reload();
  }

  /** Opens the comparison of the chain with the rest of its family. */
  protected async compare(chain: ChainSummaryDto): Promise<void> {
    try {
      const query = compareQueryOf(await firstValueFrom(this.api.family(chain.id)), chain.id);
      if (query) {
        void this.router.navigate(['/w', chain.workspaceId, 'compare'], { queryParams: query });
      }
    } catch {
      // The error interceptor has shown why.
    }
  }

  protected async remove(chain: ChainSummaryDto): Promise<void> {
    if (await this.actions.remove(chain)) this.reload();
  }

  protected reload(): void {
    this.reloads.update((n) => n + 1);
  }
}
