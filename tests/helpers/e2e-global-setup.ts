import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import type { TestProject } from 'vitest/node';
import { createDataSource } from '../../server/db/data-source';
import { seedDemo } from '../../server/db/seed/index';
import { prepareTestDatabase } from './db';

const STAMP = 'dist/client/.build';
/** What the client bundle is made of: a change here makes the bundle stale. */
const CLIENT_SOURCES = ['src', 'shared', 'public', 'index.html', 'vite.config.ts', 'tailwind.config.ts', 'package-lock.json'];

function newestMtime(path: string): number {
  if (!existsSync(path)) return 0;
  const st = statSync(path);
  if (!st.isDirectory()) return st.mtimeMs;
  let t = 0;
  for (const e of readdirSync(path)) t = Math.max(t, newestMtime(join(path, e)));
  return t;
}

/** Why the production bundle must be built again, or null when dist/client is current. */
function staleReason(): string | null {
  if (process.env.PW_E2E_REBUILD === '1') return 'PW_E2E_REBUILD=1';
  if (!existsSync('dist/client/index.html') || !existsSync(STAMP)) return 'no build of scripts/build-client.sh in dist/client';
  if (readFileSync(STAMP, 'utf8').trim() !== 'production') return `dist/client holds a ${readFileSync(STAMP, 'utf8').trim()} bundle`;
  const built = statSync(STAMP).mtimeMs;
  const changed = CLIENT_SOURCES.find((p) => newestMtime(p) > built);
  return changed ? `${changed} changed since the last build` : null;
}

/**
 * The browser tests' database (`placewright_e2e`, emptied, migrated and seeded with the demo),
 * the client built exactly as `npm start` builds it (scripts/build-client.sh: a production
 * bundle), and Chromium from Debian's packages. The tests start the server entry itself.
 */
export default async function setup(project: TestProject) {
  const url = await prepareTestDatabase(process.env.PW_E2E_DB_NAME ?? 'placewright_e2e');
  const ds = createDataSource(url);
  await ds.initialize();
  await seedDemo(ds, () => {}, { programs: false });
  await ds.destroy();
  const why = staleReason();
  if (why) {
    console.error(`[e2e] building the client (${why})`);
    execFileSync('bash', ['scripts/build-client.sh', 'production'], { stdio: 'inherit' });
  }
  if (!existsSync('/usr/bin/chromium')) {
    execFileSync('bash', ['-c', 'source scripts/lib.sh && ensure_chromium'], { stdio: 'inherit' });
  }
  project.provide('databaseUrl', url);
}
