import { ChangeDetectionStrategy, Component, inject, Injector, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { RouterLink, type Params } from '@angular/router';
import type { ChainDocument, Mode } from '../../../../../shared/schema/chain';
import { ScreenSize } from '../../../core/layout/screen-size';
import { SessionStore } from '../../../core/session/session.store';
import { PresenceBarComponent } from '../../presence/presence-bar.component';
import { ShareDialogComponent, type ShareDialogData } from '../../share/share-dialog.component';
import { saveAsVariant } from '../design/save-variant';
import { GlyphComponent } from '../icons/glyph.component';
import { ChainExport } from '../save/chain-export';
import { ChainPersistence } from '../save/chain-persistence';
import { EditorStore } from '../state/editor.store';
import { ExportMenuComponent } from './export-menu.component';

/**
 * The editor's toolbar: the chain's name and state, undo and redo, saving with a message,
 * and the ways out (variant, comparison, studies, report, export, share). On a phone the
 * ways out sit in one "more" menu.
 */
@Component({
  selector: 'cw-editor-header',
  imports: [
    MatButtonModule,
    MatIconModule,
    MatMenuModule,
    RouterLink,
    GlyphComponent,
    PresenceBarComponent,
    ExportMenuComponent,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './editor-header.component.html',
  styleUrl: './editor-header.component.scss',
})
export class EditorHeaderComponent {
  readonly workspaceId = input.required<string>();
  readonly chainId = input.required<string>();
  /** True while nothing may change the chain (a viewer, or a revision on screen). */
  readonly locked = input(false);
  /** What is on screen: the edited document, or the revision viewed. */
  readonly shownDoc = input.required<ChainDocument>();
  /** The mode on screen; null for the chain as written. */
  readonly mode = input<Mode | null>(null);
  /** Query of the variants comparison, when the chain has variants. */
  readonly compareQuery = input<Params | null>(null);

  protected readonly store = inject(EditorStore);
  protected readonly persistence = inject(ChainPersistence);
  protected readonly exporter = inject(ChainExport);
  protected readonly session = inject(SessionStore);
  protected readonly screen = inject(ScreenSize);
  private readonly dialog = inject(MatDialog);
  private readonly injector = inject(Injector);

  protected readonly saveMessage = signal('');

  protected onSaveMessage(event: Event): void {
    this.saveMessage.set((event.target as HTMLInputElement).value);
  }

  protected async save(): Promise<void> {
    if (await this.persistence.save(this.saveMessage())) this.saveMessage.set('');
  }

  protected share(): void {
    const chain = this.store.chain();
    if (!chain) return;
    this.dialog.open<ShareDialogComponent, ShareDialogData>(ShareDialogComponent, {
      data: { chainId: chain.id, chainName: chain.name, canManageLinks: !this.store.readOnly() },
      width: '560px',
    });
  }

  /** A named, linked copy of the edited chain (unsaved edits included); opens it. */
  protected async saveAsVariant(): Promise<void> {
    const chain = this.store.chain();
    if (chain) await saveAsVariant(this.injector, chain, this.store.doc());
  }
}
