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
    path: 'forgot-password',
    title: 'New password · Chainwright',
    loadComponent: () => import('./features/account-links/forgot-password.component'),
  },
  {
    path: 'reset-password/:token',
    title: 'New password · Chainwright',
    loadComponent: () => import('./features/account-links/reset-password.component'),
  },
  {
    path: 'confirm/:token',
    title: 'Confirm your address · Chainwright',
    loadComponent: () => import('./features/account-links/confirm-address.component'),
  },
  {
    path: 'invitation/:token',
    title: 'Invitation · Chainwright',
    loadComponent: () => import('./features/invitations/accept-invitation.component'),
  },
  {
    path: 'shared/:token',
    title: 'Shared chain · Chainwright',
    loadComponent: () => import('./features/share/shared-chain.component'),
  },
  {
    path: 'shared/:token/report',
    title: 'Report · Chainwright',
    loadComponent: () => import('./features/report/report-page.component'),
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
    path: 'admin/mail',
    title: 'Mail · Chainwright',
    canActivate: [adminGuard],
    loadComponent: () => import('./features/mailbox/mailbox.component'),
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
        path: 'chains/:chainId/report',
        title: 'Report · Chainwright',
        loadComponent: () => import('./features/report/report-page.component'),
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
        path: 'activity',
        title: 'Activity · Chainwright',
        loadComponent: () => import('./features/activity/activity.component'),
      },
      {
        path: 'parts',
        title: 'Parts bin · Chainwright',
        loadComponent: () => import('./features/parts/parts-bin.component'),
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
