import { execFileSync } from 'node:child_process';
import { createDataSource } from '../../server/db/data-source';

/**
 * Makes sure the project-local cluster runs and database `name` exists, empties it and migrates
 * it. Returns its URL. With DATABASE_URL_TEST_BASE set (postgres://…/ without a name), that
 * server is used instead of the local cluster.
 */
export async function prepareTestDatabase(name: string): Promise<string> {
  let url: string;
  if (process.env.DATABASE_URL_TEST_BASE) {
    url = process.env.DATABASE_URL_TEST_BASE.replace(/\/?$/, '/') + name;
  } else {
    execFileSync('bash', ['scripts/db.sh', 'ensure-db', name], { stdio: ['ignore', 'ignore', 'inherit'] });
    url = execFileSync('bash', ['scripts/db.sh', 'url', name], { encoding: 'utf8' }).trim();
  }
  const ds = createDataSource(url);
  await ds.initialize();
  await ds.query('DROP SCHEMA IF EXISTS public CASCADE; CREATE SCHEMA public;');
  await ds.runMigrations({ transaction: 'each' });
  await ds.destroy();
  return url;
}
