import {
  ChangeDetectionStrategy,
  Component,
  computed,
  DestroyRef,
  inject,
  input,
  signal,
} from '@angular/core';
import type { ParamSpec } from '../../../../../shared/engine/types';
import { AnalysisRunner } from '../state/analysis-runner';
import { EditorStore } from '../state/editor.store';
import { visibleParams, withValue } from '../state/stage-factory';
import { tunedChain } from './tuned-chain';
import type { KnobAnswer, KnobQuestion } from './knob-messages';
import { SparkPlotComponent } from './spark-plot.component';
import { decibels, engineering, plain } from '../results/format-quantity';

/** Slider half-range in ln(value): coarse ×/÷ 2, fine ±10 %. */
const SPAN = { coarse: Math.log(2), fine: Math.log(1.1) };
const STEPS = 1000;

/**
 * Turns one numeric value of the selected stage continuously (slider, or the mouse wheel
 * over it: fine steps, coarse with Shift). While it turns, the chain is analysed in a Web
 * Worker and the response and key figures follow; on release the value lands as one
 * undoable edit and the server's analysis takes over again.
 */
@Component({
  selector: 'cw-value-knob',
  imports: [SparkPlotComponent],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './value-knob.component.html',
  styleUrl: './value-knob.component.scss',
})
export class ValueKnobComponent {
  readonly readOnly = input(false);

  protected readonly store = inject(EditorStore);
  private readonly runner = inject(AnalysisRunner);
  private worker: Worker | null = null;
  private nextId = 0;
  private busy = false;
  private queued: Omit<KnobQuestion, 'id'> | null = null;
  private answerTimes: number[] = [];

  protected readonly key = signal<string | null>(null);
  protected readonly mode = signal<'coarse' | 'fine'>('coarse');
  /** The value when the gesture began, and the slider position (−STEPS … STEPS). */
  protected readonly base = signal<number | null>(null);
  protected readonly position = signal(0);
  protected readonly live = signal<Extract<KnobAnswer, { ok: true }> | null>(null);
  protected readonly failure = signal<string | null>(null);
  protected readonly rate = signal<number | null>(null);
  protected readonly steps = STEPS;

  protected readonly params = computed<ParamSpec[]>(() => {
    const stage = this.store.selectedStage();
    const type = this.store.selectedType();
    if (!stage || !type) return [];
    return visibleParams(stage, type).filter(
      (p) => p.kind === 'number' && typeof stage.values[p.key] === 'number',
    );
  });
  protected readonly spec = computed<ParamSpec | null>(
    () => this.params().find((p) => p.key === this.key()) ?? this.params()[0] ?? null,
  );
  protected readonly current = computed(() => {
    const spec = this.spec();
    const stage = this.store.selectedStage();
    const v = spec && stage ? stage.values[spec.key] : null;
    return typeof v === 'number' ? v : null;
  });
  protected readonly turning = computed(() => {
    const b = this.base();
    return b === null ? null : b * Math.exp((this.position() / STEPS) * SPAN[this.mode()]);
  });

  constructor() {
    inject(DestroyRef).onDestroy(() => this.worker?.terminate());
  }

  protected readonly db = decibels;
  protected readonly num = plain;

  protected fmt(v: number | null | undefined): string {
    const spec = this.spec();
    return v === null || v === undefined || !spec ? '—' : engineering(v, spec.unit);
  }

  protected fmtHz(v: number | null | undefined): string {
    return v === null || v === undefined ? '—' : engineering(v, 'hertz');
  }

  protected choose(event: Event): void {
    this.key.set((event.target as HTMLSelectElement).value);
    this.reset();
  }

  protected setMode(mode: 'coarse' | 'fine'): void {
    this.mode.set(mode);
    this.reset();
  }

  private reset(): void {
    this.base.set(null);
    this.position.set(0);
    this.live.set(null);
  }

  private begin(): void {
    if (this.base() === null) {
      this.base.set(this.current());
      this.answerTimes = [];
      this.rate.set(null);
    }
  }

  protected onSlide(event: Event): void {
    if (this.readOnly()) return;
    this.begin();
    this.position.set(Number((event.target as HTMLInputElement).value));
    this.ask();
  }

  private wheelTimer: ReturnType<typeof setTimeout> | null = null;

  protected onWheel(event: WheelEvent): void {
    if (this.readOnly() || this.current() === null) return;
    event.preventDefault();
    this.begin();
    const step = event.shiftKey ? 50 : 5;
    const next = this.position() + (event.deltaY < 0 ? step : -step);
    this.position.set(Math.max(-STEPS, Math.min(STEPS, next)));
    this.ask();
    if (this.wheelTimer) clearTimeout(this.wheelTimer);
    this.wheelTimer = setTimeout(() => this.release(), 400);
  }

  /** The gesture ends: one undoable edit with the value reached. */
  protected release(): void {
    const value = this.turning();
    const spec = this.spec();
    const stage = this.store.selectedStage();
    if (value === null || !spec || !stage || this.readOnly()) return;
    const bounded = Math.min(Math.max(value, spec.min ?? -Infinity), spec.max ?? Infinity);
    this.store.updateStage(withValue(stage, spec.key, bounded));
    this.base.set(null);
    this.position.set(0);
  }

  private ask(): void {
    const value = this.turning();
    const spec = this.spec();
    const stage = this.store.selectedStage();
    if (value === null || !spec || !stage) return;
    this.queued = tunedChain(this.store.doc(), this.store.mode(), stage.id, spec.key, value);
    this.pump();
  }

  /** Only the latest value is analysed: a value overtaken while the worker is busy is skipped. */
  private pump(): void {
    if (this.busy || !this.queued) return;
    this.worker ??= this.createWorker();
    const question: KnobQuestion = { id: ++this.nextId, ...this.queued };
    this.queued = null;
    this.busy = true;
    this.worker.postMessage(question);
  }

  private createWorker(): Worker {
    const worker = new Worker(new URL('./knob.worker', import.meta.url), { type: 'module' });
    worker.onmessage = ({ data }: MessageEvent<KnobAnswer>) => {
      this.busy = false;
      if (data.ok) {
        this.live.set(data);
        // The main plots and key figures follow too, until the server answers the release.
        if (this.base() !== null) this.runner.showLive(data.live);
        this.failure.set(null);
        this.countAnswer();
      } else {
        this.failure.set(data.message);
      }
      this.pump();
    };
    worker.onerror = (e) => {
      this.busy = false;
      this.failure.set(`The live analysis stopped: ${e.message}`);
    };
    return worker;
  }

  /** Updates per second over the last second of answers. */
  private countAnswer(): void {
    const now = performance.now();
    this.answerTimes.push(now);
    this.answerTimes = this.answerTimes.filter((t) => now - t <= 1000);
    const first = this.answerTimes[0];
    if (this.answerTimes.length >= 2 && now > first) {
      this.rate.set(((this.answerTimes.length - 1) * 1000) / (now - first));
    }
  }
}
