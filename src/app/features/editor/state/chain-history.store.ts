import { computed, signal, type WritableSignal } from '@angular/core';

/** How many steps back undo can go; older steps are dropped. */
const DEPTH = 200;

/**
 * Undo/redo over immutable snapshots (the editor keeps whole chain documents). Commits
 * with the same `coalesceKey` in a row merge into one step, so typing "22 uH" is one undo,
 * not six.
 */
export class HistoryStore<T> {
  private readonly past = signal<readonly T[]>([]);
  private readonly future = signal<readonly T[]>([]);
  private readonly current: WritableSignal<T>;
  private lastKey: string | null = null;

  /** The present snapshot. */
  readonly present;
  readonly canUndo = computed(() => this.past().length > 0);
  readonly canRedo = computed(() => this.future().length > 0);

  constructor(initial: T) {
    this.current = signal(initial);
    this.present = this.current.asReadonly();
  }

  /** Makes `next` the present; the old present becomes an undo step unless coalesced. */
  commit(next: T, coalesceKey?: string): void {
    const merge = coalesceKey !== undefined && coalesceKey === this.lastKey && this.canUndo();
    if (!merge) this.past.update((p) => [...p, this.current()].slice(-DEPTH));
    this.future.set([]);
    this.current.set(next);
    this.lastKey = coalesceKey ?? null;
  }

  undo(): boolean {
    const past = this.past();
    if (past.length === 0) return false;
    this.future.update((f) => [this.current(), ...f]);
    this.current.set(past[past.length - 1]);
    this.past.set(past.slice(0, -1));
    this.lastKey = null;
    return true;
  }

  redo(): boolean {
    const [next, ...rest] = this.future();
    if (next === undefined) return false;
    this.past.update((p) => [...p, this.current()]);
    this.current.set(next);
    this.future.set(rest);
    this.lastKey = null;
    return true;
  }

  /** Starts over from `snapshot` with no undo steps (after loading or reloading). */
  reset(snapshot: T): void {
    this.past.set([]);
    this.future.set([]);
    this.current.set(snapshot);
    this.lastKey = null;
  }
}
