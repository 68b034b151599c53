/**
 * Shared set-up for the browser tests: launch the system's Chromium (never a downloaded
 * one), open pages that record every console error and page error, sign in, and keep
 * screenshots under test-results/screenshots/ for a person to look at.
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';

/** Where the server under test answers, e.g. http://127.0.0.1:4310. */
export const BASE_URL = (process.env.BASE_URL ?? 'http://127.0.0.1:4300').replace(/\/$/, '');

// scripts/test.sh passes CHROME_PATH; the Debian package installs it here.
const CHROMIUM = process.env.CHROME_PATH ?? process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-dev-shm-usage',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

const SCREENSHOTS = join(process.cwd(), 'test-results', 'screenshots');

/** Demo sign-ins created by the server's seed (override with env for another data set). */
export const DEMO = {
  password: process.env.CW_DEMO_PASSWORD ?? 'demo-receiver-2026',
  owner: process.env.CW_DEMO_OWNER ?? 'owner@chainwright.test',
  editor: process.env.CW_DEMO_EDITOR ?? 'editor@chainwright.test',
  viewer: process.env.CW_DEMO_VIEWER ?? 'viewer@chainwright.test',
};

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS, headless: true });
}

/** A page plus the problems it reported; assert `problems` is empty at the end of a test. */
export interface WatchedPage {
  context: BrowserContext;
  page: Page;
  problems: string[];
}

/**
 * The browser logs a console error for every 4xx answer ("Failed to load resource"),
 * including those the app expects and handles itself (401 for a visitor on /api/me, a
 * wrong password). Those are not app faults; server errors (5xx) still count.
 */
const HANDLED_HTTP_NOISE = /^Failed to load resource: the server responded with a status of 4\d\d/;

export async function openPage(
  browser: Browser,
  options: {
    colorScheme?: 'light' | 'dark';
    viewport?: { width: number; height: number };
    /** Touch and a mobile viewport, as on a phone. */
    phone?: boolean;
  } = {},
): Promise<WatchedPage> {
  const context = await browser.newContext({
    baseURL: BASE_URL,
    viewport: options.viewport ?? { width: 1280, height: 800 },
    colorScheme: options.colorScheme ?? 'light',
    hasTouch: options.phone ?? false,
    isMobile: options.phone ?? false,
  });
  const page = await context.newPage();
  const problems: string[] = [];
  page.on('console', (message) => {
    if (message.type() === 'error' && !HANDLED_HTTP_NOISE.test(message.text())) {
      problems.push(`console error: ${message.text()}`);
    }
  });
  page.on('pageerror', (error) => problems.push(`page error: ${error.message}`));
  page.on('response', (response) => {
    if (response.status() >= 500) {
      problems.push(`server error ${response.status()} on ${response.url()}`);
    }
  });
  return { context, page, problems };
}

/** Signs in through the form and waits until the app has left the sign-in page. */
export async function signIn(page: Page, email: string, password: string): Promise<void> {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
}

/** Signs out through the account menu. */
export async function signOut(page: Page, displayName: string): Promise<void> {
  await page.getByRole('button', { name: displayName }).click();
  await page.getByRole('menuitem', { name: 'Sign out' }).click();
  await page.waitForURL('**/sign-in');
}

/**
 * Saves a PNG as test-results/screenshots/<name>.png: the full page, or only the window with
 * `{ fullPage: false }`, for an open menu (the full page is taken in a taller window, and an
 * overlay menu closes on that resize).
 *
 * Not Playwright's own `fullPage`: in Chromium it shrinks the window to 1×1 px for a moment,
 * so every width media query flips to the phone layout and back, and components inside the
 * layout's branches are re-created with their state lost (a half-finished form, an answer
 * on screen) whenever the page catches up with that flip, as it does on a busy machine.
 * Only the height changes here, and the width layout stays put.
 */
export async function shot(
  page: Page,
  name: string,
  options: { fullPage?: boolean } = {},
): Promise<string> {
  mkdirSync(SCREENSHOTS, { recursive: true });
  const path = join(SCREENSHOTS, `${name}.png`);
  // Let fonts and Material's entry transitions settle so the picture shows the real state.
  // Functions run inside the page, so they reach its document through globalThis.
  await page.evaluate(() =>
    (globalThis as unknown as PageGlobal).document.fonts.ready.then(() => 0),
  );
  await page.waitForFunction(() =>
    (globalThis as unknown as PageGlobal).document
      .getAnimations()
      .every((a) => a.playState !== 'running' || a.effect?.getTiming().iterations === Infinity),
  );
  const window = page.viewportSize();
  if ((options.fullPage ?? true) && window) {
    const height = await page.evaluate(() =>
      Math.ceil((globalThis as unknown as PageGlobal).document.documentElement.scrollHeight),
    );
    if (height > window.height) {
      // Capped: Chromium cannot paint a window taller than 16,384 px in one piece.
      await page.setViewportSize({ width: window.width, height: Math.min(height, 16_000) });
      try {
        await page.screenshot({ path });
      } finally {
        await page.setViewportSize(window);
      }
      return path;
    }
  }
  await page.screenshot({ path });
  return path;
}

/**
 * The page's globals, typed just enough for shot(): the tests compile without DOM types,
 * and page functions (not strings) are needed because the app's CSP forbids eval.
 */
interface PageGlobal {
  document: {
    documentElement: { scrollHeight: number };
    fonts: { ready: Promise<unknown> };
    getAnimations(): {
      playState: string;
      effect: { getTiming(): { iterations?: number | string } } | null;
    }[];
  };
}

/** A unique suffix so repeated runs against one database do not collide. */
export function uniqueSuffix(): string {
  return `${Date.now().toString(36)}${Math.floor(Math.random() * 1e4).toString(36)}`;
}
