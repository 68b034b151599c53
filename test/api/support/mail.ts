import { OutboxMessageSchema } from '../../../server/mail/outbox.entity';
import type { TestContext } from './test-db';

/** A message as the tests read it: what the transport was handed. */
export interface SentMail {
  to: string;
  subject: string;
  text: string;
  html: string;
}

/**
 * Records every message handed to the transport of `ctx` (tests run with nodemailer's JSON
 * transport unless they start the fake SMTP server themselves).
 */
export function recordMail(ctx: TestContext): SentMail[] {
  const sent: SentMail[] = [];
  const original = ctx.services.mailer.sendMail.bind(ctx.services.mailer);
  jest.spyOn(ctx.services.mailer, 'sendMail').mockImplementation(async (mail) => {
    sent.push({
      to: String(mail.to),
      subject: String(mail.subject),
      text: String(mail.text),
      html: String(mail.html),
    });
    return original(mail);
  });
  (ctx as TestContext & { sent?: SentMail[] }).sent = sent;
  return sent;
}

/**
 * Waits for a message to `to` whose subject contains `subject`. Some mail goes out after
 * the answer (so its timing says nothing), hence the wait; the outbox row shows it went.
 */
export async function waitForMail(
  ctx: TestContext,
  to: string,
  subject: string,
  timeoutMs = 20_000,
): Promise<SentMail> {
  const sent = (ctx as TestContext & { sent?: SentMail[] }).sent ?? recordMail(ctx);
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = sent.find((m) => m.to === to && m.subject.includes(subject));
    if (found) {
      const row = await ctx.services.orm.em
        .fork()
        .findOne(OutboxMessageSchema, { recipient: to, subject: found.subject, state: 'sent' });
      if (row) return found;
    }
    if (Date.now() > deadline) {
      throw new Error(`no mail to ${to} about "${subject}"; sent: ${sent.map((m) => m.subject)}`);
    }
    await new Promise((r) => setTimeout(r, 50));
  }
}

/** The token at the end of the first link in `text` that contains `marker`. */
export function linkFrom(text: string, marker: string): string {
  const m = new RegExp(`https?://\\S*${marker.replace(/\//g, '\\/')}([A-Za-z0-9_-]+)`).exec(text);
  if (!m) throw new Error(`no link with ${marker} in:\n${text}`);
  return m[1];
}
