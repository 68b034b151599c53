import { HttpContext } from '@angular/common/http';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  signal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { Title } from '@angular/platform-browser';
import { RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import type { AnalysisResult, StageTypeInfo } from '../../../../shared/engine/types';
import type { SharedChainDto } from '../../../../shared/schema/api';
import { ColleaguesApi } from '../../core/api/colleagues.api';
import { significantFigures } from '../../core/format/number-format';
import { describeHttpError } from '../../core/http/error-message';
import { SKIP_ERROR_SNACKBAR } from '../../core/http/http-context';
import { CautionBannerComponent } from '../editor/cautions/caution-banner.component';
import { documentForResults, hasTransmitMode } from '../editor/modes/mode-edits';
import { TransmitPanelComponent } from '../editor/modes/transmit-panel.component';
import { AnalysisResultsComponent } from '../editor/results/analysis-results.component';
import { nominalEngineering } from '../editor/results/format-quantity';
import { stageValues } from '../report/report-model';

/**
 * A chain opened through a read-only link, without signing in: its stages, budget, flags
 * and plots, and its exports. Nothing here can change the chain.
 */
@Component({
  selector: 'cw-shared-chain',
  imports: [
    MatButtonModule,
    MatButtonToggleModule,
    RouterLink,
    AnalysisResultsComponent,
    CautionBannerComponent,
    TransmitPanelComponent,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (failure(); as text) {
      <section class="cw-page" role="alert">
        <h1>This link does not open a chain</h1>
        <p>{{ text }}</p>
      </section>
    } @else if (shared(); as s) {
      <header class="bar">
        <div>
          <p class="ribbon" data-testid="shared-ribbon">
            Read-only link · from the workspace “{{ s.workspaceName }}” · version {{ s.version }},
            saved {{ s.updatedAt.slice(0, 10) }}
          </p>
          <h1>{{ s.name }}</h1>
          @if (s.description) {
            <p class="cw-muted">{{ s.description }}</p>
          }
        </div>
        <span class="cw-spacer"></span>
        <nav class="exports" aria-label="Exports">
          <a
            mat-stroked-button
            data-testid="open-report"
            [routerLink]="['/shared', token(), 'report']"
            [queryParams]="modeShown() ? { mode: modeShown()!.id } : {}"
            >Report</a
          >
          <a mat-stroked-button [href]="exportUrl('json', false)" download>Chain file</a>
          <a mat-stroked-button [href]="exportUrl('spice')" download>SPICE netlist</a>
          <a mat-stroked-button [href]="exportUrl('touchstone')" download>Touchstone 1.1</a>
          <a mat-stroked-button [href]="exportUrl('touchstone') + '&version=2'" download
            >Touchstone 2.0</a
          >
        </nav>
      </header>
      <p class="caution" role="note">
        Figures are from a model. Before building anything that transmits, carries high voltage or
        exposes people to RF, check it against local codes and licensed practice.
      </p>
      <cw-caution-banner class="cautions" [types]="[]" [transmit]="transmit()" />
      @if (s.modes?.length) {
        <div class="modes">
          <span id="cw-shared-mode">Mode</span>
          <mat-button-toggle-group
            aria-labelledby="cw-shared-mode"
            data-testid="mode-selector"
            hideSingleSelectionIndicator
            [value]="modeId()"
            (change)="chooseMode($event.value)"
          >
            @for (m of s.modes; track m.id) {
              <mat-button-toggle [value]="m.id" [attr.data-mode-id]="m.id">{{
                m.name
              }}</mat-button-toggle>
            }
          </mat-button-toggle-group>
        </div>
      }
      <ol class="stages" aria-label="Stages from source to load">
        @for (st of stageCards(); track st.id; let i = $index) {
          <li [attr.data-stage-id]="st.id">
            <span class="n">{{ i + 1 }}</span>
            <span class="label">{{ st.label }}</span>
            <span class="cw-muted type">{{ st.typeLabel }}</span>
            @if (st.values.length) {
              <span class="values cw-num">{{ st.values.join(' · ') }}</span>
            }
          </li>
        }
      </ol>
      <p class="cw-muted">Design frequency {{ f0(s) }}.</p>
      @if (analysisError()) {
        <p class="cw-error-text" role="alert">Not analysed: {{ analysisError() }}</p>
      }
      <main class="results">
        <cw-analysis-results
          [result]="analysis()"
          [document]="shownDoc()!"
          [selectedStageId]="selected()"
          (stageSelected)="selected.set($event)"
        />
        <cw-transmit-panel [result]="analysis()" [labels]="stageLabels()" />
      </main>
    } @else {
      <p class="cw-page cw-muted">Opening the shared chain…</p>
    }
  `,
  styles: `
    .bar {
      display: flex;
      gap: 16px;
      align-items: flex-start;
      flex-wrap: wrap;
      padding: 16px 24px 0;
    }
    h1 {
      margin: 0;
      font: var(--mat-sys-headline-small);
    }
    .ribbon {
      display: inline-block;
      margin: 0 0 6px;
      padding: 2px 10px;
      border-radius: 12px;
      background: var(--mat-sys-tertiary-container);
      color: var(--mat-sys-on-tertiary-container);
      font-size: 13px;
    }
    .exports {
      display: flex;
      gap: 8px;
      flex-wrap: wrap;
    }
    .cautions,
    .modes {
      display: flex;
      align-items: center;
      gap: 8px;
      margin: 0 24px 8px;
    }
    .caution {
      margin: 12px 24px;
      font-size: 13px;
      color: var(--mat-sys-on-surface-variant);
    }
    .stages {
      display: flex;
      flex-wrap: wrap;
      gap: 8px;
      list-style: none;
      margin: 0 24px;
      padding: 0;
    }
    .stages li {
      display: flex;
      flex-wrap: wrap;
      gap: 6px;
      align-items: baseline;
      padding: 6px 10px;
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: 8px;
    }
    .values {
      flex-basis: 100%;
      font-size: 13px;
    }
    .n {
      font-weight: 700;
      color: var(--mat-sys-primary);
    }
    p.cw-muted {
      margin: 8px 24px;
    }
    .results {
      padding: 0 24px 24px;
    }
  `,
})
export default class SharedChainComponent {
  private readonly api = inject(ColleaguesApi);
  private readonly title = inject(Title);
  /** From the route. */
  readonly token = input.required<string>();

  protected readonly shared = signal<SharedChainDto | null>(null);
  protected readonly failure = signal('');
  protected readonly selected = signal<string | null>(null);
  /** The mode shown, for a chain with modes (the first until another is chosen). */
  protected readonly modeId = signal<string | null>(null);
  protected readonly modeShown = computed(() => {
    const modes = this.shared()?.modes ?? [];
    return modes.find((m) => m.id === this.modeId()) ?? modes[0] ?? null;
  });
  protected readonly analysis = computed(() => {
    const s = this.shared();
    const mode = this.modeShown();
    return ((mode ? mode.analysis : s?.analysis) as AnalysisResult | null) ?? null;
  });
  protected readonly analysisError = computed(() =>
    this.modeShown() ? this.modeShown()?.analysisError : this.shared()?.analysisError,
  );
  /** The stages of the mode shown, in its order, with its values. */
  protected readonly shownDoc = computed(() => {
    const s = this.shared();
    if (!s) return null;
    const id = this.modeShown()?.id;
    return documentForResults(s.document, s.document.modes?.find((m) => m.id === id) ?? null);
  });
  /** Stage types by key, from the link's catalogue: names and units for every value. */
  private readonly types = signal<ReadonlyMap<string, StageTypeInfo>>(new Map());
  /** Each stage of the mode shown with its type's name and its defining values in full. */
  protected readonly stageCards = computed(() =>
    (this.shownDoc()?.stages ?? []).map((st) => {
      const type = this.types().get(st.type);
      return {
        id: st.id,
        label: st.label || type?.label || st.type,
        typeLabel: type?.label ?? st.type,
        values: type ? stageValues(st, type) : [],
      };
    }),
  );
  protected readonly stageLabels = computed(
    () => new Map((this.shownDoc()?.stages ?? []).map((st) => [st.id, st.label || st.type])),
  );
  protected readonly transmit = computed(() => {
    const s = this.shared();
    return s ? hasTransmitMode(s.document) : false;
  });

  constructor() {
    effect(() => void this.load(this.token()));
  }

  /** An export of the mode shown (the chain file without `inMode`: the whole chain). */
  protected exportUrl(format: string, inMode = true): string {
    const mode = inMode ? this.modeShown()?.id : undefined;
    const modePart = mode ? `&mode=${encodeURIComponent(mode)}` : '';
    return `/api/shared/${encodeURIComponent(this.token())}/export?format=${format}${modePart}`;
  }

  protected chooseMode(id: string): void {
    this.modeId.set(id);
    this.selected.set(null);
  }

  protected f0(s: SharedChainDto): string {
    return nominalEngineering(s.document.settings.f0Hz, 'hertz'); // as stated, not padded
  }

  private async load(token: string): Promise<void> {
    try {
      const context = new HttpContext().set(SKIP_ERROR_SNACKBAR, [404]);
      // The flag sentences at the reader's figures, as every other figure on the page.
      const shared = await firstValueFrom(this.api.shared(token, context, significantFigures()));
      const types = await firstValueFrom(this.api.sharedCatalogue(token, context));
      this.types.set(new Map(types.map((t) => [t.type, t])));
      this.shared.set(shared);
      this.title.setTitle(`${shared.name} (read only) · Chainwright`);
    } catch (error) {
      this.failure.set(describeHttpError(error));
    }
  }
}
