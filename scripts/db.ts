/**
 * Database tasks: `node --import tsx scripts/db.ts [roles] [migrate] [seed]`, in that order.
 * - roles: (as a superuser, CW_SUPERUSER_DATABASE_URL) creates the owner and application
 *   roles with the passwords in CW_DB_OWNER_PASSWORD / CW_DB_APP_PASSWORD, see db-roles.ts.
 * - migrate: applies pending migrations from migrations/ as the owner (CW_OWNER_DATABASE_URL,
 *   else DATABASE_URL), installs the study queue (pg-boss's schema), then grants the
 *   application role row access to any new table.
 * - seed: loads the demo accounts, workspace and example chains (idempotent). Refused in
 *   production mode (NODE_ENV=production or CW_MODE=production).
 * scripts/start.sh and test.sh set the variables; without them the URLs `npm start` left in
 * .data/dev.env are used.
 */
import path from 'node:path';
import { MikroORM } from '@mikro-orm/postgresql';
import { serverMode } from '../server/config';
import { ormOptions } from '../server/mikro-orm.config';
import { loadDevEnv } from '../server/dev-env';
import { seedDemo } from '../server/seed/seed-demo';
import { installStudyQueue } from '../server/studies/queue';
import { grantAppRole, setUpRoles } from './db-roles';

const TASKS = ['roles', 'migrate', 'seed'];

function required(name: string): string {
  const value = process.env[name];
  if (!value) throw new Error(`db: ${name} is not set (npm start and npm test set it)`);
  return value;
}

async function run(tasks: string[]): Promise<void> {
  loadDevEnv();
  const unknown = tasks.filter((t) => !TASKS.includes(t));
  if (unknown.length || !tasks.length)
    throw new Error(`db: tasks are ${TASKS.join(', ')}; got ${tasks.join(' ') || 'none'}`);
  if (tasks.includes('seed') && serverMode() === 'production') {
    throw new Error('db: production mode loads no demo data; leave out "seed"');
  }
  if (tasks.includes('roles')) {
    await setUpRoles(required('CW_SUPERUSER_DATABASE_URL'), {
      owner: required('CW_DB_OWNER_PASSWORD'),
      app: required('CW_DB_APP_PASSWORD'),
    });
    console.log('[db] roles: owner and application roles are set up');
  }
  if (!tasks.includes('migrate') && !tasks.includes('seed')) return;
  const url = process.env.CW_OWNER_DATABASE_URL || required('DATABASE_URL');
  const orm = await MikroORM.init(ormOptions(url));
  try {
    if (tasks.includes('migrate')) {
      const applied = await orm.migrator.up();
      console.log(
        `[db] migrations: ${applied.length ? applied.map((m) => m.name).join(', ') : 'up to date'}`,
      );
      await installStudyQueue(url);
      await grantAppRole(url);
    }
    if (tasks.includes('seed')) {
      const examplesDir = process.env.CW_EXAMPLES_DIR || path.resolve(__dirname, '..', 'examples');
      const report = await seedDemo(orm.em.fork(), examplesDir);
      console.log(
        `[db] demo data: ${report.usersCreated} users, ${report.workspacesCreated} workspaces, ` +
          `${report.membershipsCreated} memberships, ${report.chainsCreated} chains added`,
      );
    }
  } finally {
    await orm.close(true);
  }
}

run(process.argv.slice(2)).catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
