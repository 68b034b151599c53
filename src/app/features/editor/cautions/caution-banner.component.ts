import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { StageTypeInfo } from '../../../../../shared/engine/types';
import { CAUTION_DEFER, CAUTION_WORDING, cautionsOf } from './caution-words';

/**
 * Safety notes for the stage types in the chain that declare cautions, and for a chain with
 * a transmit mode. A transmit path also brings the RF exposure note (`caution-words.ts`).
 * Figures here are design estimates; local codes and licensed practice have the last word.
 */
@Component({
  selector: 'cw-caution-banner',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (cautions().length > 0) {
      <aside class="banner" role="note" aria-label="Safety cautions">
        <svg viewBox="0 0 24 24" width="24" height="24" aria-hidden="true">
          <path
            d="M12 3l10 18H2zM12 10v5M12 18v.01"
            fill="none"
            stroke="currentColor"
            stroke-width="2"
            stroke-linecap="round"
            stroke-linejoin="round"
          />
        </svg>
        <div>
          <strong>Caution</strong>
          <ul>
            @for (c of cautions(); track c) {
              <li [attr.data-caution]="c">{{ wording[c] }}</li>
            }
          </ul>
          <p class="defer">{{ defer }}</p>
        </div>
      </aside>
    }
  `,
  styles: `
    .banner {
      display: flex;
      gap: 12px;
      padding: 8px 12px;
      margin: 8px 0;
      border-radius: 8px;
      border: 1px solid var(--cw-warn);
      background: var(--mat-sys-surface-container);
      color: var(--mat-sys-on-surface);
    }
    svg {
      color: var(--cw-warn);
      flex: none;
    }
    ul {
      margin: 4px 0;
      padding-left: 18px;
    }
    .defer {
      margin: 0;
      font: var(--mat-sys-body-small);
    }
  `,
})
export class CautionBannerComponent {
  /** Types of the stages in the chain. */
  readonly types = input.required<StageTypeInfo[]>();
  /** Whether the chain has a transmit mode (the transmit caution then shows in every mode). */
  readonly transmit = input(false);
  protected readonly wording = CAUTION_WORDING;
  protected readonly defer = CAUTION_DEFER;
  protected readonly cautions = computed(() => cautionsOf(this.types(), this.transmit()));
}
