import type { WorkspaceRole } from '../../shared/schema/api';
import { layoutMail, type Mail } from './layout';

/** The wording of every message the app sends. Links are absolute (see config publicBaseUrl). */
export const messages = {
  invitation(to: string, p: { by: string; workspace: string; role: WorkspaceRole; url: string }) {
    return layoutMail(to, {
      subject: `${p.by} invites you to "${p.workspace}" on Chainwright`,
      paragraphs: [
        `${p.by} invites you to join the workspace "${p.workspace}" as ${roleWords(p.role)}.`,
        'Open the link to accept. If you have no account yet, you choose a name and a password there.',
      ],
      action: { label: 'Accept the invitation', url: p.url },
      footnote:
        'The link works once and for 7 days. If you did not expect this, ignore this message.',
    });
  },

  passwordReset(to: string, p: { url: string }) {
    return layoutMail(to, {
      subject: 'Choose a new Chainwright password',
      paragraphs: [
        'Someone asked to reset the password of the Chainwright account with this address.',
        'Open the link to choose a new password. Every other sign-in of the account ends.',
      ],
      action: { label: 'Choose a new password', url: p.url },
      footnote: 'The link works once and for 1 hour. If you did not ask, ignore this message.',
    });
  },

  confirmAddress(to: string, p: { name: string; url: string }) {
    return layoutMail(to, {
      subject: 'Confirm your address for Chainwright',
      paragraphs: [
        `Hello ${p.name},`,
        'open the link to confirm this address and finish creating your Chainwright account.',
      ],
      action: { label: 'Confirm my address', url: p.url },
      footnote: 'The link works once and for 24 hours. If you did not sign up, ignore this.',
    });
  },

  alreadyRegistered(to: string, p: { signInUrl: string; resetUrl: string }) {
    return layoutMail(to, {
      subject: 'You already have a Chainwright account',
      paragraphs: [
        'Someone tried to create a Chainwright account with this address, which has one already.',
        `Sign in at ${p.signInUrl}, or choose a new password at ${p.resetUrl} if you forgot it.`,
      ],
    });
  },

  chainLink(to: string, p: { by: string; chain: string; note: string; url: string }) {
    return layoutMail(to, {
      subject: `${p.by} sent you the chain "${p.chain}"`,
      paragraphs: [`${p.by} wants you to look at the chain "${p.chain}".`],
      ...(p.note ? { quote: p.note } : {}),
      action: { label: 'Open the chain', url: p.url },
    });
  },

  mention(to: string, p: { by: string; chain: string; where: string; body: string; url: string }) {
    return layoutMail(to, {
      subject: `${p.by} mentioned you on "${p.chain}"`,
      paragraphs: [`${p.by} mentioned you in a comment on ${p.where} of "${p.chain}".`],
      quote: p.body,
      action: { label: 'Read the comment', url: p.url },
    });
  },
} satisfies Record<string, (to: string, p: never) => Mail>;

function roleWords(role: WorkspaceRole): string {
  if (role === 'owner') return 'an owner (who manages members)';
  if (role === 'editor') return 'an editor (who changes chains)';
  return 'a viewer (who reads and comments)';
}
