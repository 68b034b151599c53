import type { Transporter } from 'nodemailer';
import type { WorkspaceRole } from '../../shared/schema/api';
import type { User } from '../users/user.entity';
import type { Workspace } from '../workspaces/workspace.entity';

export const MAIL_FROM = 'Chainwright <no-reply@chainwright.localhost>';

/**
 * Tells a user they were added to a workspace. A mail failure is logged and does not undo
 * the membership: the member sees the workspace at their next sign-in anyway.
 */
export async function sendMemberAddedMail(
  mailer: Transporter,
  notice: { to: User; by: User; workspace: Workspace; role: WorkspaceRole },
): Promise<void> {
  try {
    await mailer.sendMail({
      from: MAIL_FROM,
      to: notice.to.email,
      subject: `You were added to "${notice.workspace.name}"`,
      text:
        `${notice.by.displayName} added you to the workspace "${notice.workspace.name}" ` +
        `as ${notice.role}.\nSign in to Chainwright to see its chains.\n`,
    });
  } catch (err) {
    console.error(`[server] mail to ${notice.to.email} failed:`, (err as Error).message);
  }
}
