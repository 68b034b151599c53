import { CdkDrag, CdkDragPlaceholder, CdkDropList } from '@angular/cdk/drag-drop';
import { ChangeDetectionStrategy, Component, computed, input, output, signal } from '@angular/core';
import type { StageCategory, StageTypeInfo } from '../../../../../shared/engine/types';
import { GlyphComponent } from '../icons/glyph.component';
import { StageSymbolComponent } from '../icons/stage-symbol.component';

/** Palette groups in the order a signal meets them. */
const GROUPS: { category: StageCategory; title: string }[] = [
  { category: 'source', title: 'Sources' },
  { category: 'coupler', title: 'Couplers' },
  { category: 'matching', title: 'Matching' },
  { category: 'filter', title: 'Filters' },
  { category: 'amplifier', title: 'Amplifiers' },
  { category: 'mixer', title: 'Mixers' },
  { category: 'load', title: 'Detectors & loads' },
  { category: 'element', title: 'Elements' },
];

/**
 * Every stage type, grouped by category, with a search box. Types are dragged into the
 * strip (its drop list id is `stripListId`); the "+" button inserts after the selected
 * stage for keyboard and pointer users alike.
 */
@Component({
  selector: 'cw-stage-palette',
  imports: [CdkDropList, CdkDrag, CdkDragPlaceholder, StageSymbolComponent, GlyphComponent],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './stage-palette.component.html',
  styleUrl: './stage-palette.component.scss',
})
export class StagePaletteComponent {
  readonly types = input.required<StageTypeInfo[]>();
  readonly stripListId = input.required<string>();
  readonly readOnly = input(false);
  /** Insert this type after the selected stage. */
  readonly insert = output<StageTypeInfo>();

  protected readonly query = signal('');
  protected readonly groups = computed(() => {
    const q = this.query().trim().toLowerCase();
    const matches = (t: StageTypeInfo) =>
      q === '' || `${t.label} ${t.summary} ${t.type}`.toLowerCase().includes(q);
    return GROUPS.map((g) => ({
      ...g,
      types: this.types().filter((t) => t.category === g.category && matches(t)),
    })).filter((g) => g.types.length > 0);
  });

  /** The palette gives stages away but never takes any back. */
  protected readonly refuseDrops = () => false;

  protected onSearch(event: Event): void {
    this.query.set((event.target as HTMLInputElement).value);
  }
}
