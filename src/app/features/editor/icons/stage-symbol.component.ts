import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { StageCategory } from '../../../../../shared/engine/types';

/**
 * Schematic-style symbols drawn for Chainwright on a 32×24 grid, one per stage category:
 * antenna, transformer, inductor-capacitor L, resonant tank, amplifier triangle, mixer
 * circle-X, detector diode, resistor. Strokes follow the text colour.
 */
const SYMBOLS: Record<StageCategory, string> = {
  source: 'M16 22V10M16 10L8 2M16 10L24 2M16 10V2M10 22h12',
  coupler:
    'M2 6h6M2 18h6M8 4c3 0 3 4 0 4c3 0 3 4 0 4c3 0 3 4 0 4c3 0 3 4 0 4M15 3v18M17 3v18M24 4c-3 0-3 4 0 4c-3 0-3 4 0 4c-3 0-3 4 0 4c-3 0-3 4 0 4M24 6h6M24 18h6',
  matching: 'M1 8h4c0-3 4-3 4 0c0-3 4-3 4 0c0-3 4-3 4 0h14M23 8v5M19 13h8M19 16h8M23 16v6M19 22h8',
  filter:
    'M2 4h28M9 4v5c3 0 3 3 0 3c3 0 3 3 0 3c3 0 3 3 0 3v4M23 4v8M19 12h8M19 15h8M23 15v7M6 22h20',
  amplifier: 'M2 12h6M8 3v18l18-9zM26 12h4',
  mixer: 'M2 12h7M23 12h7M16 19v4M16 5a7 7 0 1 0 0.01 0M11 7l10 10M21 7L11 17',
  load: 'M2 12h8M10 6v12l12-6zM22 6v12M22 12h8',
  element: 'M2 12h6l2-5 3 10 3-10 3 10 3-10 2 5h6',
};

@Component({
  selector: 'cw-stage-symbol',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <svg viewBox="0 0 32 24" width="40" height="30" aria-hidden="true" focusable="false">
      <path
        [attr.d]="path()"
        fill="none"
        stroke="currentColor"
        stroke-width="1.6"
        stroke-linecap="round"
        stroke-linejoin="round"
      />
    </svg>
  `,
  styles: `
    :host {
      display: inline-flex;
      color: var(--mat-sys-primary);
    }
  `,
})
export class StageSymbolComponent {
  readonly category = input.required<StageCategory>();
  protected readonly path = computed(() => SYMBOLS[this.category()]);
}
