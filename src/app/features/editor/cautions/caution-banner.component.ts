import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { Caution, StageTypeInfo } from '../../../../../shared/engine/types';

const WORDING: Record<Caution, string> = {
  transmit:
    'This chain has a transmit path. Transmitting needs a licence for the band and power used, and must respect local rules on frequencies, power and spurious emissions.',
  'rf-exposure':
    'RF exposure limits apply near transmitting antennas: keep people at the distances your local exposure rules require.',
  'high-voltage':
    'Tube stages run at plate voltages that can kill. Work on them only with the supply off and the capacitors discharged, and follow your local electrical safety rules.',
};

/**
 * Safety notes for the stage types in the chain that declare cautions. A transmit path
 * also brings the RF exposure note. Figures here are design estimates; local codes and
 * licensed practice have the last word.
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
          <p class="defer">
            Chainwright gives design estimates only. Defer to your local codes and to licensed
            practice.
          </p>
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
  protected readonly wording = WORDING;
  protected readonly cautions = computed(() => {
    const found = new Set<Caution>();
    for (const t of this.types()) for (const c of t.cautions ?? []) found.add(c);
    if (found.has('transmit')) found.add('rf-exposure');
    const order: Caution[] = ['transmit', 'rf-exposure', 'high-voltage'];
    return order.filter((c) => found.has(c));
  });
}
