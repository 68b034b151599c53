import { CdkDrag, CdkDragDrop, CdkDropList } from '@angular/cdk/drag-drop';
import {
  afterNextRender,
  ChangeDetectionStrategy,
  Component,
  computed,
  ElementRef,
  inject,
  Injector,
  input,
  output,
} from '@angular/core';
import type { ChainIssue } from '../../../../../shared/engine/errors';
import type { Flag, StageTypeInfo } from '../../../../../shared/engine/types';
import type { StageInstance } from '../../../../../shared/schema/chain';
import { AnalysisRunner } from '../state/analysis-runner';
import { EditFeedback } from '../state/edit-feedback';
import { EditorStore } from '../state/editor.store';
import { leftOutBy, overriddenKeys } from '../modes/mode-edits';
import { StageCardComponent } from './stage-card.component';

/**
 * The chain as a horizontal strip of cards. Cards reorder by drag; palette types drop in
 * at any position. Keyboard: Alt+←/→ moves the focused card's stage, Delete removes it,
 * Ctrl+D duplicates it. After a move, a removal or a duplicate, focus stays on a card (the
 * moved one, the one before the removed one, the copy) so the keyboard user keeps their place.
 */
@Component({
  selector: 'cw-stage-strip',
  imports: [CdkDropList, CdkDrag, StageCardComponent],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div
      class="strip"
      cdkDropList
      cdkDropListOrientation="horizontal"
      [id]="listId()"
      [cdkDropListData]="stages()"
      [cdkDropListDisabled]="readOnly()"
      (cdkDropListDropped)="dropped($event)"
      role="list"
      aria-label="Stages from source to load"
    >
      @for (stage of stages(); track stage.id; let i = $index, last = $last) {
        <div
          class="slot"
          cdkDrag
          [cdkDragData]="stage"
          [cdkDragDisabled]="readOnly() || !movable(stage)"
          role="listitem"
          tabindex="0"
          [attr.data-slot-id]="stage.id"
          [attr.aria-label]="'Stage ' + (i + 1) + ': ' + (stage.label || stage.type)"
          [attr.aria-keyshortcuts]="
            readOnly() ? null : 'Alt+ArrowLeft Alt+ArrowRight Delete Control+D'
          "
          (keydown)="onKey($event, stage)"
        >
          <cw-stage-card
            [stage]="stage"
            [type]="typeOf(stage)"
            [flags]="flagsByStage().get(stage.id) ?? []"
            [issues]="issuesByStage().get(stage.id) ?? []"
            [designed]="designedByStage().get(stage.id)"
            [selected]="stage.id === store.selectedId()"
            [readOnly]="readOnly()"
            [canMoveLeft]="movable(stage) && i > 1"
            [canMoveRight]="movable(stage) && i < stages().length - 2"
            [modeName]="modeShown()?.name ?? null"
            [overriddenCount]="overriddenCount(stage.id)"
            [leftOut]="leftOutOf(stage.id)"
            (leaveOut)="store.setLeftOut(stage.id, $event)"
            (picked)="pick(stage.id)"
            (moveLeft)="moveBy(stage.id, -1)"
            (moveRight)="moveBy(stage.id, 1)"
            (duplicated)="duplicate(stage.id)"
            (removed)="remove(stage.id)"
          />
          @if (!last) {
            <span class="wire" aria-hidden="true"></span>
          }
        </div>
      }
    </div>
  `,
  styles: `
    :host {
      display: block;
      /* Positioned, so nothing absolutely placed inside escapes the scroll box. */
      position: relative;
      overflow-x: auto;
      padding: 8px 4px 12px;
      /* Sideways scrolling on a touch screen stays in the strip, not the page. */
      overscroll-behavior-x: contain;
      scroll-snap-type: x proximity;
    }
    .slot {
      scroll-snap-align: start;
    }
    .strip {
      display: flex;
      align-items: flex-start;
      min-height: 160px;
      min-width: min-content;
    }
    .slot {
      display: flex;
      align-items: flex-start;
    }
    .wire {
      margin-top: 30px;
      width: 18px;
      height: 2px;
      background: var(--mat-sys-outline);
    }
    .cdk-drag-placeholder {
      opacity: 0.3;
    }
    /* A palette type over the strip shows where its card will land, at card size. */
    :host ::ng-deep .strip .placeholder {
      width: 180px;
      height: 150px;
      margin-right: 18px;
      box-sizing: border-box;
      border: 2px dashed var(--mat-sys-primary);
      border-radius: 10px;
    }
    .cdk-drag-animating,
    .strip.cdk-drop-list-dragging .slot:not(.cdk-drag-placeholder) {
      transition: transform 200ms cubic-bezier(0, 0, 0.2, 1);
    }
  `,
})
export class StageStripComponent {
  readonly listId = input.required<string>();
  /** The document shown: the edited one, or a revision being viewed. */
  readonly stages = input.required<StageInstance[]>();
  /** Viewers, and anyone looking at an old revision, cannot change the strip. */
  readonly readOnly = input(false);
  /** Whether the cards mark the selected mode's values (not for an old revision). */
  readonly showModes = input(true);
  /** A card was picked (clicked or tapped): the page shows its values. */
  readonly stagePicked = output<string>();

  protected readonly store = inject(EditorStore);
  protected readonly feedback = inject(EditFeedback);
  private readonly runner = inject(AnalysisRunner);
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  private readonly injector = inject(Injector);

  protected readonly flagsByStage = computed(() =>
    groupBy(this.runner.result()?.flags ?? [], (f: Flag) => f.stageId),
  );
  protected readonly designedByStage = computed(
    () =>
      new Map(
        (this.runner.result()?.stages ?? []).flatMap((s) =>
          s.designedValues ? [[s.id, s.designedValues] as const] : [],
        ),
      ),
  );
  protected readonly issuesByStage = computed(() =>
    groupBy(
      (this.runner.refusal()?.issues ?? []).filter((i) => i.stageId),
      (i: ChainIssue) => i.stageId ?? '',
    ),
  );

  /** The mode whose marks the cards show: the selected one, unless a revision is shown. */
  protected readonly modeShown = computed(() => (this.showModes() ? this.store.mode() : null));

  protected overriddenCount(stageId: string): number {
    return overriddenKeys(this.modeShown(), stageId).size;
  }

  protected leftOutOf(stageId: string): 'bypass' | 'path' | null {
    return leftOutBy(this.modeShown(), stageId);
  }

  protected typeOf(stage: StageInstance): StageTypeInfo | null {
    return this.store.catalogue().get(stage.type) ?? null;
  }

  protected movable(stage: StageInstance): boolean {
    return this.store.roleOf(stage) === 'two-port';
  }

  protected dropped(
    event: CdkDragDrop<StageInstance[], unknown, StageInstance | StageTypeInfo>,
  ): void {
    if (event.previousContainer === event.container) {
      if (event.previousIndex !== event.currentIndex) {
        this.feedback.report(this.store.move(event.previousIndex, event.currentIndex));
      }
      return;
    }
    const type = event.item.data as StageTypeInfo;
    this.feedback.report(this.store.insertType(type, event.currentIndex));
  }

  protected onKey(event: KeyboardEvent, stage: StageInstance): void {
    if (this.readOnly()) return;
    if (event.altKey && (event.key === 'ArrowLeft' || event.key === 'ArrowRight')) {
      event.preventDefault();
      this.moveBy(stage.id, event.key === 'ArrowLeft' ? -1 : 1);
    } else if (event.key === 'Delete') {
      event.preventDefault();
      this.remove(stage.id);
    } else if ((event.ctrlKey || event.metaKey) && event.key.toLowerCase() === 'd') {
      event.preventDefault();
      this.duplicate(stage.id);
    }
  }

  protected pick(stageId: string): void {
    this.store.select(stageId);
    this.stagePicked.emit(stageId);
  }

  protected moveBy(stageId: string, delta: number): void {
    const outcome = this.store.moveBy(stageId, delta);
    this.feedback.report(outcome);
    // The moved card's element is re-inserted in the list, which drops its focus.
    this.focusAfterRender(stageId);
  }

  protected remove(stageId: string): void {
    const stages = this.stages();
    const index = stages.findIndex((s) => s.id === stageId);
    const outcome = this.store.remove(stageId);
    this.feedback.report(outcome);
    if (!outcome.ok) return;
    // The card before the removed one (the source at worst) takes the focus.
    this.focusAfterRender(stages[Math.max(0, index - 1)]?.id ?? null);
  }

  protected duplicate(stageId: string): void {
    const outcome = this.store.duplicate(stageId);
    this.feedback.report(outcome);
    this.focusAfterRender(outcome.ok ? this.store.selectedId() : stageId);
  }

  private focusAfterRender(stageId: string | null): void {
    if (stageId === null) return;
    afterNextRender(
      () => {
        const slots = this.host.nativeElement.querySelectorAll<HTMLElement>('[data-slot-id]');
        const slot = Array.from(slots).find((el) => el.dataset['slotId'] === stageId);
        slot?.focus();
      },
      { injector: this.injector },
    );
  }
}

function groupBy<T>(items: T[], keyOf: (item: T) => string): Map<string, T[]> {
  const map = new Map<string, T[]>();
  for (const item of items) map.set(keyOf(item), [...(map.get(keyOf(item)) ?? []), item]);
  return map;
}
