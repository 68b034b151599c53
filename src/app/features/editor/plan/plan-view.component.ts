import { HttpClient, HttpContext } from '@angular/common/http';
import { DOCUMENT } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  linkedSignal,
  signal,
} from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatSelectModule } from '@angular/material/select';
import { catchError, debounceTime, map, of, startWith, switchMap } from 'rxjs';
import type { PlanReport } from '../../../../../shared/engine/planning/plan';
import type { AnalysisResult } from '../../../../../shared/engine/types';
import {
  planningSchema,
  type ChainDocument,
  type PlanningSettings,
  type StageInstance,
} from '../../../../../shared/schema/chain';
import { parseQuantity } from '../../../../../shared/units';
import { significantFigures } from '../../../core/format/number-format';
import { SKIP_ERROR_SNACKBAR } from '../../../core/http/http-context';
import { QuantityFieldComponent, type QuantityEdit } from '../params/quantity-field.component';
import { themePalette } from '../results/plot-theme';
import { ResultPlotComponent } from '../results/result-plot.component';
import { EditorStore } from '../state/editor.store';
import { csvFileName } from '../results/budget-csv';
import { planFigureRows, spurRows } from '../../../../../shared/io/plan-text';
import { csvFromRows } from '../../../../../shared/io/csv-writer';
import { chainReferenceOhm } from '../../../../../shared/io/export-name';
import { saveCsv } from '../../report/csv-download';
import {
  KIND_LABEL,
  parseProfile,
  profileText,
  rejectionBand,
  sortSpurs,
  spurChartFigure,
  type SpurSortKey,
} from './plan-figures';
import {
  engineering,
  fieldText,
  figures,
  nominalEngineering,
  percent,
  plain,
} from '../results/format-quantity';

type PlanState = { status: 'loading' } | { status: 'ready'; plan: PlanReport } | { status: 'failed'; message: string }; // prettier-ignore

/**
 * The receiver plan of the chain on screen: the spur chart and table, the IF choice,
 * strong signals (blocking, off-channel intermodulation, reciprocal mixing), the noise from
 * outside and the converter. Its inputs are the chain's planning settings (and the mixer's
 * IF), edited here as undoable edits of the chain; the plan itself is asked of the server
 * with every change, the stale request cancelled.
 */
@Component({
  selector: 'cw-plan-view',
  imports: [
    MatButtonModule,
    MatSelectModule,
    MatCheckboxModule,
    QuantityFieldComponent,
    ResultPlotComponent,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './plan-view.component.html',
  styleUrl: './plan-view.component.scss',
})
export class PlanViewComponent {
  readonly document = input.required<ChainDocument>();

  private readonly http = inject(HttpClient);
  private readonly page = inject(DOCUMENT);
  protected readonly store = inject(EditorStore);
  protected readonly sortKey = signal<SpurSortKey>('rejection');

  protected readonly state = toSignal(
    toObservable(
      computed(() => ({
        doc: this.document(),
        wid: this.store.chain()?.workspaceId ?? null,
        // The server writes a refusal's values at the user's figures, as the screen does.
        digits: significantFigures(),
      })),
    ).pipe(
      debounceTime(150),
      switchMap(({ doc, wid, digits }) =>
        this.http
          .post<AnalysisResult>(
            '/api/analysis',
            {
              document: doc,
              sweep: false,
              plan: 'full',
              figures: digits,
              ...(wid ? { workspaceId: wid } : {}),
            },
            { context: new HttpContext().set(SKIP_ERROR_SNACKBAR, [422]) },
          )
          .pipe(
            map((r): PlanState => ({ status: 'ready', plan: r.plan! })),
            catchError(
              (e: { error?: { message?: string } }) =>
              of<PlanState>({ status: 'failed', message: e.error?.message ?? 'the plan could not be worked out' }), // prettier-ignore
            ),
            startWith<PlanState>({ status: 'loading' }),
          ),
      ),
    ),
    { initialValue: { status: 'loading' } as PlanState },
  );
  /** The last plan that arrived, kept on screen while the next one is worked out. */
  protected readonly plan = linkedSignal<PlanState, PlanReport | null>({
    source: this.state,
    computation: (s, previous) =>
      s.status === 'ready' ? s.plan : s.status === 'failed' ? null : (previous?.value ?? null),
  });
  protected readonly failure = computed(() => {
    const s = this.state();
    return s.status === 'failed' ? s.message : null;
  });
  protected readonly settings = computed<PlanningSettings>(() =>
    planningSchema.parse(this.document().settings.planning ?? {}),
  );
  protected readonly mixerStage = computed(
    () => this.document().stages.find((s) => s.type === 'mixer' && s.values['loSource'] !== 'frequency') ?? null, // prettier-ignore
  );
  protected readonly chart = computed(() => {
    const plan = this.plan();
    return plan ? spurChartFigure(plan, themePalette(this.page)) : null;
  });
  protected readonly spurs = computed(() => sortSpurs(this.plan()?.spurs ?? [], this.sortKey()));
  protected readonly profileDraft = signal<string | null>(null);
  protected readonly profileError = signal<string | null>(null);
  protected readonly profile = computed(() => this.profileDraft() ?? profileText(this.settings().loPhaseNoise)); // prettier-ignore

  protected kindText(kind: string | null): string {
    const label: string | undefined = kind === null ? undefined : KIND_LABEL[kind];
    return label ?? kind ?? '—';
  }
  protected band(db: number | null): string {
    return rejectionBand(db, this.settings().spurTargetDb);
  }
  /** A spacing or bandwidth the user set (or a round spacing of the list): as stated. */
  protected statedHz(v: number): string {
    return nominalEngineering(v, 'hertz');
  }
  protected hz(v: number | null | undefined): string {
    return v === null || v === undefined ? 'any input' : engineering(v, 'hertz');
  }
  /** A level's number, to the user's significant figures (the unit follows in the page). */
  protected db(v: number | null | undefined): string {
    return v === null || v === undefined || !Number.isFinite(v) ? '—' : figures(v, undefined, true).replace('-', '−'); // prettier-ignore
  }
  /** A plain figure (a noise temperature) to the user's significant figures. */
  protected num(v: number | null | undefined): string {
    return plain(v).replace('-', '−');
  }
  protected text(v: number | undefined, unit: 'hertz' | 'dbm' | 'db'): string {
    return v === undefined ? '' : unit === 'hertz' ? fieldText(v, 'hertz') : String(v);
  }

  /** Downloads the plan as CSV: the spur table, then the figures (UTF-8 with a byte-order mark). */
  protected downloadCsv(): void {
    const plan = this.plan();
    if (!plan) return;
    const doc = this.document();
    const name = csvFileName(doc.name, 'plan', chainReferenceOhm(doc.settings));
    saveCsv(this.page, name, [csvFromRows(spurRows(plan)), csvFromRows(planFigureRows(plan))]);
  }

  /** What the IF field shows: what was typed, or the stored value written out. */
  protected ifText(mixer: StageInstance): string {
    const typed: string | undefined = mixer.entered?.['ifHz'];
    const value = mixer.values['ifHz'];
    return typed ?? (typeof value === 'number' ? fieldText(value, 'hertz') : '');
  }
  /** A stage's share of the off-channel IM product, as a percentage. */
  protected imShare(plan: PlanReport, i: number): string {
    const share: number | undefined = plan.intermod.stages[i]?.share;
    return share === undefined ? '—' : percent(share);
  }

  /** One planning setting changed: an undoable edit of the chain's settings. */
  protected set<K extends keyof PlanningSettings>(key: K, value: PlanningSettings[K]): void {
    const settings = this.document().settings;
    const planning = { ...this.settings(), [key]: value };
    this.store.updateSettings({ ...settings, planning }, `planning.${key}`);
  }
  protected setNumber(
    key:
      | 'spurTargetDb'
      | 'blockerOffsetHz'
      | 'blockerLevelDbm'
      | 'toneSpacingHz'
      | 'strongestSignalDbm'
      | 'tuningStartHz'
      | 'tuningStopHz',
    e: QuantityEdit,
  ): void {
    // prettier-ignore
    this.set(key, e.value);
  }
  protected setOrder(value: number): void {
    this.set('spurMaxOrder', value);
  }
  protected setAtmospheric(e: QuantityEdit): void {
    this.set('atmosphericFaDb', Number.isNaN(e.value) ? null : e.value);
  }
  /** The mixer's IF: an undoable edit of the mixer stage. */
  protected setIf(e: QuantityEdit): void {
    const stage = this.mixerStage();
    if (!stage) return;
    const entered = { ...(stage.entered ?? {}), ifHz: e.text };
    this.store.updateStage(
      { ...stage, values: { ...stage.values, ifHz: e.value }, entered },
      'ifHz',
    );
  }
  protected editProfile(text: string): void {
    this.profileDraft.set(text);
    const hz = (t: string) => {
      const r = parseQuantity(t, 'hertz');
      return r.ok ? r.value : null;
    };
    const parsed = parseProfile(text, hz);
    if (!parsed.ok) {
      this.profileError.set(parsed.message);
      return;
    }
    this.profileError.set(null);
    this.set('loPhaseNoise', parsed.profile);
  }
}
