import { inject } from '@angular/core';
import {
  ActivatedRouteSnapshot,
  CanActivateFn,
  Router,
  RouterStateSnapshot,
} from '@angular/router';
import type { WorkspaceRole } from '../../../../shared/schema/api';
import { roleAtLeast } from '../session/roles';
import { SessionStore } from '../session/session.store';

function signInTree(router: Router, state: RouterStateSnapshot) {
  return router.createUrlTree(['/sign-in'], { queryParams: { next: state.url } });
}

/** Lets signed-in users through; sends visitors to sign in and back here afterwards. */
export const signedInGuard: CanActivateFn = async (_route, state) => {
  // inject() only works before the first await: take everything needed up front.
  const session = inject(SessionStore);
  const router = inject(Router);
  const me = await session.ensureLoaded();
  return me ? true : signInTree(router, state);
};

/** Keeps signed-in users away from the sign-in and registration pages. */
export const signedOutGuard: CanActivateFn = async () => {
  const session = inject(SessionStore);
  const router = inject(Router);
  const me = await session.ensureLoaded();
  return me ? router.createUrlTree(['/']) : true;
};

/**
 * Requires at least `minimum` in the route's `:workspaceId` and makes it the current
 * workspace. Without the role the user lands on the workspace's chain list (if a member
 * at all) or the not-found page.
 */
export function workspaceRoleGuard(minimum: WorkspaceRole): CanActivateFn {
  return async (route: ActivatedRouteSnapshot, state: RouterStateSnapshot) => {
    const session = inject(SessionStore);
    const router = inject(Router);
    const me = await session.ensureLoaded();
    if (!me) return signInTree(router, state);
    const workspaceId = route.paramMap.get('workspaceId') ?? '';
    // Someone may have added the user to this workspace since /api/me last answered.
    const membership =
      session.membershipOf(workspaceId) ??
      (await session.refresh().then(() => session.membershipOf(workspaceId)));
    if (!membership) return router.createUrlTree(['/not-found']);
    session.setCurrentWorkspace(workspaceId);
    if (roleAtLeast(membership.role, minimum)) return true;
    return router.createUrlTree(['/w', workspaceId, 'chains']);
  };
}

/** Site administrators only. */
export const adminGuard: CanActivateFn = async (_route, state) => {
  const session = inject(SessionStore);
  const router = inject(Router);
  const me = await session.ensureLoaded();
  if (!me) return signInTree(router, state);
  return me.user.siteRole === 'admin' ? true : router.createUrlTree(['/not-found']);
};

/** The start page: the user's workspace, the welcome page without one, or sign-in. */
export const homeRedirectGuard: CanActivateFn = async () => {
  const session = inject(SessionStore);
  const router = inject(Router);
  const me = await session.ensureLoaded();
  if (!me) return router.createUrlTree(['/sign-in']);
  const workspaceId = session.homeWorkspaceId();
  return workspaceId
    ? router.createUrlTree(['/w', workspaceId, 'chains'])
    : router.createUrlTree(['/welcome']);
};
