import { computed, Injectable, signal } from '@angular/core';
import type { StageTypeInfo } from '../../../../../shared/engine/types';
import type { ChainDto } from '../../../../../shared/schema/api';
import type {
  ChainDocument,
  ChainSettings,
  StageInstance,
} from '../../../../../shared/schema/chain';
import {
  addMode,
  clearOverride,
  deleteMode,
  findMode,
  forgetStage,
  modesOf,
  setBypass,
  setOverride,
  stageInMode,
  typedKey,
  type TypedText,
  updateMode,
} from '../modes/mode-edits';
import type { ModeKind } from '../modes/mode-types';
import { HistoryStore } from './chain-history.store';
import { sameJson } from './same-document';
import { createStage, newStageId } from './stage-factory';
import {
  duplicateStage,
  insertStage,
  moveStage,
  removeStage,
  type OrderChange,
  type RoleOf,
} from './stage-order';

/** The answer of an edit: done, or refused with a reason to show the user. */
export type EditOutcome = { ok: true; message?: string } | { ok: false; reason: string };

const EMPTY: ChainDocument = {
  format: 'chainwright-chain',
  formatVersion: 1,
  name: '',
  description: '',
  settings: {
    f0Hz: 1e6,
    sweep: { startHz: 5e5, stopHz: 2e6, points: 201, scale: 'lin' },
    temperatureK: 290,
    channelBandwidthHz: 10e3,
    requiredSnrDb: 10,
    offsetsHz: [],
    thresholds: {
      loadingWarn: 0.5,
      loadingError: 0.2,
      compressionBackoffDb: 3,
      matchReturnLossDb: 15,
      detuneFraction: 0.5,
      noiseMismatchVswr: 2,
      qBudgetLossDb: 1,
    },
  },
  stages: [],
};

/**
 * The chain being edited: the loaded chain's metadata, the document with undo/redo,
 * the selected stage, and every edit as a method that keeps the source first and the
 * load last. Provided per editor page.
 */
@Injectable()
export class EditorStore {
  private readonly history = new HistoryStore<ChainDocument>(EMPTY);
  private readonly chainState = signal<ChainDto | null>(null);
  private readonly savedState = signal<ChainDocument | null>(null);
  private readonly catalogueState = signal<ReadonlyMap<string, StageTypeInfo>>(new Map());
  private readonly selectedState = signal<string | null>(null);
  private readonly modeState = signal<string | null>(null);
  /** Text typed for mode overrides in this session (the document keeps only the values). */
  private readonly typedState = signal<ReadonlyMap<string, TypedText>>(new Map());

  readonly doc = this.history.present;
  readonly chain = this.chainState.asReadonly();
  readonly catalogue = this.catalogueState.asReadonly();
  readonly selectedId = this.selectedState.asReadonly();
  readonly canUndo = this.history.canUndo;
  readonly canRedo = this.history.canRedo;
  readonly readOnly = computed(() => this.chainState()?.role === 'viewer');
  /** Whether the document differs from the last saved or loaded one. */
  readonly dirty = computed(() => {
    const saved = this.savedState();
    return saved !== null && !sameJson(saved, this.doc());
  });
  readonly modes = computed(() => modesOf(this.doc()));
  /** The mode being looked at and edited; null: the chain as written. */
  readonly mode = computed(() => findMode(this.doc(), this.modeState()));
  /** The stages as the selected mode sets them (overrides on top; none left out here). */
  readonly stagesInMode = computed(() => {
    const mode = this.mode();
    const typed = this.typedState();
    return mode ? this.doc().stages.map((s) => stageInMode(s, mode, typed)) : this.doc().stages;
  });
  readonly selectedStage = computed(
    () => this.stagesInMode().find((s) => s.id === this.selectedState()) ?? null,
  );
  readonly selectedType = computed(() => {
    const stage = this.selectedStage();
    return stage ? (this.catalogueState().get(stage.type) ?? null) : null;
  });

  readonly roleOf: RoleOf = (stage) => this.catalogueState().get(stage.type)?.role ?? 'two-port';

  setCatalogue(types: StageTypeInfo[]): void {
    this.catalogueState.set(new Map(types.map((t) => [t.type, t])));
  }

  /** Loads a chain from the server: no undo steps, nothing unsaved. */
  load(chain: ChainDto, document: ChainDocument = chain.document): void {
    this.chainState.set(chain);
    this.savedState.set(chain.document);
    this.history.reset(document);
    // A chain with modes opens in its first mode (the one the server analyses by default;
    // a chain whose modes take different paths may not be analysable as written).
    if (!findMode(document, this.modeState())) this.modeState.set(document.modes?.[0]?.id ?? null);
    if (!document.stages.some((s) => s.id === this.selectedState())) {
      this.selectedState.set(document.stages[0]?.id ?? null);
    }
  }

  /** After a save: the new version is the baseline; undo history stays. */
  markSaved(chain: ChainDto): void {
    this.chainState.set(chain);
    this.savedState.set(chain.document);
  }

  select(stageId: string | null): void {
    this.selectedState.set(stageId);
  }

  /** Shows and edits mode `modeId` (null: the chain as written). */
  selectMode(modeId: string | null): void {
    this.modeState.set(modeId);
  }

  /** A new mode with no overrides, selected at once; one undo step. */
  addMode(name: string, kind: ModeKind): EditOutcome {
    if (this.readOnly()) return { ok: false, reason: 'You can view this chain but not change it.' };
    if (!name.trim()) return { ok: false, reason: 'Give the mode a name, e.g. "transmit".' };
    const { doc, id } = addMode(this.doc(), name, kind);
    this.history.commit(doc);
    this.modeState.set(id);
    return { ok: true };
  }

  updateMode(modeId: string, change: { name?: string; kind?: ModeKind }): void {
    if (!this.readOnly()) this.history.commit(updateMode(this.doc(), modeId, change));
  }

  /** Deletes a mode with its overrides (undo brings it back); shows the chain as written. */
  deleteMode(modeId: string): void {
    if (this.readOnly()) return;
    this.history.commit(deleteMode(this.doc(), modeId));
    if (this.modeState() === modeId) this.modeState.set(null);
  }

  /** Drops the selected mode's override of `key` on a stage: the chain's value applies. */
  clearOverride(stageId: string, key: string): void {
    const mode = this.mode();
    if (mode && !this.readOnly())
      this.history.commit(clearOverride(this.doc(), mode.id, stageId, key));
  }

  /** Leaves a stage out of the selected mode, or puts it back. */
  setLeftOut(stageId: string, leftOut: boolean): void {
    const mode = this.mode();
    if (mode && !this.readOnly())
      this.history.commit(setBypass(this.doc(), mode.id, stageId, leftOut));
  }

  undo(): boolean {
    return !this.readOnly() && this.history.undo();
  }

  redo(): boolean {
    return !this.readOnly() && this.history.redo();
  }

  /** Drops a catalogue type at `index` (or after the selected stage when index is omitted). */
  insertType(type: StageTypeInfo, index?: number): EditOutcome {
    const stages = this.doc().stages;
    const selectedIndex = stages.findIndex((s) => s.id === this.selectedState());
    const at = index ?? (selectedIndex >= 0 ? selectedIndex + 1 : stages.length - 1);
    const stage = createStage(type);
    // "Insert after" the load means just before it; after the source, right after it.
    const target = index === undefined && at >= stages.length ? stages.length - 1 : at;
    const outcome = this.applyOrder(insertStage(stages, this.roleOf, stage, target));
    if (outcome.ok) this.selectedState.set(stage.id);
    return outcome;
  }

  move(from: number, to: number): EditOutcome {
    return this.applyOrder(moveStage(this.doc().stages, this.roleOf, from, to));
  }

  moveBy(stageId: string, delta: number): EditOutcome {
    const from = this.doc().stages.findIndex((s) => s.id === stageId);
    return this.move(from, from + delta);
  }

  remove(stageId: string): EditOutcome {
    const stages = this.doc().stages;
    const index = stages.findIndex((s) => s.id === stageId);
    const outcome = this.applyOrder(removeStage(stages, this.roleOf, index), (doc) =>
      forgetStage(doc, stageId),
    );
    if (outcome.ok && this.selectedState() === stageId) {
      this.selectedState.set(this.doc().stages[Math.max(0, index - 1)]?.id ?? null);
    }
    return outcome;
  }

  duplicate(stageId: string): EditOutcome {
    const stages = this.doc().stages;
    const index = stages.findIndex((s) => s.id === stageId);
    const id = newStageId();
    const outcome = this.applyOrder(duplicateStage(stages, this.roleOf, index, id));
    if (outcome.ok) this.selectedState.set(id);
    return outcome;
  }

  /**
   * Replaces one stage (a field edit); consecutive edits of one field are one undo step.
   * With a mode selected, changed values become that mode's overrides (their typed text is
   * remembered for the field); the label, tolerances and data file stay the chain's own.
   */
  updateStage(next: StageInstance, coalesceKey?: string): void {
    if (this.readOnly()) return;
    const mode = this.mode();
    const base = this.doc().stages.find((s) => s.id === next.id);
    let doc = this.doc();
    if (mode && base) {
      const shown = stageInMode(base, mode, this.typedState());
      const typed = new Map(this.typedState());
      for (const [key, value] of Object.entries(next.values)) {
        if (value === shown.values[key] && next.entered?.[key] === shown.entered?.[key]) continue;
        doc = setOverride(doc, mode.id, next.id, key, value);
        const text = next.entered?.[key];
        if (text === undefined) typed.delete(typedKey(mode.id, next.id, key));
        else typed.set(typedKey(mode.id, next.id, key), { text, value });
      }
      this.typedState.set(typed);
      next = { ...next, values: base.values };
      if (base.entered) next.entered = base.entered;
      else delete next.entered;
    }
    const stages = doc.stages.map((s) => (s.id === next.id ? next : s));
    this.history.commit({ ...doc, stages }, coalesceKey && `${next.id}:${coalesceKey}`);
  }

  updateSettings(settings: ChainSettings, coalesceKey?: string): void {
    if (this.readOnly()) return;
    this.history.commit({ ...this.doc(), settings }, coalesceKey && `settings:${coalesceKey}`);
  }

  updateInfo(info: { name?: string; description?: string }, coalesceKey?: string): void {
    if (this.readOnly()) return;
    this.history.commit({ ...this.doc(), ...info }, coalesceKey && `info:${coalesceKey}`);
  }

  /** Replaces the whole document as one undo step (restoring a draft). */
  replaceDocument(document: ChainDocument): void {
    this.history.commit(document);
  }

  private applyOrder(
    change: OrderChange,
    tidy: (doc: ChainDocument) => ChainDocument = (doc) => doc,
  ): EditOutcome {
    if (this.readOnly()) return { ok: false, reason: 'You can view this chain but not change it.' };
    if (!change.ok) return change;
    this.history.commit(tidy({ ...this.doc(), stages: change.stages }));
    if (change.note === 'replaced-source')
      return { ok: true, message: 'The new source replaced the old one.' };
    if (change.note === 'replaced-load')
      return { ok: true, message: 'The new load replaced the old one.' };
    return { ok: true };
  }
}
