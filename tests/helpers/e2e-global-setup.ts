import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import type { TestProject } from 'vitest/node';
import { createDataSource } from '../../server/db/data-source';
import { seedDemo } from '../../server/db/seed/index';
import { ensureProductionBuild } from './client-build';
import { prepareTestDatabase } from './db';

/**
 * The browser tests' database (`placewright_e2e`, emptied, migrated and seeded with the demo),
 * the client built exactly as `npm start` builds it (scripts/build-client.sh: a production
 * bundle, rebuilt when its sources changed or PW_E2E_REBUILD=1), and Chromium from Debian's
 * packages. The tests start the server entry itself (tests/helpers/app-process.ts).
 */
export default async function setup(project: TestProject) {
  const url = await prepareTestDatabase(process.env.PW_E2E_DB_NAME ?? 'placewright_e2e');
  const ds = createDataSource(url);
  await ds.initialize();
  await seedDemo(ds, () => {}, { programs: false });
  await ds.destroy();
  ensureProductionBuild(process.env.PW_E2E_REBUILD === '1', (s) => console.error(`[e2e] ${s}`));
  if (!existsSync('/usr/bin/chromium')) {
    execFileSync('bash', ['-c', 'source scripts/lib.sh && ensure_chromium'], { stdio: 'inherit' });
  }
  project.provide('databaseUrl', url);
}
