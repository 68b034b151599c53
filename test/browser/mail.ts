/** Reading what the local mail catcher caught, for browser tests that follow mailed links. */
import path from 'node:path';
import { listCaught, readCaught } from '../../server/mail/mailbox';
import { BASE_URL } from './harness';

/** Where the server under test has its catcher write (scripts/test.sh sets CW_MAIL_DIR). */
export const MAIL_DIR = process.env.CW_MAIL_DIR ?? path.join(process.cwd(), '.data', 'mail-test');

/**
 * The first link in a caught message to `to` whose path starts with `prefix`, made to open
 * on the server under test (mailed links are absolute, from the server's public address).
 */
export async function mailedLink(to: string, prefix: string): Promise<string> {
  const deadline = Date.now() + 30_000;
  while (Date.now() < deadline) {
    for (const m of await listCaught(MAIL_DIR)) {
      if (!m.to.includes(to)) continue;
      const mail = await readCaught(MAIL_DIR, m.id);
      const link = new RegExp(`https?://[^\\s"]*${prefix}[A-Za-z0-9_-]+`).exec(mail?.text ?? '');
      if (link) return BASE_URL + new URL(link[0]).pathname;
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`no mail to ${to} with a ${prefix} link arrived in ${MAIL_DIR}`);
}
