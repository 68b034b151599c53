import { NgTemplateOutlet } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  DestroyRef,
  effect,
  HostListener,
  inject,
  input,
  signal,
  TemplateRef,
  untracked,
  viewChild,
  ViewContainerRef,
} from '@angular/core';
import { MatBottomSheet, type MatBottomSheetRef } from '@angular/material/bottom-sheet';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Title } from '@angular/platform-browser';
import { forkJoin, firstValueFrom } from 'rxjs';
import type { StageTypeInfo } from '../../../../shared/engine/types';
import type { RevisionDto } from '../../../../shared/schema/api';
import { ChainsApi } from '../../core/api/chains.api';
import { Ask } from '../../core/dialogs/ask';
import { describeHttpError } from '../../core/http/error-message';
import { ScreenSize } from '../../core/layout/screen-size';
import { SkipLinks } from '../../core/layout/skip-links';
import { SessionStore } from '../../core/session/session.store';
import { CommentsPanelComponent } from '../comments/comments-panel.component';
import { compareQueryOf, familyOf } from '../compare/compare-entry';
import { RevisionDiffComponent } from '../diff/revision-diff.component';
import { CollabStore } from '../presence/collab.store';
import { SavedNoticeComponent } from '../presence/saved-notice.component';
import { CautionBannerComponent } from './cautions/caution-banner.component';
import { documentForResults, hasTransmitMode, withModes } from './modes/mode-edits';
import { ModeBarComponent } from './modes/mode-bar.component';
import { TransmitPanelComponent } from './modes/transmit-panel.component';
import { DesignPanelComponent } from './design/design-panel.component';
import { EditorHeaderComponent } from './header/editor-header.component';
import { RevisionPanelComponent } from './history/revision-panel.component';
import { GlyphComponent } from './icons/glyph.component';
import type { LeaveAware } from './leave.guard';
import { StagePaletteComponent } from './palette/stage-palette.component';
import { ParamPanelComponent } from './params/param-panel.component';
import { AnalysisResultsComponent } from './results/analysis-results.component';
import { PlotDrawQueue } from './results/plot-draw-queue';
import { ChainPersistence } from './save/chain-persistence';
import { ChainSettingsComponent } from './settings/chain-settings.component';
import { AnalysisApi } from './state/analysis-api';
import { AnalysisRunner } from './state/analysis-runner';
import { clearDrafts, readDraft, writeDraft, type Draft } from './state/draft-store';
import { EditFeedback } from './state/edit-feedback';
import { EditorStore } from './state/editor.store';
import { sameJson } from './state/same-document';
import { StageStripComponent } from './strip/stage-strip.component';

type SidePanel = 'stage' | 'chain' | 'history' | 'design' | 'comments' | 'changes';

const PANEL_CHOICES: { value: SidePanel; label: string }[] = [
  { value: 'stage', label: 'Stage' },
  { value: 'chain', label: 'Chain' },
  { value: 'history', label: 'History' },
  { value: 'design', label: 'Design' },
  { value: 'changes', label: 'Changes' },
  { value: 'comments', label: 'Comments' },
];

/**
 * The chain editor page: palette, strip of stage cards, live analysis, the side panel
 * (stage values, chain settings, revisions) and saving. Viewers get the same page with
 * every control that changes the chain disabled.
 *
 * Three layouts: a desktop has palette, centre and side panel side by side; a tablet keeps
 * the side panel and opens the palette as a sheet; a phone shows the strip and the results
 * full width, and opens the palette and every panel as a sheet.
 */
@Component({
  selector: 'cw-chain-editor',
  imports: [
    NgTemplateOutlet,
    MatButtonModule,
    MatButtonToggleModule,
    MatIconModule,
    MatProgressBarModule,
    GlyphComponent,
    StagePaletteComponent,
    StageStripComponent,
    ParamPanelComponent,
    ChainSettingsComponent,
    RevisionPanelComponent,
    CautionBannerComponent,
    ModeBarComponent,
    TransmitPanelComponent,
    AnalysisResultsComponent,
    DesignPanelComponent,
    SavedNoticeComponent,
    CommentsPanelComponent,
    RevisionDiffComponent,
    EditorHeaderComponent,
  ],
  providers: [EditorStore, AnalysisRunner, EditFeedback, ChainPersistence, CollabStore],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './chain-editor.component.html',
  styleUrl: './chain-editor.component.scss',
})
export default class ChainEditorComponent implements LeaveAware {
  readonly workspaceId = input.required<string>();
  readonly chainId = input.required<string>();

  protected readonly store = inject(EditorStore);
  protected readonly runner = inject(AnalysisRunner);
  protected readonly persistence = inject(ChainPersistence);
  protected readonly feedback = inject(EditFeedback);
  private readonly chains = inject(ChainsApi);
  private readonly analysisApi = inject(AnalysisApi);
  private readonly title = inject(Title);
  private readonly ask = inject(Ask);
  protected readonly session = inject(SessionStore);
  protected readonly collab = inject(CollabStore);
  protected readonly screen = inject(ScreenSize);
  private readonly bottomSheet = inject(MatBottomSheet);
  private readonly viewContainer = inject(ViewContainerRef);
  private readonly skipLinks = inject(SkipLinks);

  private readonly panelSheet = viewChild<TemplateRef<unknown>>('panelSheet');
  private readonly paletteSheet = viewChild<TemplateRef<unknown>>('paletteSheet');
  private sheetRef: MatBottomSheetRef<unknown> | null = null;
  protected readonly panelChoices = PANEL_CHOICES;
  protected readonly layoutName = computed(() =>
    this.screen.phone() ? 'phone' : this.screen.tablet() ? 'tablet' : 'desktop',
  );

  protected readonly stripListId = 'cw-stage-strip';
  protected readonly loadError = signal<string | null>(null);
  protected readonly types = signal<StageTypeInfo[]>([]);
  protected readonly panel = signal<SidePanel>('stage');
  protected readonly draftOffer = signal<Draft | null>(null);
  protected readonly viewing = signal<RevisionDto | null>(null);

  /** The chain's family (root and variants); "Compare variants" shows when it has two or more. */
  protected readonly family = familyOf(this.chainId);
  protected readonly compareQuery = computed(() => compareQueryOf(this.family(), this.chainId()));

  protected readonly doc = this.store.doc;
  protected readonly selectedId = this.store.selectedId;
  /** The server's analysis, with a turning knob's live sweep and figures laid over it. */
  protected readonly analysis = this.runner.shown;
  /** The document on screen: a revision being looked at, or the one being edited. */
  protected readonly shownDoc = computed(() => this.viewing()?.document ?? this.doc());
  protected readonly locked = computed(() => this.store.readOnly() || this.viewing() !== null);
  /** The mode on screen: the selected one, except on an old revision (shown as written). */
  protected readonly modeShown = computed(() => (this.viewing() ? null : this.store.mode()));
  /** The stages the strip shows: in the mode on screen, with its values. */
  protected readonly stripStages = computed(() =>
    this.viewing() ? this.shownDoc().stages : this.store.stagesInMode(),
  );
  /** What the results are read against: the mode's stages in its order. */
  protected readonly resultsDoc = computed(() =>
    documentForResults(this.shownDoc(), this.modeShown()),
  );
  protected readonly transmitMode = computed(() => hasTransmitMode(this.shownDoc()));
  /**
   * The chain as written is refused while it has modes: their paths together make a chain
   * with two sources or two loads (a transceiver). Offer the modes rather than the refusal.
   */
  protected readonly asWrittenHasNoAnalysis = computed(
    () =>
      this.modeShown() === null &&
      !this.viewing() &&
      this.store.modes().length > 0 &&
      (this.runner.refusal()?.issues ?? []).some((i) => i.path.at(-1) === 'type'),
  );
  protected readonly stageLabels = computed(
    () => new Map(this.shownDoc().stages.map((s) => [s.id, s.label || s.type])),
  );
  protected readonly chainTypes = computed(() => {
    const catalogue = this.store.catalogue();
    return this.shownDoc()
      .stages.map((s) => catalogue.get(s.type))
      .filter((t): t is StageTypeInfo => t !== undefined);
  });

  constructor() {
    this.skipLinks.set([
      { label: 'Skip to the stages', targetId: 'cw-strip' },
      { label: 'Skip to the results', targetId: 'cw-results' },
    ]);
    // While an edit's answer is on its way, plots below the window wait for it instead of
    // drawing the figures it is about to replace in the idle time of the wait.
    const drawQueue = inject(PlotDrawQueue);
    effect(() => drawQueue.holdOffScreen(this.runner.pending()));
    inject(DestroyRef).onDestroy(() => {
      this.skipLinks.clear();
      this.closeSheet();
      drawQueue.holdOffScreen(false);
    });
    // A sheet belongs to the phone and tablet layouts; a wider window shows it in place.
    effect(() => {
      if (this.screen.desktop()) untracked(() => this.closeSheet());
    });
    effect(() => {
      const id = this.chainId();
      untracked(() => void this.loadChain(id));
    });
    // Every change of what is on screen (the document or the mode) is analysed; the chain
    // as written is sent without its modes. Unsaved edits also go to the draft.
    effect(() => {
      const doc = this.shownDoc();
      const mode = this.modeShown();
      const chain = this.store.chain();
      if (!chain) return;
      untracked(() =>
        mode
          ? this.runner.request(doc, chain.workspaceId, mode.id)
          : this.runner.request(withModes(doc, []), chain.workspaceId),
      );
    });
    // The tab says which chain it holds, and whether it has unsaved edits.
    effect(() => {
      const name = this.doc().name.trim();
      if (!this.store.chain() || !name) return;
      this.title.setTitle(`${this.hasUnsavedEdits() ? '• ' : ''}${name} · Chainwright`);
    });
    // Colleagues on the same chain: presence, their saves and comments, live.
    effect(() => {
      const id = this.store.chain()?.id;
      if (id) untracked(() => this.collab.start(id, () => this.store.chain()?.version ?? 0));
    });
    // A card's comment count opens the comments on that stage.
    effect(() => {
      const request = this.collab.commentsRequest();
      if (!request) return;
      untracked(() => {
        if (request.stageId) this.store.select(request.stageId);
        this.panel.set('comments');
      });
    });
    effect(() => {
      const chain = this.store.chain();
      const doc = this.doc();
      if (chain && this.store.dirty() && !this.store.readOnly()) {
        untracked(() => writeDraft(chain.id, chain.version, doc));
      }
    });
  }

  hasUnsavedEdits(): boolean {
    return this.store.dirty() && !this.store.readOnly();
  }

  @HostListener('window:beforeunload', ['$event'])
  protected warnBeforeUnload(event: BeforeUnloadEvent): void {
    if (this.hasUnsavedEdits()) event.preventDefault();
  }

  @HostListener('window:keydown', ['$event'])
  protected onShortcut(event: KeyboardEvent): void {
    if (!(event.ctrlKey || event.metaKey) || this.locked()) return;
    // Inside a text field the browser's own undo applies to the text being typed.
    if (event.target instanceof HTMLInputElement || event.target instanceof HTMLTextAreaElement)
      return;
    const key = event.key.toLowerCase();
    if (key === 'z' && !event.shiftKey) {
      event.preventDefault();
      this.store.undo();
    } else if (key === 'y' || (key === 'z' && event.shiftKey)) {
      event.preventDefault();
      this.store.redo();
    }
  }

  /** A stage picked on the strip or in a table: its values show, whatever panel was open. */
  protected select(stageId: string): void {
    this.store.select(stageId);
    this.panel.set('stage');
  }

  /** A card picked on the strip; on a phone its values open as a sheet. */
  protected pickStage(stageId: string): void {
    this.select(stageId);
    if (this.screen.phone()) this.openPanelSheet('stage');
  }

  protected insertFromPalette(type: StageTypeInfo): void {
    this.feedback.report(this.store.insertType(type));
    this.panel.set('stage');
  }

  protected openPanelSheet(panel: SidePanel): void {
    this.panel.set(panel);
    this.openSheet(this.panelSheet(), 'Side panel');
  }

  protected openPaletteSheet(): void {
    this.openSheet(this.paletteSheet(), 'Stage types');
  }

  protected closeSheet(): void {
    this.sheetRef?.dismiss();
    this.sheetRef = null;
  }

  /** Material's sheet traps focus inside and gives it back to the opener when it closes. */
  private openSheet(template: TemplateRef<unknown> | undefined, label: string): void {
    if (!template) return;
    this.closeSheet();
    const ref = this.bottomSheet.open(template, {
      viewContainerRef: this.viewContainer,
      ariaLabel: label,
      panelClass: 'cw-editor-sheet',
      restoreFocus: true,
    });
    this.sheetRef = ref;
    ref.afterDismissed().subscribe(() => {
      if (this.sheetRef === ref) this.sheetRef = null;
    });
  }

  protected restoreDraft(): void {
    const draft = this.draftOffer();
    if (draft) this.store.replaceDocument(draft.document);
    this.draftOffer.set(null);
  }

  protected discardDraft(): void {
    clearDrafts(this.chainId());
    this.draftOffer.set(null);
  }

  protected async viewRevision(version: number): Promise<void> {
    try {
      this.viewing.set(await firstValueFrom(this.chains.revision(this.chainId(), version)));
    } catch (e) {
      this.feedback.report({
        ok: false,
        reason: `Revision ${version} did not load: ${describeHttpError(e)}`,
      });
    }
  }

  protected async restoreRevision(version: number): Promise<void> {
    const sure =
      !this.hasUnsavedEdits() ||
      (await this.ask.confirm({
        title: `Restore revision ${version}?`,
        message:
          'Restoring replaces your unsaved edits with this revision, saved as a new version. ' +
          'The edits are not kept.',
        confirmLabel: 'Restore',
        cancelLabel: 'Keep my edits',
      }));
    if (!sure) return;
    if (await this.persistence.restore(version)) this.viewing.set(null);
  }

  private async loadChain(id: string): Promise<void> {
    this.loadError.set(null);
    this.viewing.set(null);
    try {
      const { chain, catalogue } = await firstValueFrom(
        forkJoin({ chain: this.chains.get(id), catalogue: this.analysisApi.catalogue() }),
      );
      this.types.set(catalogue);
      this.store.setCatalogue(catalogue);
      this.store.load(chain);
      const draft = chain.role === 'viewer' ? null : readDraft(id);
      const differs = draft && !sameJson(draft.document, chain.document);
      this.draftOffer.set(differs ? draft : null);
    } catch (e) {
      this.loadError.set(describeHttpError(e));
    }
  }
}
