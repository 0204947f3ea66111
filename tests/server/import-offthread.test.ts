import { monitorEventLoopDelay } from 'node:perf_hooks';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type { CheckPool } from '../../server/modules/programs/check-pool';
import { signedInAgent, startTestApp, truncateAll, type TestContext } from '../helpers/test-app';

/**
 * Issue "Reliability and scale", defect 1: an import preview (and an import's parsing) held the
 * event loop, so health and every other request waited for it. The file is read in the worker
 * pool now; these tests watch the event loop of this process (where the app runs) while a large
 * file is read. No speed target is timed here: the bound is generous (the loop must never stall
 * for a whole second), and the < 100 ms health figure is measured by `npm run bench:load`.
 */
let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp();
});
afterAll(() => ctx.close());

type Agent = Awaited<ReturnType<typeof signedInAgent>>;
let author: Agent;

beforeEach(async () => {
  await truncateAll(ctx.ds);
  author = await signedInAgent(ctx, ['engineer']);
});

async function createProgram(name = 'offthread') {
  const res = await author.a.post('/api/programs').set('X-CSRF-Token', author.token).send({ name, product: 'Load probe', board: 'HCI-LP1 rev A' });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.revisions[0].id as string;
}

async function upload(revId: string, file: Buffer, name: string, path: 'centroid' | 'centroid/preview') {
  const d = (await author.a.get(`/api/revisions/${revId}`).expect(200)).body;
  return author.a
    .post(`/api/revisions/${revId}/${path}`)
    .set('X-CSRF-Token', author.token)
    .field('options', JSON.stringify({}))
    .field('version', String(d.version))
    .attach('file', file, name);
}

const HEADER = 'Ref,X(mm),Y(mm),Rot,Side,Footprint\n';

/** `n` rows whose X is not a number (each one a row error at column "X(mm)"). */
function badRows(n: number): Buffer {
  const parts = [HEADER];
  for (let i = 0; i < n; i++) parts.push(`R${i + 1},abc,${(i % 500) * 0.5},0,top,R0603\n`);
  return Buffer.from(parts.join(''));
}

/** `n` good rows on a 0.5 mm grid. */
function goodRows(n: number): Buffer {
  const parts = [HEADER];
  for (let i = 0; i < n; i++) parts.push(`R${i + 1},${((i % 400) * 0.5).toFixed(1)},${(Math.floor(i / 400) * 0.5).toFixed(1)},0,top,R0603\n`);
  return Buffer.from(parts.join(''));
}

/** Runs `work` while watching this process's event loop; the longest stall seen, in ms. */
async function longestStall<T>(work: () => Promise<T>): Promise<{ result: T; maxMs: number }> {
  const h = monitorEventLoopDelay({ resolution: 10 });
  h.enable();
  try {
    const result = await work();
    return { result, maxMs: h.max / 1e6 };
  } finally {
    h.disable();
  }
}

// The generous bound on one stall of the event loop (see the note at the top). Reading the
// preview file below on the main thread stalled it for about 4 s on an idle machine.
const STALL_BOUND_MS = 1000;

describe('imports off the main thread', () => {
  it('previews 150,000 bad rows (4 MB) without stalling the event loop; the error list is capped', async () => {
    const revId = await createProgram();
    const file = badRows(150_000);
    const { result: res, maxMs } = await longestStall(() => upload(revId, file, 'bad-rows.csv', 'centroid/preview'));
    expect(res.status, JSON.stringify(res.body).slice(0, 500)).toBe(200);
    expect(res.body.rowErrors).toHaveLength(200);
    expect(res.body.truncated).toBe(true);
    expect(res.body.rowErrors[0]).toMatchObject({ line: 2, column: 'X(mm)' });
    expect(res.body.rowErrors[199]).toMatchObject({ line: 201, column: 'X(mm)' });
    console.info(`longest event-loop stall during the 150,000-bad-row preview: ${maxMs.toFixed(0)} ms`);
    expect(maxMs, `the event loop stalled for ${maxMs.toFixed(0)} ms`).toBeLessThan(STALL_BOUND_MS);
  }, 120_000);

  it('commits 200,000 rows without stalling the event loop; the revision holds every row', async () => {
    const revId = await createProgram();
    const file = goodRows(200_000);
    const { result: res, maxMs } = await longestStall(() => upload(revId, file, 'big.csv', 'centroid'));
    expect(res.status, JSON.stringify(res.body).slice(0, 500)).toBe(200);
    expect(res.body.imported.rows).toBe(200_000);
    expect(res.body.placements).toBe(200_000);
    console.info(`longest event-loop stall during the 200,000-row import: ${maxMs.toFixed(0)} ms`);
    expect(maxMs, `the event loop stalled for ${maxMs.toFixed(0)} ms`).toBeLessThan(STALL_BOUND_MS);
  }, 180_000);

  it('a preview over the time limit answers 422 naming the limit', async () => {
    const revId = await createProgram();
    const pool = ctx.app.locals.services.checks as CheckPool;
    const before = pool.importTimeoutMs;
    pool.importTimeoutMs = 1;
    try {
      const res = await upload(revId, badRows(20_000), 'slow.csv', 'centroid/preview');
      expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(422);
      expect(res.headers['content-type']).toMatch(/problem\+json/);
      expect(res.body.detail).toMatch(/slow\.csv/);
      expect(res.body.detail).toMatch(/0\.001 s/);
    } finally {
      pool.importTimeoutMs = before;
    }
  }, 60_000);

  it('past the most uploads read at once, a preview answers 503 and nothing is queued', async () => {
    const revId = await createProgram();
    const pool = ctx.app.locals.services.checks as CheckPool;
    const before = pool.maxImportsInFlight;
    pool.maxImportsInFlight = 0;
    try {
      const res = await upload(revId, badRows(10), 'busy.csv', 'centroid/preview');
      expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(503);
      expect(res.body.detail).toMatch(/busy\.csv again/);
    } finally {
      pool.maxImportsInFlight = before;
    }
    const ok = await upload(revId, badRows(10), 'calm.csv', 'centroid/preview');
    expect(ok.status).toBe(200);
    expect(ok.body.badRows).toBe(10);
  }, 60_000);

  it('a bad file committed is refused with its first bad line, read in the worker', async () => {
    const revId = await createProgram();
    const res = await upload(revId, Buffer.from(HEADER + 'R1,1,1,0,top,R0603\nR2,x,1,0,top,R0603\n'), 'one-bad.csv', 'centroid');
    expect(res.status).toBe(400);
    expect(res.body.detail).toMatch(/one-bad\.csv, line 3, column "X\(mm\)"/);
    const binary = await upload(revId, Buffer.from([0x52, 0x65, 0x66, 0, 1, 2]), 'blob.csv', 'centroid/preview');
    expect(binary.status).toBe(400);
    expect(binary.body.detail).toMatch(/not a text file/);
  }, 60_000);
});
