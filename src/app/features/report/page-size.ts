import { DOCUMENT, Injectable, inject, signal } from '@angular/core';

export type PageSize = 'A4' | 'Letter';

/** The paper sizes offered, with their printable margins. */
export const PAGE_SIZES: { size: PageSize; label: string; css: string }[] = [
  { size: 'A4', label: 'A4', css: 'A4 portrait' },
  { size: 'Letter', label: 'Letter', css: 'letter portrait' },
];

const STORAGE_KEY = 'cw.report.pageSize';

/**
 * The report's paper size: remembered in this browser, and written into the page as an
 * `@page` rule so the print dialog and a PDF start on that size.
 */
@Injectable({ providedIn: 'root' })
export class PageSizeStore {
  private readonly page = inject(DOCUMENT);
  private readonly chosen = signal<PageSize>(this.stored());
  readonly size = this.chosen.asReadonly();

  constructor() {
    this.apply(this.chosen());
  }

  set(size: PageSize): void {
    this.chosen.set(size);
    try {
      this.page.defaultView?.localStorage.setItem(STORAGE_KEY, size);
    } catch {
      // Storage may be off (private mode): the choice then lasts for this page only.
    }
    this.apply(size);
  }

  private stored(): PageSize {
    try {
      const value = this.page.defaultView?.localStorage.getItem(STORAGE_KEY);
      return value === 'Letter' ? 'Letter' : 'A4';
    } catch {
      return 'A4';
    }
  }

  private apply(size: PageSize): void {
    const css = PAGE_SIZES.find((p) => p.size === size)?.css ?? 'A4 portrait';
    let style = this.page.getElementById('cw-page-size') as HTMLStyleElement | null;
    if (!style) {
      style = this.page.createElement('style');
      style.id = 'cw-page-size';
      this.page.head.appendChild(style);
    }
    style.textContent = `@page { size: ${css}; margin: 14mm 12mm 16mm; }`;
  }
}
