/**
 * The three widths the app is designed for, and a signed-out page opened at one of them:
 * touch and a mobile viewport on the phone, so sheets and sideways scrolling behave as a
 * phone user meets them.
 */
import type { Browser } from 'playwright-core';
import { openPage, type WatchedPage } from '../harness';

export const WIDTHS = [
  { name: 'desktop', width: 1440, height: 900 },
  { name: 'tablet', width: 1024, height: 768 },
  { name: 'phone', width: 390, height: 844 },
] as const;

export type Width = (typeof WIDTHS)[number];

/** A watched page (console errors, page errors, 5xx answers) at this width. */
export function openAtWidth(browser: Browser, size: Width): Promise<WatchedPage> {
  return openPage(browser, {
    viewport: { width: size.width, height: size.height },
    phone: size.name === 'phone',
  });
}
