/** The committed migrations build exactly the schema the entities describe. */
import { randomBytes } from 'node:crypto';
import { MikroORM } from '@mikro-orm/postgresql';
import pg from 'pg';
import { ormOptions } from '../../server/mikro-orm.config';
import { testDatabaseUrl } from './support/test-db';

const dbName = `cw_migrations_${randomBytes(4).toString('hex')}`;
const urlFor = (name: string) => {
  const url = new URL(testDatabaseUrl());
  url.pathname = `/${name}`;
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

beforeAll(() => admin(`create database "${dbName}"`));
afterAll(() => admin(`drop database if exists "${dbName}" with (force)`));

describe('migrations', () => {
  it('should apply to an empty database and leave nothing for the entities to change', async () => {
    const orm = await MikroORM.init(ormOptions(urlFor(dbName)));
    try {
      const applied = await orm.migrator.up();
      expect(applied.length).toBeGreaterThan(0);
      expect(await orm.migrator.getPendingMigrations()).toEqual([]);
      const diff = await orm.schema.getUpdateSchemaSQL({ wrap: false });
      expect(diff.trim()).toBe('');
      // The session store's table comes from the migration too.
      const tables = await orm.em
        .getConnection()
        .execute(`select tablename from pg_tables where schemaname = 'public'`);
      expect(tables.map((t) => t.tablename)).toContain('user_session');
    } finally {
      await orm.close(true);
    }
  });
});
