import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatDialog } from '@angular/material/dialog';
import { MatMenuModule } from '@angular/material/menu';
import { RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { entryKey, MAX_COMPARED } from '../../compare/compare-ids';
import { EditFeedback } from '../state/edit-feedback';
import { EditorStore } from '../state/editor.store';
import {
  ModeDialogComponent,
  type ModeDialogAnswer,
  type ModeDialogData,
} from './mode-dialog.component';
import { MODE_KIND_WORDS } from './mode-types';

/** The toggle's value for the chain as written (mode ids are slugs, so this never clashes). */
const AS_WRITTEN = '';

/**
 * The mode selector: the chain as written or one of its modes. Every figure, flag and plot
 * on the page follows it, and value edits go to the selected mode. Creating, renaming and
 * deleting modes are edits of the document like any other (one undo step each).
 */
@Component({
  selector: 'cw-mode-bar',
  imports: [MatButtonModule, MatButtonToggleModule, MatMenuModule, RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="row">
      <span class="title" id="cw-mode-title">Mode</span>
      <mat-button-toggle-group
        aria-labelledby="cw-mode-title"
        data-testid="mode-selector"
        hideSingleSelectionIndicator
        [value]="store.mode()?.id ?? asWritten"
        (change)="store.selectMode($event.value || null)"
      >
        <mat-button-toggle [value]="asWritten" data-mode-id="">As written</mat-button-toggle>
        @for (mode of store.modes(); track mode.id) {
          <mat-button-toggle
            [value]="mode.id"
            [attr.data-mode-id]="mode.id"
            [title]="words[mode.kind] + ' mode'"
          >
            <span class="kind" [class]="mode.kind" aria-hidden="true">{{ badge[mode.kind] }}</span>
            {{ mode.name }}
          </mat-button-toggle>
        }
      </mat-button-toggle-group>
      @if (compareQuery(); as query) {
        <a
          mat-button
          data-testid="compare-modes"
          [routerLink]="['/w', store.chain()?.workspaceId, 'compare']"
          [queryParams]="query"
          title="Compare the saved chain's modes side by side"
        >
          Compare modes
        </a>
      }
      @if (!readOnly()) {
        <button mat-button type="button" data-testid="mode-new" (click)="create()">
          + New mode
        </button>
        @if (store.mode(); as mode) {
          <button
            mat-button
            type="button"
            data-testid="mode-menu"
            [matMenuTriggerFor]="modeMenu"
            [attr.aria-label]="'More for mode ' + mode.name"
          >
            Mode…
          </button>
          <mat-menu #modeMenu="matMenu">
            <button mat-menu-item type="button" (click)="rename()">Rename or change kind</button>
            <button mat-menu-item type="button" data-testid="mode-delete" (click)="remove()">
              Delete “{{ mode.name }}”
            </button>
          </mat-menu>
        }
      }
    </div>
    @if (!store.mode() && store.modes().length > 0 && !readOnly()) {
      <p class="hint" data-testid="mode-hint">
        Showing the chain as written. Values you change here apply to every mode that does not set
        its own.
      </p>
    }
    @if (store.mode(); as mode) {
      <p class="hint" data-testid="mode-hint">
        Showing “{{ mode.name }}” ({{ words[mode.kind].toLowerCase() }}).
        @if (!readOnly()) {
          Values you change now belong to this mode; marked values differ from the chain as written.
        }
      </p>
    }
  `,
  styles: `
    :host {
      display: block;
      padding: 4px 0;
    }
    .row {
      display: flex;
      align-items: center;
      gap: 8px;
      flex-wrap: wrap;
    }
    .title {
      font: var(--mat-sys-label-large);
    }
    mat-button-toggle-group {
      flex-wrap: wrap;
    }
    .kind {
      display: inline-block;
      min-width: 1.4em;
      margin-right: 4px;
      padding: 0 4px;
      border-radius: 4px;
      font: var(--mat-sys-label-small);
      background: var(--mat-sys-surface-container-highest);
    }
    .kind.transmit {
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
    }
    .hint {
      margin: 4px 0 0;
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
    }
  `,
})
export class ModeBarComponent {
  /** Viewers and anyone looking at an old revision can switch modes but not change them. */
  readonly readOnly = input(false);

  protected readonly store = inject(EditorStore);
  private readonly feedback = inject(EditFeedback);
  private readonly dialog = inject(MatDialog);
  protected readonly asWritten = AS_WRITTEN;
  protected readonly words = MODE_KIND_WORDS;
  /** A short tag beside each mode's name: what kind it is, readable without colour. */
  protected readonly badge = { receive: 'RX', transmit: 'TX', state: 'S' } as const;
  /**
   * The comparison of the saved chain's modes (it reads stored chains): the mode shown and
   * the others, up to six; none when the saved chain has fewer than two modes.
   */
  protected readonly compareQuery = computed(() => {
    const chain = this.store.chain();
    const saved = chain?.document.modes ?? [];
    if (!chain || saved.length < 2) return null;
    const first = saved.find((m) => m.id === this.store.mode()?.id) ?? saved[0];
    const ids = [first, ...saved.filter((m) => m !== first)].slice(0, MAX_COMPARED);
    return { chains: ids.map((m) => entryKey({ chainId: chain.id, modeId: m.id })).join(',') };
  });

  protected async create(): Promise<void> {
    const answer = await this.ask({
      title: 'New mode',
      submitLabel: 'Create',
      name: this.store.modes().length === 0 ? 'receive' : '',
      kind: this.store.modes().length === 0 ? 'receive' : 'state',
    });
    if (answer) this.feedback.report(this.store.addMode(answer.name, answer.kind));
  }

  protected async rename(): Promise<void> {
    const mode = this.store.mode();
    if (!mode) return;
    const answer = await this.ask({
      title: `Mode “${mode.name}”`,
      submitLabel: 'Save',
      name: mode.name,
      kind: mode.kind,
    });
    if (answer) this.store.updateMode(mode.id, answer);
  }

  protected remove(): void {
    const mode = this.store.mode();
    if (!mode) return;
    this.store.deleteMode(mode.id);
    this.feedback.report({
      ok: true,
      message: `Deleted the mode “${mode.name}” and its values. Undo (Ctrl+Z) brings it back.`,
    });
  }

  private ask(data: ModeDialogData): Promise<ModeDialogAnswer | undefined> {
    const ref = this.dialog.open<ModeDialogComponent, ModeDialogData, ModeDialogAnswer>(
      ModeDialogComponent,
      { data, width: '420px' },
    );
    return firstValueFrom(ref.afterClosed());
  }
}
