import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { GlyphComponent } from '../icons/glyph.component';
import type { FlagItem } from './detail-rows';

/**
 * The analysis flags, worst first. Severity is told three ways (colour, icon shape and
 * word) so it survives colour blindness and greyscale print. Activating a flag selects
 * the stage it concerns.
 */
@Component({
  selector: 'cw-flags-list',
  imports: [GlyphComponent],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './flags-list.component.html',
  styleUrl: './flags-list.component.scss',
})
export class FlagsListComponent {
  readonly items = input.required<FlagItem[]>();
  readonly selectedStageId = input<string | null>(null);
  /** Emits the id of the stage whose flag was activated. */
  readonly stageSelected = output<string>();
}
