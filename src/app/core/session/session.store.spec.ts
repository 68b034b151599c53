import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { MeDto } from '../../../../shared/schema/api';
import { CsrfTokenStore } from '../http/csrf-token.store';
import { SessionStore } from './session.store';

describe('SessionStore', () => {
  let store: SessionStore;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting()],
    });
    store = TestBed.inject(SessionStore);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  describe('loading who is signed in', () => {
    it('should hold the user and memberships from /api/me', async () => {
      const loaded = store.ensureLoaded();
      http.expectOne('/api/me').flush(ME);
      await expect(loaded).resolves.toEqual(ME);
      expect(store.signedIn()).toBe(true);
      expect(store.user()?.displayName).toBe('Ada');
      expect(store.memberships().length).toBe(2);
    });

    it('should treat 401 as signed out without failing', async () => {
      const loaded = store.ensureLoaded();
      http.expectOne('/api/me').flush(UNAUTHORIZED, { status: 401, statusText: 'Unauthorized' });
      await expect(loaded).resolves.toBeNull();
      expect(store.signedIn()).toBe(false);
      expect(store.loaded()).toBe(true);
    });

    it('should ask the server only once for repeated loads', async () => {
      const first = store.ensureLoaded();
      const second = store.ensureLoaded();
      http.expectOne('/api/me').flush(ME);
      await Promise.all([first, second]);
      await store.ensureLoaded();
      http.expectNone('/api/me');
    });
  });

  describe('roles in the current workspace', () => {
    beforeEach(async () => {
      const loaded = store.ensureLoaded();
      http.expectOne('/api/me').flush(ME);
      await loaded;
    });

    it('should have no role outside a workspace', () => {
      expect(store.role()).toBeNull();
      expect(store.canEdit()).toBe(false);
    });

    it('should let an editor edit but not own', () => {
      store.setCurrentWorkspace('w-lab');
      expect(store.role()).toBe('editor');
      expect(store.canEdit()).toBe(true);
      expect(store.isOwner()).toBe(false);
    });

    it('should give a viewer read-only access', () => {
      store.setCurrentWorkspace('w-demo');
      expect(store.canEdit()).toBe(false);
    });

    it('should open the current workspace first, else the first membership', () => {
      expect(store.homeWorkspaceId()).toBe('w-lab');
      store.setCurrentWorkspace('w-demo');
      expect(store.homeWorkspaceId()).toBe('w-demo');
    });
  });

  describe('starting and ending a session', () => {
    it('should keep the new CSRF token and reload the memberships', async () => {
      const started = store.startSession({ user: ME.user, csrfToken: 'fresh-token' });
      expect(store.signedIn()).toBe(true);
      http.expectOne('/api/me').flush(ME);
      await started;
      await expect(TestBed.inject(CsrfTokenStore).get()).resolves.toBe('fresh-token');
    });

    it('should forget the user and the token', async () => {
      const started = store.startSession({ user: ME.user, csrfToken: 'fresh-token' });
      http.expectOne('/api/me').flush(ME);
      await started;
      store.forget();
      expect(store.me()).toBeNull();
      const token = TestBed.inject(CsrfTokenStore).get();
      http.expectOne('/api/auth/csrf').flush({ token: 'after-sign-out' });
      await expect(token).resolves.toBe('after-sign-out');
    });
  });
});

// Helpers
const ME: MeDto = {
  user: { id: 'u1', email: 'ada@example.org', displayName: 'Ada', siteRole: 'user' },
  memberships: [
    { workspaceId: 'w-lab', workspaceName: 'Lab', role: 'editor' },
    { workspaceId: 'w-demo', workspaceName: 'Demo', role: 'viewer' },
  ],
};
const UNAUTHORIZED = { error: 'unauthorized', message: 'sign in first' };
