import { randomBytes } from 'node:crypto';
import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import pg from 'pg';
import type { Express } from 'express';
import { createApp } from '../../../server/app';
import { REPO_ROOT, type ServerConfig } from '../../../server/config';
import { initServices, type Services } from '../../../server/common/services';
import { SESSION_TABLE } from '../../../server/mikro-orm.config';

/**
 * The test database: CW_TEST_DATABASE_URL (set by scripts/test.sh), else the URL that
 * `npm run test:db` wrote to .data/test.env.
 */
export function testDatabaseUrl(): string {
  if (process.env.CW_TEST_DATABASE_URL) return process.env.CW_TEST_DATABASE_URL;
  const file = path.join(REPO_ROOT, '.data', 'test.env');
  if (existsSync(file)) {
    const match = /^CW_TEST_DATABASE_URL=(.+)$/m.exec(readFileSync(file, 'utf8'));
    if (match) return match[1].trim();
  }
  throw new Error('API tests need PostgreSQL: run `npm run test:db` first (or `npm test`)');
}

export const FIXTURES = path.join(REPO_ROOT, 'test', 'api', 'fixtures');

/** Configuration for an app under test; each test file gets its own schema. */
export function testConfig(schema: string, overrides: Partial<ServerConfig> = {}): ServerConfig {
  return {
    databaseUrl: testDatabaseUrl(),
    dbSchema: schema,
    host: '127.0.0.1',
    port: 0,
    sessionSecret: randomBytes(16).toString('hex'),
    cookieSecure: false,
    trustProxyHops: 0,
    clientDir: path.join(FIXTURES, 'client'),
    examplesDir: path.join(FIXTURES, 'examples'),
    bodyLimitBytes: 1024 * 1024,
    signInLimit: { windowMs: 60_000, limit: 50 },
    mail: { kind: 'json' },
    pruneSessions: false,
    // Warnings and errors reach the console, where fail-on-console.ts catches them.
    log: { level: 'warn', destination: { write: (line: string) => console.error(line.trim()) } },
    ...overrides,
  };
}

/** An app on a fresh schema of the test database, and how to tear it down. */
export interface TestContext {
  services: Services;
  app: Express;
  schema: string;
  /** Drops the schema and closes every pool (call in afterAll). */
  close(): Promise<void>;
}

/**
 * Creates a schema of its own (so jest workers never collide), builds the tables from the
 * entities plus the session table, and an app on it.
 */
export async function createTestContext(
  overrides: Partial<ServerConfig> = {},
): Promise<TestContext> {
  const schema = `t_${process.env.JEST_WORKER_ID ?? '0'}_${randomBytes(4).toString('hex')}`;
  const admin = new pg.Client({ connectionString: testDatabaseUrl() });
  await admin.connect();
  try {
    await admin.query(`create schema "${schema}"`);
    await admin.query(
      `create table "${schema}"."${SESSION_TABLE}" ("sid" varchar not null primary key, "sess" json not null, "expire" timestamp(6) not null)`,
    );
  } finally {
    await admin.end();
  }
  const services = await initServices(testConfig(schema, overrides));
  await services.orm.schema.createSchema({ schema });
  const app = createApp(services);
  return {
    services,
    app,
    schema,
    async close() {
      await services.close();
      const c = new pg.Client({ connectionString: testDatabaseUrl() });
      await c.connect();
      await c.query(`drop schema if exists "${schema}" cascade`);
      // The study queue's own schema (pg-boss), made when a test starts a study.
      await c.query(`drop schema if exists "${schema}_boss" cascade`);
      await c.end();
    },
  };
}
