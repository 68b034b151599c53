import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter, Router } from '@angular/router';
import type { AnalysisResult } from '../../../../shared/engine/types';
import type { ChainDto, ChainSummaryDto } from '../../../../shared/schema/api';
import { PLOTLY_LOADER } from '../editor/results/plotly-loader';
import { fakePlotly, type FakePlotly } from '../editor/results/testing/fake-plotly';
import { sampleDocument, sampleResult } from '../editor/results/testing/sample-analysis';
import CompareComponent from './compare.component';

function summary(id: string, name: string, parentId: string | null = null): ChainSummaryDto {
  return {
    id,
    workspaceId: 'w1',
    name,
    description: '',
    f0Hz: 10e6,
    stageCount: 3,
    flagCount: 0,
    version: 1,
    parentId,
    createdBy: 'O',
    updatedBy: 'O',
    updatedAt: '2026-11-30T10:00:00Z',
  };
}

function chainDto(id: string, name: string): ChainDto {
  return {
    ...summary(id, name),
    document: { ...sampleDocument(), name },
    role: 'viewer',
    createdAt: '2026-11-30T10:00:00Z',
  };
}

function withImageRejection(db: number): AnalysisResult {
  const result = sampleResult();
  const last = result.nodes.length - 1;
  result.selectivity = result.selectivity.map((s) =>
    s.node === last ? { ...s, imageRejectionDb: db } : s,
  );
  return result;
}

describe('CompareComponent', () => {
  let fixture: ComponentFixture<CompareComponent>;
  let http: HttpTestingController;
  let plotly: FakePlotly;
  let el: HTMLElement;

  beforeEach(async () => {
    plotly = fakePlotly();
    TestBed.configureTestingModule({
      providers: [
        provideRouter([]),
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: PLOTLY_LOADER, useValue: plotly.loader },
      ],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(CompareComponent);
    fixture.componentRef.setInput('workspaceId', 'w1');
    fixture.componentRef.setInput('chains', 'a,b');
    el = fixture.nativeElement;
    fixture.detectChanges();
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  async function answer(): Promise<void> {
    // The catalogue gives the stage differences their units; none needed here.
    for (const request of http.match('/api/catalogue')) request.flush([]);
    http
      .expectOne('/api/chains/a/family')
      .flush([summary('a', 'One tank'), summary('b', 'Pair', 'a')]);
    http.expectOne('/api/chains/a').flush(chainDto('a', 'One tank'));
    http.expectOne('/api/chains/b').flush(chainDto('b', 'Pair'));
    http.expectOne((r) => r.url === '/api/chains/a/analysis').flush(withImageRejection(14.2));
    const b = http.expectOne((r) => r.url === '/api/chains/b/analysis');
    expect(b.request.params.get('sweep')).toBe('1');
    expect(b.request.params.get('packing')).toBe('differences');
    b.flush(withImageRejection(32.5));
    await fixture.whenStable();
  }

  it('should show one column per variant and mark the better image rejection', async () => {
    await answer();
    const heads = [...el.querySelectorAll('th.variant a')].map((a) => a.textContent!.trim());
    expect(heads).toEqual(['One tank', 'Pair']);
    const cells = [...el.querySelectorAll('tr[data-row="image"] td')];
    expect(cells.map((c) => c.textContent!.replace(/\s+/g, ' ').trim())).toEqual([
      '14.20 dB',
      '32.50 dB best',
    ]);
    expect(cells.map((c) => c.classList.contains('best'))).toEqual([false, true]);
    expect(el.querySelector('tr[data-row="image"] th')!.textContent).toContain('higher is better');
  });

  it('should draw both overlaid plots with one trace per variant', async () => {
    await answer();
    await fixture.whenStable();
    expect(plotly.reacts.length).toBeGreaterThanOrEqual(2);
    for (const call of plotly.reacts.slice(-2)) {
      expect(call.data).toHaveLength(2);
      expect(call.data.every((d) => d.type === 'scatter')).toBe(true);
    }
  });

  it('should drop a variant through the address when it is removed', async () => {
    await answer();
    const navigate = jest.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    el.querySelector<HTMLButtonElement>('[aria-label="Stop comparing Pair"]')!.click();
    expect(navigate).toHaveBeenCalledWith(['/w', 'w1', 'compare'], {
      queryParams: { chains: 'a' },
    });
  });

  it('should show a variant the engine refuses with a dash and say why', async () => {
    for (const request of http.match('/api/catalogue')) request.flush([]);
    http
      .expectOne('/api/chains/a/family')
      .flush([summary('a', 'One tank'), summary('b', 'Pair', 'a')]);
    http.expectOne('/api/chains/a').flush(chainDto('a', 'One tank'));
    http.expectOne('/api/chains/b').flush(chainDto('b', 'Pair'));
    http.expectOne((r) => r.url === '/api/chains/a/analysis').flush(withImageRejection(14.2));
    http
      .expectOne((r) => r.url === '/api/chains/b/analysis')
      .flush(
        { error: 'invalid-chain', message: 'no' },
        { status: 422, statusText: 'Unprocessable' },
      );
    await fixture.whenStable();
    const cells = [...el.querySelectorAll('tr[data-row="image"] td')];
    expect(cells[1].textContent!.trim()).toBe('—');
    expect(cells.some((c) => c.classList.contains('best'))).toBe(false);
    expect(el.querySelector('[role="alert"]')!.textContent).toContain('Pair');
  });

  it('should compare two modes of one chain, each analysed in its mode', async () => {
    // Answer the first selection, then show two modes of chain "a".
    await answer();
    fixture.componentRef.setInput('chains', 'a:rx,a:tx');
    fixture.detectChanges();
    await fixture.whenStable();
    const modal = chainDto('a', 'Transceiver');
    modal.document = {
      ...modal.document,
      modes: [
        { id: 'rx', name: 'Receive', kind: 'receive' },
        { id: 'tx', name: 'Transmit', kind: 'transmit' },
      ],
    };
    // The family is the chain's (already read for "a"), never asked for "a:rx".
    http.expectNone((r) => r.url.includes('a:rx'));
    for (const request of http.match('/api/chains/a')) request.flush(modal);
    const analyses = http.match((r) => r.url === '/api/chains/a/analysis');
    expect(analyses.map((r) => r.request.params.get('mode'))).toEqual(['rx', 'tx']);
    analyses[0].flush(withImageRejection(10));
    analyses[1].flush(withImageRejection(20));
    await fixture.whenStable();
    fixture.detectChanges();
    const heads = [...el.querySelectorAll('th.variant a')].map((a) => a.textContent!.trim());
    expect(heads).toEqual(['Transceiver · Receive', 'Transceiver · Transmit']);
    expect(el.querySelector('h1')!.textContent).toContain('Compare modes and variants');
    // Each column links to the chain itself.
    expect(el.querySelector('th.variant a')!.getAttribute('href')).toBe('/w/w1/chains/a');
  });
});
