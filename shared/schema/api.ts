/**
 * Request bodies and response shapes of the JSON API under /api. The server validates
 * every body with these schemas; the client's forms use the same ones.
 *
 * Errors are always JSON: { error: string (a code), message: string, details?: unknown }.
 * Status codes: 400 malformed / 422 invalid field (details: [{ path, message }]),
 * 401 not signed in, 403 role too low, 404, 409 conflict (stale version: details
 * carries { currentVersion }), 413 body too large, 429 too many sign-in attempts.
 *
 * State-changing requests carry the CSRF token from GET /api/auth/csrf in the
 * `x-csrf-token` header.
 *
 * This module holds accounts, workspaces, invitations and mail, and re-exports the other
 * domains: chains and their analysis (`chains-api.ts`), sharing, comments and activity
 * (`collaboration-api.ts`), the parts bin (`parts-api.ts`) and the design assistants
 * (`design-api.ts`).
 */
import { z } from 'zod';
import { email, password, ROLES, type SiteRole, type WorkspaceRole } from './account-fields';

export { ROLES, SITE_ROLES, type SiteRole, type WorkspaceRole } from './account-fields';
export * from './chains-api';
export * from './collaboration-api';
export * from './parts-api';

// ------------------------------------------------------------------ auth
export const registerSchema = z.object({
  email,
  displayName: z.string().trim().min(1, 'enter a display name').max(80),
  password,
});
export const loginSchema = z.object({ email, password: z.string().min(1).max(200) });
export const changePasswordSchema = z.object({
  currentPassword: z.string().min(1).max(200),
  newPassword: password,
});
export const siteSettingsSchema = z.object({ openRegistration: z.boolean() });
/** PATCH /api/admin/users/:id: deactivate (`active: false`) or reactivate an account. */
export const adminUserUpdateSchema = z.object({ active: z.boolean() }).strict();

/** A row of the admin's account list. */
export interface AdminUserDto extends UserDto {
  createdAt: string;
  /** False once an admin deactivated (or deleted) the account: it cannot sign in. */
  active: boolean;
  /** True once deleted: the address and name are erased, the chains it wrote stay. */
  deleted: boolean;
}
/** DELETE /api/admin/users/:id: what happened to the account's workspaces. */
export interface AccountDeletedDto {
  /** Workspaces it was the only member of: deleted with their chains and files. */
  deletedWorkspaces: { id: string; name: string; chainCount: number }[];
  /** Workspaces shared with others: it left them; their chains stay, credited to "Deleted account". */
  leftWorkspaces: { id: string; name: string; chainCount: number }[];
}

export interface UserDto {
  id: string;
  email: string;
  displayName: string;
  siteRole: SiteRole;
}
export interface MembershipDto {
  workspaceId: string;
  workspaceName: string;
  role: WorkspaceRole;
}
/** POST /api/auth/login and /api/auth/register answer this; the session is new, so is the CSRF token. */
export interface SignedInDto {
  user: UserDto;
  csrfToken: string;
}
/** GET /api/me */
export interface MeDto {
  user: UserDto;
  memberships: MembershipDto[];
  /**
   * Site admins only: whether mail goes to the local development catcher, whose messages
   * the development mailbox page lists (absent for everyone else).
   */
  mailCatcher?: boolean;
}

// ------------------------------------------------------------------ workspaces
export const workspaceNameSchema = z.object({
  name: z.string().trim().min(1, 'a workspace needs a name').max(120),
});
export interface WorkspaceDto {
  id: string;
  name: string;
  role: WorkspaceRole;
}
export const addMemberSchema = z.object({ email, role: z.enum(ROLES) });
export const changeRoleSchema = z.object({ role: z.enum(ROLES) });
export interface MemberDto {
  userId: string;
  email: string;
  displayName: string;
  role: WorkspaceRole;
}

export interface ApiErrorDto {
  error: string;
  message: string;
  details?: unknown;
}

// ------------------------------------------------------------------ design assistants
export * from './design-api';

// ------------------------------------------------------------------ mail
/** Whether a mail an action caused went out; a failure keeps the action and retries the mail. */
export interface MailOutcomeDto {
  sent: boolean;
  /** The message's row in the outbox (for the admin's retry). */
  outboxId: string;
  /** Set when it did not go: what happened and what happens next. */
  message?: string;
}
/** GET /api/admin/mailbox: the local mail catcher's messages (development only). */
export interface CaughtMailSummaryDto {
  id: string;
  to: string;
  subject: string;
  date: string;
}
export interface CaughtMailDto extends CaughtMailSummaryDto {
  from: string;
  text: string;
  html: string | null;
}
/** GET /api/admin/outbox: messages that have not gone out (yet). */
export interface OutboxMessageDto {
  id: string;
  recipient: string;
  subject: string;
  state: 'pending' | 'sent' | 'failed';
  attempts: number;
  lastError: string | null;
  nextAttemptAt: string | null;
  createdAt: string;
}

// ------------------------------------------------------------------ invitations, passwords
export const invitationSchema = z.object({ email, role: z.enum(ROLES) });
/** An invitation as its workspace's owners see it. */
export interface InvitationDto {
  id: string;
  email: string;
  role: WorkspaceRole;
  invitedBy: string;
  createdAt: string;
  expiresAt: string;
  /** Set on the answer to POST: whether the invitation mail went out. */
  mail?: MailOutcomeDto;
}
/** GET /api/invitations/:token: what the link offers, for the person holding it. */
export interface InvitationPreviewDto {
  workspaceName: string;
  role: WorkspaceRole;
  email: string;
  invitedBy: string;
  expiresAt: string;
  /** Whether accepting needs a new account (name and password) or the existing one's password. */
  hasAccount: boolean;
}
/** POST /api/invitations/:token/accept: nothing when signed in as the invited address. */
export const acceptInvitationSchema = z.object({
  displayName: z.string().trim().min(1, 'enter a display name').max(80).optional(),
  password: z.string().min(1).max(200).optional(),
});
export interface AcceptedInvitationDto extends SignedInDto {
  workspaceId: string;
  role: WorkspaceRole;
}
export const passwordResetRequestSchema = z.object({ email });
export const passwordResetSchema = z.object({ password });
/** POST /api/auth/register answers 202 with this when the address must be confirmed first. */
export interface RegistrationPendingDto {
  pending: true;
  message: string;
}
