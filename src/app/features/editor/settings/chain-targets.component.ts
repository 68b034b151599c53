import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import {
  chainTargetsSchema,
  type ChainSettings,
  type ChainTargets,
} from '../../../../../shared/schema/chain';
import { parseQuantity } from '../../../../../shared/units';
import { fieldText } from '../results/format-quantity';
import { EditorStore } from '../state/editor.store';

type TargetKey = keyof ChainTargets;

interface TargetField {
  key: TargetKey;
  label: string;
  unit: 'hertz' | 'db';
}

/** The targets a Monte Carlo run judges its trials by (all optional). */
const FIELDS: TargetField[] = [
  { key: 'centreMinHz', label: 'Centre frequency at least', unit: 'hertz' },
  { key: 'centreMaxHz', label: 'Centre frequency at most', unit: 'hertz' },
  { key: 'minBandwidthHz', label: '−3 dB width at least', unit: 'hertz' },
  { key: 'maxBandwidthHz', label: '−3 dB width at most', unit: 'hertz' },
  { key: 'minGainDb', label: 'Gain at least', unit: 'db' },
  { key: 'maxNoiseFigureDb', label: 'Noise figure at most', unit: 'db' },
  { key: 'minImageRejectionDb', label: 'Image rejection at least', unit: 'db' },
];

/**
 * The chain's yield targets (`settings.targets`): what a Monte Carlo study counts a trial as
 * passing. Each is optional; an empty field is not judged. A pair that contradicts itself
 * (a maximum below its minimum) is refused with the reason and not stored.
 */
@Component({
  selector: 'cw-chain-targets',
  changeDetection: ChangeDetectionStrategy.OnPush,
  styleUrl: '../params/field.scss',
  template: `
    <details class="ports" data-testid="targets-form" [open]="hasTargets()">
      <summary>Targets for yield studies</summary>
      <p class="note cw-muted">
        A Monte Carlo study counts a trial as passing when it meets every target set here (the
        centre and width are read at the node the study judges, the last by default). Empty: not
        judged.
      </p>
      @for (field of fields; track field.key) {
        <div class="field">
          <label class="label" [for]="'cw-target-' + field.key">{{ field.label }}</label>
          <input
            type="text"
            [id]="'cw-target-' + field.key"
            [attr.data-target]="field.key"
            [value]="textOf(field)"
            [disabled]="readOnly()"
            [attr.aria-invalid]="problems()[field.key] ? 'true' : null"
            (change)="onChange(field, $event)"
          />
          @if (problems()[field.key]; as problem) {
            <span class="note cw-error-text" role="alert">{{ problem }}</span>
          }
        </div>
      }
    </details>
  `,
})
export class ChainTargetsComponent {
  readonly settings = input.required<ChainSettings>();
  readonly readOnly = input(false);

  private readonly store = inject(EditorStore);
  protected readonly fields = FIELDS;
  protected readonly problems = signal<Partial<Record<TargetKey, string>>>({});
  protected readonly hasTargets = computed(
    () => Object.keys(this.settings().targets ?? {}).length > 0,
  );

  protected textOf(field: TargetField): string {
    const v = this.settings().targets?.[field.key];
    return v === undefined ? '' : fieldText(v, field.unit);
  }

  protected onChange(field: TargetField, event: Event): void {
    const text = (event.target as HTMLInputElement).value.trim();
    const next: Record<string, number> = { ...(this.settings().targets ?? {}) };
    if (text === '') {
      delete next[field.key];
    } else {
      const parsed = parseQuantity(text, field.unit);
      if (!parsed.ok) return this.refuse(field.key, parsed.message);
      next[field.key] = parsed.value;
    }
    const checked = chainTargetsSchema.safeParse(next);
    if (!checked.success) return this.refuse(field.key, checked.error.issues[0].message);
    this.problems.set({});
    const { targets: _old, ...rest } = this.settings();
    const targets = checked.data;
    this.store.updateSettings(
      Object.keys(targets).length ? { ...rest, targets } : rest,
      `target:${field.key}`,
    );
  }

  private refuse(key: TargetKey, message: string): void {
    this.problems.set({ [key]: message });
  }
}
