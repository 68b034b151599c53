import {
  ChangeDetectionStrategy,
  Component,
  DOCUMENT,
  computed,
  effect,
  inject,
  input,
  output,
  signal,
} from '@angular/core';
import { MatTabsModule } from '@angular/material/tabs';
import type { ChainDocument } from '../../../../../shared/schema/chain';
import type { AnalysisResult } from '../../../../../shared/engine/types';
import type { CsvTable } from '../../../../../shared/io/csv-writer';
import { chainReferenceOhm } from '../../../../../shared/io/export-name';
import {
  flagsCsv,
  levelsCsv,
  resonatorsCsv,
  selectivityCsv,
} from '../../../../../shared/io/result-csv';
import { CsvButtonComponent } from '../../report/csv-button.component';
import { csvFileName } from './budget-csv';
import { budgetTable, nodeOfStage } from './budget-rows';
import { BudgetTableComponent } from './budget-table.component';
import {
  flagCounts,
  flagItems,
  offsetHeadings,
  resonatorRows,
  selectivityRows,
  summaryItems,
} from './detail-rows';
import { FlagsListComponent } from './flags-list.component';
import { ResonanceTablesComponent } from './resonance-tables.component';
import { PLOTLY_LOADER } from './plotly-loader';
import { prefetchWhenIdle, warmPlotly } from './plot-timing';
import { ResultPlotsComponent } from './result-plots.component';
import { SummaryPanelComponent } from './summary-panel.component';
import { TRANSMIT_HEADLINE } from './transmit-summary';

const RECEIVE_HEADLINE = ['nf', 'gain', 'sensitivity', 'sfdr'];
import { PlanViewComponent } from '../plan/plan-view.component';

/**
 * The results of one analysis of the chain: budget by node, resonators and selectivity,
 * flags, sweep plots and the headline figures. Selecting a node column, resonator or flag
 * asks the editor to select that stage.
 */
@Component({
  selector: 'cw-analysis-results',
  imports: [
    MatTabsModule,
    BudgetTableComponent,
    FlagsListComponent,
    ResonanceTablesComponent,
    ResultPlotsComponent,
    SummaryPanelComponent,
    PlanViewComponent,
    CsvButtonComponent,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './analysis-results.component.html',
  styleUrl: './analysis-results.component.scss',
})
export class AnalysisResultsComponent {
  /** The latest analysis, or null while none has arrived (or it failed). */
  readonly result = input.required<AnalysisResult | null>();
  /** The chain the result belongs to: labels, thresholds, sweep scale. */
  readonly document = input.required<ChainDocument>();
  readonly selectedStageId = input<string | null>(null);
  /** Emits the id of a stage the user picked from the results. */
  readonly stageSelected = output<string>();

  constructor() {
    // The plotting library is large: once a result with a sweep shows, fetch it and draw a
    // hidden plot with it while the browser is idle, so the Plots tab opens straight to
    // drawing.
    const load = inject(PLOTLY_LOADER);
    const page = inject(DOCUMENT);
    const view = page.defaultView;
    let prefetched = false;
    effect(() => {
      const sweep = this.result()?.sweep;
      if (prefetched || !sweep || sweep.freqsHz.length < 2) return;
      prefetched = true;
      prefetchWhenIdle(load, view, (plotly) => warmPlotly(plotly, page));
    });
  }

  /** Kept across new results so an edit does not throw the user back to the first tab. */
  protected readonly tabIndex = signal(0);

  /** The reference impedance the exported figures are named with. */
  protected readonly referenceOhm = computed(() => chainReferenceOhm(this.document().settings));

  /** A CSV file's name for one of the tables. */
  protected csvName(content: string): string {
    return csvFileName(this.document().name, content, this.referenceOhm());
  }

  /** Builders of each table's CSV, run when its button is pressed. */
  protected readonly csv = {
    resonators: () => this.tablesOf((r, d) => resonatorsCsv(r, d)),
    selectivity: () => this.tablesOf((r) => selectivityCsv(r)),
    flags: () => this.tablesOf((r, d) => flagsCsv(r, d)),
    levels: () => this.tablesOf((r, d) => levelsCsv(r, d)),
  };

  private tablesOf(build: (r: AnalysisResult, d: ChainDocument) => CsvTable): CsvTable[] {
    const result = this.result();
    return result ? [build(result, this.document())] : [];
  }

  protected readonly budget = computed(() => {
    const result = this.result();
    return result ? budgetTable(result, this.document()) : null;
  });
  protected readonly selectedNode = computed(() => {
    const result = this.result();
    return result ? nodeOfStage(this.selectedStageId(), result, this.document()) : null;
  });
  protected readonly resonators = computed(() => {
    const result = this.result();
    return result ? resonatorRows(result, this.document()) : [];
  });
  protected readonly selectivity = computed(() => {
    const result = this.result();
    return result ? selectivityRows(result) : [];
  });
  protected readonly offsets = computed(() => offsetHeadings(this.document()));
  protected readonly flags = computed(() => {
    const result = this.result();
    return result ? flagItems(result, this.document()) : [];
  });
  protected readonly counts = computed(() => {
    const result = this.result();
    return result ? flagCounts(result) : { error: 0, warning: 0, info: 0 };
  });
  protected readonly summary = computed(() => {
    const result = this.result();
    return result ? summaryItems(result, this.document()) : [];
  });
  /** The four figures shown above the tabs (a transmitter's in a transmit mode). */
  protected readonly headline = computed(() => {
    const keys = this.result()?.transmit ? TRANSMIT_HEADLINE : RECEIVE_HEADLINE;
    return this.summary().filter((s) => keys.includes(s.key));
  });

  protected readonly flagsTabLabel = computed(() => {
    const { error, warning, info } = this.counts();
    const parts = [
      error ? `${error} error${error > 1 ? 's' : ''}` : '',
      warning ? `${warning} warning${warning > 1 ? 's' : ''}` : '',
      info ? `${info} note${info > 1 ? 's' : ''}` : '',
    ].filter(Boolean);
    return parts.length ? `Flags (${parts.join(', ')})` : 'Flags (none)';
  });
}
