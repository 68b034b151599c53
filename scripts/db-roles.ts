/**
 * Least privilege for the product's database: an owner role that owns the database and its
 * schema (migrations run as it) and an application role the server connects as, which may
 * only read and write rows. Run as a superuser; every step can run again safely.
 */
import pg from 'pg';

export interface RoleNames {
  owner: string;
  app: string;
}

/** Role names from CW_DB_OWNER_ROLE / CW_DB_APP_ROLE, else chainwright_owner / chainwright_app. */
export function roleNames(env: NodeJS.ProcessEnv = process.env): RoleNames {
  return {
    owner: env.CW_DB_OWNER_ROLE || 'chainwright_owner',
    app: env.CW_DB_APP_ROLE || 'chainwright_app',
  };
}

const ident = (name: string) => `"${name.replace(/"/g, '""')}"`;
const literal = (text: string) => `'${text.replace(/'/g, "''")}'`;

async function withClient<T>(url: string, run: (c: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    return await run(client);
  } finally {
    await client.end();
  }
}

/** Creates the role, or sets its password; never a superuser, never creates roles or databases. */
async function ensureRole(c: pg.Client, name: string, password: string): Promise<void> {
  const exists = await c.query('select 1 from pg_roles where rolname = $1', [name]);
  const verb = exists.rowCount ? 'alter' : 'create';
  await c.query(
    `${verb} role ${ident(name)} login nosuperuser nocreatedb nocreaterole noinherit ` +
      `password ${literal(password)}`,
  );
}

/**
 * Sets up both roles for the database `superuserUrl` points at: the owner owns the database,
 * the `public` schema and every table and sequence in it (tables an older set-up made as the
 * superuser are handed over); the application role may connect, use the schema and
 * select/insert/update/delete rows of the owner's tables, now and in future migrations.
 */
export async function setUpRoles(
  superuserUrl: string,
  passwords: { owner: string; app: string },
  names: RoleNames = roleNames(),
): Promise<void> {
  const db = decodeURIComponent(new URL(superuserUrl).pathname.slice(1));
  const owner = ident(names.owner);
  const app = ident(names.app);
  await withClient(superuserUrl, async (c) => {
    await ensureRole(c, names.owner, passwords.owner);
    await ensureRole(c, names.app, passwords.app);
    await c.query(`alter database ${ident(db)} owner to ${owner}`);
    await c.query(`revoke all on database ${ident(db)} from public`);
    await c.query(`grant connect on database ${ident(db)} to ${app}`);
    await c.query(`alter schema public owner to ${owner}`);
    await c.query(`revoke all on schema public from public`);
    await c.query(`grant usage on schema public to ${app}`);
    const objects = await c.query<{ kind: string; name: string }>(
      `select case c.relkind when 'S' then 'sequence' else 'table' end as kind,
              format('%I.%I', n.nspname, c.relname) as name
         from pg_class c join pg_namespace n on n.oid = c.relnamespace
        where n.nspname = 'public' and c.relkind in ('r', 'p', 'S')
          and pg_get_userbyid(c.relowner) <> $1`,
      [names.owner],
    );
    for (const o of objects.rows) await c.query(`alter ${o.kind} ${o.name} owner to ${owner}`);
    await c.query(
      `alter default privileges for role ${owner} in schema public ` +
        `grant select, insert, update, delete on tables to ${app}`,
    );
    await c.query(
      `alter default privileges for role ${owner} in schema public ` +
        `grant usage, select on sequences to ${app}`,
    );
  });
  await grantAppRole(superuserUrl, names);
}

/**
 * Grants the application role row access to every table and sequence in the schemas the
 * owner owns, except the migrations table, which only the owner touches. Run after each
 * migration (the owner may run it; so may a superuser).
 */
export async function grantAppRole(url: string, names: RoleNames = roleNames()): Promise<void> {
  await withClient(url, async (c) => {
    const appExists = await c.query('select 1 from pg_roles where rolname = $1', [names.app]);
    if (!appExists.rowCount) return;
    const app = ident(names.app);
    const schemas = await c.query<{ nspname: string }>(
      `select nspname from pg_namespace where pg_get_userbyid(nspowner) = $1`,
      [names.owner],
    );
    for (const { nspname } of schemas.rows) {
      const schema = ident(nspname);
      await c.query(`grant usage on schema ${schema} to ${app}`);
      await c.query(
        `grant select, insert, update, delete on all tables in schema ${schema} to ${app}`,
      );
      await c.query(`grant usage, select on all sequences in schema ${schema} to ${app}`);
    }
    const migrations = await c.query(`select to_regclass('public.mikro_orm_migrations') as t`);
    if (migrations.rows[0].t)
      await c.query(`revoke all on public.mikro_orm_migrations from ${app}`);
  });
}
