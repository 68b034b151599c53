import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { AnalysisResult } from '../../../../../shared/engine/types';
import { significantFigures } from '../../../core/format/number-format';
import {
  decibels,
  engineering,
  impedancePolar,
  nominalEngineering,
  times,
} from '../results/format-quantity';
import { TransmitTablesComponent } from './transmit-tables.component';
import { transmitRows, verdictClass, verdictWords, type TransmitRows } from './transmit-rows';

type Transmit = NonNullable<AnalysisResult['transmit']>;
type Trap = NonNullable<AnalysisResult['traps']>[number];

/**
 * What a transmit mode's analysis adds (power into the antenna, harmonic attenuation, the
 * power reaching the receiver's input, each part's stress) and how the chain's branches to
 * ground measure up as traps at f0 in the mode shown. Shown under the results, for the
 * mode on screen.
 */
@Component({
  selector: 'cw-transmit-panel',
  imports: [TransmitTablesComponent],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (transmit(); as tx) {
      <section class="panel" aria-labelledby="cw-tx-head" data-testid="transmit-panel">
        <h2 id="cw-tx-head">Transmit at {{ statedHz(tx.f0Hz) }}</h2>
        <dl class="figures">
          <div data-key="delivered">
            <dt>Into the antenna</dt>
            <dd class="cw-num">
              {{ f(tx.deliveredW, 'watt') }} ({{ db(tx.deliveredDbm, 'dBm') }})
            </dd>
          </div>
          <div data-key="available">
            <dt>Amplifier's target</dt>
            <dd class="cw-num">{{ f(tx.availableW, 'watt') }}</dd>
          </div>
          <div data-key="loss">
            <dt>Network loss</dt>
            <dd class="cw-num">{{ db(tx.networkLossDb) }}</dd>
          </div>
          <div data-key="swing">
            <dt>Amplifier output swing</dt>
            <dd class="cw-num">{{ f(tx.sourceSwingPeakV, 'volt') }} peak</dd>
          </div>
          @if (tx.receiverInput; as rx) {
            <div data-key="receiver-input">
              <dt>Reaching the receiver input</dt>
              <dd class="cw-num">
                {{ db(rx.dbm, 'dBm') }} · isolation {{ db(rx.isolationDb) }}
                <span [class]="mark(rx.ok)">{{ words(rx.ok) }}</span>
              </dd>
            </div>
          }
        </dl>
        <cw-transmit-tables [rows]="rows()!" />
        <p class="note">
          Figures at the amplifier's target power, voltages peak. Transmitting needs a licence and
          must meet local rules; see the caution above.
        </p>
      </section>
    }
    @if (traps().length) {
      <section class="panel" aria-labelledby="cw-trap-head" data-testid="trap-panel">
        <h2 id="cw-trap-head">Branches to ground at f0</h2>
        <table class="cw-judged" aria-label="Branches to ground judged as traps at f0">
          <thead>
            <tr>
              <th scope="col">Branch</th>
              <th scope="col">Meant to be</th>
              <th scope="col">Its impedance</th>
              <th scope="col">Impedance it shunts</th>
              <th scope="col">Ratio (needed)</th>
              <th scope="col"></th>
            </tr>
          </thead>
          <tbody>
            @for (t of traps(); track t.stageId) {
              <tr [attr.data-stage-id]="t.stageId">
                <th scope="row">{{ t.label }}</th>
                <td>{{ t.intent === 'high' ? 'a block (high)' : 'a short (low)' }}</td>
                <td class="cw-num">{{ z(t.zBranch) }}</td>
                <td class="cw-num">{{ z(t.zShunted) }}</td>
                <td class="cw-num">
                  {{ x(t.ratio) }} ({{ t.intent === 'high' ? '≥' : '≤' }}
                  {{ x(t.intent === 'high' ? t.required : 1 / t.required) }})
                </td>
                <td>
                  <span [class]="mark(t.ok)">{{ t.ok ? 'does its job' : 'falls short' }}</span>
                </td>
              </tr>
            }
          </tbody>
        </table>
      </section>
    }
  `,
  styles: `
    .panel {
      margin: 12px 0;
      padding: 12px 16px;
      border-radius: 12px;
      border: 1px solid var(--mat-sys-outline-variant);
      background: var(--mat-sys-surface-container-lowest);
    }
    h2 {
      margin: 0 0 8px;
      font: var(--mat-sys-title-medium);
    }
    .figures {
      display: grid;
      grid-template-columns: repeat(auto-fill, minmax(190px, 1fr));
      gap: 8px 16px;
      margin: 0 0 8px;
    }
    dt {
      font: var(--mat-sys-label-medium);
      color: var(--mat-sys-on-surface-variant);
    }
    dd {
      margin: 0;
    }
    .note {
      margin: 4px 0 0;
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
    }
  `,
})
export class TransmitPanelComponent {
  readonly result = input<AnalysisResult | null>(null);
  /** Stage labels by id, to name the stage of a part whose own label does not. */
  readonly labels = input<ReadonlyMap<string, string>>(new Map());

  protected readonly transmit = computed((): Transmit | null => this.result()?.transmit ?? null);
  protected readonly traps = computed((): Trap[] => this.result()?.traps ?? []);
  protected readonly rows = computed((): TransmitRows | null => {
    const tx = this.transmit();
    return tx ? transmitRows(tx, this.labels()) : null;
  });

  protected readonly f = engineering;
  protected readonly db = decibels;
  protected readonly x = times;
  protected readonly z = impedancePolar;
  protected readonly words = verdictWords;
  protected readonly mark = verdictClass;

  /** The design frequency as stated, to at least 5 figures so 433.92 MHz reads whole. */
  protected statedHz(hz: number): string {
    return nominalEngineering(hz, 'hertz', Math.max(5, significantFigures()));
  }
}
