import { HttpContext } from '@angular/common/http';
import {
  ChangeDetectionStrategy,
  Component,
  DOCUMENT,
  DestroyRef,
  computed,
  effect,
  inject,
  input,
  signal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { Title } from '@angular/platform-browser';
import { RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import type { AnalysisResult, StageTypeInfo } from '../../../../shared/engine/types';
import type { ChainDocument } from '../../../../shared/schema/chain';
import { exportFileName } from '../../../../shared/io/export-name';
import { ChainsApi } from '../../core/api/chains.api';
import { ColleaguesApi } from '../../core/api/colleagues.api';
import { significantFigures } from '../../core/format/number-format';
import { describeHttpError } from '../../core/http/error-message';
import { SKIP_ERROR_SNACKBAR } from '../../core/http/http-context';
import { SessionStore } from '../../core/session/session.store';
import { StageSymbolComponent } from '../editor/icons/stage-symbol.component';
import { PLOTLY_LOADER } from '../editor/results/plotly-loader';
import { AnalysisApi } from '../editor/state/analysis-api';
import { documentForResults, findMode, hasTransmitMode, modesOf } from '../editor/modes/mode-edits';
import { type ReportPlot, drawReportPlots, reportPlotSpecs } from './report-plots';
import { reportModel } from './report-model';
import { TRANSMIT_NOTE } from './report-transmit';
import { TransmitTablesComponent } from '../editor/modes/transmit-tables.component';
import { PAGE_SIZES, PageSizeStore, type PageSize } from './page-size';

/** What the report is of, however it was reached. */
interface ReportSource {
  name: string;
  description: string;
  version: number;
  updatedAt: string;
  /** Where it came from, in words ("workspace “Bench”", "read-only link"). */
  origin: string;
  document: ChainDocument;
  /** What the results read against: the mode's stages, values and order, or the chain's. */
  resultsDocument: ChainDocument;
  /** The mode reported, or null for the chain as written. */
  modeId: string | null;
  modeName: string | null;
  analysis: AnalysisResult | null;
  analysisError: string | null;
}

/**
 * The chain as a printable page, at /w/:workspaceId/chains/:chainId/report and
 * /shared/:token/report: the strip, budget, resonators, selectivity, flags, plots as
 * pictures, the mode and revision, and the cautions. The browser prints it to paper or
 * PDF in A4 or Letter (the choice sets the page's `@page` size); on screen it reads as a
 * sheet of that size. It shows the saved chain, never unsaved edits.
 */
@Component({
  selector: 'cw-report-page',
  imports: [
    MatButtonModule,
    MatButtonToggleModule,
    RouterLink,
    StageSymbolComponent,
    TransmitTablesComponent,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './report-page.component.html',
  styleUrl: './report-page.component.scss',
  host: { '[attr.data-page-size]': 'pageSize.size()' },
})
export default class ReportPageComponent {
  /** From the route: a workspace chain… */
  readonly workspaceId = input<string>();
  readonly chainId = input<string>();
  /** …or a read-only link. */
  readonly token = input<string>();
  /** From the query: the mode to report (`?mode=ID`); none: the chain as written. */
  readonly mode = input<string>();

  private readonly chains = inject(ChainsApi);
  private readonly colleagues = inject(ColleaguesApi);
  private readonly analysisApi = inject(AnalysisApi);
  private readonly session = inject(SessionStore);
  private readonly loadPlotly = inject(PLOTLY_LOADER);
  private readonly title = inject(Title);
  private readonly page = inject(DOCUMENT);
  protected readonly pageSize = inject(PageSizeStore);
  protected readonly sizes = PAGE_SIZES;
  protected readonly transmitNote = TRANSMIT_NOTE;

  protected readonly source = signal<ReportSource | null>(null);
  private readonly types = signal<ReadonlyMap<string, StageTypeInfo>>(new Map());
  protected readonly failure = signal('');
  protected readonly plots = signal<ReportPlot[]>([]);
  /** 'drawing' until the pictures are in, so a print waits for them (data-plots on the page). */
  protected readonly plotState = signal<'drawing' | 'ready' | 'none' | 'failed'>('drawing');
  protected readonly printedAt = new Date().toISOString().slice(0, 16).replace('T', ' ');

  protected readonly model = computed(() => {
    const s = this.source();
    return s
      ? reportModel(s.resultsDocument, s.analysis, this.types(), hasTransmitMode(s.document))
      : null;
  });

  /** The mode line of the report's head. */
  protected readonly modeText = computed(() => {
    const s = this.source();
    if (!s) return '';
    if (s.modeName) return s.modeName;
    return modesOf(s.document).length > 0
      ? 'the chain as written (no mode applied)'
      : 'the chain as written (no modes)';
  });

  /** Back to where the report was opened from. */
  protected readonly backLink = computed(() => {
    const token = this.token();
    if (token) return ['/shared', token];
    return ['/w', this.workspaceId(), 'chains', this.chainId()];
  });

  /** The name a PDF saved from the print dialog gets (browsers take it from the title). */
  protected readonly fileTitle = computed(() => {
    const s = this.source();
    const m = this.model();
    if (!s || !m) return 'report';
    return exportFileName({
      chainName: s.name,
      // The mode's id, as the other exports name it.
      mode: s.modeId,
      referenceOhm: m.referenceOhm,
      content: 'report',
      extension: 'pdf',
    }).replace(/\.pdf$/, '');
  });

  constructor() {
    effect(() => void this.load(this.token(), this.chainId(), this.workspaceId(), this.mode()));
    effect(() => {
      if (this.source()) this.title.setTitle(this.fileTitle());
    });
    // Print rules that reach outside this component (the shell's toolbar) key on this class.
    const root = this.page.documentElement;
    root.classList.add('cw-report-open');
    inject(DestroyRef).onDestroy(() => root.classList.remove('cw-report-open'));
  }

  protected choose(size: PageSize): void {
    this.pageSize.set(size);
  }

  protected print(): void {
    this.page.defaultView?.print();
  }

  private async load(
    token?: string,
    chainId?: string,
    workspaceId?: string,
    modeId?: string,
  ): Promise<void> {
    this.failure.set('');
    try {
      const source = token
        ? await this.fromLink(token, modeId)
        : chainId
          ? await this.fromWorkspace(chainId, workspaceId, modeId)
          : null;
      if (!source) return;
      this.source.set(source);
      await this.drawPlots(source);
    } catch (error) {
      this.failure.set(describeHttpError(error));
    }
  }

  private async fromLink(token: string, modeId?: string): Promise<ReportSource> {
    const context = new HttpContext().set(SKIP_ERROR_SNACKBAR, [404]);
    const figures = significantFigures();
    const shared = await firstValueFrom(this.colleagues.shared(token, context, figures));
    // The link's own catalogue: a signed-out reader sees names and units too.
    const types = await firstValueFrom(this.colleagues.sharedCatalogue(token, context));
    this.types.set(new Map(types.map((t) => [t.type, t])));
    // A chain with modes: the mode asked for, else the first, as the share page shows it.
    const modes = shared.modes ?? [];
    const shown = modes.find((m) => m.id === modeId) ?? modes[0] ?? null;
    return {
      name: shared.name,
      description: shared.description,
      version: shared.version,
      updatedAt: shared.updatedAt,
      origin: `read-only link from the workspace “${shared.workspaceName}”`,
      document: shared.document,
      resultsDocument: documentForResults(
        shared.document,
        shown ? findMode(shared.document, shown.id) : null,
      ),
      modeId: shown?.id ?? null,
      modeName: shown?.name ?? null,
      analysis: ((shown ? shown.analysis : shared.analysis) as AnalysisResult | null) ?? null,
      analysisError: (shown ? shown.analysisError : shared.analysisError) ?? null,
    };
  }

  private async fromWorkspace(
    chainId: string,
    workspaceId?: string,
    modeId?: string,
  ): Promise<ReportSource> {
    const [chain] = await Promise.all([firstValueFrom(this.chains.get(chainId)), this.loadTypes()]);
    const mode = modeId ? findMode(chain.document, modeId) : null;
    if (modeId && !mode) throw new Error(`This chain has no mode "${modeId}".`);
    // As the editor does: the chain as written is the document without its modes.
    const resultsDocument = documentForResults(chain.document, mode);
    let analysis: AnalysisResult | null = null;
    let analysisError: string | null = null;
    try {
      // The flag sentences at the user's figures, as on the rest of the report.
      const figures = significantFigures();
      analysis = await firstValueFrom(
        mode
          ? this.analysisApi.analyse(chain.document, workspaceId, mode.id, figures)
          : this.analysisApi.analyse(resultsDocument, workspaceId, undefined, figures),
      );
    } catch (error) {
      analysisError = describeHttpError(error);
    }
    const workspace = this.session.memberships().find((m) => m.workspaceId === workspaceId);
    return {
      name: chain.name,
      description: chain.description,
      version: chain.version,
      updatedAt: chain.updatedAt,
      origin: workspace ? `workspace “${workspace.workspaceName}”` : 'workspace',
      document: chain.document,
      resultsDocument,
      modeId: mode?.id ?? null,
      modeName: mode?.name ?? null,
      analysis,
      analysisError,
    };
  }

  private async loadTypes(): Promise<void> {
    const list = await firstValueFrom(this.analysisApi.catalogue());
    this.types.set(new Map(list.map((t) => [t.type, t])));
  }

  private async drawPlots(source: ReportSource): Promise<void> {
    const specs = source.analysis ? reportPlotSpecs(source.analysis, source.document) : [];
    if (specs.length === 0) {
      this.plotState.set('none');
      return;
    }
    try {
      this.plots.set(await drawReportPlots(await this.loadPlotly(), specs));
      this.plotState.set('ready');
    } catch {
      this.plotState.set('failed');
    }
  }
}
