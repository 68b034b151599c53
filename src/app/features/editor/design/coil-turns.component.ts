import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { coilWinding } from '../../../../../shared/engine/design/coil-winding';
import { CoilFormStore } from './coil-form.store';
import { engineering } from '../results/format-quantity';

/** "≈ 10¼ turns, 10.2 mm long" beside an inductance, on the editor's coil form (Wheeler). */
@Component({
  selector: 'cw-coil-turns',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `@if (text(); as t) {
    <span class="turns cw-muted" data-testid="coil-turns">{{ t }}</span>
  }`,
  styles: `
    .turns {
      font-size: 0.8rem;
    }
  `,
})
export class CoilTurnsComponent {
  readonly henries = input<unknown>(null);
  private readonly coil = inject(CoilFormStore);

  protected readonly text = computed(() => {
    const l = this.henries();
    if (typeof l !== 'number' || !(l > 0)) return '';
    try {
      const w = coilWinding(l, this.coil.form());
      const whole = Math.floor(w.roundedTurns);
      const quarter = ['', '¼', '½', '¾'][Math.round((w.roundedTurns - whole) * 4)];
      const note = w.withinAccuracy ? '' : ' (short coil: Wheeler is rough here)';
      return `≈ ${whole}${quarter} turns air-core, ${engineering(w.lengthM, 'metre')} long${note}`;
    } catch {
      return '';
    }
  });
}
