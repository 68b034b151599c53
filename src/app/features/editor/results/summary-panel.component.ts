import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import type { SummaryItem } from './detail-rows';

/** The chain's headline figures: noise, gain, sensitivity and dynamic range. */
@Component({
  selector: 'cw-summary-panel',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <dl class="figures">
      @for (item of items(); track item.key) {
        <div class="figure" [attr.data-key]="item.key">
          <dt>{{ item.label }}</dt>
          <dd class="value cw-num">{{ item.value }}</dd>
          @if (item.note) {
            <dd class="note">{{ item.note }}</dd>
          }
        </div>
      }
    </dl>
  `,
  styles: `
    .figures {
      display: grid;
      grid-template-columns: repeat(auto-fill, minmax(200px, 1fr));
      gap: 12px;
      margin: 0;
    }
    .figure {
      padding: 12px 16px;
      border-radius: 12px;
      background: var(--mat-sys-surface-container-low);
      border: 1px solid var(--mat-sys-outline-variant);
    }
    dt {
      font: var(--mat-sys-label-large);
      color: var(--mat-sys-on-surface-variant);
    }
    dd {
      margin: 0;
    }
    .value {
      font: var(--mat-sys-headline-small);
      margin-top: 4px;
    }
    .note {
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
    }
  `,
})
export class SummaryPanelComponent {
  readonly items = input.required<SummaryItem[]>();
}
