import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';

/** Small UI glyphs of the editor on a 24-unit grid, stroked in the text colour. */
const GLYPHS = {
  undo: 'M9 14L4 9l5-5M4 9h10a6 6 0 0 1 0 12h-3',
  redo: 'M15 14l5-5-5-5M20 9H10a6 6 0 0 0 0 12h3',
  left: 'M15 5l-7 7 7 7',
  right: 'M9 5l7 7-7 7',
  duplicate: 'M8 8h12v12H8zM16 8V4H4v12h4',
  remove: 'M4 7h16M9 7V4h6v3M6 7l1 13h10l1-13',
  insert: 'M12 5v14M5 12h14',
  save: 'M5 4h11l3 3v13H5zM8 4v5h7V4M8 20v-6h8v6',
  download: 'M12 4v11M7 10l5 5 5-5M5 20h14',
  history: 'M3 12a9 9 0 1 0 3-6.7M3 4v5h5M12 7v5l3 3',
  tune: 'M4 6h10M18 6h2M4 12h4M12 12h8M4 18h12M20 18h0M14 4v4M8 10v4M16 16v4',
  error: 'M12 3l9 16H3zM12 10v4M12 17v.01',
  warning: 'M12 3a9 9 0 1 0 0.01 0M12 7v6M12 16v.01',
  info: 'M12 3a9 9 0 1 0 0.01 0M12 11v6M12 7v.01',
  close: 'M6 6l12 12M18 6L6 18',
  compare: 'M4 5h6v14H4zM14 5h6v14h-6zM6 9h2M16 13h2',
  grip: 'M9 6v.01M15 6v.01M9 12v.01M15 12v.01M9 18v.01M15 18v.01',
} as const;

export type GlyphName = keyof typeof GLYPHS;

@Component({
  selector: 'cw-glyph',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <svg
      viewBox="0 0 24 24"
      [attr.width]="size()"
      [attr.height]="size()"
      aria-hidden="true"
      focusable="false"
    >
      <path
        [attr.d]="path()"
        fill="none"
        stroke="currentColor"
        stroke-width="2"
        stroke-linecap="round"
        stroke-linejoin="round"
      />
    </svg>
  `,
  styles: `
    :host {
      display: inline-flex;
      vertical-align: middle;
    }
  `,
})
export class GlyphComponent {
  readonly name = input.required<GlyphName>();
  readonly size = input(20);
  protected readonly path = computed(() => GLYPHS[this.name()]);
}
