import { inject, provideAppInitializer } from '@angular/core';
import { MatIconRegistry } from '@angular/material/icon';
import { DomSanitizer } from '@angular/platform-browser';

/**
 * The app's own icons, drawn on a 24-unit grid with strokes in currentColor so they follow
 * the text colour in both themes. Shipped in the bundle: nothing is fetched from elsewhere.
 */
const STROKE =
  'fill="none" stroke="currentColor" stroke-width="2" stroke-linecap="round" stroke-linejoin="round"';

const ICONS: Record<string, string> = {
  // The product mark: a signal stepping up through a tuned stage.
  mark: `<path d="M2 15h4l2.5-6 3.5 11 3.5-15 2.5 10h4" ${STROKE}/>`,
  add: `<path d="M12 5v14M5 12h14" ${STROKE}/>`,
  delete: `<path d="M4 7h16M9 7V4h6v3M6 7l1 13h10l1-13M10 11v6M14 11v6" ${STROKE}/>`,
  compare: `<rect x="3" y="5" width="7" height="14" rx="1" ${STROKE}/><rect x="14" y="5" width="7" height="14" rx="1" ${STROKE}/><path d="M5.5 10h2M16.5 14h2" ${STROKE}/>`,
  copy: `<rect x="8" y="8" width="12" height="12" rx="2" ${STROKE}/><path d="M16 8V5a1 1 0 0 0-1-1H5a1 1 0 0 0-1 1v10a1 1 0 0 0 1 1h3" ${STROKE}/>`,
  // A branch: a variant grows from its parent.
  variant: `<circle cx="6" cy="5" r="2" ${STROKE}/><circle cx="6" cy="19" r="2" ${STROKE}/><circle cx="18" cy="9" r="2" ${STROKE}/><path d="M6 7v10M18 11c0 4-6 3-12 6" ${STROKE}/>`,
  rename: `<path d="M4 20h4L19 9l-4-4L4 16v4zM13 7l4 4" ${STROKE}/>`,
  sun: `<circle cx="12" cy="12" r="4" ${STROKE}/><path d="M12 2v2M12 20v2M2 12h2M20 12h2M4.9 4.9l1.4 1.4M17.7 17.7l1.4 1.4M4.9 19.1l1.4-1.4M17.7 6.3l1.4-1.4" ${STROKE}/>`,
  moon: `<path d="M20 14.5A8 8 0 0 1 9.5 4a8 8 0 1 0 10.5 10.5z" ${STROKE}/>`,
  person: `<circle cx="12" cy="8" r="4" ${STROKE}/><path d="M4 21c1-4 4.5-6 8-6s7 2 8 6" ${STROKE}/>`,
  people: `<circle cx="9" cy="8" r="3.5" ${STROKE}/><path d="M2 20c.8-3.5 3.6-5.5 7-5.5s6.2 2 7 5.5M16 4.5a3.5 3.5 0 0 1 0 7M18 14.8c2 .7 3.4 2.5 4 5.2" ${STROKE}/>`,
  shield: `<path d="M12 3l8 3v6c0 5-3.5 8-8 9-4.5-1-8-4-8-9V6z" ${STROKE}/><path d="M9 12l2 2 4-4" ${STROKE}/>`,
  'sign-out': `<path d="M14 4h5v16h-5M10 8l-4 4 4 4M6 12h10" ${STROKE}/>`,
  flag: `<path d="M5 21V4M5 4h11l-2 4 2 4H5" ${STROKE}/>`,
  search: `<circle cx="10.5" cy="10.5" r="6.5" ${STROKE}/><path d="M15.5 15.5L21 21" ${STROKE}/>`,
  close: `<path d="M6 6l12 12M18 6L6 18" ${STROKE}/>`,
  more: `<circle cx="12" cy="5" r="1.6" fill="currentColor"/><circle cx="12" cy="12" r="1.6" fill="currentColor"/><circle cx="12" cy="19" r="1.6" fill="currentColor"/>`,
  key: `<circle cx="8" cy="15" r="4" ${STROKE}/><path d="M11 12l9-9M16 7l3 3M14 9l2 2" ${STROKE}/>`,
  workspace: `<rect x="3" y="4" width="18" height="14" rx="2" ${STROKE}/><path d="M8 21h8M3 9h18" ${STROKE}/>`,
  activity: `<path d="M3 12h4l2-6 4 12 2-6h6" ${STROKE}/>`,
  mail: `<rect x="3" y="5" width="18" height="14" rx="2" ${STROKE}/><path d="M3 7l9 6 9-6" ${STROKE}/>`,
  caution: `<path d="M12 3l10 18H2z" ${STROKE}/><path d="M12 10v5M12 18v.01" ${STROKE}/>`,
};

function svg(body: string): string {
  return `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 24 24">${body}</svg>`;
}

/** The icon names registered by provideAppIcons(), for use as <mat-icon svgIcon="…">. */
export const APP_ICON_NAMES = Object.keys(ICONS);

/** Registers every app icon with Material's icon registry at start-up. */
export function provideAppIcons() {
  return provideAppInitializer(() => {
    const registry = inject(MatIconRegistry);
    const sanitizer = inject(DomSanitizer);
    for (const [name, body] of Object.entries(ICONS)) {
      // Trusted: the markup is a constant of this file, never user input.
      registry.addSvgIconLiteral(name, sanitizer.bypassSecurityTrustHtml(svg(body)));
    }
  });
}
