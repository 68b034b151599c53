import { Clipboard } from '@angular/cdk/clipboard';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { Component, signal } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatTabGroupHarness } from '@angular/material/tabs/testing';
import type { ChainDocument } from '../../../../../shared/schema/chain';
import type { AnalysisResult } from '../../../../../shared/engine/types';
import { AnalysisResultsComponent } from './analysis-results.component';
import * as detailRows from './detail-rows';
import { PLOTLY_LOADER } from './plotly-loader';
import { type FakePlotly, fakePlotly } from './testing/fake-plotly';
import { sampleDocument, sampleResult } from './testing/sample-analysis';

describe('AnalysisResultsComponent', () => {
  let fixture: ComponentFixture<ResultsHostComponent>;
  let host: ResultsHostComponent;
  let harnesses: HarnessLoader;
  let plotly: FakePlotly;

  beforeEach(async () => {
    plotly = fakePlotly();
    TestBed.configureTestingModule({
      providers: [{ provide: PLOTLY_LOADER, useValue: plotly.loader }],
    });
    fixture = TestBed.createComponent(ResultsHostComponent);
    host = fixture.componentInstance;
    harnesses = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  });

  describe('without a result', () => {
    it('should say that no analysis has arrived yet', async () => {
      host.result.set(null);
      await fixture.whenStable();
      expect(text('.waiting')).toContain('No analysis yet');
      expect(all('table')).toHaveLength(0);
    });
  });

  describe('tabs', () => {
    afterEach(() => jest.restoreAllMocks());

    it('should work a new result into the open tab only, and into the next when it is opened', async () => {
      const flags = jest.spyOn(detailRows, 'flagItems');
      const resonators = jest.spyOn(detailRows, 'resonatorRows');
      const next = sampleResult();
      next.flags = [];
      host.result.set(next);
      await fixture.whenStable();
      // The budget is open: the hidden tabs' rows are not built for the new result.
      expect(flags).not.toHaveBeenCalled();
      expect(resonators).not.toHaveBeenCalled();
      expect(all('cw-budget-table')).toHaveLength(1);
      await selectTab('Flags');
      await fixture.whenStable();
      expect(flags).toHaveBeenCalled();
      expect(text('cw-flags-list')).toContain('No flags');
      expect(all('cw-budget-table')).toHaveLength(0);
    });
  });

  describe('headline', () => {
    it('should show noise figure, gain, sensitivity and dynamic range above the tabs', () => {
      const values = all('.headline-value').map((e) => e.textContent?.trim());
      expect(values).toEqual(['3.310 dB', '22.20 dB', '-120.7 dBm', '83.10 dB']);
    });

    it('should count the flags by severity and open the flags on click', async () => {
      const button = one('.flag-count') as HTMLButtonElement;
      expect(button.textContent).toContain('1 error, 1 warning, 1 note');
      expect(button.classList).toContain('has-errors');
      button.click();
      await fixture.whenStable();
      const tabs = await harnesses.getHarness(MatTabGroupHarness);
      expect(await (await tabs.getSelectedTab()).getLabel()).toContain('Flags');
    });
  });

  describe('budget', () => {
    it('should show one column per node after the quantity column', () => {
      const headers = all('th.node').map(
        (e) =>
          `${e.querySelector('.node-title')?.textContent} · ${e.querySelector('.node-after')?.textContent}`,
      );
      expect(headers).toEqual([
        'Node 0 · Antenna',
        'Node 1 · Preselector',
        'Node 2 · LNA',
        'Node 3 · Mixer',
        'Node 4 · IF filter',
      ]);
      expect(text('th.quantity')).toBe('Quantity');
    });

    it("should highlight the selected stage's output column", async () => {
      host.selected.set('lna');
      await fixture.whenStable();
      const selected = all('th.node.selected').map((e) => e.querySelector('.node-title'));
      expect(selected.map((e) => e?.textContent)).toEqual(['Node 2']);
      expect(all('td.value.selected')).toHaveLength(rowCount());
    });

    it('should move the highlight when the selection changes', async () => {
      host.selected.set('lna');
      await fixture.whenStable();
      host.selected.set('det');
      await fixture.whenStable();
      expect(one('th.node.selected .node-title').textContent).toBe('Node 4');
    });

    it('should ask for a stage when its column header is activated', async () => {
      (all('th.node button')[3] as HTMLButtonElement).click();
      await fixture.whenStable();
      expect(host.picked).toEqual(['mix']);
    });

    it('should show impedance, voltage and stage figures in the node columns', () => {
      const cells = rowCells('Z looking in');
      expect(cells[1]).toBe('2.400 kΩ + j150.0 Ω');
      expect(rowCells('Node voltage')[1]).toBe('10.00 µV rms');
      expect(rowCells('Cumulative noise figure')[0]).toBe('—');
    });

    it('should copy the budget as CSV', async () => {
      const clipboard = TestBed.inject(Clipboard);
      const copy = jest.spyOn(clipboard, 'copy').mockReturnValue(true);
      buttonNamed('Copy as CSV').click();
      await fixture.whenStable();
      expect(copy).toHaveBeenCalledTimes(1);
      expect(copy.mock.calls[0][0]).toMatch(/^Quantity,Unit,Node 0 \(Antenna\),/);
      expect(text('.notice')).toBe('Budget copied as CSV.');
    });

    it('should say so when the browser refuses to copy', async () => {
      jest.spyOn(TestBed.inject(Clipboard), 'copy').mockReturnValue(false);
      buttonNamed('Copy as CSV').click();
      await fixture.whenStable();
      expect(text('.notice')).toContain('refused');
    });

    it('should download the budget as a CSV file named after the chain', async () => {
      const urls: Blob[] = [];
      URL.createObjectURL = (blob: Blob) => {
        urls.push(blob);
        return 'blob:budget';
      };
      URL.revokeObjectURL = () => undefined;
      const clicked = jest.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (
        this: HTMLAnchorElement,
      ) {
        expect(this.download).toBe('ten-metre-first-try_50ohm_budget.csv');
      });
      buttonNamed('Download CSV').click();
      await fixture.whenStable();
      expect(clicked).toHaveBeenCalledTimes(1);
      expect(urls[0].type).toBe('text/csv;charset=utf-8');
      const bytes = new Uint8Array(await urls[0].arrayBuffer());
      expect(Array.from(bytes.slice(0, 3))).toEqual([0xef, 0xbb, 0xbf]);
      expect(await urls[0].text()).toContain('Frequency at node,Hz,');
      clicked.mockRestore();
    });
  });

  describe('resonators and selectivity', () => {
    beforeEach(() => selectTab('Resonators'));

    it('should show loaded and detached Q with the loading in words as well as colour', async () => {
      await fixture.whenStable();
      const loading = one('[data-loading]');
      expect(loading.getAttribute('data-loading')).toBe('warning');
      expect(loading.textContent).toContain('0.28');
      expect(loading.textContent).toContain('heavy');
    });

    it('should ask for the resonator stage when its name is activated', async () => {
      await fixture.whenStable();
      (one('.stage-button') as HTMLButtonElement).click();
      expect(host.picked).toEqual(['tank']);
    });

    it('should give the selectivity a column per stated offset', async () => {
      await fixture.whenStable();
      const headers = all('th').map((e) => e.textContent ?? '');
      // A stated offset, rounded but not padded.
      expect(headers.some((h) => h.includes('±100 kHz'))).toBe(true);
      expect(headers.some((h) => h.includes('±100.0 kHz'))).toBe(false);
      expect(headers.some((h) => h.includes('Image rejection'))).toBe(true);
    });
  });

  describe('flags', () => {
    beforeEach(() => selectTab('Flags'));

    it('should list flags worst first with word, icon and stage label', async () => {
      await fixture.whenStable();
      const flags = all('.flag');
      expect(flags.map((f) => f.querySelector('.severity')?.textContent)).toEqual([
        'Error',
        'Warning',
        'Note',
      ]);
      expect(flags.map((f) => f.querySelector('.stage')?.textContent)).toEqual([
        'Preselector',
        'Detector',
        'IF filter',
      ]);
      expect(flags.every((f) => f.querySelector('cw-glyph svg') !== null)).toBe(true);
      expect(flags[0].classList).toContain('severity-error');
    });

    it('should ask for the flagged stage when a flag is activated', async () => {
      await fixture.whenStable();
      (all('.flag')[1] as HTMLButtonElement).click();
      expect(host.picked).toEqual(['det']);
    });

    it('should say when there are no flags', async () => {
      const clean = sampleResult();
      clean.flags = [];
      host.result.set(clean);
      await fixture.whenStable();
      expect(text('cw-flags-list')).toContain('No flags');
    });
  });

  describe('plots', () => {
    it('should not load the plotting library before the plots are opened', () => {
      expect(plotly.loads).toBe(0);
    });

    it('should draw four SVG plots once the plots are opened, none of them WebGL', async () => {
      await selectTab('Plots');
      await fixture.whenStable();
      expect(drawn()).toHaveLength(4);
      const types = drawn().flatMap((call) => call.data.map((trace) => trace.type));
      expect(new Set(types)).toEqual(new Set(['scatter', 'scattersmith']));
    });

    it('should redraw in place with Plotly.react when a new result arrives', async () => {
      await selectTab('Plots');
      await fixture.whenStable();
      const elements = drawn().map((call) => call.element);
      const next = sampleResult();
      next.f0Hz = 10.2e6;
      host.result.set(next);
      await fixture.whenStable();
      expect(drawn()).toHaveLength(8);
      expect(
        drawn()
          .slice(4)
          .map((call) => call.element),
      ).toEqual(elements);
      expect(plotly.purged.filter((e) => elements.includes(e))).toEqual([]);
    });

    it('should mark each plot busy from a new result until its figure is drawn', async () => {
      await selectTab('Plots');
      await fixture.whenStable();
      const busy = () => all('cw-result-plot [aria-busy="true"]').length;
      expect(drawn()).toHaveLength(4);
      expect(busy()).toBe(0);
      const next = sampleResult();
      next.f0Hz = 10.2e6;
      host.result.set(next);
      fixture.detectChanges();
      // Queued (the plots are below the fold in a page without layout), not yet drawn.
      expect(drawn()).toHaveLength(4);
      expect(busy()).toBe(4);
      await fixture.whenStable();
      expect(drawn()).toHaveLength(8);
      expect(busy()).toBe(0);
    });

    it('should redraw no plot for an edit the plots do not show, until its result lands', async () => {
      await selectTab('Plots');
      await fixture.whenStable();
      expect(drawn()).toHaveLength(4);
      // A value typed into a stage: the document changes at once, the result only later.
      const edited = sampleDocument();
      edited.stages[2].values = { gainDb: 21 };
      edited.name = 'Ten metre, second try';
      host.document.set(edited);
      await fixture.whenStable();
      expect(drawn()).toHaveLength(4);
      // The sweep's scale is drawn: changing it redraws the plots.
      const logScale = sampleDocument();
      logScale.settings.sweep.scale = 'log';
      host.document.set(logScale);
      await fixture.whenStable();
      expect(drawn()).toHaveLength(8);
    });

    it('should tick a zoom the user made again when a new result redraws the plot', async () => {
      await selectTab('Plots');
      await fixture.whenStable();
      expect(plotly.relayouts).toHaveLength(0);
      // Plotly keeps the zoom on the element's layout through a redraw (uirevision).
      const stepUp = drawn()[0].element as HTMLElement & { layout?: unknown };
      stepUp.layout = { xaxis: { autorange: false, range: [9.8e6, 10.2e6] } };
      const next = sampleResult();
      next.f0Hz = 10.1e6;
      host.result.set(next);
      await fixture.whenStable();
      expect(plotly.relayouts).toHaveLength(1);
      const ticks = plotly.relayouts[0]['xaxis.tickvals'] as number[];
      expect(ticks.length).toBeGreaterThanOrEqual(3);
      expect(Math.min(...ticks)).toBeGreaterThanOrEqual(9.8e6);
      expect(Math.max(...ticks)).toBeLessThanOrEqual(10.2e6);
    });

    it('should redraw only the step-up plot when a node is ticked', async () => {
      await selectTab('Plots');
      await fixture.whenStable();
      const box = all('mat-checkbox input')[2] as HTMLInputElement;
      box.click();
      await fixture.whenStable();
      expect(drawn()).toHaveLength(5);
      const names = drawn()[4].data.map((trace) => trace.name);
      expect(names).toContain('Node 2 · LNA');
    });

    it('should save a PNG named after the chain and the plot', async () => {
      await selectTab('Plots');
      await fixture.whenStable();
      buttonNamed('Save PNG').click();
      expect(plotly.downloads).toEqual([
        expect.objectContaining({ filename: 'ten-metre-first-try_50ohm_step-up', format: 'png' }),
      ]);
      // Drawn from the figure with a system font, so the picture's text fits its layout.
      const root = plotly.downloads[0].root as { layout: { font: { family: string } } };
      expect(root.layout.font.family).toMatch(/^Arial/);
    });

    it('should release the plots when the panel goes away', async () => {
      await selectTab('Plots');
      await fixture.whenStable();
      fixture.destroy();
      expect(plotly.purged.filter((e) => e.closest('cw-result-plot'))).toHaveLength(4);
    });

    it('should explain a result without a sweep', async () => {
      const noSweep = sampleResult();
      delete noSweep.sweep;
      host.result.set(noSweep);
      await selectTab('Plots');
      await fixture.whenStable();
      expect(text('cw-result-plots')).toContain('no frequency sweep');
      // The library may have been fetched ahead (the first result had a sweep); nothing is drawn.
      expect(drawn()).toHaveLength(0);
    });
  });

  describe('summary', () => {
    it('should give the sensitivity as dBm and as source EMF', async () => {
      await selectTab('Summary');
      await fixture.whenStable();
      const figures = text('cw-summary-panel');
      expect(figures).toContain('-120.7 dBm');
      expect(figures).toContain('410.0 nV rms');
    });
  });

  // Helpers

  async function selectTab(label: string): Promise<void> {
    const tabs = await harnesses.getHarness(MatTabGroupHarness);
    const all = await tabs.getTabs();
    for (const tab of all) {
      if ((await tab.getLabel()).startsWith(label)) {
        await tab.select();
        return;
      }
    }
    throw new Error(`no tab labelled ${label}`);
  }

  function all(selector: string): Element[] {
    return Array.from((fixture.nativeElement as HTMLElement).querySelectorAll(selector));
  }

  function one(selector: string): Element {
    const found = (fixture.nativeElement as HTMLElement).querySelector(selector);
    if (!found) throw new Error(`nothing matches ${selector}`);
    return found;
  }

  /** Plotly's drawings into the panel's plots (not the hidden warm-up plot). */
  function drawn() {
    return plotly.reacts.filter((call) => call.element.closest('cw-result-plot') !== null);
  }

  function text(selector: string): string {
    return one(selector).textContent?.trim() ?? '';
  }

  function buttonNamed(name: string): HTMLButtonElement {
    const found = all('button').find((b) => b.textContent?.trim() === name);
    if (!found) throw new Error(`no button named ${name}`);
    return found as HTMLButtonElement;
  }

  /** Cells of the first budget row whose label starts with `label`. */
  function rowCells(label: string): string[] {
    const row = all('tr').find((r) =>
      r.querySelector('td.quantity')?.textContent?.trim().startsWith(label),
    );
    if (!row) throw new Error(`no budget row ${label}`);
    return Array.from(row.querySelectorAll('td.value')).map((c) => c.textContent?.trim() ?? '');
  }

  function rowCount(): number {
    return all('td.quantity').length;
  }
});

describe('AnalysisResultsComponent without the plotting library', () => {
  it('should say why the plots are missing when the library cannot be fetched', async () => {
    TestBed.configureTestingModule({
      providers: [
        {
          provide: PLOTLY_LOADER,
          useValue: () => Promise.reject(new Error('the network is down')),
        },
      ],
    });
    const fixture = TestBed.createComponent(ResultsHostComponent);
    await fixture.whenStable();
    const tabs = await TestbedHarnessEnvironment.loader(fixture).getHarness(MatTabGroupHarness);
    await tabs.selectTab({ label: 'Plots' });
    await fixture.whenStable();
    const alerts = Array.from(
      (fixture.nativeElement as HTMLElement).querySelectorAll('cw-result-plot [role="alert"]'),
    ).map((e) => e.textContent?.trim());
    expect(alerts).toHaveLength(4);
    expect(alerts[0]).toBe('The plot could not be drawn: the network is down');
  });
});

@Component({
  imports: [AnalysisResultsComponent],
  template: `
    <cw-analysis-results
      [result]="result()"
      [document]="document()"
      [selectedStageId]="selected()"
      (stageSelected)="picked.push($event)"
    />
  `,
})
class ResultsHostComponent {
  readonly result = signal<AnalysisResult | null>(sampleResult());
  readonly document = signal<ChainDocument>(sampleDocument());
  readonly selected = signal<string | null>(null);
  readonly picked: string[] = [];
}
