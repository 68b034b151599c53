import type { Server } from 'node:http';
import path from 'node:path';
import type { SMTPServer } from 'smtp-server';
import { startAnalysisPool, stopAnalysisPool } from './analysis/analysis-pool';
import { createApp } from './app';
import { ConfigError, configFromEnv, REPO_ROOT } from './config';
import { loadDevEnv } from './dev-env';
import { listenHttp } from './common/http-server';
import { flushLogs } from './common/logger';
import { initServices } from './common/services';
import { startFakeSmtp } from './mail/fake-smtp';

/** Starts the fake mail catcher (when CW_SMTP_PORT is set), the ORM and the HTTP server. */
async function main(): Promise<void> {
  loadDevEnv();
  const config = configFromEnv();
  let smtp: SMTPServer | undefined;
  // The mail catcher is a demo-mode helper; production sends to the relay it is given.
  if (config.mail.kind === 'smtp' && config.mode !== 'production') {
    const mailDir = config.mail.dir ?? path.join(REPO_ROOT, '.data', 'mail');
    smtp = await startFakeSmtp(config.mail.port, mailDir);
    console.log(
      `[server] mail is caught on 127.0.0.1:${config.mail.port} and written to ${mailDir}`,
    );
  }
  const services = await initServices(config);
  // Analysis threads start now, not on the first request.
  startAnalysisPool();
  const app = createApp(services);
  // Mail that could not be sent is retried from the outbox table while the server runs.
  const retryMail = setInterval(() => {
    services.mail
      .retryDue(services.em)
      .catch((err: Error) => console.error('[server] mail retry failed:', err.message));
  }, 60_000);
  retryMail.unref();
  const server: Server = await listenHttp(app, config.port, config.host);
  console.log(
    `[server] Chainwright is listening on http://${config.host}:${config.port} in ${config.mode} mode`,
  );

  let stopping = false;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    clearInterval(retryMail);
    console.log(`[server] ${signal}: stopping`);
    // Keep-alive connections would hold close() open; a browser tab should not block Ctrl-C.
    server.closeAllConnections();
    await new Promise<void>((resolve) => server.close(() => resolve()));
    if (smtp) await new Promise<void>((resolve) => smtp.close(() => resolve()));
    await stopAnalysisPool();
    await services.close();
    flushLogs();
    process.exit(0);
  };
  process.on('SIGINT', () => void stop('SIGINT'));
  process.on('SIGTERM', () => void stop('SIGTERM'));
}

main().catch((err: unknown) => {
  console.error('[server] failed to start:', err instanceof ConfigError ? err.message : err);
  process.exit(1);
});
