import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import type { ParamSpec, UnitKind } from '../../../../../shared/engine/types';
import type { ChainDocument, ChainSettings, Thresholds } from '../../../../../shared/schema/chain';
import { parseQuantity } from '../../../../../shared/units';
import { fieldText } from '../results/format-quantity';
import { QuantityFieldComponent, type QuantityEdit } from '../params/quantity-field.component';
import { EditorStore } from '../state/editor.store';
import { ChainTargetsComponent } from './chain-targets.component';

type Range = Pick<ParamSpec, 'min' | 'max' | 'exclusiveMin'>;

interface SettingField {
  key: string;
  label: string;
  unit: UnitKind;
  range: Range;
  help?: string;
  read: (s: ChainSettings) => number;
  write: (s: ChainSettings, v: number) => ChainSettings;
}

const positive: Range = { min: 0, exclusiveMin: true };
const threshold = (
  key: keyof Thresholds,
  label: string,
  unit: UnitKind,
  range: Range,
  help: string,
): SettingField => ({
  key: `thresholds.${key}`,
  label,
  unit,
  range,
  help,
  read: (s) => s.thresholds[key],
  write: (s, v) => ({ ...s, thresholds: { ...s.thresholds, [key]: v } }),
});

/** The chain-wide settings as unit-aware fields, in the order an analysis uses them. */
const FIELDS: SettingField[] = [
  {
    key: 'f0Hz',
    label: 'Design frequency f0',
    unit: 'hertz',
    range: positive,
    read: (s) => s.f0Hz,
    write: (s, v) => ({ ...s, f0Hz: v }),
  },
  {
    key: 'sweep.startHz',
    label: 'Sweep start',
    unit: 'hertz',
    range: positive,
    read: (s) => s.sweep.startHz,
    write: (s, v) => ({ ...s, sweep: { ...s.sweep, startHz: v } }),
  },
  {
    key: 'sweep.stopHz',
    label: 'Sweep stop',
    unit: 'hertz',
    range: positive,
    read: (s) => s.sweep.stopHz,
    write: (s, v) => ({ ...s, sweep: { ...s.sweep, stopHz: v } }),
  },
  {
    key: 'sweep.points',
    label: 'Sweep points',
    unit: 'none',
    range: { min: 1, max: 100001 },
    help: 'a whole number; 201 to 1001 is plenty for most plots',
    read: (s) => s.sweep.points,
    write: (s, v) => ({ ...s, sweep: { ...s.sweep, points: v } }),
  },
  {
    key: 'temperatureK',
    label: 'Reference temperature',
    unit: 'kelvin',
    range: positive,
    help: '290 K is the usual reference',
    read: (s) => s.temperatureK,
    write: (s, v) => ({ ...s, temperatureK: v }),
  },
  {
    key: 'channelBandwidthHz',
    label: 'Channel bandwidth',
    unit: 'hertz',
    range: positive,
    read: (s) => s.channelBandwidthHz,
    write: (s, v) => ({ ...s, channelBandwidthHz: v }),
  },
  {
    key: 'requiredSnrDb',
    label: 'Required SNR',
    unit: 'db',
    range: {},
    read: (s) => s.requiredSnrDb,
    write: (s, v) => ({ ...s, requiredSnrDb: v }),
  },
  threshold(
    'loadingWarn',
    'Tank loading: warn below',
    'ratio',
    { min: 0, exclusiveMin: true, max: 0.999 },
    'loaded Q ÷ Q without the next stage',
  ),
  threshold(
    'loadingError',
    'Tank loading: error below',
    'ratio',
    { min: 0, exclusiveMin: true, max: 0.999 },
    'must be below the warning level',
  ),
  threshold(
    'compressionBackoffDb',
    'Compression back-off',
    'db',
    { min: 0, max: 40 },
    'flag when the input passes P1dB less this',
  ),
  threshold(
    'matchReturnLossDb',
    'Designed match: return loss at least',
    'db',
    { min: 0, max: 60 },
    '',
  ),
  threshold(
    'detuneFraction',
    'Detuning: flag beyond',
    'ratio',
    { min: 0, exclusiveMin: true, max: 10 },
    'as a fraction of the bandwidth',
  ),
  threshold(
    'noiseMismatchVswr',
    'Noise figure off its rated source: flag beyond VSWR',
    'ratio',
    { min: 1, exclusiveMin: true, max: 100 },
    'between the source a noise figure was stated for and the one the stage sees',
  ),
  threshold(
    'qBudgetLossDb',
    'Part-Q loss: flag beyond',
    'db',
    { min: 0, exclusiveMin: true, max: 40 },
    'in a matching network or filter at f0',
  ),
];

/** Settings that may be left empty (the engine then uses its rule, said in `empty`). */
interface OptionalField {
  key: 'referenceOhm' | 'sourceNoiseTemperatureK';
  id: string;
  label: string;
  unit: UnitKind;
  empty: string;
}

const OPTIONAL_FIELDS: OptionalField[] = [
  {
    key: 'sourceNoiseTemperatureK',
    id: 'cw-source-temperature',
    label: 'Source (antenna) noise temperature',
    unit: 'kelvin',
    empty: 'empty: the reference temperature',
  },
  {
    key: 'referenceOhm',
    id: 'cw-reference-ohm',
    label: 'Reference for VSWR and return loss',
    unit: 'ohm',
    empty: 'empty: none, so VSWR and return loss are not shown; e.g. 50 Ω',
  },
];

/** One port a reference can be set for: the node after a stage (the source for the input). */
interface PortRow {
  stageId: string;
  label: string;
}

/** Name, description and the chain-wide analysis settings. */
@Component({
  selector: 'cw-chain-settings',
  imports: [QuantityFieldComponent, ChainTargetsComponent],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './chain-settings.component.html',
  styleUrl: '../params/field.scss',
})
export class ChainSettingsComponent {
  readonly readOnly = input(false);
  /** The document on screen when it is not the edited one (a revision being viewed). */
  readonly document = input<ChainDocument | null>(null);
  protected readonly store = inject(EditorStore);
  protected readonly fields = FIELDS;
  protected readonly optionalFields = OPTIONAL_FIELDS;
  /** Typed text and the problem with it, per optional field or port (`port:<stage id>`). */
  private readonly optionalTyped = signal<Record<string, { text: string; error: string | null }>>(
    {},
  );
  /** Every node but the last (a load has no port after it), named by the stage before it. */
  protected readonly ports = computed<PortRow[]>(() =>
    this.shown()
      .stages.slice(0, -1)
      .map((s, i) => ({
        stageId: s.id,
        label: i === 0 ? `Chain input (after ${s.label || s.type})` : `After ${s.label || s.type}`,
      })),
  );
  protected readonly shown = computed(() => this.document() ?? this.store.doc());
  protected readonly settings = computed(() => this.shown().settings);
  /** What was typed per field with the value it gave, so undo shows the value, not stale text. */
  private readonly typed = signal<Record<string, { text: string; value: number }>>({});
  protected readonly offsetsError = signal<string | null>(null);
  private readonly offsetsTyped = signal<{ text: string; values: number[] } | null>(null);
  protected readonly offsetsText = computed(() => {
    const current = this.settings().offsetsHz;
    const typed = this.offsetsTyped();
    if (typed && JSON.stringify(typed.values) === JSON.stringify(current)) return typed.text;
    return current.map((f) => fieldText(f, 'hertz')).join(', ');
  });

  protected text(field: SettingField): string {
    const current = field.read(this.settings());
    const typed = this.typed()[field.key];
    return typed && typed.value === current ? typed.text : fieldText(current, field.unit);
  }

  protected onField(field: SettingField, edit: QuantityEdit): void {
    const value = field.key === 'sweep.points' ? Math.round(edit.value) : edit.value;
    this.typed.update((t) => ({ ...t, [field.key]: { text: edit.text, value } }));
    this.store.updateSettings(field.write(this.settings(), value), field.key);
  }

  private valueOf(key: string): number | undefined {
    const s = this.settings();
    if (key.startsWith('port:')) return s.portReferences?.[key.slice(5)];
    return s[key as OptionalField['key']];
  }

  protected optionalText(key: string, unit: UnitKind): string {
    const typed = this.optionalTyped()[key];
    if (typed) return typed.text;
    const v = this.valueOf(key);
    return v === undefined ? '' : fieldText(v, unit);
  }

  protected optionalError(key: string): string | null {
    return this.optionalTyped()[key]?.error ?? null;
  }

  /** Parses an optional quantity: empty clears it, a value above 0 sets it. */
  protected onOptional(key: string, unit: UnitKind, event: Event): void {
    const text = (event.target as HTMLInputElement).value;
    let value: number | undefined;
    let error: string | null = null;
    if (text.trim() !== '') {
      const r = parseQuantity(text, unit);
      if (!r.ok) error = r.message;
      else if (!(r.value > 0)) error = 'must be above 0';
      else value = r.value;
    }
    this.optionalTyped.update((t) => ({ ...t, [key]: { text, error } }));
    if (error) return;
    const s = this.settings();
    let next: ChainSettings;
    if (key.startsWith('port:')) {
      const { [key.slice(5)]: _old, ...rest } = s.portReferences ?? {};
      const ports = value === undefined ? rest : { ...rest, [key.slice(5)]: value };
      const { portReferences: _p, ...others } = s;
      next = Object.keys(ports).length > 0 ? { ...others, portReferences: ports } : others;
    } else {
      const { [key as OptionalField['key']]: _old, ...others } = s;
      next = value === undefined ? others : { ...others, [key]: value };
    }
    this.store.updateSettings(next, key);
  }

  protected onScale(event: Event): void {
    const scale = (event.target as HTMLSelectElement).value === 'log' ? 'log' : 'lin';
    this.store.updateSettings({ ...this.settings(), sweep: { ...this.settings().sweep, scale } });
  }

  protected onName(event: Event): void {
    this.store.updateInfo({ name: (event.target as HTMLInputElement).value.slice(0, 200) }, 'name');
  }

  protected onDescription(event: Event): void {
    const description = (event.target as HTMLTextAreaElement).value.slice(0, 5000);
    this.store.updateInfo({ description }, 'description');
  }

  /** Offsets are a comma-separated list of frequencies, e.g. "10 kHz, 20k, 455 kHz". */
  protected onOffsets(event: Event): void {
    const text = (event.target as HTMLInputElement).value;
    const parts = text
      .split(/[,;]/)
      .map((p) => p.trim())
      .filter((p) => p !== '');
    if (parts.length > 16) return this.offsetsError.set('at most 16 offsets');
    const values: number[] = [];
    for (const part of parts) {
      const r = parseQuantity(part, 'hertz');
      if (!r.ok) return this.offsetsError.set(`"${part}": ${r.message}`);
      if (r.value <= 0) return this.offsetsError.set(`"${part}": offsets must be above 0 Hz`);
      values.push(r.value);
    }
    this.offsetsError.set(null);
    this.offsetsTyped.set({ text, values });
    this.store.updateSettings({ ...this.settings(), offsetsHz: values }, 'offsets');
  }
}
