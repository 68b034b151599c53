import { provideHttpClient } from '@angular/common/http';
import {
  HttpTestingController,
  provideHttpClientTesting,
  TestRequest,
} from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter, Router } from '@angular/router';
import type { ChainListDto, ChainSummaryDto, WorkspaceRole } from '../../../../shared/schema/api';
import { SessionStore } from '../../core/session/session.store';
import { provideAppIcons } from '../../core/theme/icons';
import ChainListComponent, { FILTER_DEBOUNCE_MS } from './chain-list.component';

describe('ChainListComponent', () => {
  let fixture: ComponentFixture<ChainListComponent>;
  let http: HttpTestingController;
  let el: HTMLElement;

  afterEach(() => {
    http.verify();
    jest.useRealTimers();
  });

  describe('loading the list', () => {
    beforeEach(async () => setUp('editor'));

    it('should ask for the first page, newest change first, without a filter', () => {
      const req = expectList(http);
      expect(params(req)).toEqual({ page: '0', pageSize: '25', sort: 'updatedAt', dir: 'desc' });
      req.flush(page([]));
    });

    it('should show each chain with f0 in engineering form, stages, flags and author', async () => {
      expectList(http).flush(page([chain({ name: 'Loop front end', f0Hz: 77.5e3, flagCount: 2 })]));
      await fixture.whenStable();
      const cells = [...el.querySelectorAll('tr.mat-mdc-row td')].map((td) =>
        td.textContent!.trim(),
      );
      expect(cells[0]).toContain('Loop front end');
      expect(cells[1]).toBe('77.5 kHz'); // the design frequency as stated, not padded
      expect(cells[2]).toBe('3');
      expect(cells[3]).toBe('2');
      expect(cells[5]).toBe('Olga Owner');
    });

    it('should say so when the workspace has no chains yet', async () => {
      expectList(http).flush(page([]));
      await fixture.whenStable();
      expect(el.querySelector('.cw-empty')?.textContent).toContain('No chains here yet');
    });

    it('should open the editor when a row is clicked', async () => {
      const navigate = jest.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
      expectList(http).flush(page([chain({ id: 'c9' })]));
      await fixture.whenStable();
      el.querySelector<HTMLElement>('tr.mat-mdc-row')!.click();
      expect(navigate).toHaveBeenCalledWith(['/w', 'w1', 'chains', 'c9']);
    });
  });

  describe('sorting, filtering and paging on the server', () => {
    beforeEach(async () => setUp('editor'));

    it('should ask the server again, sorted by name, when the name header is clicked', async () => {
      expectList(http).flush(page([chain({})]));
      await fixture.whenStable();
      el.querySelector<HTMLElement>('th.mat-column-name .mat-sort-header-container')!.click();
      await fixture.whenStable();
      const req = expectList(http);
      expect(params(req)).toMatchObject({ sort: 'name', dir: 'asc', page: '0' });
      req.flush(page([chain({})]));
    });

    it('should send the filter once typing pauses, from the first page', async () => {
      expectList(http).flush(page([chain({})], 60));
      await fixture.whenStable();
      jest.useFakeTimers();
      const input = el.querySelector<HTMLInputElement>('input[type="search"]')!;
      input.value = 'preselector';
      input.dispatchEvent(new Event('input'));
      jest.advanceTimersByTime(FILTER_DEBOUNCE_MS - 50);
      TestBed.tick();
      http.expectNone((r) => r.url.endsWith('/chains'));
      jest.advanceTimersByTime(50);
      TestBed.tick();
      const req = expectList(http);
      expect(params(req)).toMatchObject({ q: 'preselector', page: '0' });
      req.flush(page([]));
    });

    it('should ask for the next page when the paginator moves on', async () => {
      expectList(http).flush(page([chain({})], 60));
      await fixture.whenStable();
      el.querySelector<HTMLButtonElement>('button.mat-mdc-paginator-navigation-next')!.click();
      await fixture.whenStable();
      const req = expectList(http);
      expect(params(req)).toMatchObject({ page: '1', pageSize: '25' });
      req.flush(page([chain({})], 60));
    });
  });

  describe('what each role sees', () => {
    it('should offer an editor the new chain button and row actions', async () => {
      await setUp('editor');
      expectList(http).flush(page([chain({ name: 'Tank' })]));
      await fixture.whenStable();
      expect(el.querySelector('.cw-new-chain')).not.toBeNull();
      el.querySelector<HTMLElement>('[aria-label="Actions for Tank"]')!.click();
      await fixture.whenStable();
      expect(menuItems()).toEqual(['Rename', 'Save as variant', 'Duplicate', 'Delete']);
    });

    it('should show a viewer no edit controls at all', async () => {
      await setUp('viewer');
      expectList(http).flush(page([chain({ name: 'Tank' })]));
      await fixture.whenStable();
      expect(el.querySelector('.cw-new-chain')).toBeNull();
      expect(el.querySelector('.mat-column-actions')).toBeNull();
      expect(el.querySelectorAll('button[aria-label^="Delete"]').length).toBe(0);
      expect(el.querySelector('.cw-empty')).toBeNull();
    });

    it('should offer a viewer the compare action on rows of a family only', async () => {
      await setUp('viewer');
      const navigate = jest.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
      expectList(http).flush(
        page([
          chain({ id: 'p', name: 'Parent', variantCount: 1 }),
          chain({ id: 'v', name: 'Variant', parentId: 'p', variantCount: 0 }),
          chain({ id: 'x', name: 'Alone', variantCount: 0 }),
        ]),
      );
      await fixture.whenStable();
      // Only rows of a family get a menu, and a viewer's menu offers nothing that edits.
      expect(el.querySelectorAll('button[aria-label^="Actions for"]').length).toBe(2);
      expect(el.querySelector('[aria-label="Actions for Alone"]')).toBeNull();
      el.querySelector<HTMLElement>('[aria-label="Actions for Variant"]')!.click();
      await fixture.whenStable();
      expect(menuItems()).toEqual(['Compare with its variants']);
      menuItem('Compare with its variants').click();
      http
        .expectOne('/api/chains/v/family')
        .flush([chain({ id: 'p' }), chain({ id: 'v', parentId: 'p' })]);
      await fixture.whenStable();
      expect(navigate).toHaveBeenCalledWith(['/w', 'w1', 'compare'], {
        queryParams: { chains: 'p,v' },
      });
    });
  });

  // Helpers
  function menuItems(): string[] {
    return [...document.querySelectorAll('.cdk-overlay-container [mat-menu-item]')].map((b) =>
      b.textContent!.trim(),
    );
  }

  function menuItem(text: string): HTMLElement {
    return [
      ...document.querySelectorAll<HTMLElement>('.cdk-overlay-container [mat-menu-item]'),
    ].find((b) => b.textContent!.trim() === text)!;
  }

  async function setUp(role: WorkspaceRole): Promise<void> {
    TestBed.configureTestingModule({
      providers: [
        provideRouter([]),
        provideHttpClient(),
        provideHttpClientTesting(),
        provideAppIcons(),
      ],
    });
    http = TestBed.inject(HttpTestingController);
    const session = TestBed.inject(SessionStore);
    const loaded = session.ensureLoaded();
    http.expectOne('/api/me').flush({
      user: { id: 'u1', email: 'a@example.org', displayName: 'A', siteRole: 'user' },
      memberships: [{ workspaceId: 'w1', workspaceName: 'Lab', role }],
    });
    await loaded;
    session.setCurrentWorkspace('w1');
    fixture = TestBed.createComponent(ChainListComponent);
    fixture.componentRef.setInput('workspaceId', 'w1');
    el = fixture.nativeElement;
    await fixture.whenStable();
  }
});

function expectList(http: HttpTestingController): TestRequest {
  return http.expectOne((r) => r.url === '/api/workspaces/w1/chains');
}

function params(req: TestRequest): Record<string, string> {
  const p = req.request.params;
  return Object.fromEntries(p.keys().map((k) => [k, p.get(k)!]));
}

function page(items: ChainSummaryDto[], total = items.length): ChainListDto {
  return { items, total, page: 0, pageSize: 25 };
}

function chain(over: Partial<ChainSummaryDto>): ChainSummaryDto {
  return {
    id: 'c1',
    workspaceId: 'w1',
    name: 'Chain',
    description: '',
    f0Hz: 1e6,
    stageCount: 3,
    flagCount: 0,
    version: 1,
    parentId: null,
    createdBy: 'Olga Owner',
    updatedBy: 'Eddie Editor',
    updatedAt: '2026-11-30T10:00:00Z',
    ...over,
  };
}
