import { Routes } from '@angular/router';
import { editorLeaveGuard } from './features/editor/leave.guard';
import {
  adminGuard,
  homeRedirectGuard,
  signedInGuard,
  signedOutGuard,
  workspaceRoleGuard,
} from './core/guards/session.guards';

/** Every page is lazy: the initial bundle holds only the shell and core. */
export const appRoutes: Routes = [
  { path: '', pathMatch: 'full', canActivate: [homeRedirectGuard], children: [] },
  {
    path: 'sign-in',
    title: 'Sign in · Chainwright',
    canActivate: [signedOutGuard],
    loadComponent: () => import('./features/auth/sign-in.component'),
  },
  {
    path: 'register',
    title: 'Create an account · Chainwright',
    canActivate: [signedOutGuard],
    loadComponent: () => import('./features/auth/register.component'),
  },
  {
    path: 'welcome',
    title: 'Welcome · Chainwright',
    canActivate: [signedInGuard],
    loadComponent: () => import('./features/welcome/welcome.component'),
  },
  {
    path: 'account',
    title: 'Account · Chainwright',
    canActivate: [signedInGuard],
    loadComponent: () => import('./features/account/account.component'),
  },
  {
    path: 'admin',
    title: 'Site administration · Chainwright',
    canActivate: [adminGuard],
    loadComponent: () => import('./features/admin/admin.component'),
  },
  {
    path: 'w/:workspaceId',
    canActivate: [workspaceRoleGuard('viewer')],
    children: [
      { path: '', pathMatch: 'full', redirectTo: 'chains' },
      {
        path: 'chains',
        title: 'Chains · Chainwright',
        loadComponent: () => import('./features/chains/chain-list.component'),
      },
      {
        path: 'chains/:chainId',
        title: 'Chain · Chainwright',
        loadComponent: () => import('./features/editor/chain-editor.component'),
        canDeactivate: [editorLeaveGuard],
      },
      {
        path: 'chains/:chainId/studies',
        title: 'Studies · Chainwright',
        loadComponent: () => import('./features/studies/studies.component'),
      },
      {
        path: 'compare',
        title: 'Compare variants · Chainwright',
        loadComponent: () => import('./features/compare/compare.component'),
      },
      {
        path: 'members',
        title: 'Members · Chainwright',
        loadComponent: () => import('./features/members/members.component'),
      },
    ],
  },
  {
    path: '**',
    title: 'Not found · Chainwright',
    loadComponent: () => import('./features/not-found/not-found.component'),
  },
];
