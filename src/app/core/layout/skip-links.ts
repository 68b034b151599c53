import { Injectable, signal } from '@angular/core';

/** A "skip to" link a page offers at the top of the tab order. */
export interface SkipLink {
  label: string;
  /** Id of the element that receives focus. */
  targetId: string;
}

/**
 * Page-specific skip links (the editor: to the stages, to the results). The shell lists
 * them after its own "Skip to content" so a keyboard user reaches them first.
 */
@Injectable({ providedIn: 'root' })
export class SkipLinks {
  private readonly items = signal<SkipLink[]>([]);
  readonly links = this.items.asReadonly();

  set(links: SkipLink[]): void {
    this.items.set(links);
  }

  clear(): void {
    this.items.set([]);
  }
}

/**
 * Moves focus to the element with `targetId` (made focusable if it is not) and scrolls it
 * into view. Fragment links are not used: with a base href they would leave the page.
 */
export function focusById(doc: Document, targetId: string): boolean {
  const target = doc.getElementById(targetId);
  if (!target) return false;
  if (!target.hasAttribute('tabindex') && target.tabIndex < 0)
    target.setAttribute('tabindex', '-1');
  target.focus();
  target.scrollIntoView?.({ block: 'start' });
  return true;
}
