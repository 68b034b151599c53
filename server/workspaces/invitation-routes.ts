import { Router, type Request, type RequestHandler, type Response } from 'express';
import { LockMode } from '@mikro-orm/core';
import type { CsrfSync } from 'csrf-sync';
import {
  acceptInvitationSchema,
  invitationSchema,
  passwordResetSchema,
  type InvitationDto,
  type InvitationPreviewDto,
} from '../../shared/schema/api';
import { recordActivity } from '../activity/record';
import { signIn } from '../auth/routes';
import { assertStrongPassword } from '../auth/strength';
import { hashToken, looksLikeToken, newToken } from '../auth/tokens';
import {
  ConflictError,
  ForbiddenError,
  HttpError,
  NotFoundError,
  ValidationError,
} from '../common/errors';
import { access, currentUser, uuidParam, workspaceRole } from '../common/roles';
import type { Services } from '../common/services';
import { parseOr422 } from '../common/validate';
import { publicBaseUrl } from '../config';
import { messages } from '../mail/messages';
import { hashPassword, verifyPassword } from '../users/password';
import { toUserDto } from '../users/dto';
import { UserSchema, type User } from '../users/user.entity';
import { INVITATION_DAYS, InvitationSchema, type Invitation } from './invitation.entity';
import { MembershipSchema } from './membership.entity';
import { membershipsOf } from './membership.repository';

/** A link that was real but can no longer be used. */
class GoneError extends HttpError {
  constructor(message: string) {
    super(410, 'invitation-gone', message);
  }
}

function toInvitationDto(i: Invitation): InvitationDto {
  return {
    id: i.id,
    email: i.email,
    role: i.role,
    invitedBy: i.invitedBy.displayName,
    createdAt: i.createdAt.toISOString(),
    expiresAt: i.expiresAt.toISOString(),
  };
}

function whyUnusable(i: Invitation, now = new Date()): string | null {
  if (i.acceptedAt) return 'this invitation was accepted already; sign in to reach the workspace';
  if (i.revokedAt) return 'this invitation was withdrawn; ask the workspace owner for a new one';
  if (i.expiresAt <= now)
    return 'this invitation has expired; ask the workspace owner for a new one';
  return null;
}

/** /api/workspaces/:wid/invitations: owners invite by address, list pending ones, revoke. */
export function workspaceInvitationsRouter(services: Services): Router {
  const router = Router();
  const { em } = services;

  router.get('/:wid/invitations', workspaceRole(em, 'owner'), async (_req, res) => {
    const pending = await em.find(
      InvitationSchema,
      {
        workspace: access(res).workspace.id,
        acceptedAt: null,
        revokedAt: null,
        expiresAt: { $gt: new Date() },
      },
      { populate: ['invitedBy'], orderBy: { createdAt: 'desc' } },
    );
    res.json(pending.map(toInvitationDto));
  });

  router.post('/:wid/invitations', workspaceRole(em, 'owner'), async (req, res) => {
    const body = parseOr422(invitationSchema, req.body);
    const { workspace } = access(res);
    const by = currentUser(req);
    const member = await em.findOne(MembershipSchema, {
      workspace: workspace.id,
      user: { email: body.email },
    });
    if (member) {
      throw new ConflictError(
        'already-member',
        `${body.email} is already a member; change their role instead`,
      );
    }
    // A new invitation replaces any earlier one to the same address: one live link each.
    await em.nativeUpdate(
      InvitationSchema,
      { workspace: workspace.id, email: body.email, acceptedAt: null, revokedAt: null },
      { revokedAt: new Date() },
    );
    const { token, hash } = newToken();
    const invitation = em.create(InvitationSchema, {
      workspace,
      email: body.email,
      role: body.role,
      tokenHash: hash,
      invitedBy: by,
      expiresAt: new Date(Date.now() + INVITATION_DAYS * 24 * 3600_000),
    });
    recordActivity(em, {
      workspaceId: workspace.id,
      actor: by,
      kind: 'member-invited',
      summary: `invited ${body.email} as ${body.role}`,
    });
    await em.flush();
    const mail = await services.mail.send(
      em,
      messages.invitation(body.email, {
        by: by.displayName,
        workspace: workspace.name,
        role: body.role,
        url: `${publicBaseUrl(services.config)}/invitation/${token}`,
      }),
    );
    res.status(201).json({ ...toInvitationDto(invitation), mail });
  });

  router.delete('/:wid/invitations/:id', workspaceRole(em, 'owner'), async (req, res) => {
    const id = uuidParam(req, 'id', 'invitation');
    const revoked = await em.nativeUpdate(
      InvitationSchema,
      { id, workspace: access(res).workspace.id, acceptedAt: null, revokedAt: null },
      { revokedAt: new Date() },
    );
    if (!revoked) throw new NotFoundError('no pending invitation with this id in this workspace');
    res.status(204).end();
  });

  return router;
}

/**
 * /api/invitations/:token: what a link offers, and accepting it (signing up if needed).
 * Accepting into an existing account checks its password, so it counts against the same
 * failed-attempt limit as sign-in (`limiter`).
 */
export function invitationsRouter(
  services: Services,
  csrf: CsrfSync,
  limiter: RequestHandler,
): Router {
  const router = Router();
  const { em } = services;

  const findByToken = async (req: Request) => {
    const token = req.params.token;
    if (!looksLikeToken(token)) throw new NotFoundError('this invitation link is not valid');
    const invitation = await em.findOne(
      InvitationSchema,
      { tokenHash: hashToken(token) },
      { populate: ['workspace', 'invitedBy'] },
    );
    if (!invitation) throw new NotFoundError('this invitation link is not valid');
    const why = whyUnusable(invitation);
    if (why) throw new GoneError(why);
    return invitation;
  };

  router.get('/:token', async (req, res) => {
    const i = await findByToken(req);
    const body: InvitationPreviewDto = {
      workspaceName: i.workspace.name,
      role: i.role,
      email: i.email,
      invitedBy: i.invitedBy.displayName,
      expiresAt: i.expiresAt.toISOString(),
      hasAccount: !!(await em.findOne(UserSchema, { email: i.email })),
    };
    res.json(body);
  });

  router.post('/:token/accept', limiter, async (req: Request, res: Response) => {
    const invitation = await findByToken(req);
    const body = parseOr422(acceptInvitationSchema, req.body ?? {});
    const signedIn = req.user;
    if (signedIn && signedIn.email !== invitation.email) {
      throw new ConflictError(
        'other-account',
        `this invitation is for ${invitation.email}, but you are signed in as ${signedIn.email}; sign out and open the link again`,
      );
    }
    const existing = signedIn ?? (await em.findOne(UserSchema, { email: invitation.email }));
    let newPasswordHash: string | null = null;
    if (!signedIn && existing) {
      if (!body.password || !(await verifyPassword(body.password, existing.passwordHash))) {
        throw new ValidationError(`enter the password of the account ${invitation.email}`, [
          { path: 'password', message: 'wrong password for this account' },
        ]);
      }
      // Said only to someone who knows the password, as at sign-in.
      if (existing.deactivatedAt) {
        throw new ForbiddenError(
          'this account is deactivated; ask a site admin to reactivate it',
          'account-deactivated',
        );
      }
    } else if (!existing) {
      const details = [];
      if (!body.displayName) details.push({ path: 'displayName', message: 'enter a display name' });
      const pw = passwordResetSchema.safeParse({ password: body.password ?? '' });
      if (!pw.success) details.push({ path: 'password', message: pw.error.issues[0].message });
      if (details.length) {
        throw new ValidationError('choose a display name and a password for your account', details);
      }
      assertStrongPassword(body.password!, [invitation.email, body.displayName!], 'password');
      newPasswordHash = await hashPassword(body.password!);
    }

    const user = await em.transactional(async (tem) => {
      // The row lock makes the link single-use even when it is opened twice at once.
      const fresh = await tem.findOneOrFail(InvitationSchema, invitation.id, {
        lockMode: LockMode.PESSIMISTIC_WRITE,
      });
      const why = whyUnusable(fresh);
      if (why) throw new GoneError(why);
      fresh.acceptedAt = new Date();
      let account: User | null = existing
        ? await tem.findOneOrFail(UserSchema, existing.id)
        : await tem.findOne(UserSchema, { email: invitation.email });
      account ??= tem.create(UserSchema, {
        email: invitation.email,
        displayName: body.displayName!,
        passwordHash: newPasswordHash!,
        siteRole: 'user',
      });
      const member = account.id
        ? await membershipsOf(tem).findFor(account.id, invitation.workspace.id)
        : null;
      if (!member) {
        tem.create(MembershipSchema, {
          user: account,
          workspace: invitation.workspace.id,
          role: invitation.role,
        });
      }
      recordActivity(tem, {
        workspaceId: invitation.workspace.id,
        actor: account,
        kind: 'member-joined',
        summary: `joined as ${invitation.role}`,
      });
      return account;
    });
    const extra = { workspaceId: invitation.workspace.id, role: invitation.role };
    if (signedIn) {
      res.json({ user: toUserDto(signedIn), csrfToken: csrf.generateToken(req), ...extra });
      return;
    }
    await signIn(req, res, user, csrf, existing ? 200 : 201, extra);
  });

  return router;
}
