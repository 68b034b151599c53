import { ChangeDetectionStrategy, Component, computed, inject, input, output } from '@angular/core';
import { MatTableModule } from '@angular/material/table';
import { ColumnChoiceStore } from '../../../core/tables/column-choice';
import {
  ColumnMenuComponent,
  type ChoosableColumn,
} from '../../../core/tables/column-menu.component';
import { ScrollFrameComponent } from '../../../core/tables/scroll-frame.component';
import type { LoadingState, ResonatorRow, SelectivityRow } from './detail-rows';

const LOADING_TEXT: Record<LoadingState, string> = {
  fine: 'light',
  matched: 'matched',
  warning: 'heavy',
  error: 'severe',
  unknown: '',
};

const RESONATOR_COLUMNS = [
  'stage',
  'resonator',
  'resonance',
  'loadedQ',
  'unloadedQ',
  'bandwidth',
  'detachedQ',
  'detachedBandwidth',
  'loadingRatio',
  'downstreamShare',
];
/** Shown only when a coupled pair is in the chain. */
const PAIR_COLUMN = 'pairPeak';

/** Headings of the columns the user may hide, in the menu's words (the label column stays). */
const RESONATOR_LABELS: Record<string, string> = {
  resonator: 'Resonator',
  resonance: 'Resonant frequency',
  pairPeak: 'Pair peaks at',
  loadedQ: 'Loaded Q',
  unloadedQ: 'Unloaded Q',
  bandwidth: 'Bandwidth',
  detachedQ: 'Q detached',
  detachedBandwidth: 'Bandwidth detached',
  loadingRatio: 'Loading ratio',
  downstreamShare: 'Downstream share',
};
const SELECTIVITY_LABELS: Record<string, string> = {
  peak: 'Peak at',
  peakStepUp: 'Peak step-up',
  bw3: '−3 dB width',
  bw60: '−60 dB width',
  shapeFactor: 'Shape factor',
  image: 'Image at',
  imageRejection: 'Image rejection',
};

/**
 * Every resonator's Q and bandwidth with and without the downstream side attached (the
 * "does the next stage load the tank?" question), whether its stage declared it or the
 * analysis found it in the network, and the cumulative selectivity per node.
 */
@Component({
  selector: 'cw-resonance-tables',
  imports: [MatTableModule, ColumnMenuComponent, ScrollFrameComponent],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './resonance-tables.component.html',
  styleUrl: './resonance-tables.component.scss',
})
export class ResonanceTablesComponent {
  readonly resonators = input.required<ResonatorRow[]>();
  readonly selectivity = input.required<SelectivityRow[]>();
  /** Column headings for the stated offsets, in the order of `SelectivityRow.offsets`. */
  readonly offsetHeadings = input.required<string[]>();
  readonly selectedStageId = input<string | null>(null);
  readonly stageSelected = output<string>();

  private readonly choices = inject(ColumnChoiceStore);
  protected readonly resonatorTable = 'resonators';
  protected readonly selectivityTable = 'selectivity';
  protected readonly hiddenResonatorColumns = this.choices.hidden(this.resonatorTable);
  protected readonly hiddenSelectivityColumns = this.choices.hidden(this.selectivityTable);

  /** Every column this chain has, before the user's choice. */
  private readonly allResonatorColumns = computed(() =>
    this.resonators().some((r) => r.pairPeak !== '')
      ? [...RESONATOR_COLUMNS.slice(0, 3), PAIR_COLUMN, ...RESONATOR_COLUMNS.slice(3)]
      : RESONATOR_COLUMNS,
  );
  protected readonly resonatorChoices = computed<ChoosableColumn[]>(() =>
    this.allResonatorColumns()
      .slice(1)
      .map((id) => ({ id, label: RESONATOR_LABELS[id] ?? id })),
  );
  protected readonly resonatorColumns = computed(() => {
    const hidden = this.hiddenResonatorColumns();
    return this.allResonatorColumns().filter((id) => !hidden.has(id));
  });
  protected readonly offsetColumns = computed(() =>
    this.offsetHeadings().map((heading, i) => ({ id: `offset${i}`, heading, index: i })),
  );
  private readonly allSelectivityColumns = computed(() => [
    'node',
    'peak',
    'peakStepUp',
    'bw3',
    'bw60',
    'shapeFactor',
    ...this.offsetColumns().map((c) => c.id),
    'image',
    'imageRejection',
  ]);
  protected readonly selectivityChoices = computed<ChoosableColumn[]>(() => {
    const offsets = new Map(this.offsetColumns().map((c) => [c.id, `At ${c.heading}`]));
    return this.allSelectivityColumns()
      .slice(1)
      .map((id) => ({ id, label: SELECTIVITY_LABELS[id] ?? offsets.get(id) ?? id }));
  });
  protected readonly selectivityColumns = computed(() => {
    const hidden = this.hiddenSelectivityColumns();
    return this.allSelectivityColumns().filter((id) => !hidden.has(id));
  });

  protected choose(table: string, id: string, show: boolean): void {
    this.choices.setHidden(table, id, !show);
  }

  protected showAll(table: string): void {
    this.choices.showAll(table);
  }

  protected loadingText(state: LoadingState): string {
    return LOADING_TEXT[state];
  }

  /** Template helpers: Material's cell context is untyped, so narrow it here. */
  protected resonator(row: ResonatorRow): ResonatorRow {
    return row;
  }
  protected selective(row: SelectivityRow): SelectivityRow {
    return row;
  }
}
