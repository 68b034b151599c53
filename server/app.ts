import { existsSync } from 'node:fs';
import path from 'node:path';
import compression from 'compression';
import express, { type Express, type Request, type Response } from 'express';
import helmet from 'helmet';
import { RequestContext } from '@mikro-orm/core';
import { chainExportRouter, exportRouter } from './analysis/export-routes';
import { analysisRouter, chainAnalysisRouter } from './analysis/routes';
import { designRouter } from './design/routes';
import { authRouter } from './auth/routes';
import {
  createCsrf,
  createPassport,
  rollSession,
  sessionMiddleware,
  signInLimiter,
} from './auth/session';
import { chainsRouter, examplesRouter, workspaceChainsRouter } from './chains/routes';
import { dataFilesRouter } from './files/routes';
import { partsRouter } from './parts/routes';
import { chainStudiesRouter } from './studies/routes';
import { studyLimitsFromEnv } from './studies/limits';
import { apiNotFound, createErrorHandler } from './common/error-handler';
import { databaseProbe, healthHandler } from './common/health';
import { jsonBody } from './common/json-body';
import { requestLogger } from './common/logger';
import { rejectNulCharacters } from './common/reject-nul';
import type { Services } from './common/services';
import { adminRouter } from './users/admin-routes';
import { meRouter } from './users/me-routes';
import { usesMailCatcher } from './config';
import { workspacesRouter } from './workspaces/routes';
import { invitationsRouter, workspaceInvitationsRouter } from './workspaces/invitation-routes';
import { activityRouter } from './activity/routes';
import { revisionDiffRouter } from './activity/revision-diff';
import { commentsRouter } from './comments/routes';
import { mailAdminRouter } from './mail/admin-routes';
import { presenceRouter } from './presence/routes';
import { chainSharingRouter, sharedRouter } from './sharing/routes';

/**
 * Builds the Express app (API under /api, the built client for everything else) without
 * listening; server/main.ts listens, tests drive it with supertest.
 */
export function createApp(services: Services): Express {
  const { config, em, orm } = services;
  const app = express();
  // No ETag on sent bodies: API answers are no-store, so a validator is never used, and
  // hashing every answer (an analysis is hundreds of kilobytes) costs the event loop.
  // Static files keep theirs (express.static sets its own).
  app.set('etag', false);
  app.use(requestLogger(services.logger));
  // Behind a proxy, client addresses (for the sign-in limit) and HTTPS come from its headers.
  // Only the proxies configured are trusted (addresses, else a hop count); none by default.
  if (config.trustProxyAddresses) app.set('trust proxy', config.trustProxyAddresses);
  else if (config.trustProxyHops > 0) app.set('trust proxy', config.trustProxyHops);

  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          // Angular writes component styles into <style> elements at run time and plotly
          // sets inline style attributes on its SVG, so inline styles must be allowed;
          // inline scripts stay forbidden.
          styleSrc: ["'self'", "'unsafe-inline'"],
          // data: and blob: for plot images (PNG export) and Material's inline SVG icons.
          imgSrc: ["'self'", 'data:', 'blob:'],
          fontSrc: ["'self'"],
          connectSrc: ["'self'"],
          workerSrc: ["'self'", 'blob:'],
          objectSrc: ["'none'"],
          baseUri: ["'self'"],
          formAction: ["'self'"],
          frameAncestors: ["'none'"],
        },
      },
      // Served over plain http on loopback in development: no HSTS there.
      strictTransportSecurity: config.cookieSecure,
    }),
  );
  // Every answer compressed when the client accepts it (an analysis with its sweep to under
  // half, the client's scripts to about a quarter); not event streams, which must not wait
  // in a compressor's buffer. The analyses' answers come compressed from their thread
  // (analysis/answer-encoding.ts), so those requests skip the middleware altogether.
  const compress = compression({ filter: compressible });
  app.use((req, res, next) => (answersEncoded(req) ? next() : compress(req, res, next)));
  app.use(jsonBody(config.bodyLimitBytes), rejectNulCharacters);
  // One entity manager per request, so identity maps never leak between requests.
  app.use((_req, _res, next) => RequestContext.create(orm.em, next));

  // API answers are per user and per moment: no cache (the browser's or a proxy's) keeps one.
  app.use('/api', noStore);
  // Health answers before the session store, which needs the database it is checking.
  app.get('/api/health', healthHandler(orm));

  const passport = createPassport(em);
  const csrf = createCsrf(config.sessionSecret, config.cookieSecure);
  app.use(
    '/api',
    sessionMiddleware(services),
    rollSession,
    passport.session(),
    csrf.csrfSynchronisedProtection,
  );

  // One limit for every place a password is tried: sign-in, its change, an invitation's accept.
  const passwordLimiter = signInLimiter(services);
  app.use('/api/auth', authRouter({ services, passport, csrf, signInLimiter: passwordLimiter }));
  app.use('/api/me', meRouter(em, usesMailCatcher(config)));
  app.use('/api/admin', adminRouter(em, config.dbSchema));
  app.use('/api/workspaces', workspacesRouter(em));
  app.use('/api/admin', mailAdminRouter(services));
  app.use('/api/workspaces', workspaceInvitationsRouter(services));
  app.use('/api/workspaces', activityRouter(em));
  app.use('/api/invitations', invitationsRouter(services, csrf, passwordLimiter));
  app.use('/api/shared', sharedRouter(services));
  app.use('/api/workspaces', workspaceChainsRouter(em, config.examplesDir));
  app.use('/api/workspaces', dataFilesRouter(em));
  app.use('/api/workspaces', partsRouter(em));
  app.use('/api/chains', chainsRouter(em));
  app.use('/api/chains', chainAnalysisRouter(em));
  app.use('/api/chains', chainExportRouter(em));
  app.use('/api/chains', chainStudiesRouter(em, services.studyQueue, studyLimitsFromEnv()));
  app.use('/api/chains', chainSharingRouter(services));
  app.use('/api/chains', commentsRouter(services));
  app.use('/api/chains', revisionDiffRouter(em));
  app.use('/api/chains', presenceRouter(services));
  app.use('/api/examples', examplesRouter(config.examplesDir));
  app.use('/api/design', designRouter(em));
  app.use('/api', analysisRouter(em));
  app.use('/api', exportRouter(em));
  app.use('/api', apiNotFound);

  serveClient(app, config.clientDir);
  app.use(createErrorHandler(databaseProbe(services.orm)));
  return app;
}

function compressible(req: Request, res: Response): boolean {
  const type = String(res.getHeader('Content-Type') ?? '');
  return !type.startsWith('text/event-stream') && compression.filter(req, res);
}

/** The analysis routes, whose answers are encoded on the analysis thread. */
const ENCODED_ON_THREAD = /^\/api\/(analysis|chains\/[^/]+\/analysis)\/?$/;

function answersEncoded(req: Request): boolean {
  return (req.method === 'POST' || req.method === 'GET') && ENCODED_ON_THREAD.test(req.path);
}

function noStore(_req: Request, res: Response, next: () => void): void {
  res.setHeader('Cache-Control', 'no-store');
  next();
}

/** The built Angular app, with every other GET answered by index.html (client-side routes). */
function serveClient(app: Express, clientDir: string): void {
  const index = path.join(clientDir, 'index.html');
  app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
  app.get('/{*splat}', (_req, res) => {
    if (existsSync(index)) {
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(index);
    } else {
      res
        .status(503)
        .type('text/plain')
        .send('The client is not built yet: `npm start` builds it (npx ng build).\n');
    }
  });
}
