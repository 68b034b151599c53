import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import {
  ActivatedRouteSnapshot,
  CanActivateFn,
  convertToParamMap,
  provideRouter,
  Router,
  RouterStateSnapshot,
  UrlTree,
} from '@angular/router';
import type { MeDto } from '../../../../shared/schema/api';
import { SessionStore } from '../session/session.store';
import { adminGuard, homeRedirectGuard, signedInGuard, workspaceRoleGuard } from './session.guards';

describe('route guards', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  describe('signedInGuard', () => {
    it('should send a visitor to sign in and back afterwards', async () => {
      const result = run(signedInGuard, {}, '/w/w1/chains');
      answerMe(http, null);
      expect(serialize(await result)).toBe('/sign-in?next=%2Fw%2Fw1%2Fchains');
    });

    it('should let a signed-in user through', async () => {
      const result = run(signedInGuard, {}, '/account');
      answerMe(http, me('user', 'editor'));
      expect(await result).toBe(true);
    });
  });

  describe('workspaceRoleGuard', () => {
    it('should let a member with enough role through and set the workspace', async () => {
      const result = run(workspaceRoleGuard('editor'), { workspaceId: 'w1' }, '/w/w1/x');
      answerMe(http, me('user', 'owner'));
      expect(await result).toBe(true);
      expect(TestBed.inject(SessionStore).currentWorkspaceId()).toBe('w1');
    });

    it('should send a viewer who needs editor back to the chain list', async () => {
      const result = run(workspaceRoleGuard('editor'), { workspaceId: 'w1' }, '/w/w1/x');
      answerMe(http, me('user', 'viewer'));
      expect(serialize(await result)).toBe('/w/w1/chains');
    });

    it('should show not-found for a workspace the user is not in, after asking again', async () => {
      const result = run(workspaceRoleGuard('viewer'), { workspaceId: 'other' }, '/w/other');
      answerMe(http, me('user', 'owner'));
      await flushMicrotasks();
      answerMe(http, me('user', 'owner'));
      expect(serialize(await result)).toBe('/not-found');
    });
  });

  describe('adminGuard', () => {
    it('should turn away a user who is not a site admin', async () => {
      const result = run(adminGuard, {}, '/admin');
      answerMe(http, me('user', 'owner'));
      expect(serialize(await result)).toBe('/not-found');
    });

    it('should let a site admin through', async () => {
      const result = run(adminGuard, {}, '/admin');
      answerMe(http, me('admin', 'viewer'));
      expect(await result).toBe(true);
    });
  });

  describe('homeRedirectGuard', () => {
    it("should open the first workspace's chain list", async () => {
      const result = run(homeRedirectGuard, {}, '/');
      answerMe(http, me('user', 'viewer'));
      expect(serialize(await result)).toBe('/w/w1/chains');
    });

    it('should welcome a user without a workspace', async () => {
      const result = run(homeRedirectGuard, {}, '/');
      answerMe(http, { ...me('user', 'viewer'), memberships: [] });
      expect(serialize(await result)).toBe('/welcome');
    });
  });
});

// Helpers
function run(guard: CanActivateFn, params: Record<string, string>, url: string) {
  const route = { paramMap: convertToParamMap(params) } as ActivatedRouteSnapshot;
  const state = { url } as RouterStateSnapshot;
  return TestBed.runInInjectionContext(() => guard(route, state)) as Promise<boolean | UrlTree>;
}

function answerMe(http: HttpTestingController, body: MeDto | null): void {
  const req = http.expectOne('/api/me');
  if (body) req.flush(body);
  else req.flush({ error: 'unauthorized', message: 'sign in' }, { status: 401, statusText: 'x' });
}

function serialize(result: boolean | UrlTree): string {
  if (typeof result === 'boolean') return String(result);
  return TestBed.inject(Router).serializeUrl(result);
}

function flushMicrotasks(): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, 0));
}

function me(siteRole: 'admin' | 'user', role: 'owner' | 'editor' | 'viewer'): MeDto {
  return {
    user: { id: 'u1', email: 'a@example.org', displayName: 'A', siteRole },
    memberships: [{ workspaceId: 'w1', workspaceName: 'One', role }],
  };
}
