import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { firstValueFrom } from 'rxjs';
import type {
  MatchCandidate,
  MatchHereResult,
  PreferredSeries,
  SnapResult,
  TuneCandidate,
  TuneResult,
} from '../../../../../shared/engine/design';
import type { UnitKind } from '../../../../../shared/engine/types';
import type { StageInstance } from '../../../../../shared/schema/chain';
import { parseQuantity } from '../../../../../shared/units';
import { describeHttpError } from '../../../core/http/error-message';
import { AnalysisRunner } from '../state/analysis-runner';
import { EditorStore } from '../state/editor.store';
import { withValue } from '../state/stage-factory';
import { CoilPartsComponent } from './coil-parts.component';
import { DesignApi } from './design-api';
import { DesignFieldComponent } from './design-field.component';
import { ValueKnobComponent } from './value-knob.component';
import { SparkPlotComponent } from './spark-plot.component';
import { decibels, engineering, figures, impedanceRect, plain } from '../results/format-quantity';

const SERIES: PreferredSeries[] = ['E6', 'E12', 'E24', 'E48', 'E96'];

/**
 * The design tools beside the chain: tune a resonator to f0, match between two stages,
 * snap parts to a preferred series, coil turns and the parts list, and a knob that turns a
 * value while the response follows. Every answer is applied as one undoable edit.
 */
@Component({
  selector: 'cw-design-panel',
  imports: [
    MatButtonModule,
    SparkPlotComponent,
    CoilPartsComponent,
    ValueKnobComponent,
    DesignFieldComponent,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './design-panel.component.html',
  styleUrl: './design-panel.component.scss',
})
export class DesignPanelComponent {
  readonly readOnly = input(false);

  protected readonly store = inject(EditorStore);
  private readonly runner = inject(AnalysisRunner);
  private readonly api = inject(DesignApi);

  protected readonly series = SERIES;
  protected readonly busy = signal<string | null>(null);
  protected readonly error = signal<string | null>(null);

  private readonly workspaceId = computed(() => this.store.chain()?.workspaceId);
  protected readonly resonators = computed(() => this.runner.result()?.resonators ?? []);
  protected readonly f0Hz = computed(() => this.store.doc().settings.f0Hz);

  // ---------------------------------------------------------------- tune
  protected readonly resonatorIndex = signal(0);
  protected readonly tuneTargetText = signal('');
  protected readonly candidates = signal<TuneCandidate[]>([]);
  protected readonly elementIndex = signal(0);
  protected readonly tuned = signal<TuneResult | null>(null);
  /** Null: the resonator's resonance goes on the target; a node: the pass-band peak there. */
  protected readonly tunePeakNode = signal<number | null>(null);
  /** Nodes whose peak can be tuned: node n is the output of stage n (0: the source's). */
  protected readonly peakNodes = computed(() =>
    (this.runner.result()?.selectivity ?? []).map((s) => ({
      node: s.node,
      after: this.store.doc().stages[s.node]?.label || this.store.doc().stages[s.node]?.type,
    })),
  );

  // ---------------------------------------------------------------- match here
  protected readonly afterStageId = signal<string | null>(null);
  protected readonly matchQ = signal('10');
  protected readonly matchK = signal('0.5');
  protected readonly parasiticText = signal('');
  protected readonly partQl = signal('200');
  protected readonly typedZs = signal('');
  protected readonly typedZl = signal('');
  protected readonly matches = signal<MatchHereResult | null>(null);
  protected readonly matchAfterOptions = computed(() => this.store.doc().stages.slice(0, -1));

  // ---------------------------------------------------------------- snap
  protected readonly snapSeries = signal<PreferredSeries>('E12');
  protected readonly snapScope = signal<'chain' | 'stage'>('chain');
  protected readonly snapped = signal<SnapResult | null>(null);

  protected fmt(v: number | null | undefined, unit: UnitKind): string {
    return v === null || v === undefined || !Number.isFinite(v) ? '—' : engineering(v, unit);
  }

  /** Figures written as every table writes them (the user's significant figures). */
  protected readonly db = decibels;
  protected readonly num = plain;
  protected readonly impedance = impedanceRect;
  protected dbNum(v: number): string {
    return figures(v, undefined, true);
  }

  protected partText(p: { part: 'L' | 'C'; place: string; value: number }): string {
    return `${p.place} ${p.part} ${engineering(p.value, p.part === 'L' ? 'henry' : 'farad')}`;
  }

  protected inputValue(event: Event): string {
    return (event.target as HTMLInputElement | HTMLSelectElement).value;
  }

  private async run<T>(what: string, work: () => Promise<T>): Promise<T | null> {
    this.busy.set(what);
    this.error.set(null);
    try {
      return await work();
    } catch (e) {
      this.error.set(describeHttpError(e));
      return null;
    } finally {
      this.busy.set(null);
    }
  }

  // ---------------------------------------------------------------- tune
  protected async chooseResonator(index: number): Promise<void> {
    this.resonatorIndex.set(index);
    this.tuned.set(null);
    const r = this.resonators()[index];
    if (!r) return;
    const list = await this.run('candidates', () =>
      firstValueFrom(
        this.api.tuneCandidates(
          this.store.doc(),
          { stageId: r.stageId, label: r.label },
          this.workspaceId(),
        ),
      ),
    );
    this.candidates.set(list ?? []);
    this.elementIndex.set(
      Math.max(
        0,
        (list ?? []).findIndex((c) => c.unit === 'farad'),
      ),
    );
  }

  protected async solveTune(): Promise<void> {
    const r = this.resonators()[this.resonatorIndex()];
    const el = this.candidates()[this.elementIndex()];
    if (!r || !el) {
      this.error.set('Choose a resonator and the value to solve first.');
      return;
    }
    const text = this.tuneTargetText().trim();
    const parsed = text ? parseQuantity(text, 'hertz') : { ok: true as const, value: this.f0Hz() };
    if (!parsed.ok) {
      this.error.set(`Target frequency: ${parsed.message}`);
      return;
    }
    const peakNode = this.tunePeakNode();
    const result = await this.run('tune', () =>
      firstValueFrom(
        this.api.tune(
          this.store.doc(),
          {
            resonator: { stageId: r.stageId, label: r.label },
            element: { stageId: el.stageId, key: el.key },
            targetHz: parsed.value,
            ...(peakNode === null ? {} : { peakNode }),
          },
          this.workspaceId(),
        ),
      ),
    );
    this.tuned.set(result);
  }

  protected applyTune(): void {
    const t = this.tuned();
    if (!t) return;
    const stage = this.store.doc().stages.find((s) => s.id === t.element.stageId);
    if (!stage) return;
    this.store.updateStage(withValue(stage, t.element.key, t.value));
    this.tuned.set(null);
  }

  // ---------------------------------------------------------------- match here
  private complexOf(text: string, what: string): { re: number; im: number } | undefined {
    const t = text.trim();
    if (!t) return undefined;
    // "10 - j2350" or "10-2350j" or "1000"
    const m = /^([-+]?[\d.eE+-]+?)\s*(?:([-+])\s*j?\s*([\d.eE+]+)\s*j?)?\s*(?:Ω|ohms?)?$/.exec(t);
    if (!m) throw new Error(`${what}: write it as R + jX in ohms, e.g. 10 - j2350`);
    const re = Number(m[1]);
    const im = m[3] ? Number(m[3]) * (m[2] === '-' ? -1 : 1) : 0;
    if (!Number.isFinite(re) || !Number.isFinite(im)) {
      throw new Error(`${what}: write it as R + jX in ohms, e.g. 10 - j2350`);
    }
    return { re, im };
  }

  protected async listMatches(): Promise<void> {
    const doc = this.store.doc();
    const after =
      this.afterStageId() ??
      (doc.stages.findIndex((s) => s.id === this.store.selectedId()) < doc.stages.length - 1
        ? this.store.selectedId()
        : doc.stages[0]?.id) ??
      doc.stages[0]?.id;
    if (!after) return;
    let zSource: { re: number; im: number } | undefined;
    let zLoad: { re: number; im: number } | undefined;
    try {
      zSource = this.complexOf(this.typedZs(), 'Source side');
      zLoad = this.complexOf(this.typedZl(), 'Load side');
    } catch (e) {
      this.error.set((e as Error).message);
      return;
    }
    const parasitic = this.parasiticText().trim()
      ? parseQuantity(this.parasiticText(), 'farad')
      : { ok: true as const, value: 0 };
    if (!parasitic.ok) {
      this.error.set(`Device capacitance: ${parasitic.message}`);
      return;
    }
    this.afterStageId.set(after);
    const result = await this.run('match', () =>
      firstValueFrom(
        this.api.matchHere(
          doc,
          {
            afterStageId: after,
            q: Number(this.matchQ()),
            k: Number(this.matchK()),
            parasiticC: parasitic.value,
            partsQ: { ql: Number(this.partQl()) },
            ...(zSource ? { zSource } : {}),
            ...(zLoad ? { zLoad } : {}),
          },
          this.workspaceId(),
        ),
      ),
    );
    this.matches.set(result);
  }

  protected insertMatch(candidate: MatchCandidate): void {
    const doc = this.store.doc();
    const at = doc.stages.findIndex((s) => s.id === this.afterStageId());
    if (at < 0) return;
    const stages = [
      ...doc.stages.slice(0, at + 1),
      ...(candidate.stages as StageInstance[]),
      ...doc.stages.slice(at + 1),
    ];
    this.store.replaceDocument({ ...doc, stages });
    this.store.select(candidate.stages[0].id);
    this.matches.set(null);
  }

  // ---------------------------------------------------------------- snap
  protected async previewSnap(): Promise<void> {
    const stageId =
      this.snapScope() === 'stage' ? (this.store.selectedId() ?? undefined) : undefined;
    const result = await this.run('snap', () =>
      firstValueFrom(
        this.api.snap(this.store.doc(), this.snapSeries(), stageId, this.workspaceId()),
      ),
    );
    this.snapped.set(result);
  }

  protected applySnap(): void {
    const s = this.snapped();
    if (!s) return;
    this.store.replaceDocument(s.document);
    this.snapped.set(null);
  }
}
