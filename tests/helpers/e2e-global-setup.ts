import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import type { TestProject } from 'vitest/node';
import { createDataSource } from '../../server/db/data-source';
import { seedDemo } from '../../server/db/seed/index';
import { prepareTestDatabase } from './db';

/**
 * The browser tests' database (`placewright_e2e`, emptied, migrated and seeded with the demo),
 * a built client, and Chromium from Debian's packages.
 */
export default async function setup(project: TestProject) {
  const url = await prepareTestDatabase(process.env.PW_E2E_DB_NAME ?? 'placewright_e2e');
  const ds = createDataSource(url);
  await ds.initialize();
  await seedDemo(ds, () => {}, { programs: false });
  await ds.destroy();
  if (!existsSync('dist/client/index.html') || process.env.PW_E2E_REBUILD === '1') {
    execFileSync('npx', ['vite', 'build', '--logLevel', 'error'], { stdio: 'inherit' });
  }
  if (!existsSync('/usr/bin/chromium')) {
    execFileSync('bash', ['-c', 'source scripts/lib.sh && ensure_chromium'], { stdio: 'inherit' });
  }
  project.provide('databaseUrl', url);
}
