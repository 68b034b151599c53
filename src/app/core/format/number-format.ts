import { Injectable, effect, inject, signal } from '@angular/core';
import { SessionStore } from '../session/session.store';

/** Significant figures shown when the user has chosen none. */
export const DEFAULT_SIGNIFICANT_FIGURES = 4;
export const MIN_SIGNIFICANT_FIGURES = 2;
export const MAX_SIGNIFICANT_FIGURES = 8;

/** Reference resistance the Smith chart is normalised to when the user has chosen none. */
export const DEFAULT_SMITH_REFERENCE_OHM = 50;

const sigFigs = signal(DEFAULT_SIGNIFICANT_FIGURES);
const smithZ0 = signal(DEFAULT_SMITH_REFERENCE_OHM);

/**
 * The number of significant figures every figure on screen is written with (tables, cards,
 * tooltips, plot labels). A signal: whatever formats with it redraws when the user changes it.
 */
export const significantFigures = sigFigs.asReadonly();

/** The resistance, in ohms, the Smith chart is drawn normalised to (a user setting). */
export const smithReferenceOhm = smithZ0.asReadonly();

/** Whether `value` can be a Smith chart reference: a finite resistance above zero. */
export function isReferenceOhm(value: number): boolean {
  return Number.isFinite(value) && value > 0 && value <= 1e9;
}

/** Sets the figure count for this page (the store calls it; so do specs). */
export function applySignificantFigures(value: number): void {
  sigFigs.set(clampFigures(value));
}

/** Keeps a requested figure count inside what the setting offers. */
export function clampFigures(value: number): number {
  if (!Number.isFinite(value)) return DEFAULT_SIGNIFICANT_FIGURES;
  return Math.min(MAX_SIGNIFICANT_FIGURES, Math.max(MIN_SIGNIFICANT_FIGURES, Math.round(value)));
}

function storageKey(userId: string, what: 'figures' | 'smith' = 'figures'): string {
  return what === 'figures' ? `cw.number-format.${userId}` : `cw.smith-reference.${userId}`;
}

/**
 * The user's number format, kept in this browser per account (local storage), and applied
 * to `significantFigures` whenever the signed-in user changes.
 */
@Injectable({ providedIn: 'root' })
export class NumberFormatStore {
  private readonly session = inject(SessionStore);
  readonly figures = significantFigures;
  readonly smithReference = smithReferenceOhm;

  constructor() {
    effect(() => {
      const userId = this.session.user()?.id;
      sigFigs.set(userId ? readFigures(userId) : DEFAULT_SIGNIFICANT_FIGURES);
      smithZ0.set(userId ? readReference(userId) : DEFAULT_SMITH_REFERENCE_OHM);
    });
  }

  /** Sets the Smith chart reference; returns false (and changes nothing) for a bad value. */
  setSmithReference(ohm: number): boolean {
    if (!isReferenceOhm(ohm)) return false;
    smithZ0.set(ohm);
    const userId = this.session.user()?.id;
    if (userId) store(storageKey(userId, 'smith'), String(ohm));
    return true;
  }

  setFigures(value: number): void {
    const figures = clampFigures(value);
    sigFigs.set(figures);
    const userId = this.session.user()?.id;
    if (userId) store(storageKey(userId), String(figures));
  }
}

function store(key: string, value: string): void {
  try {
    globalThis.localStorage?.setItem(key, value);
  } catch {
    // Storage full or refused (private mode): the choice still holds for this visit.
  }
}

function readReference(userId: string): number {
  try {
    const stored = Number(globalThis.localStorage?.getItem(storageKey(userId, 'smith')) ?? NaN);
    return isReferenceOhm(stored) ? stored : DEFAULT_SMITH_REFERENCE_OHM;
  } catch {
    return DEFAULT_SMITH_REFERENCE_OHM;
  }
}

function readFigures(userId: string): number {
  try {
    const stored = globalThis.localStorage?.getItem(storageKey(userId));
    return stored ? clampFigures(Number(stored)) : DEFAULT_SIGNIFICANT_FIGURES;
  } catch {
    return DEFAULT_SIGNIFICANT_FIGURES;
  }
}
