// `npm run bench:load`: the server under load, on loopback only, with its own database.
//
// The server runs as `npm start` runs it (its own process, tests/helpers/app-process.ts) on a
// spare loopback port, on the database `placewright_load` (PW_LOAD_DB_NAME), emptied, migrated
// and given the demo scenario (released programs, so the operator's run-file list is not empty),
// plus an engineer and an operator of the bench's own and a draft of 200,000 placements. Then:
//   1. the 200,000-row import itself: its time, and the slowest health answer meanwhile;
//   2. autocannon, 50 connections × 20 s each, on /api/health, /api/programs (engineer) and
//      /api/run-files (operator), then on /api/health while a 20 MB file of bad rows is
//      previewed again and again;
//   3. 300 generated hostile files (tests/helpers/hostile-centroid.ts) through the HTTP preview:
//      none may answer 5xx.
// Bounded: each load run lasts 20 s, the fuzz is 300 files, the whole bench a few minutes.
// Progress goes to stderr; the last line on stdout is one JSON object with the figures.
import 'reflect-metadata';
import bcrypt from 'bcryptjs';
import fc from 'fast-check';
import { execFileSync } from 'node:child_process';
import { createRequire } from 'node:module';
import { createDataSource } from '../../server/db/data-source';
import { User } from '../../server/db/entities/user.entity';
import { startAppProcess, type AppProcess } from '../helpers/app-process';
import { prepareTestDatabase } from '../helpers/db';
import { hostileCentroidBytes } from '../helpers/hostile-centroid';
import { runAsScript } from './run-main';

// autocannon ships no types: the little of its result used here.
interface CannonResult {
  latency: { p99: number; p50: number; max: number };
  requests: { total: number; average: number };
  errors: number;
  timeouts: number;
  non2xx: number;
}
type Cannon = (opts: { url: string; connections: number; duration: number; headers?: Record<string, string>; timeout?: number }) => Promise<CannonResult>;
const autocannon = createRequire(import.meta.url)('autocannon') as Cannon;

const CONNECTIONS = 50;
const DURATION_S = 20;
const FUZZ_FILES = 300;
const BIG_ROWS = 200_000;
// Just under the upload limit (20 MiB, server/modules/programs/program.service.ts).
const BAD_FILE_BYTES = 20_000_000;
const PASSWORD = 'load-bench-not-a-real-password-kx';

const log = (s: string) => process.stderr.write(`[bench:load] ${s}\n`);

/** A signed-in session: its cookies and CSRF token. */
class Session {
  private jar = new Map<string, string>();
  token = '';
  constructor(readonly base: string) {}

  get cookie(): string {
    return [...this.jar].map(([k, v]) => `${k}=${v}`).join('; ');
  }

  async fetch(path: string, init: RequestInit = {}): Promise<Response> {
    const headers = new Headers(init.headers);
    headers.set('cookie', this.cookie);
    if (init.method && init.method !== 'GET') headers.set('X-CSRF-Token', this.token);
    const res = await fetch(this.base + path, { ...init, headers });
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const eq = pair.indexOf('=');
      this.jar.set(pair.slice(0, eq).trim(), pair.slice(eq + 1).trim());
    }
    return res;
  }

  async json<T = any>(path: string, init: RequestInit = {}, expect = 200): Promise<T> {
    const res = await this.fetch(path, init);
    const body = await res.text();
    if (res.status !== expect) throw new Error(`${init.method ?? 'GET'} ${path}: ${res.status} ${body.slice(0, 400)}`);
    return JSON.parse(body) as T;
  }

  async signIn(email: string) {
    this.token = (await this.json<{ token: string }>('/api/auth/csrf')).token;
    const body = await this.json<{ csrfToken: string }>('/api/auth/sign-in', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email, password: PASSWORD }) });
    this.token = body.csrfToken;
  }

  upload(revId: string, path: 'centroid' | 'centroid/preview', bytes: Uint8Array, name: string, version: number, signal?: AbortSignal) {
    const form = new FormData();
    form.set('options', '{}');
    form.set('version', String(version));
    form.set('file', new Blob([bytes as Uint8Array<ArrayBuffer>]), name);
    return this.fetch(`/api/revisions/${revId}/${path}`, { method: 'POST', body: form, signal });
  }
}

function centroid(rows: number, row: (i: number) => string): Buffer {
  const parts = ['Ref,X(mm),Y(mm),Rot,Side,Footprint\n'];
  for (let i = 0; i < rows; i++) parts.push(row(i));
  return Buffer.from(parts.join(''));
}

/** Health answers, one after another, until `stop`; the slowest, in ms. */
async function watchHealth(base: string, stop: { done: boolean }): Promise<{ maxMs: number; count: number; failures: number }> {
  let maxMs = 0;
  let count = 0;
  let failures = 0;
  while (!stop.done) {
    const t0 = performance.now();
    try {
      const res = await fetch(`${base}/api/health`, { signal: AbortSignal.timeout(120_000) });
      await res.arrayBuffer();
      if (!res.ok) failures++;
    } catch {
      failures++;
    }
    maxMs = Math.max(maxMs, performance.now() - t0);
    count++;
    await new Promise((r) => setTimeout(r, 20));
  }
  return { maxMs, count, failures };
}

async function cannon(label: string, base: string, path: string, cookie?: string) {
  log(`autocannon ${CONNECTIONS} connections × ${DURATION_S} s on ${path} (${label})`);
  const r = await autocannon({ url: base + path, connections: CONNECTIONS, duration: DURATION_S, headers: cookie ? { cookie } : {}, timeout: 30 });
  log(`  ${r.requests.total} requests, p50 ${r.latency.p50} ms, p99 ${r.latency.p99} ms, max ${r.latency.max} ms, ${r.errors} errors, ${r.timeouts} timeouts, ${r.non2xx} non-2xx`);
  return { p99: r.latency.p99, errors: r.errors + r.timeouts, non2xx: r.non2xx, requests: r.requests.total };
}

export async function run(): Promise<Record<string, unknown>> {
  const url = await prepareTestDatabase(process.env.PW_LOAD_DB_NAME ?? 'placewright_load');
  log('seeding the demo scenario');
  execFileSync(process.execPath, ['--import', 'tsx', 'server/db/seed.ts', '--force'], { env: { ...process.env, DATABASE_URL: url }, stdio: ['ignore', 'ignore', 'inherit'] });
  const ds = createDataSource(url);
  await ds.initialize();
  const hash = bcrypt.hashSync(PASSWORD, 10);
  const users = ds.getRepository(User);
  await users.save([
    users.create({ email: 'load-engineer@harrowcreek.example', name: 'Load Engineer', roles: ['engineer'], passwordHash: hash, active: true }),
    users.create({ email: 'load-operator@harrowcreek.example', name: 'Load Operator', roles: ['operator'], passwordHash: hash, active: true }),
  ]);
  await ds.destroy();

  let server: AppProcess | null = null;
  try {
    server = await startAppProcess({ databaseUrl: url });
    const base = server.baseUrl;
    log(`server at ${base}`);
    const engineer = new Session(base);
    await engineer.signIn('load-engineer@harrowcreek.example');
    const operator = new Session(base);
    await operator.signIn('load-operator@harrowcreek.example');

    // ---- the 200,000-placement draft ------------------------------------------------------
    const created = await engineer.json<{ revisions: { id: string }[] }>(
      '/api/programs',
      { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ name: 'Load probe 200k', product: 'Load probe', board: 'HCI-LP2 rev A' }) },
      201,
    );
    const revId = created.revisions[0].id;
    const big = centroid(BIG_ROWS, (i) => `R${i + 1},${((i % 400) * 0.5).toFixed(1)},${(Math.floor(i / 400) * 0.5).toFixed(1)},0,top,R0603\n`);
    log(`importing ${BIG_ROWS} rows (${(big.length / 1e6).toFixed(1)} MB)`);
    const stopCommit = { done: false };
    const commitHealth = watchHealth(base, stopCommit);
    const t0 = performance.now();
    const commit = await engineer.upload(revId, 'centroid', big, 'load-200k.csv', 1);
    const commitBody = await commit.text();
    const commitMs = performance.now() - t0;
    stopCommit.done = true;
    const ch = await commitHealth;
    if (commit.status !== 200) throw new Error(`the 200,000-row import answered ${commit.status}: ${commitBody.slice(0, 400)}`);
    log(`  ${commitMs.toFixed(0)} ms; health meanwhile: ${ch.count} answers, slowest ${ch.maxMs.toFixed(0)} ms`);

    // ---- load -------------------------------------------------------------------------------
    await fetch(`${base}/api/health`);
    const health = await cannon('nothing else running', base, '/api/health');
    const programs = await cannon('engineer, 200,000-placement draft present', base, '/api/programs', engineer.cookie);
    const runFiles = await cannon('operator', base, '/api/run-files', operator.cookie);

    const bad = centroid(0, () => '');
    const badParts = [bad.toString()];
    let size = bad.length;
    for (let i = 0; size < BAD_FILE_BYTES - 64; i++) {
      const row = `B${i + 1},abc,${(i % 500) * 0.5},0,top,R0603\n`;
      badParts.push(row);
      size += row.length;
    }
    const badFile = Buffer.from(badParts.join(''));
    log(`previewing a ${(badFile.length / 1e6).toFixed(1)} MB file of bad rows in a loop`);
    const previewLoop = new AbortController();
    const previews = { done: 0, statuses: new Map<number, number>() };
    const looping = (async () => {
      while (!previewLoop.signal.aborted) {
        try {
          const res = await engineer.upload(revId, 'centroid/preview', badFile, 'load-bad-rows.csv', 0, previewLoop.signal);
          await res.arrayBuffer();
          previews.done++;
          previews.statuses.set(res.status, (previews.statuses.get(res.status) ?? 0) + 1);
        } catch {
          /* aborted at the end */
        }
      }
    })();
    // the first upload is under way before the load starts
    await new Promise((r) => setTimeout(r, 1500));
    const healthDuringPreview = await cannon('while a 20 MB bad file is previewed', base, '/api/health');
    previewLoop.abort();
    await looping;
    log(`  previews finished meanwhile: ${previews.done} (${[...previews.statuses].map(([s, n]) => `${n}× ${s}`).join(', ') || 'none'})`);

    // ---- hostile files through the HTTP preview ----------------------------------------------
    log(`${FUZZ_FILES} hostile files through the preview`);
    const files = fc.sample(hostileCentroidBytes, { numRuns: FUZZ_FILES, seed: 19_019 });
    let fuzz5xx = 0;
    const fuzzStatuses = new Map<number, number>();
    for (const [i, f] of files.entries()) {
      const res = await engineer.upload(revId, 'centroid/preview', f, `hostile-${i + 1}.csv`, 0);
      const text = await res.text();
      fuzzStatuses.set(res.status, (fuzzStatuses.get(res.status) ?? 0) + 1);
      if ((i + 1) % 100 === 0) log(`  ${i + 1} files`);
      if (res.status >= 500) {
        fuzz5xx++;
        log(`  file ${i + 1}: ${res.status} ${text.slice(0, 300)}`);
      }
    }
    log(`  answers: ${[...fuzzStatuses].sort().map(([s, n]) => `${n}× ${s}`).join(', ')}`);

    return {
      healthP99Ms: health.p99,
      healthErrors: health.errors,
      healthNon2xx: health.non2xx,
      programsP99Ms: programs.p99,
      programsErrors: programs.errors,
      programsNon2xx: programs.non2xx,
      runFilesP99Ms: runFiles.p99,
      runFilesErrors: runFiles.errors,
      runFilesNon2xx: runFiles.non2xx,
      healthDuringPreviewP99Ms: healthDuringPreview.p99,
      healthDuringPreviewErrors: healthDuringPreview.errors,
      healthDuringPreviewNon2xx: healthDuringPreview.non2xx,
      fuzzPreviewFiles: files.length,
      fuzzPreview5xx: fuzz5xx,
      commit200kMs: Math.round(commitMs),
      healthDuringCommitMaxMs: Math.round(ch.maxMs),
      requests: { health: health.requests, programs: programs.requests, runFiles: runFiles.requests, healthDuringPreview: healthDuringPreview.requests },
      previewsDuringLoad: previews.done,
    };
  } catch (e) {
    if (server) log(`server output (last 3000 characters):\n${server.output().slice(-3000)}`);
    throw e;
  } finally {
    await server?.stop();
  }
}

// A hard stop, in case something hangs (the bench itself takes a few minutes).
const RUN_LIMIT_MS = 15 * 60_000;

runAsScript(import.meta.url, 'bench:load', RUN_LIMIT_MS, run);
