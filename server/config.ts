import { randomBytes } from 'node:crypto';
import path from 'node:path';
import type { LogOptions } from './common/logger';

/** Where fake mail goes: an SMTP server on loopback, or an in-memory JSON transport (tests). */
export type MailConfig = { kind: 'smtp'; host: string; port: number } | { kind: 'json' };

/** Everything the server reads from its environment, resolved once at start. */
export interface ServerConfig {
  databaseUrl: string;
  /** PostgreSQL schema for all tables (tests give each file its own); default `public`. */
  dbSchema?: string;
  host: string;
  port: number;
  sessionSecret: string;
  /** Whether the session cookie is sent over HTTPS only (set behind a TLS proxy). */
  cookieSecure: boolean;
  /** Reverse proxies in front of the server (0: none); sets Express's `trust proxy`. */
  trustProxyHops: number;
  /** The built Angular app (index.html and assets). */
  clientDir: string;
  /** Folder of `<key>.chain.json` example chains. */
  examplesDir: string;
  /** Largest accepted JSON body, in bytes. */
  bodyLimitBytes: number;
  /** Failed sign-in attempts allowed per client address and window. */
  signInLimit: { windowMs: number; limit: number };
  mail: MailConfig;
  /** Log level and destination (default: info and up, to standard output). */
  log?: LogOptions;
  /** Whether the session store prunes expired sessions on a timer (off in tests: jest must exit). */
  pruneSessions: boolean;
}

export const REPO_ROOT = path.resolve(__dirname, '..');

const intFrom = (value: string | undefined, fallback: number) => {
  const n = Number(value);
  return value && Number.isInteger(n) && n > 0 ? n : fallback;
};

/** Reads the configuration from environment variables (see DEVELOPERS.md for the list). */
export function configFromEnv(env: NodeJS.ProcessEnv = process.env): ServerConfig {
  if (!env.DATABASE_URL) {
    throw new Error('config: DATABASE_URL is not set; start the server through `npm start`');
  }
  return {
    databaseUrl: env.DATABASE_URL,
    dbSchema: env.CW_DB_SCHEMA || undefined,
    host: env.HOST || '127.0.0.1',
    port: intFrom(env.PORT, 4300),
    // A random secret signs out everyone at restart; scripts/start.sh keeps one in .data/.
    sessionSecret: env.CW_SESSION_SECRET || randomBytes(32).toString('hex'),
    cookieSecure: env.CW_COOKIE_SECURE === '1',
    trustProxyHops: intFrom(env.CW_TRUST_PROXY_HOPS, 0),
    clientDir: env.CW_CLIENT_DIR || path.join(REPO_ROOT, 'dist', 'client', 'browser'),
    examplesDir: env.CW_EXAMPLES_DIR || path.join(REPO_ROOT, 'examples'),
    bodyLimitBytes: intFrom(env.CW_BODY_LIMIT_BYTES, 1024 * 1024),
    signInLimit: {
      windowMs: intFrom(env.CW_SIGNIN_WINDOW_MS, 15 * 60 * 1000),
      limit: intFrom(env.CW_SIGNIN_LIMIT, 10),
    },
    mail: env.CW_SMTP_PORT
      ? { kind: 'smtp', host: '127.0.0.1', port: intFrom(env.CW_SMTP_PORT, 2530) }
      : { kind: 'json' },
    pruneSessions: true,
  };
}
