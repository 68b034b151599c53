import { CdkDrag, CdkDragDrop, CdkDropList } from '@angular/cdk/drag-drop';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
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
 * Ctrl+D duplicates it.
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
            [selected]="stage.id === store.selectedId()"
            [readOnly]="readOnly()"
            [canMoveLeft]="movable(stage) && i > 1"
            [canMoveRight]="movable(stage) && i < stages().length - 2"
            [modeName]="modeShown()?.name ?? null"
            [overriddenCount]="overriddenCount(stage.id)"
            [leftOut]="leftOutOf(stage.id)"
            (leaveOut)="store.setLeftOut(stage.id, $event)"
            (picked)="store.select(stage.id)"
            (moveLeft)="feedback.report(store.moveBy(stage.id, -1))"
            (moveRight)="feedback.report(store.moveBy(stage.id, 1))"
            (duplicated)="feedback.report(store.duplicate(stage.id))"
            (removed)="feedback.report(store.remove(stage.id))"
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
      overflow-x: auto;
      padding: 8px 4px 12px;
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
      width: 172px;
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

  protected readonly store = inject(EditorStore);
  protected readonly feedback = inject(EditFeedback);
  private readonly runner = inject(AnalysisRunner);

  protected readonly flagsByStage = computed(() =>
    groupBy(this.runner.result()?.flags ?? [], (f: Flag) => f.stageId),
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
      this.feedback.report(this.store.moveBy(stage.id, event.key === 'ArrowLeft' ? -1 : 1));
    } else if (event.key === 'Delete') {
      event.preventDefault();
      this.feedback.report(this.store.remove(stage.id));
    } else if ((event.ctrlKey || event.metaKey) && event.key.toLowerCase() === 'd') {
      event.preventDefault();
      this.feedback.report(this.store.duplicate(stage.id));
    }
  }
}

function groupBy<T>(items: T[], keyOf: (item: T) => string): Map<string, T[]> {
  const map = new Map<string, T[]>();
  for (const item of items) map.set(keyOf(item), [...(map.get(keyOf(item)) ?? []), item]);
  return map;
}
