import { HttpClient, HttpContext, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatSnackBar } from '@angular/material/snack-bar';
import { provideRouter, Router } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { SessionStore } from '../session/session.store';
import { csrfInterceptor } from './csrf.interceptor';
import { CsrfTokenStore } from './csrf-token.store';
import { errorInterceptor } from './error.interceptor';
import { SKIP_ERROR_SNACKBAR, SKIP_LOADING_BAR } from './http-context';
import { LoadingTracker, loadingInterceptor } from './loading.interceptor';

describe('HTTP interceptors', () => {
  let http: HttpClient;
  let backend: HttpTestingController;
  let snackBar: { open: jest.Mock };

  beforeEach(() => {
    snackBar = { open: jest.fn() };
    TestBed.configureTestingModule({
      providers: [
        provideRouter([]),
        provideHttpClient(
          withInterceptors([loadingInterceptor, errorInterceptor, csrfInterceptor]),
        ),
        provideHttpClientTesting(),
        { provide: MatSnackBar, useValue: snackBar },
      ],
    });
    http = TestBed.inject(HttpClient);
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => backend.verify());

  describe('CSRF token', () => {
    it('should add the token to a POST, fetching it first', async () => {
      const answer = firstValueFrom(http.post('/api/workspaces', { name: 'Lab' }));
      backend.expectOne('/api/auth/csrf').flush({ token: 'tok-1' });
      await settle();
      const req = backend.expectOne('/api/workspaces');
      expect(req.request.headers.get('x-csrf-token')).toBe('tok-1');
      req.flush({ id: 'w1' });
      await answer;
    });

    it('should reuse a held token for PUT, PATCH and DELETE', async () => {
      TestBed.inject(CsrfTokenStore).set('held');
      for (const method of ['PUT', 'PATCH', 'DELETE']) {
        const answer = firstValueFrom(http.request(method, '/api/chains/c1', { body: {} }));
        await settle();
        const req = backend.expectOne({ method, url: '/api/chains/c1' });
        expect(req.request.headers.get('x-csrf-token')).toBe('held');
        req.flush({});
        await answer;
      }
    });

    it('should send a request with a held token at once, without waiting a turn', async () => {
      TestBed.inject(CsrfTokenStore).set('held');
      const answer = firstValueFrom(http.post('/api/analysis', {}));
      // No settle(): the request must already be with the backend.
      const req = backend.expectOne('/api/analysis');
      expect(req.request.headers.get('x-csrf-token')).toBe('held');
      req.flush({ ok: true });
      await expect(answer).resolves.toEqual({ ok: true });
    });

    it('should not add the token to a GET', async () => {
      TestBed.inject(CsrfTokenStore).set('held');
      const answer = firstValueFrom(http.get('/api/me'));
      const req = backend.expectOne('/api/me');
      expect(req.request.headers.has('x-csrf-token')).toBe(false);
      req.flush({});
      await answer;
    });

    it('should never send the token to another origin', async () => {
      TestBed.inject(CsrfTokenStore).set('held');
      const answer = firstValueFrom(http.post('https://elsewhere.example/api/x', {}));
      const req = backend.expectOne('https://elsewhere.example/api/x');
      expect(req.request.headers.has('x-csrf-token')).toBe(false);
      req.flush({});
      await answer;
    });

    it('should fetch a new token and retry once when the server rejects it', async () => {
      TestBed.inject(CsrfTokenStore).set('stale');
      const answer = firstValueFrom(http.post('/api/workspaces', {}));
      await settle();
      backend
        .expectOne('/api/workspaces')
        .flush(
          { error: 'csrf-invalid', message: 'the form expired' },
          { status: 403, statusText: 'Forbidden' },
        );
      backend.expectOne('/api/auth/csrf').flush({ token: 'renewed' });
      await settle();
      const retry = backend.expectOne('/api/workspaces');
      expect(retry.request.headers.get('x-csrf-token')).toBe('renewed');
      retry.flush({ id: 'w1' });
      await expect(answer).resolves.toEqual({ id: 'w1' });
      expect(snackBar.open).not.toHaveBeenCalled();
    });
  });

  describe('errors', () => {
    it("should show the server's message in a snackbar", async () => {
      const answer = firstValueFrom(http.get('/api/chains/c1'));
      backend
        .expectOne('/api/chains/c1')
        .flush({ error: 'not-found', message: 'no such chain' }, { status: 404, statusText: 'x' });
      await expect(answer).rejects.toMatchObject({ status: 404 });
      expect(snackBar.open).toHaveBeenCalledWith('No such chain.', 'Dismiss', expect.anything());
    });

    it('should stay quiet for the statuses the caller handles itself', async () => {
      const context = new HttpContext().set(SKIP_ERROR_SNACKBAR, [409, 422]);
      const answer = firstValueFrom(http.get('/api/chains/c1', { context }));
      backend
        .expectOne('/api/chains/c1')
        .flush({ error: 'stale', message: 'changed meanwhile' }, { status: 409, statusText: 'x' });
      await expect(answer).rejects.toMatchObject({ status: 409 });
      expect(snackBar.open).not.toHaveBeenCalled();
    });

    it('should still report statuses the caller did not list', async () => {
      const context = new HttpContext().set(SKIP_ERROR_SNACKBAR, [409]);
      const answer = firstValueFrom(http.get('/api/chains/c1', { context }));
      backend
        .expectOne('/api/chains/c1')
        .flush({ error: 'boom', message: 'database down' }, { status: 500, statusText: 'x' });
      await expect(answer).rejects.toBeTruthy();
      expect(snackBar.open).toHaveBeenCalledWith('Database down.', 'Dismiss', expect.anything());
    });

    it('should describe a server that cannot be reached', async () => {
      const answer = firstValueFrom(http.get('/api/me'));
      backend.expectOne('/api/me').error(new ProgressEvent('error'), { status: 0 });
      await expect(answer).rejects.toBeTruthy();
      expect(snackBar.open.mock.calls[0][0]).toMatch(/cannot be reached/);
    });

    it('should forget the session and go to sign-in on 401', async () => {
      const router = TestBed.inject(Router);
      const navigate = jest.spyOn(router, 'navigate').mockResolvedValue(true);
      const forget = jest.spyOn(TestBed.inject(SessionStore), 'forget');
      const answer = firstValueFrom(http.get('/api/workspaces'));
      backend
        .expectOne('/api/workspaces')
        .flush(
          { error: 'unauthorized', message: 'sign in first' },
          { status: 401, statusText: 'x' },
        );
      await expect(answer).rejects.toBeTruthy();
      expect(forget).toHaveBeenCalled();
      expect(navigate).toHaveBeenCalledWith(['/sign-in'], { queryParams: { next: '/' } });
    });
  });

  describe('loading indicator', () => {
    it('should be busy while a request runs and idle after it', async () => {
      const tracker = TestBed.inject(LoadingTracker);
      const answer = firstValueFrom(http.get('/api/examples'));
      expect(tracker.busy()).toBe(true);
      backend.expectOne('/api/examples').flush([]);
      await answer;
      expect(tracker.busy()).toBe(false);
    });

    it('should be idle again after a failure', async () => {
      const tracker = TestBed.inject(LoadingTracker);
      const answer = firstValueFrom(http.get('/api/examples'));
      backend.expectOne('/api/examples').flush({}, { status: 500, statusText: 'x' });
      await expect(answer).rejects.toBeTruthy();
      expect(tracker.busy()).toBe(false);
    });

    it('should ignore requests marked to skip it', () => {
      const tracker = TestBed.inject(LoadingTracker);
      const context = new HttpContext().set(SKIP_LOADING_BAR, true);
      http.get('/api/health', { context }).subscribe();
      expect(tracker.busy()).toBe(false);
      backend.expectOne('/api/health').flush({});
    });
  });
});

// Helpers
/** Lets the promise that fetches the CSRF token hand over to the request. */
function settle(): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, 0));
}
