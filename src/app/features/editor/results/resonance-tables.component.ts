import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatTableModule } from '@angular/material/table';
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

/**
 * Every resonator's Q and bandwidth with and without the downstream side attached (the
 * "does the next stage load the tank?" question), whether its stage declared it or the
 * analysis found it in the network, and the cumulative selectivity per node.
 */
@Component({
  selector: 'cw-resonance-tables',
  imports: [MatTableModule],
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

  protected readonly resonatorColumns = computed(() =>
    this.resonators().some((r) => r.pairPeak !== '')
      ? [...RESONATOR_COLUMNS.slice(0, 3), PAIR_COLUMN, ...RESONATOR_COLUMNS.slice(3)]
      : RESONATOR_COLUMNS,
  );
  protected readonly offsetColumns = computed(() =>
    this.offsetHeadings().map((heading, i) => ({ id: `offset${i}`, heading, index: i })),
  );
  protected readonly selectivityColumns = computed(() => [
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
