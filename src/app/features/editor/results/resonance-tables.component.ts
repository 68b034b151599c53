import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatTableModule } from '@angular/material/table';
import type { LoadingState, ResonatorRow, SelectivityRow } from './detail-rows';

const LOADING_TEXT: Record<LoadingState, string> = {
  fine: 'light',
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

/**
 * Every resonator's Q and bandwidth with and without the downstream side attached (the
 * "does the next stage load the tank?" question), and the cumulative selectivity per node.
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

  protected readonly resonatorColumns = RESONATOR_COLUMNS;
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
