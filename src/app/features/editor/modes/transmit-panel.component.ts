import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { AnalysisResult } from '../../../../../shared/engine/types';
import {
  decibels,
  engineering,
  impedancePolar,
  nominalDecibels,
  nominalEngineering,
  times,
} from '../results/format-quantity';
import { significantFigures } from '../../../core/format/number-format';

type Transmit = NonNullable<AnalysisResult['transmit']>;
type Trap = NonNullable<AnalysisResult['traps']>[number];

/** A judged figure's word: within the stated limit, over it, or no limit stated. */
function verdict(ok: boolean | null): { text: string; cls: string } {
  if (ok === null) return { text: 'no limit stated', cls: 'none' };
  return ok ? { text: 'within limit', cls: 'ok' } : { text: 'over limit', cls: 'bad' };
}

/**
 * What a transmit mode's analysis adds (power into the antenna, harmonic attenuation, the
 * power reaching the receiver's input, each part's stress) and how the chain's branches to
 * ground measure up as traps at f0 in the mode shown. Shown under the results, for the
 * mode on screen.
 */
@Component({
  selector: 'cw-transmit-panel',
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
                <span class="verdict" [class]="word(rx.ok).cls">{{ word(rx.ok).text }}</span>
              </dd>
            </div>
          }
        </dl>
        @if (tx.harmonics.length) {
          <table class="grid" aria-label="Harmonic attenuation of the output network">
            <thead>
              <tr>
                <th scope="col">Harmonic</th>
                <th scope="col">Frequency</th>
                <th scope="col">Attenuation</th>
                <th scope="col">Limit</th>
                <th scope="col"></th>
              </tr>
            </thead>
            <tbody>
              @for (h of tx.harmonics; track h.n) {
                <tr [attr.data-harmonic]="h.n">
                  <th scope="row">{{ h.n }}·f0</th>
                  <td class="cw-num">{{ f(h.fHz, 'hertz', 5) }}</td>
                  <td class="cw-num">{{ db(h.attenuationDb) }}</td>
                  <td class="cw-num">{{ h.limitDb === null ? '—' : statedDb(h.limitDb) }}</td>
                  <td>
                    <span class="verdict" [class]="word(h.ok).cls">{{ word(h.ok).text }}</span>
                  </td>
                </tr>
              }
            </tbody>
          </table>
        }
        @if (tx.parts.length) {
          <table class="grid" aria-label="Voltage and current of each part at the transmit power">
            <thead>
              <tr>
                <th scope="col">Part</th>
                <th scope="col">Peak voltage</th>
                <th scope="col">RMS current</th>
                <th scope="col">Power</th>
                <th scope="col">Rating</th>
              </tr>
            </thead>
            <tbody>
              @for (p of tx.parts; track $index) {
                <tr [attr.data-stage-id]="p.stageId">
                  <th scope="row">{{ partName(p.stageId, p.label) }}</th>
                  <td class="cw-num">{{ f(p.vPeak, 'volt') }}</td>
                  <td class="cw-num">{{ f(p.iRms, 'ampere') }}</td>
                  <td class="cw-num">{{ f(p.powerW, 'watt') }}</td>
                  <td>
                    <span class="verdict" [class]="word(p.ok).cls">{{ word(p.ok).text }}</span>
                  </td>
                </tr>
              }
            </tbody>
          </table>
        }
        <p class="note">
          Figures at the amplifier's target power, voltages peak. Transmitting needs a licence and
          must meet local rules; see the caution above.
        </p>
      </section>
    }
    @if (traps().length) {
      <section class="panel" aria-labelledby="cw-trap-head" data-testid="trap-panel">
        <h2 id="cw-trap-head">Branches to ground at f0</h2>
        <table class="grid" aria-label="Branches to ground judged as traps at f0">
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
                  <span class="verdict" [class]="t.ok ? 'ok' : 'bad'">{{
                    t.ok ? 'does its job' : 'falls short'
                  }}</span>
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
    .grid {
      border-collapse: collapse;
      margin: 8px 0;
      font-size: 14px;
    }
    .grid th,
    .grid td {
      padding: 4px 10px;
      text-align: left;
      border-bottom: 1px solid var(--mat-sys-outline-variant);
    }
    .verdict {
      font: var(--mat-sys-label-medium);
      padding: 1px 6px;
      border-radius: 8px;
    }
    .verdict.ok {
      background: var(--mat-sys-secondary-container);
      color: var(--mat-sys-on-secondary-container);
    }
    .verdict.bad {
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
    }
    .verdict.none {
      color: var(--mat-sys-on-surface-variant);
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

  protected readonly f = engineering;
  protected readonly db = decibels;
  /** A limit the user states, rounded but not padded ("20 dB"). */
  protected readonly statedDb = nominalDecibels;
  protected readonly x = times;
  protected readonly z = impedancePolar;
  protected readonly word = verdict;

  /** The design frequency as stated, to at least 5 figures so 433.92 MHz reads whole. */
  protected statedHz(hz: number): string {
    return nominalEngineering(hz, 'hertz', Math.max(5, significantFigures()));
  }

  protected partName(stageId: string, label: string): string {
    const stage = this.labels().get(stageId);
    return stage && !label.startsWith(stage) ? `${stage} · ${label}` : label;
  }
}
