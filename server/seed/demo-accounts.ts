import type { WorkspaceRole } from '../../shared/schema/api';

/** Name of the workspace the demo data lives in. */
export const DEMO_WORKSPACE = 'Demo receivers';

/**
 * Demo sign-ins, listed in README.md. The `.test` domain is reserved (RFC 2606), so no mail
 * to these addresses can reach anyone. The password is public: demo data only.
 */
export const DEMO_PASSWORD = 'demo-receiver-2026';
export const DEMO_ACCOUNTS: {
  email: string;
  displayName: string;
  role: WorkspaceRole;
  siteAdmin: boolean;
}[] = [
  { email: 'owner@chainwright.test', displayName: 'Olga Owner', role: 'owner', siteAdmin: true },
  {
    email: 'editor@chainwright.test',
    displayName: 'Eddie Editor',
    role: 'editor',
    siteAdmin: false,
  },
  {
    email: 'viewer@chainwright.test',
    displayName: 'Vera Viewer',
    role: 'viewer',
    siteAdmin: false,
  },
];
