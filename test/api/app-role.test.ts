/**
 * Least privilege: after the role set-up, migrations run as the owner role and the server
 * runs as the application role, which can read and write rows but change no schema, touch
 * no migration record and is no superuser.
 */
import { randomBytes } from 'node:crypto';
import { MikroORM } from '@mikro-orm/postgresql';
import pg from 'pg';
import request from 'supertest';
import { createApp } from '../../server/app';
import { initServices, type Services } from '../../server/common/services';
import { ormOptions } from '../../server/mikro-orm.config';
import { grantAppRole, setUpRoles } from '../../scripts/db-roles';
import { testConfig, testDatabaseUrl } from './support/test-db';

const tag = randomBytes(4).toString('hex');
const dbName = `cw_roles_${tag}`;
// Roles are cluster-wide: names of this run only, dropped at the end.
const names = { owner: `cw_owner_${tag}`, app: `cw_app_${tag}` };
const passwords = { owner: `owner-${tag}-pw`, app: `app-${tag}-pw` };

const urlAs = (user: string | null, password: string | null, db = dbName) => {
  const url = new URL(testDatabaseUrl());
  url.pathname = `/${db}`;
  if (user) url.username = user;
  if (password) url.password = password;
  return url.toString();
};

async function asSuperuser(sql: string, db = 'postgres') {
  const client = new pg.Client({ connectionString: urlAs(null, null, db) });
  await client.connect();
  try {
    return await client.query(sql);
  } finally {
    await client.end();
  }
}

let app: pg.Client;
let services: Services | undefined;

beforeAll(async () => {
  await asSuperuser(`create database "${dbName}"`);
  // An older set-up made a table as the superuser: it is handed over to the owner.
  await asSuperuser('create table legacy_note (id int primary key)', dbName);
  await setUpRoles(urlAs(null, null), passwords, names);
  const orm = await MikroORM.init(ormOptions(urlAs(names.owner, passwords.owner)));
  try {
    expect((await orm.migrator.up()).length).toBeGreaterThan(0);
  } finally {
    await orm.close(true);
  }
  await grantAppRole(urlAs(names.owner, passwords.owner), names);
  app = new pg.Client({ connectionString: urlAs(names.app, passwords.app) });
  await app.connect();
}, 60_000);

afterAll(async () => {
  await app?.end();
  await services?.close();
  await asSuperuser(`drop database if exists "${dbName}" with (force)`);
  for (const role of [names.app, names.owner]) await asSuperuser(`drop role if exists "${role}"`);
});

/** The SQLSTATE a statement fails with as the application role ('' if it succeeds). */
async function stateOf(sql: string): Promise<string> {
  try {
    await app.query(sql);
    return '';
  } catch (err) {
    return (err as { code: string }).code;
  }
}

describe('application role', () => {
  it('should be no superuser and own nothing', async () => {
    const me = await app.query(
      `select rolsuper, rolcreatedb, rolcreaterole from pg_roles where rolname = current_user`,
    );
    expect(me.rows[0]).toEqual({ rolsuper: false, rolcreatedb: false, rolcreaterole: false });
    const owned = await app.query(
      `select count(*)::int as n from pg_class where pg_get_userbyid(relowner) = current_user`,
    );
    expect(owned.rows[0].n).toBe(0);
    const legacy = await asSuperuser(
      `select pg_get_userbyid(relowner) as owner from pg_class where relname = 'legacy_note'`,
      dbName,
    );
    expect(legacy.rows[0].owner).toBe(names.owner);
  });

  it('should be refused every schema change and the migration records (42501)', async () => {
    expect(await stateOf('create table intruder (id int)')).toBe('42501');
    expect(await stateOf('drop table chain')).toBe('42501');
    expect(await stateOf('alter table app_user add column x int')).toBe('42501');
    expect(await stateOf('truncate chain')).toBe('42501');
    expect(await stateOf('create schema intruder')).toBe('42501');
    expect(await stateOf('select * from mikro_orm_migrations')).toBe('42501');
    expect(await stateOf(`delete from mikro_orm_migrations`)).toBe('42501');
  });

  it('should run the server: register, create a chain, read it back', async () => {
    services = await initServices({
      ...testConfig('public'),
      databaseUrl: urlAs(names.app, passwords.app),
      dbSchema: undefined,
    });
    const agent = request.agent(createApp(services));
    const csrf = (await agent.get('/api/auth/csrf').expect(200)).body.token;
    const reg = await agent.post('/api/auth/register').set('x-csrf-token', csrf).send({
      email: 'least@privilege.test',
      displayName: 'Least Privilege',
      password: 'a-long-enough-password',
    });
    expect(reg.status).toBe(201);
    const token = reg.body.csrfToken;
    const ws = await agent
      .post('/api/workspaces')
      .set('x-csrf-token', token)
      .send({ name: 'Roles' });
    expect(ws.status).toBe(201);
    const created = await agent
      .post(`/api/workspaces/${ws.body.id}/chains`)
      .set('x-csrf-token', token)
      .send({ fromExample: 'test-tank' });
    expect(created.status).toBe(201);
    const read = await agent.get(`/api/chains/${created.body.id}`);
    expect(read.status).toBe(200);
    expect(read.body.document.name).toBe(created.body.document.name);
  });
});
