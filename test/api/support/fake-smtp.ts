import { mkdtemp, rm } from 'node:fs/promises';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { startFakeSmtp } from '../../../server/mail/fake-smtp';
import { listCaught, readCaught } from '../../../server/mail/mailbox';
import type { ParsedMail } from '../../../server/mail/eml';

/** The local mail catcher on a free loopback port, writing to a temporary folder. */
export async function startCatcher() {
  const dir = await mkdtemp(path.join(os.tmpdir(), 'cw-mail-'));
  const server = await startFakeSmtp(0, dir);
  const port = (server.server.address() as AddressInfo).port;
  return {
    dir,
    mailConfig: { kind: 'smtp' as const, host: '127.0.0.1', port, dir },
    /** Waits until a message to `to` with `subject` in its subject was caught. */
    async waitFor(to: string, subject: string, timeoutMs = 20_000): Promise<ParsedMail> {
      const deadline = Date.now() + timeoutMs;
      for (;;) {
        const hit = (await listCaught(dir)).find(
          (m) => m.to.includes(to) && m.subject.includes(subject),
        );
        if (hit) return (await readCaught(dir, hit.id))!;
        if (Date.now() > deadline) throw new Error(`the catcher got no mail to ${to}: ${subject}`);
        await new Promise((r) => setTimeout(r, 50));
      }
    },
    async stop() {
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await rm(dir, { recursive: true, force: true });
    },
  };
}
