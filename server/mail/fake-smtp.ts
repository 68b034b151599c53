import { promises as fs } from 'node:fs';
import path from 'node:path';
import { SMTPServer } from 'smtp-server';

/**
 * A development-only SMTP server on loopback that accepts every message and writes it to
 * `<dir>/<time>-<n>.eml`, so a developer can read what the app would have sent.
 */
export async function startFakeSmtp(port: number, dir: string): Promise<SMTPServer> {
  await fs.mkdir(dir, { recursive: true });
  let counter = 0;
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['AUTH', 'STARTTLS'],
    banner: 'Chainwright development mail catcher',
    logger: false,
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => {
        counter += 1;
        const name = `${new Date().toISOString().replace(/[:.]/g, '-')}-${counter}.eml`;
        fs.writeFile(path.join(dir, name), Buffer.concat(chunks)).then(
          () => callback(),
          (err: Error) => callback(err),
        );
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => resolve());
  });
  return server;
}
