import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { verdictClass, verdictWords, type TransmitRows } from './transmit-rows';

/**
 * A transmit mode's tables: each harmonic's attenuation against its limit, and each part's
 * voltage, current and power at the transmit power against its rating. The editor's panel
 * shows them on screen (verdicts as coloured marks); the report prints them (`look="print"`:
 * verdicts as plain words, the report's thin rules).
 */
@Component({
  selector: 'cw-transmit-tables',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { '[class.print]': "look() === 'print'" },
  template: `
    @if (rows().harmonics.length) {
      <table class="grid cw-judged" aria-label="Harmonic attenuation of the output network">
        <thead>
          <tr>
            <th scope="col">Harmonic</th>
            <th scope="col">Frequency</th>
            <th scope="col">Attenuation</th>
            <th scope="col">Limit</th>
            <th scope="col">Verdict</th>
          </tr>
        </thead>
        <tbody>
          @for (h of rows().harmonics; track h.n) {
            <tr [attr.data-harmonic]="h.n">
              <th scope="row">{{ h.n }}·f0</th>
              <td class="cw-num">{{ h.frequency }}</td>
              <td class="cw-num">{{ h.attenuation }}</td>
              <td class="cw-num">{{ h.limit }}</td>
              <td>
                <span [class]="mark(h.ok)">{{ words(h.ok) }}</span>
              </td>
            </tr>
          }
        </tbody>
      </table>
    }
    @if (rows().parts.length) {
      <table
        class="grid cw-judged"
        aria-label="Voltage and current of each part at the transmit power"
      >
        <thead>
          <tr>
            <th scope="col">Part</th>
            <th scope="col">Peak voltage</th>
            <th scope="col">RMS current</th>
            <th scope="col">Power</th>
            <th scope="col">Rating</th>
            <th scope="col">Verdict</th>
          </tr>
        </thead>
        <tbody>
          @for (p of rows().parts; track p.key) {
            <tr [attr.data-stage-id]="p.stageId">
              <th scope="row">{{ p.name }}</th>
              <td class="cw-num">{{ p.voltage }}</td>
              <td class="cw-num">{{ p.current }}</td>
              <td class="cw-num">{{ p.power }}</td>
              <td class="cw-num">{{ p.rating }}</td>
              <td>
                <span [class]="mark(p.ok)">{{ words(p.ok) }}</span>
              </td>
            </tr>
          }
        </tbody>
      </table>
    }
  `,
  styles: `
    :host {
      display: block;
    }
    // On screen the tables are the app's judged tables (styles.scss).
    // Printed: the report's tables (full width, thin rules, headings repeated on each page).
    :host(.print) .grid {
      width: 100%;
      margin: 0 0 10px;
      font-size: 7.5pt;
    }
    :host(.print) .grid thead {
      display: table-header-group;
    }
    :host(.print) .grid tr {
      break-inside: avoid;
    }
    :host(.print) .grid th,
    :host(.print) .grid td {
      padding: 1px 4px;
      border-bottom: 0.5px solid var(--rule);
      vertical-align: top;
    }
    :host(.print) .grid thead th {
      background: var(--tint);
      border-bottom: 1px solid var(--ink);
    }
    :host(.print) .grid td {
      text-align: right;
      white-space: nowrap;
    }
    :host(.print) .cw-verdict {
      font: inherit;
      padding: 0;
      background: none;
      color: inherit;
    }
    :host(.print) .cw-verdict.bad {
      font-weight: 700;
    }
  `,
})
export class TransmitTablesComponent {
  readonly rows = input.required<TransmitRows>();
  readonly look = input<'screen' | 'print'>('screen');

  protected readonly words = verdictWords;
  protected readonly mark = verdictClass;
}
