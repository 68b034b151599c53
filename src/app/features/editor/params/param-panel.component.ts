import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatMenuModule } from '@angular/material/menu';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import type { ParamSpec, ParamValues } from '../../../../../shared/engine/types';
import type { ChainDocument, StageInstance } from '../../../../../shared/schema/chain';
import { AnalysisRunner } from '../state/analysis-runner';
import { EditorStore } from '../state/editor.store';
import {
  displayText,
  valueOf,
  visibleParams,
  withPreset,
  withTolerance,
  withValue,
} from '../state/stage-factory';
import { overriddenKeys } from '../modes/mode-edits';
import { OverrideMarkComponent } from '../modes/override-mark.component';
import { CoilTurnsComponent } from '../design/coil-turns.component';
import {
  DATA_FILE_KIND_OF_TYPE,
  DataFileFieldComponent,
  type DataFilePick,
} from './data-file-field.component';
import { QuantityFieldComponent, type QuantityEdit } from './quantity-field.component';
import type { PartDto } from '../../../../../shared/schema/api';
import { PartPickComponent } from '../../parts/part-pick.component';
import { withoutPart, withPart } from '../../parts/with-part';
import { VariableMarkComponent } from './variable-mark.component';

/**
 * The form for the selected stage, built from its type's parameter schema: unit-aware
 * fields for numbers, selects for enums, toggles for booleans, tolerances where the
 * schema allows them, presets where the type has them. `showWhen` hides what does not
 * apply (a matching network's design fields appear only in design mode).
 */
@Component({
  selector: 'cw-param-panel',
  imports: [
    QuantityFieldComponent,
    DataFileFieldComponent,
    MatSlideToggleModule,
    MatMenuModule,
    MatButtonModule,
    CoilTurnsComponent,
    OverrideMarkComponent,
    PartPickComponent,
    VariableMarkComponent,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './param-panel.component.html',
  styleUrl: './field.scss',
})
export class ParamPanelComponent {
  /** Disabled inputs for viewers and for revisions being viewed. */
  readonly readOnly = input(false);
  /** The document on screen when it is not the edited one (a revision being viewed). */
  readonly document = input<ChainDocument | null>(null);

  protected readonly store = inject(EditorStore);
  private readonly runner = inject(AnalysisRunner);

  protected readonly stage = computed(() => {
    // In a mode, the form shows (and edits) that mode's values.
    const stages = this.document()?.stages ?? this.store.stagesInMode();
    return stages.find((s) => s.id === this.store.selectedId()) ?? null;
  });
  /** Keys the selected mode sets on this stage (marked, each with a way back to the chain's value). */
  protected readonly overridden = computed(() =>
    this.document() ? new Set<string>() : overriddenKeys(this.store.mode(), this.stage()?.id ?? ''),
  );
  protected readonly type = computed(() => {
    const stage = this.stage();
    return stage ? (this.store.catalogue().get(stage.type) ?? null) : null;
  });
  /** Fields keyed by stage and parameter, so another stage never inherits a field's typed text. */
  protected readonly fields = computed(() => {
    const stage = this.stage();
    const type = this.type();
    if (!stage || !type) return [];
    return visibleParams(stage, type).map((spec) => ({ id: `${stage.id}:${spec.key}`, spec }));
  });
  /** The kind of data file the stage's type reads, or null when it takes none. */
  protected readonly fileKind = computed(() => {
    const stage = this.stage();
    return stage ? (DATA_FILE_KIND_OF_TYPE[stage.type] ?? null) : null;
  });
  /** The workspace of the chain being edited, whose data files the field offers. */
  protected readonly workspaceId = computed(() => this.store.chain()?.workspaceId ?? null);
  /** Server refusals of this stage, by parameter key ('' for the stage as a whole). */
  protected readonly refusals = computed(() => {
    const id = this.stage()?.id;
    const map = new Map<string, string>();
    for (const issue of this.runner.refusal()?.issues ?? []) {
      if (issue.stageId === id) map.set(issue.param ?? '', issue.message);
    }
    return map;
  });

  protected text(stage: StageInstance, spec: ParamSpec): string {
    return displayText(stage, spec);
  }

  protected value(stage: StageInstance, spec: ParamSpec): number | string | boolean {
    return valueOf(stage, spec);
  }

  protected toleranceText(stage: StageInstance, spec: ParamSpec): string {
    const t = stage.tolerances?.[spec.key];
    return t === undefined ? '' : String(t);
  }

  protected onNumber(stage: StageInstance, spec: ParamSpec, edit: QuantityEdit): void {
    const now = this.current(stage.id);
    if (!now) return;
    // A typed value is no longer the bin's part.
    const own = withoutPart(now, spec.key);
    this.store.updateStage(withValue(own, spec.key, edit.value, edit.text), spec.key);
  }

  /** Takes a part from the bin: its value, and its Q and tolerance with it. */
  protected onPart(stage: StageInstance, spec: ParamSpec, part: PartDto): void {
    const now = this.current(stage.id);
    if (now) this.store.updateStage(withPart(now, spec, this.type()?.params ?? [], part));
  }

  protected onTolerance(stage: StageInstance, spec: ParamSpec, edit: QuantityEdit): void {
    const now = this.current(stage.id);
    if (!now) return;
    const percent = edit.text.trim() === '' ? null : edit.value;
    this.store.updateStage(withTolerance(now, spec.key, percent), `tol:${spec.key}`);
  }

  protected onEnum(stage: StageInstance, spec: ParamSpec, event: Event): void {
    const now = this.current(stage.id);
    const value = (event.target as HTMLSelectElement).value;
    if (now) this.store.updateStage(withValue(now, spec.key, value));
  }

  protected onBoolean(stage: StageInstance, spec: ParamSpec, checked: boolean): void {
    const now = this.current(stage.id);
    if (now) this.store.updateStage(withValue(now, spec.key, checked));
  }

  protected onText(stage: StageInstance, spec: ParamSpec, event: Event): void {
    const now = this.current(stage.id);
    const text = (event.target as HTMLTextAreaElement).value.slice(0, 200);
    if (now) this.store.updateStage(withValue(now, spec.key, text), spec.key);
  }

  protected onLabel(stage: StageInstance, event: Event): void {
    const now = this.current(stage.id);
    const label = (event.target as HTMLInputElement).value.slice(0, 120);
    if (now) this.store.updateStage({ ...now, label }, 'label');
  }

  /** A file picked or uploaded: for the stage it was chosen for, even if another is shown now. */
  protected onDataFile({ stageId, fileId }: DataFilePick): void {
    const now = this.current(stageId);
    if (!now) return;
    const { dataFileId: _previous, ...rest } = now;
    this.store.updateStage(fileId ? { ...rest, dataFileId: fileId } : rest);
  }

  protected applyPreset(stage: StageInstance, values: ParamValues): void {
    const now = this.current(stage.id);
    if (now) this.store.updateStage(withPreset(now, values));
  }

  /**
   * The stage as the store holds it at this moment (in the mode shown). An edit starts from
   * this, not from the template's `s`: that is the stage as last rendered, and an edit made
   * since (a value chosen while a data file uploads, whose answer can land before the next
   * render) would be undone by an edit built on the older copy.
   */
  private current(stageId: string): StageInstance | null {
    return this.store.stagesInMode().find((s) => s.id === stageId) ?? null;
  }
}
