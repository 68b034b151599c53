import { DOCUMENT } from '@angular/common';
import { effect, inject, Injectable, signal } from '@angular/core';

export type ThemeMode = 'light' | 'dark';

const STORAGE_KEY = 'cw.theme';

/**
 * Light or dark, remembered in localStorage. Without a stored choice it follows the
 * system's preference. The mode is a class on <html> that flips `color-scheme`, which
 * the Material tokens (built with light-dark()) and our --cw-* properties follow.
 */
@Injectable({ providedIn: 'root' })
export class ThemeStore {
  private readonly document = inject(DOCUMENT);
  private readonly modeState = signal<ThemeMode>(this.initialMode());
  readonly mode = this.modeState.asReadonly();

  constructor() {
    effect(() => {
      this.document.documentElement.classList.toggle('cw-dark', this.modeState() === 'dark');
    });
  }

  toggle(): void {
    this.set(this.modeState() === 'dark' ? 'light' : 'dark');
  }

  set(mode: ThemeMode): void {
    this.modeState.set(mode);
    try {
      this.document.defaultView?.localStorage.setItem(STORAGE_KEY, mode);
    } catch {
      // Storage may be disabled (private windows); the choice then lasts for this visit.
    }
  }

  private initialMode(): ThemeMode {
    const view = this.document.defaultView;
    try {
      const stored = view?.localStorage.getItem(STORAGE_KEY);
      if (stored === 'light' || stored === 'dark') return stored;
    } catch {
      // Fall through to the system preference.
    }
    return view?.matchMedia?.('(prefers-color-scheme: dark)').matches ? 'dark' : 'light';
  }
}
