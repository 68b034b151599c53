import { Injectable, computed, inject, signal, type Signal } from '@angular/core';
import { SessionStore } from '../session/session.store';

/**
 * Which columns (or nodes) of a table the user hides, remembered in this browser per
 * account and per table (local storage). Only hidden ids are kept, so a column added later
 * shows by default.
 */
@Injectable({ providedIn: 'root' })
export class ColumnChoiceStore {
  private readonly session = inject(SessionStore);
  private readonly version = signal(0);

  /** The hidden ids of `table`, as a signal that follows the signed-in user. */
  hidden(table: string): Signal<ReadonlySet<string>> {
    return computed(() => {
      this.version();
      return new Set(this.read(table));
    });
  }

  setHidden(table: string, id: string, hide: boolean): void {
    const ids = new Set(this.read(table));
    if (hide) ids.add(id);
    else ids.delete(id);
    this.write(table, [...ids]);
  }

  showAll(table: string): void {
    this.write(table, []);
  }

  private key(table: string): string {
    return `cw.columns.${this.session.user()?.id ?? 'visitor'}.${table}`;
  }

  private read(table: string): string[] {
    try {
      const raw = globalThis.localStorage?.getItem(this.key(table));
      const parsed: unknown = raw ? JSON.parse(raw) : [];
      return Array.isArray(parsed) ? parsed.filter((x): x is string => typeof x === 'string') : [];
    } catch {
      return [];
    }
  }

  private write(table: string, ids: string[]): void {
    try {
      globalThis.localStorage?.setItem(this.key(table), JSON.stringify(ids));
    } catch {
      // Storage refused: the choice lasts until the page reloads.
    }
    this.version.update((v) => v + 1);
  }
}
