// The production client bundle in dist/client, built by scripts/build-client.sh exactly as
// `npm start` builds it; rebuilt when missing, of another mode, or older than its sources.
import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';

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
export function staleReason(force = false): string | null {
  if (force) return 'a rebuild was asked for';
  if (!existsSync('dist/client/index.html') || !existsSync(STAMP)) return 'no build of scripts/build-client.sh in dist/client';
  const mode = readFileSync(STAMP, 'utf8').trim();
  if (mode !== 'production') return `dist/client holds a ${mode} bundle`;
  const built = statSync(STAMP).mtimeMs;
  const changed = CLIENT_SOURCES.find((p) => newestMtime(p) > built);
  return changed ? `${changed} changed since the last build` : null;
}

/** Builds the production bundle when it is stale; returns why it was built, or null. */
export function ensureProductionBuild(force = false, log: (s: string) => void = console.error): string | null {
  const why = staleReason(force);
  if (why) {
    log(`building the client (${why})`);
    execFileSync('bash', ['scripts/build-client.sh', 'production'], { stdio: ['ignore', 'inherit', 'inherit'] });
  }
  return why;
}
