import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { ChainPersistence } from '../editor/save/chain-persistence';
import { EditorStore } from '../editor/state/editor.store';
import { CollabStore } from './collab.store';

/**
 * Says at once that someone else saved the chain, offering to load their version or to
 * keep editing (a later save then meets the version check and its conflict choice).
 */
@Component({
  selector: 'cw-saved-notice',
  imports: [MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (newer(); as saved) {
      <div class="banner info" role="alert" data-testid="saved-elsewhere">
        <span>
          {{ saved.by }} saved version {{ saved.version }} of this chain.
          @if (store.dirty()) {
            Loading it replaces your unsaved edits.
          }
        </span>
        <button mat-flat-button type="button" (click)="load()">
          Load version {{ saved.version }}
        </button>
        <button mat-button type="button" (click)="collab.dismissSaved()">Keep editing</button>
      </div>
    }
  `,
  styles: `
    .banner {
      display: flex;
      align-items: center;
      gap: 12px;
      flex-wrap: wrap;
      padding: 8px 16px;
      background: var(--mat-sys-secondary-container);
      color: var(--mat-sys-on-secondary-container);
    }
  `,
})
export class SavedNoticeComponent {
  protected readonly collab = inject(CollabStore);
  protected readonly store = inject(EditorStore);
  private readonly persistence = inject(ChainPersistence);
  /**
   * The save, while it is newer than what this page holds: one's own save can be announced
   * before its answer arrives, and then the answer makes it current.
   */
  protected readonly newer = computed(() => {
    const saved = this.collab.savedElsewhere();
    return saved && saved.version > (this.store.chain()?.version ?? 0) ? saved : null;
  });

  protected async load(): Promise<void> {
    await this.persistence.reload();
    this.collab.dismissSaved();
  }
}
