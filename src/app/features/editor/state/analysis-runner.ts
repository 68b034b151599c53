import { HttpErrorResponse } from '@angular/common/http';
import {
  afterNextRender,
  computed,
  DestroyRef,
  effect,
  inject,
  Injectable,
  Injector,
  signal,
  untracked,
} from '@angular/core';
import { catchError, map, of, Subject, switchMap, tap } from 'rxjs';
import type { ChainIssue } from '../../../../../shared/engine/errors';
import type { AnalysisResult } from '../../../../../shared/engine/types';
import type { ChainDocument } from '../../../../../shared/schema/chain';
import { significantFigures } from '../../../core/format/number-format';
import { describeHttpError } from '../../../core/http/error-message';
import type { LiveAnalysis } from '../design/knob-messages';
import { AnalysisApi } from './analysis-api';
import { sendAfterQuiet } from './edit-window';

/**
 * The quiet spell that decides when an edit is analysed (`sendAfterQuiet`): an edit after
 * this long without one goes at once, closer edits are gathered until they pause this long.
 * Short, because the edit → updated plot budget is 100 ms and a newer edit cancels a stale
 * request anyway.
 */
export const ANALYSIS_QUIET_MS = 50;
/** performance.measure name from an edit to the rendered result (read by browser tests). */
export const EDIT_TO_RENDER_MEASURE = 'cw-edit-to-render';
const EDIT_MARK = 'cw-edit';

/** Why the server would not analyse the chain, with the stages and fields at fault. */
export interface AnalysisRefusal {
  message: string;
  issues: ChainIssue[];
}

/** A document to analyse, with the time of the edit that made it (performance clock). */
interface Edit {
  doc: ChainDocument;
  at: number;
  /** The workspace whose data files the stages may refer to. */
  workspaceId?: string;
  /** The mode to analyse (absent: the document as sent). */
  mode?: string;
  /** The significant figures the server writes the flag sentences with (the user's setting). */
  figures: number;
}

type Outcome =
  | { kind: 'result'; result: AnalysisResult; editedAt: number }
  | { kind: 'refused'; refusal: AnalysisRefusal }
  | { kind: 'failed'; message: string };

/**
 * Runs the analysis for each edit of the chain: at once after a quiet spell, gathered while
 * edits come in a burst (`sendAfterQuiet`), and a newer edit cancels the request still in
 * flight (switchMap), so only the latest document's answer lands.
 * The last good result stays visible while a refused or failed edit is fixed.
 */
@Injectable()
export class AnalysisRunner {
  private readonly api = inject(AnalysisApi);
  private readonly injector = inject(Injector);
  private readonly edits = new Subject<Edit>();
  /** The last document queued, re-sent when the figures setting changes. */
  private lastEdit: Edit | null = null;

  private readonly resultState = signal<AnalysisResult | null>(null);
  private readonly pendingState = signal(false);
  private readonly refusalState = signal<AnalysisRefusal | null>(null);
  private readonly failureState = signal<string | null>(null);

  /** The latest analysis of a valid chain (the server's). */
  readonly result = this.resultState.asReadonly();
  private readonly liveState = signal<LiveAnalysis | null>(null);
  /**
   * What the results panel shows: the server's analysis, with the sweep and f0 figures of a
   * value being turned laid over it until the server's answer for the released value lands.
   */
  readonly shown = computed<AnalysisResult | null>(() => {
    const result = this.resultState();
    const live = this.liveState();
    return result && live ? { ...result, ...live } : result;
  });
  /** Whether `shown` carries a turning value's live figures. */
  readonly turning = computed(() => this.liveState() !== null);
  /** Whether an edit is waiting for its analysis. */
  readonly pending = this.pendingState.asReadonly();
  /** The server refused the latest document (422). */
  readonly refusal = this.refusalState.asReadonly();
  /** The request failed for another reason (network, 5xx). */
  readonly failure = this.failureState.asReadonly();

  constructor() {
    const subscription = this.edits
      .pipe(
        tap(() => this.pendingState.set(true)),
        sendAfterQuiet(ANALYSIS_QUIET_MS),
        switchMap((edit) =>
          this.api.analyse(edit.doc, edit.workspaceId, edit.mode, edit.figures).pipe(
            map((result): Outcome => ({ kind: 'result', result, editedAt: edit.at })),
            catchError((error: unknown) => of(toOutcome(error))),
          ),
        ),
      )
      .subscribe((outcome) => this.land(outcome));
    inject(DestroyRef).onDestroy(() => subscription.unsubscribe());
    // A new figures setting re-asks for the latest document, so its flag sentences follow.
    effect(() => {
      const figures = significantFigures();
      const last = untracked(() => this.lastEdit);
      if (last && last.figures !== figures) this.send({ ...last, figures, at: markEdit() });
    });
  }

  /** Queues `doc` for analysis (in `mode`); call on every change of the document or mode. */
  request(doc: ChainDocument, workspaceId?: string, mode?: string): void {
    const figures = significantFigures();
    this.send({ doc, at: markEdit(), workspaceId, ...(mode ? { mode } : {}), figures });
  }

  private send(edit: Edit): void {
    this.lastEdit = edit;
    this.edits.next(edit);
  }

  /** Lays a turning value's live figures over the result (null: show the server's alone). */
  showLive(live: LiveAnalysis | null): void {
    this.liveState.set(live);
  }

  private land(outcome: Outcome): void {
    this.pendingState.set(false);
    // The server's answer replaces any live figures: the saved result stays the server's.
    this.liveState.set(null);
    if (outcome.kind === 'result') {
      this.resultState.set(outcome.result);
      this.refusalState.set(null);
      this.failureState.set(null);
      const editedAt = outcome.editedAt;
      afterNextRender(() => measureEditToRender(editedAt), { injector: this.injector });
    } else if (outcome.kind === 'refused') {
      this.refusalState.set(outcome.refusal);
      this.failureState.set(null);
    } else {
      this.failureState.set(outcome.message);
    }
  }
}

function toOutcome(error: unknown): Outcome {
  if (error instanceof HttpErrorResponse && error.status === 422) {
    const body = (error.error ?? {}) as { message?: string; details?: unknown };
    const issues = Array.isArray(body.details) ? (body.details as ChainIssue[]) : [];
    return {
      kind: 'refused',
      refusal: { message: body.message ?? 'The chain cannot be analysed as it stands.', issues },
    };
  }
  return { kind: 'failed', message: describeHttpError(error) };
}

/** Marks the edit on the page's timeline and returns its time (0 without a timeline). */
function markEdit(): number {
  if (typeof performance?.mark !== 'function') return 0;
  performance.clearMarks?.(EDIT_MARK);
  return performance.mark(EDIT_MARK)?.startTime ?? performance.now();
}

/**
 * Measures from the edit whose analysis was just rendered (not from a later edit made
 * while the answer was on its way, which would read too fast).
 */
function measureEditToRender(editedAt: number): void {
  if (typeof performance?.measure !== 'function' || editedAt <= 0) return;
  performance.measure(EDIT_TO_RENDER_MEASURE, { start: editedAt, end: performance.now() });
}
