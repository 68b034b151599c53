/**
 * npm run db:backup / db:restore: a backup of one database restored into a fresh one holds
 * the same accounts, chains and revision history, and the restored database is migrated and
 * usable.
 */
import { spawnSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { MikroORM } from '@mikro-orm/postgresql';
import pg from 'pg';
import { chainDocumentSchema } from '../../shared/schema/chain';
import { createChain, saveChainVersion } from '../../server/chains/chain-store';
import { ChainSchema } from '../../server/chains/chain.entity';
import { ChainRevisionSchema } from '../../server/chains/revision.entity';
import { REPO_ROOT } from '../../server/config';
import { ormOptions } from '../../server/mikro-orm.config';
import { UserSchema } from '../../server/users/user.entity';
import { createUser, createWorkspace } from './support/agents';
import { fixtureChain } from './support/chain-fixture';
import { testDatabaseUrl } from './support/test-db';

jest.setTimeout(120_000);

const tag = randomBytes(4).toString('hex');
const source = `cw_backup_src_${tag}`;
const target = `cw_backup_dst_${tag}`;
const dir = mkdtempSync(path.join(tmpdir(), 'cw-backup-'));
const dumpFile = path.join(dir, 'nightly.dump');

const urlOf = (db: string) => {
  const url = new URL(testDatabaseUrl());
  url.pathname = `/${db}`;
  return url.toString();
};

async function admin(sql: string) {
  const client = new pg.Client({ connectionString: testDatabaseUrl() });
  await client.connect();
  try {
    await client.query(sql);
  } finally {
    await client.end();
  }
}

/** Runs one of the npm scripts' shell files against `db`, as the owner would. */
function runScript(script: string, db: string, ...args: string[]) {
  const run = spawnSync('bash', [path.join(REPO_ROOT, 'scripts', script), ...args], {
    env: { ...process.env, CW_OWNER_DATABASE_URL: urlOf(db), DATABASE_URL: urlOf(db) },
    encoding: 'utf8',
    timeout: 100_000,
  });
  if (run.status !== 0) throw new Error(`${script} failed (${run.status}):\n${run.stderr}`);
  return run;
}

beforeAll(async () => {
  await admin(`create database "${source}"`);
  await admin(`create database "${target}"`);
});
afterAll(async () => {
  await admin(`drop database if exists "${source}" with (force)`);
  await admin(`drop database if exists "${target}" with (force)`);
  rmSync(dir, { recursive: true, force: true });
});

describe('backup and restore', () => {
  it('should restore a backup into a fresh database with every chain and revision', async () => {
    const orm = await MikroORM.init(ormOptions(urlOf(source)));
    let expected: { id: string; name: string; version: number; document: unknown }[];
    try {
      await orm.migrator.up();
      const em = orm.em.fork();
      const author = await createUser(em, 'keeper@backup.test');
      const ws = await createWorkspace(em, 'Archive bench', [[author, 'owner']]);
      const first = await createChain(em, {
        workspace: ws,
        document: chainDocumentSchema.parse(fixtureChain({ name: 'Night receiver' })),
        user: author,
        message: 'first',
      });
      await saveChainVersion(em, first, {
        expectedVersion: 1,
        document: chainDocumentSchema.parse(
          fixtureChain({ name: 'Night receiver', description: 'retuned' }),
        ),
        user: author,
        message: 'second',
      });
      await createChain(em, {
        workspace: ws,
        document: chainDocumentSchema.parse(fixtureChain({ name: 'Day receiver' })),
        user: author,
        message: 'first',
      });
      const chains = await orm.em.fork().find(ChainSchema, {}, { orderBy: { name: 'asc' } });
      expected = chains.map((c) => ({
        id: c.id,
        name: c.name,
        version: c.version,
        document: c.document,
      }));
    } finally {
      await orm.close(true);
    }

    const backup = runScript('db-backup.sh', source, dumpFile);
    expect(backup.stdout).toContain('npm run db:restore');
    expect(statSync(dumpFile).size).toBeGreaterThan(1000);
    runScript('db-restore.sh', target, dumpFile);

    const restored = await MikroORM.init(ormOptions(urlOf(target)));
    try {
      const em = restored.em.fork();
      const chains = await em.find(ChainSchema, {}, { orderBy: { name: 'asc' } });
      expect(
        chains.map((c) => ({ id: c.id, name: c.name, version: c.version, document: c.document })),
      ).toEqual(expected);
      expect(expected.map((c) => c.name)).toEqual(['Day receiver', 'Night receiver']);
      const night = chains.find((c) => c.name === 'Night receiver')!;
      const history = await em.find(
        ChainRevisionSchema,
        { chain: night.id },
        { orderBy: { version: 'asc' } },
      );
      expect(history.map((r) => r.message)).toEqual(['first', 'second']);
      expect(await em.count(UserSchema, { email: 'keeper@backup.test' })).toBe(1);
      // Nothing left for the migrations to do: the restored schema is current.
      expect(await restored.migrator.getPendingMigrations()).toEqual([]);
    } finally {
      await restored.close(true);
    }
  });

  it('should refuse to restore without a file, saying how to name one', () => {
    const run = spawnSync('bash', [path.join(REPO_ROOT, 'scripts', 'db-restore.sh')], {
      env: { ...process.env, CW_OWNER_DATABASE_URL: urlOf(target) },
      encoding: 'utf8',
    });
    expect(run.status).toBe(1);
    expect(run.stderr).toContain('name the backup to restore');
  });
});
