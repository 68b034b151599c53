import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatDialog } from '@angular/material/dialog';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import { of } from 'rxjs';
import { readDraft, writeDraft } from '../state/draft-store';
import { EditorStore } from '../state/editor.store';
import { CATALOGUE } from '../testing/catalogue-fixture';
import { chainDto } from '../testing/chain-dto';
import { ChainPersistence } from './chain-persistence';
import type { ConflictChoice } from './conflict-dialog.component';

describe('ChainPersistence', () => {
  let persistence: ChainPersistence;
  let store: EditorStore;
  let http: HttpTestingController;
  let choice: ConflictChoice | undefined;
  const dialogOpen = jest.fn();
  const navigate = jest.fn();

  beforeEach(() => {
    localStorage.clear();
    dialogOpen.mockReset().mockImplementation(() => ({ afterClosed: () => of(choice) }));
    navigate.mockReset().mockResolvedValue(true);
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        EditorStore,
        ChainPersistence,
        { provide: MatDialog, useValue: { open: dialogOpen } },
        { provide: MatSnackBar, useValue: { open: jest.fn() } },
        { provide: Router, useValue: { navigate } },
      ],
    });
    store = TestBed.inject(EditorStore);
    persistence = TestBed.inject(ChainPersistence);
    http = TestBed.inject(HttpTestingController);
    store.setCatalogue(CATALOGUE);
    store.load(chainDto('editor', 3));
    store.remove('amp');
    writeDraft('c1', 3, store.doc());
  });

  afterEach(() => http.verify());

  describe('saving', () => {
    it('should send the version read and the document, then count as saved', async () => {
      const saving = persistence.save('Removed the amplifier');
      const req = http.expectOne('/api/chains/c1');
      expect(req.request.method).toBe('PUT');
      expect(req.request.body).toEqual({
        version: 3,
        document: store.doc(),
        message: 'Removed the amplifier',
      });
      req.flush({ ...chainDto('editor', 4), document: store.doc() });
      expect(await saving).toBe(true);
      expect(store.dirty()).toBe(false);
      expect(store.chain()?.version).toBe(4);
      expect(readDraft('c1')).toBeNull();
    });
  });

  describe('a stale save (409)', () => {
    it('should keep my edits as a variant when I choose so', async () => {
      choice = 'variant';
      const mine = store.doc();
      const saving = persistence.save('');
      http
        .expectOne('/api/chains/c1')
        .flush(
          { error: 'stale-version', message: 'stale', details: { currentVersion: 5 } },
          { status: 409, statusText: 'Conflict' },
        );
      await flushMicrotasks();
      expect(dialogOpen).toHaveBeenCalledWith(
        expect.anything(),
        expect.objectContaining({ data: { currentVersion: 5, myVersion: 3 } }),
      );
      const duplicate = http.expectOne('/api/chains/c1/duplicate');
      expect(duplicate.request.body).toEqual({
        name: 'Test chain (my edits)',
        asVariant: true,
        document: mine,
      });
      duplicate.flush({ ...chainDto('editor', 1), id: 'c2', name: 'Test chain (my edits)' });
      expect(await saving).toBe(false);
      expect(navigate).toHaveBeenCalledWith(['/w', 'w1', 'chains', 'c2']);
      expect(readDraft('c1')).toBeNull();
    });

    it('should load the current version when I choose theirs', async () => {
      choice = 'reload';
      const saving = persistence.save('');
      http
        .expectOne('/api/chains/c1')
        .flush(
          { error: 'stale-version', message: 'stale', details: { currentVersion: 5 } },
          { status: 409, statusText: 'Conflict' },
        );
      await flushMicrotasks();
      http.expectOne('/api/chains/c1').flush(chainDto('editor', 5));
      await saving;
      expect(store.chain()?.version).toBe(5);
      expect(store.doc().stages).toHaveLength(4);
      expect(store.dirty()).toBe(false);
    });

    it('should keep my edits and the draft when I close the dialog', async () => {
      choice = undefined;
      const saving = persistence.save('');
      http
        .expectOne('/api/chains/c1')
        .flush(
          { message: 'stale', details: { currentVersion: 5 } },
          { status: 409, statusText: 'Conflict' },
        );
      expect(await saving).toBe(false);
      expect(store.dirty()).toBe(true);
      expect(readDraft('c1')).not.toBeNull();
    });
  });

  describe('restoring a revision', () => {
    it('should send the version read and load the answer', async () => {
      const restoring = persistence.restore(1);
      const req = http.expectOne('/api/chains/c1/revisions/1/restore');
      expect(req.request.body).toEqual({ version: 3 });
      req.flush(chainDto('editor', 4));
      expect(await restoring).toBe(true);
      expect(store.chain()?.version).toBe(4);
      expect(store.dirty()).toBe(false);
    });
  });
});

// Helpers

/** Lets the awaited dialog answer and the next request go out. */
async function flushMicrotasks(): Promise<void> {
  for (let i = 0; i < 5; i++) await Promise.resolve();
}
