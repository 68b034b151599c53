/**
 * Database tasks: `node --import tsx scripts/db.ts migrate [seed]`.
 * - migrate: applies pending migrations from migrations/.
 * - seed: loads the demo accounts, workspace and example chains (idempotent).
 * Reads DATABASE_URL (and CW_EXAMPLES_DIR); scripts/start.sh and test.sh set them, and
 * without them the URL `npm start` left in .data/dev.env is used.
 */
import path from 'node:path';
import { MikroORM } from '@mikro-orm/postgresql';
import { ormOptions } from '../server/mikro-orm.config';
import { loadDevEnv } from '../server/dev-env';
import { seedDemo } from '../server/seed/seed-demo';

async function run(tasks: string[]): Promise<void> {
  loadDevEnv();
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('db: DATABASE_URL is not set (npm start and npm test set it)');
  const unknown = tasks.filter((t) => t !== 'migrate' && t !== 'seed');
  if (unknown.length || !tasks.length)
    throw new Error(`db: tasks are "migrate" and "seed"; got ${tasks.join(' ') || 'none'}`);
  const orm = await MikroORM.init(ormOptions(url));
  try {
    if (tasks.includes('migrate')) {
      const applied = await orm.migrator.up();
      console.log(
        `[db] migrations: ${applied.length ? applied.map((m) => m.name).join(', ') : 'up to date'}`,
      );
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
