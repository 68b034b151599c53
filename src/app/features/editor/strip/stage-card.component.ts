import { ChangeDetectionStrategy, Component, computed, inject, input, output } from '@angular/core';
import type { ChainIssue } from '../../../../../shared/engine/errors';
import type { Flag, StageTypeInfo } from '../../../../../shared/engine/types';
import type { StageInstance } from '../../../../../shared/schema/chain';
import { GlyphComponent } from '../icons/glyph.component';
import { StageSymbolComponent } from '../icons/stage-symbol.component';
import { CollabStore } from '../../presence/collab.store';
import { keyValues } from '../state/stage-factory';

const SEVERITY_WORD = { error: 'Error', warning: 'Warning', info: 'Note' } as const;

/** One stage in the strip: what it is, its key values, its flags, and its edit buttons. */
@Component({
  selector: 'cw-stage-card',
  imports: [StageSymbolComponent, GlyphComponent],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './stage-card.component.html',
  styleUrl: './stage-card.component.scss',
})
export class StageCardComponent {
  readonly stage = input.required<StageInstance>();
  readonly type = input.required<StageTypeInfo | null>();
  readonly flags = input<Flag[]>([]);
  readonly issues = input<ChainIssue[]>([]);
  readonly selected = input(false);
  readonly readOnly = input(false);
  readonly canMoveLeft = input(false);
  readonly canMoveRight = input(false);
  /** The mode shown (null: the chain as written), what it sets here, and whether it leaves this out. */
  readonly modeName = input<string | null>(null);
  readonly overriddenCount = input(0);
  readonly leftOut = input<'bypass' | 'path' | null>(null);
  /** Part values a design chose (from the analysis), for a network entered by design. */
  readonly designed = input<Record<string, number> | undefined>(undefined);

  readonly picked = output<void>();
  readonly moveLeft = output<void>();
  readonly moveRight = output<void>();
  readonly duplicated = output<void>();
  readonly removed = output<void>();
  /** Leave this stage out of the mode shown, or put it back. */
  readonly leaveOut = output<boolean>();

  protected readonly severityWord = SEVERITY_WORD;
  /** Colleagues' comments (absent where no editor provides them, e.g. in tests of the strip). */
  protected readonly collab = inject(CollabStore, { optional: true });
  protected readonly commentCount = computed(
    () => this.collab?.countByStage().get(this.stage().id) ?? 0,
  );
  protected readonly commentWords = computed(() => {
    const n = this.commentCount();
    return n === 0 ? 'Comment on this stage' : `${n} comment${n === 1 ? '' : 's'} on this stage`;
  });
  protected readonly isTwoPort = computed(() => (this.type()?.role ?? 'two-port') === 'two-port');
  protected readonly values = computed(() => {
    const type = this.type();
    return type ? keyValues(this.stage(), type, 4, this.designed()) : [];
  });
  protected readonly title = computed(
    () => this.stage().label || this.type()?.label || this.stage().type,
  );
}
