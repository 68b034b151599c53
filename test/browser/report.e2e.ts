/**
 * The printable report end to end: from the editor's Report button (a new tab) on the
 * long-wave loop example, whose detector loads its tank so it has flags, printed to PDF
 * by Chromium in A4 and in Letter; the PDF's text is read back with poppler's pdftotext
 * and its page size with pdfinfo (Debian's poppler-utils, installed by scripts/test.sh).
 * The PDF must hold the chain's name, every flag sentence of an analysis asked of the API
 * on its own, and a budget figure. Then the same report from a read-only link, signed
 * out, and the flags table downloaded as CSV under its export name.
 */
import { readFileSync } from 'node:fs';
import type { Browser } from 'playwright-core';
import type { AnalysisResult } from '../../shared/engine/types';
import type { ChainDto } from '../../shared/schema/api';
import { formatEngineering } from '../../shared/units/format';
import { DEMO, launchBrowser, openPage, shot, signIn, type WatchedPage } from './harness';
import { api, DEFAULT_FIGURES, savedAnalysis } from './helpers/api';
import { describeAxe, seriousAxeViolations } from './helpers/axe';
import { filterChains, openChainNamed } from './helpers/chains';
import { flat, pdfPageSize, pdfText, printPdf, reportReady } from './helpers/pdf';

const CHAIN = 'Long-wave time signal, ferrite loop into a diode detector';
const STEM = 'long-wave-time-signal-ferrite-loop-into-a-diode-detector';
const TRANSCEIVER = '433.92 MHz low-power transceiver';

describe('printable report', () => {
  let browser: Browser;
  let watched: WatchedPage;
  let chain: ChainDto;
  let analysis: AnalysisResult;
  let reportUrl: string;

  beforeAll(async () => {
    browser = await launchBrowser();
    watched = await openPage(browser);
  });
  afterAll(async () => {
    await watched?.context.close();
    await browser?.close();
  });

  it('should open from the editor in a new tab and print to an A4 PDF with every flag', async () => {
    const { page, context } = watched;
    await signIn(page, DEMO.editor, DEMO.password);
    await page.waitForURL(/\/w\/[^/]+\/chains$/);
    await openChainNamed(page, CHAIN);
    const chainId = page.url().split('/').pop()!;

    // The analysis the report must show, asked of the API on its own.
    ({ chain, analysis } = await savedAnalysis(page, chainId));
    expect(analysis.flags.length).toBeGreaterThan(0);

    const [tab] = await Promise.all([
      context.waitForEvent('page'),
      page.getByTestId('open-report').click(),
    ]);
    await tab.waitForURL(/\/chains\/[^/]+\/report$/);
    reportUrl = tab.url();
    await reportReady(tab);
    await tab.getByRole('radio', { name: 'A4' }).click();
    expect(await tab.title()).toBe(`${STEM}_50ohm_report`);
    await expect(tab.getByRole('heading', { level: 1 }).textContent()).resolves.toBe(CHAIN);
    await shot(tab, 'report-01-a4');

    const file = await printPdf(tab, 'report-a4');
    const size = pdfPageSize(file);
    // A4 is 210 × 297 mm = 595.28 × 841.89 pt (ISO 216).
    expect(size.width).toBeCloseTo(595.28, 0);
    expect(size.height).toBeCloseTo(841.89, 0);
    const text = pdfText(file);
    expect(text).toContain(CHAIN);
    for (const flag of analysis.flags) expect(text).toContain(flat(flag.message));
    // A budget figure: the rms voltage at the detector's input node, as the budget writes it
    // (a result: at the default figures, its trailing zeros kept).
    const last = analysis.nodes[analysis.nodes.length - 1];
    const vRms = formatEngineering(last.vRms, 'volt', DEFAULT_FIGURES, true);
    expect(text).toContain(flat(`${vRms} rms`));
    expect(text).toContain('Cautions');
    expect(text).toContain('licensed practice');
    await tab.close();
  });

  it('should print on Letter when Letter is chosen, and remember the choice', async () => {
    const tab = await watched.context.newPage();
    await tab.goto(reportUrl);
    await reportReady(tab);
    await tab.getByRole('radio', { name: 'Letter' }).click();
    await shot(tab, 'report-02-letter');
    const file = await printPdf(tab, 'report-letter');
    // US Letter is 8.5 × 11 in = 612 × 792 pt.
    expect(pdfPageSize(file)).toEqual({ width: 612, height: 792 });
    expect(pdfText(file)).toContain(CHAIN);

    await tab.reload();
    await reportReady(tab);
    await expect(
      tab.getByRole('radio', { name: 'Letter' }).getAttribute('aria-checked'),
    ).resolves.toBe('true');
    await tab.getByRole('radio', { name: 'A4' }).click();
    await tab.close();
  });

  it('should download the flags as CSV named after the chain and its reference', async () => {
    const { page } = watched;
    await page.getByRole('tab', { name: /^Flags/ }).click();
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Download CSV: flags' }).click(),
    ]);
    expect(download.suggestedFilename()).toBe(`${STEM}_50ohm_flags.csv`);
    const csv = readFileSync((await download.path())!, 'utf8');
    const lines = csv.split('\r\n');
    // The first line states the precision the numbers carry; the headings follow.
    expect(lines[0]).toMatch(/^\uFEFF# Numbers in SI units .* 9 significant figures/);
    expect(lines[1]).toBe('Severity,Stage,Code,Message');
    for (const flag of analysis.flags) expect(csv).toContain(flag.message.replace(/"/g, '""'));
  });

  it('should report the mode asked for, with the transmit caution of a chain that transmits', async () => {
    const { page } = watched;
    await page.goto('/');
    await page.waitForURL(/\/w\/[^/]+\/chains$/);
    await filterChains(page, TRANSCEIVER);
    const href = await page.getByRole('link', { name: TRANSCEIVER }).first().getAttribute('href');
    await page.goto(`${href}/report?mode=transmit`);
    await reportReady(page);
    await expect(page.getByTestId('report-mode').textContent()).resolves.toContain('Transmit');
    await shot(page, 'report-04-transmit-mode');
    const text = pdfText(await printPdf(page, 'report-transmit'));
    expect(text).toContain('Transmit');
    // The transmit figures themselves: power into the antenna, harmonics against their
    // limits, the receiver's isolation and every part's stress, with the caution.
    for (const words of [
      'Into the antenna',
      'Network loss',
      'Harmonic',
      'Attenuation',
      'Receiver isolation',
      'reaches the receiver input',
      'Peak voltage',
      'RMS current',
      'Rating',
    ]) {
      expect(text).toContain(words);
    }
    expect(text).toMatch(/within limit|over limit|no limit stated/);
    expect(text).toContain('defer to licensed practice');
    // The analysis words its own cautions for a transmit mode (licence, RF exposure).
    expect(text).toMatch(/licen[cs]e/);
    expect(text).toMatch(/exposure/);
  });

  it('should print the same report from a read-only link, signed out', async () => {
    const link = await api<{ url: string }>(
      watched.page,
      'post',
      `/api/chains/${chain.id}/share-links`,
      {},
    );
    const token = new URL(link.url).pathname.split('/').pop()!;
    const visitor = await openPage(browser);
    try {
      await visitor.page.goto(`/shared/${token}`);
      await visitor.page.getByTestId('open-report').click();
      await visitor.page.waitForURL(/\/shared\/[^/]+\/report$/);
      await reportReady(visitor.page);
      await shot(visitor.page, 'report-03-shared');
      // Signed out too, each value goes by its name with its unit ("Resistance 1 kΩ"), never
      // by its key ("r 1000").
      const values = await visitor.page.locator('.strip .values li').allTextContents();
      expect(values.length).toBeGreaterThan(0);
      for (const v of values) expect(v.trim()).toMatch(/^[A-Z]/);
      expect(describeAxe(await seriousAxeViolations(visitor.page))).toEqual([]);
      const text = pdfText(await printPdf(visitor.page, 'report-shared'));
      expect(text).toContain(CHAIN);
      expect(text).toContain('read-only link');
      for (const flag of analysis.flags) expect(text).toContain(flat(flag.message));
      expect(visitor.problems).toEqual([]);
    } finally {
      await visitor.context.close();
    }
    expect(watched.problems).toEqual([]);
  });
});
