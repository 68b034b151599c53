import path from 'node:path';
import { defineConfig, type Options } from '@mikro-orm/postgresql';
import { Migrator } from '@mikro-orm/migrations';
import { UserCacheSubscriber } from './auth/user-cache';
import { ENTITIES } from './common/entities';
import { REPO_ROOT } from './config';
import { loadDevEnv } from './dev-env';

/** Table of the session store (connect-pg-simple); created by a migration, not by entities. */
export const SESSION_TABLE = 'user_session';

const repoRoot = REPO_ROOT;

/**
 * ORM options for a database URL. Also the config file the MikroORM CLI loads
 * (`npm run db:migration:create`), which reads DATABASE_URL.
 */
export function ormOptions(
  clientUrl: string,
  overrides: Partial<Options> = {},
  { forCli = false }: { forCli?: boolean } = {},
): Options {
  return defineConfig({
    clientUrl,
    entities: ENTITIES,
    extensions: [Migrator],
    // Forgets the signed-in users kept in memory when a flush changes users or memberships.
    subscribers: [new UserCacheSubscriber()],
    // Entities are defined with defineEntity, so no metadata reflection is needed.
    discovery: { warnWhenNoEntities: true },
    migrations: {
      path: path.join(repoRoot, 'migrations'),
      pathTs: path.join(repoRoot, 'migrations'),
      glob: '!(*.d).{js,ts}',
      tableName: 'mikro_orm_migrations',
      snapshotName: '.snapshot-chainwright',
      transactional: true,
      emit: 'ts',
      // scripts/db.ts reports what it applied; the migrator's own log would repeat it.
      silent: true,
      // The committed snapshot is the generator's baseline. Applying migrations would
      // rewrite it from the live database (session table and all), so only the CLI, which
      // generates migrations, may write it.
      snapshot: forCli,
    },
    // The session store's table is created by our migration; without this the generator
    // would try to drop it on every diff.
    schemaGenerator: { skipTables: [SESSION_TABLE] },
    pool: { min: 0, max: 8 },
    debug: false,
    ...overrides,
  });
}

// The CLI (npm run db:migration:create) reads the URLs npm start left in .data/dev.env; it
// works on the schema, so as the owner role where there is one.
loadDevEnv();
export default ormOptions(
  process.env.CW_OWNER_DATABASE_URL ??
    process.env.DATABASE_URL ??
    'postgresql://postgres@127.0.0.1:54330/chainwright',
  {},
  { forCli: true },
);
