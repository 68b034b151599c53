/**
 * The printable report as a PDF: printed by Chromium with the page's own @page size, read
 * back with poppler's pdftotext and pdfinfo (Debian's poppler-utils, installed by
 * scripts/test.sh). PDFs go to test-results/.
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';

const OUT = join(process.cwd(), 'test-results');

/** NFKC too: it folds ligatures, and the micro sign µ into the Greek μ the PDF font maps. */
export const flat = (text: string) => text.normalize('NFKC').replace(/\s+/g, ' ').trim();

/** Waits until the report's plots are drawn (or it has none), so the PDF holds them. */
export async function reportReady(page: Page): Promise<void> {
  await page.locator('article.sheet[data-plots="ready"]').waitFor({ timeout: 60000 });
}

/** Prints the page to test-results/<name>.pdf and returns the file's path. */
export async function printPdf(page: Page, name: string): Promise<string> {
  mkdirSync(OUT, { recursive: true });
  const file = join(OUT, `${name}.pdf`);
  // The page's own @page rule sets the paper, as the browser's print dialog would take it.
  writeFileSync(file, await page.pdf({ preferCSSPageSize: true, printBackground: true }));
  return file;
}

/** Text of a PDF as poppler reads it, with runs of white space made single spaces. */
export function pdfText(file: string): string {
  const run = spawnSync('pdftotext', ['-enc', 'UTF-8', file, '-'], { encoding: 'utf8' });
  if (run.status !== 0) throw new Error(`pdftotext failed: ${run.stderr || run.error}`);
  return flat(run.stdout);
}

/** The first page's size in points, from pdfinfo. */
export function pdfPageSize(file: string): { width: number; height: number } {
  const run = spawnSync('pdfinfo', [file], { encoding: 'utf8' });
  const match = /Page size:\s+([\d.]+) x ([\d.]+) pts/.exec(run.stdout);
  if (!match) throw new Error(`pdfinfo gave no page size: ${run.stdout}${run.stderr}`);
  return { width: Number(match[1]), height: Number(match[2]) };
}
