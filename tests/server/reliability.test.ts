import request from 'supertest';
import type { Logger, QueryRunner } from 'typeorm';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { AuditEvent } from '../../server/db/entities/audit-event.entity';
import { Program, ProgramRevision } from '../../server/db/entities/program.entity';
import { User } from '../../server/db/entities/user.entity';
import { LibraryAlias } from '../../server/db/entities/library-alias.entity';
import { LibraryNozzle } from '../../server/db/entities/library-nozzle.entity';
import { LibraryPackage } from '../../server/db/entities/library-package.entity';
import { blankPackage } from '../../shared/schemas/library.schema';
import { sampleFile, sampleLibrary, sampleSettings } from '../helpers/programs';
import { signedInAgent, startTestApp, truncateAll, type TestContext } from '../helpers/test-app';

/**
 * Issue "Reliability and scale", defects 2, 3, 5, 6, 7 and 8: list queries, four-eyes, races,
 * over-long strings, what operators see, and a database that is down.
 */
let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp();
});
afterAll(() => ctx.close());

type Agent = Awaited<ReturnType<typeof signedInAgent>>;
const post = (ag: Agent, path: string, body: unknown) => ag.a.post(`/api${path}`).set('X-CSRF-Token', ag.token).send(body as object);

let admin: Agent;
beforeEach(async () => {
  await truncateAll(ctx.ds);
  admin = await signedInAgent(ctx, ['admin']);
  const lib = await post(admin, '/library/import', { file: sampleLibrary(), mode: 'replace' });
  expect(lib.status, JSON.stringify(lib.body)).toBe(200);
});

async function createProgram(ag: Agent, name: string) {
  const res = await post(ag, '/programs', { name, product: 'LED status strip', board: 'HCI-LS2 rev A' });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.revisions[0].id as string;
}

async function version(ag: Agent, revId: string): Promise<number> {
  return (await ag.a.get(`/api/revisions/${revId}`).expect(200)).body.version;
}

function upload(ag: Agent, revId: string, file: Buffer, name: string, v: number, path = 'centroid') {
  return ag.a.post(`/api/revisions/${revId}/${path}`).set('X-CSRF-Token', ag.token).field('options', '{}').field('version', String(v)).attach('file', file, name);
}

/** Records the SQL the app sends while `fn` runs. */
async function capturingSql(fn: () => Promise<unknown>): Promise<string[]> {
  const seen: string[] = [];
  const original = ctx.ds.logger;
  const spy: Logger = {
    logQuery: (q: string, _p?: unknown[], _r?: QueryRunner) => void seen.push(q),
    logQueryError: () => {},
    logQuerySlow: () => {},
    logSchemaBuild: () => {},
    logMigration: () => {},
    log: () => {},
  };
  Object.defineProperty(ctx.ds, 'logger', { value: spy, configurable: true, writable: true });
  try {
    await fn();
  } finally {
    Object.defineProperty(ctx.ds, 'logger', { value: original, configurable: true, writable: true });
  }
  return seen;
}

describe('defect 2: list and summary queries read only what they show', () => {
  it('GET /api/programs and GET /api/programs/:id never select the file, the import result, the findings or the underlay', async () => {
    const eng = await signedInAgent(ctx, ['engineer']);
    const revId = await createProgram(eng, 'led-strip');
    const up = await upload(eng, revId, sampleFile('led-strip/led-strip.csv'), 'led-strip.csv', await version(eng, revId));
    expect(up.status, JSON.stringify(up.body)).toBe(200);
    const placed = up.body.imported.top + up.body.imported.bottom;
    let list: request.Response | undefined;
    let one: request.Response | undefined;
    const sql = await capturingSql(async () => {
      list = await eng.a.get('/api/programs').expect(200);
      one = await eng.a.get(`/api/programs/${up.body.programId}`).expect(200);
    });
    // a column the app would receive: `SELECT … "ProgramRevision"."imported" …` or `SELECT * …`
    const heavy = sql.filter((q) => /program_revisions/.test(q) && /\."(imported|centroid_bytes|underlay|findings)"|SELECT \*|\bimported\b|centroid_bytes|underlay/.test(q));
    expect(heavy, heavy.join('\n---\n')).toEqual([]);
    // what the list shows is still right: placements counted without the do-not-place rows
    expect(list!.body.items[0].revisions[0]).toMatchObject({ label: 'A', placements: placed, centroidName: 'led-strip.csv' });
    expect(one!.body.revisions[0]).toMatchObject({ placements: placed });
  });

  it('the operator routes (run-file list, set-up sheet, download, problem report) never load the import, the file, the findings or the underlay', async () => {
    const a = await signedInAgent(ctx, ['engineer']);
    const b = await signedInAgent(ctx, ['engineer']);
    const revId = await createProgram(a, 'led-strip');
    expect((await upload(a, revId, sampleFile('led-strip/led-strip.csv'), 'led-strip.csv', await version(a, revId))).status).toBe(200);
    await a.a.put(`/api/revisions/${revId}/settings`).set('X-CSRF-Token', a.token).send({ settings: sampleSettings('led-strip/job.json'), version: await version(a, revId) }).expect(200);
    await a.a.post(`/api/revisions/${revId}/checks`).set('X-CSRF-Token', a.token).expect(200);
    await a.a.post(`/api/revisions/${revId}/submit`).set('X-CSRF-Token', a.token).expect(200);
    expect((await post(b, `/revisions/${revId}/approve`, { comment: '' })).status).toBe(200);
    const op = await signedInAgent(ctx, ['operator']);
    const sql = await capturingSql(async () => {
      expect((await op.a.get('/api/run-files')).status).toBe(200);
      expect((await op.a.get(`/api/run-files/${revId}/setup-sheet`)).status).toBe(200);
      expect((await op.a.get(`/api/run-files/${revId}/top.csv`)).status).toBe(200);
      expect((await post(op, `/run-files/${revId}/problems`, { text: 'Feeder 3 jams on the amber LEDs.' })).status).toBe(201);
    });
    const heavy = sql.filter((q) => /program_revisions/.test(q) && /\."(imported|centroid_bytes|underlay|findings)"|SELECT \*|\bimported\b|centroid_bytes|underlay/.test(q));
    expect(heavy, heavy.join('\n---\n')).toEqual([]);
  });

  it('a revision with 30,000 imported rows lists with its count, from the stored count', async () => {
    const eng = await signedInAgent(ctx, ['engineer']);
    const revId = await createProgram(eng, 'big-board');
    // 30,000 rows, one in ten not placed, written straight into the table as a big import would be
    const placements = Array.from({ length: 30000 }, (_, i) => ({ ref: `R${i + 1}`, x: i, y: 0, rotation: 0, side: 'top', footprint: 'R0603', value: '', partNumber: '', dnp: i % 10 === 0, line: i + 2 }));
    const r = await ctx.ds.getRepository(ProgramRevision).findOneByOrFail({ id: revId });
    r.imported = { placements, units: 'mm', columns: {}, headers: [], dialect: {}, warnings: [] } as never;
    await ctx.ds.getRepository(ProgramRevision).save(r);
    const list = await eng.a.get('/api/programs').expect(200);
    expect(list.body.items[0].revisions[0].placements).toBe(27000);
  });

  it('GET /api/programs pages: limit and offset, newest change first, with the total', async () => {
    const eng = await signedInAgent(ctx, ['engineer']);
    for (const n of ['p-one', 'p-two', 'p-three']) await createProgram(eng, n);
    const page = await eng.a.get('/api/programs?limit=2&offset=0').expect(200);
    expect(page.body.items.map((p: { name: string }) => p.name)).toEqual(['p-three', 'p-two']);
    expect(page.body.total).toBe(3);
    const rest = await eng.a.get('/api/programs?limit=2&offset=2').expect(200);
    expect(rest.body.items.map((p: { name: string }) => p.name)).toEqual(['p-one']);
    const bad = await eng.a.get('/api/programs?limit=100000');
    expect(bad.status).toBe(400);
    expect(bad.body.errors[0].path).toBe('query.limit');
  });
});

describe('defect 3: four-eyes covers everyone who changed the revision', () => {
  it('engineer B imports, sets up, checks and submits a program A created: neither A nor B may release it, C may; the audit names the contributors', async () => {
    const a = await signedInAgent(ctx, ['engineer']);
    const b = await signedInAgent(ctx, ['engineer']);
    const c = await signedInAgent(ctx, ['engineer']);
    const revId = await createProgram(a, 'led-strip');
    const up = await upload(b, revId, sampleFile('led-strip/led-strip.csv'), 'led-strip.csv', await version(b, revId));
    expect(up.status, JSON.stringify(up.body)).toBe(200);
    await b.a.put(`/api/revisions/${revId}/settings`).set('X-CSRF-Token', b.token).send({ settings: sampleSettings('led-strip/job.json'), version: await version(b, revId) }).expect(200);
    await b.a.post(`/api/revisions/${revId}/checks`).set('X-CSRF-Token', b.token).expect(200);
    await b.a.post(`/api/revisions/${revId}/submit`).set('X-CSRF-Token', b.token).expect(200);

    const asB = await b.a.get(`/api/revisions/${revId}`).expect(200);
    expect(asB.body.can.review).toBe(false);
    const byB = await post(b, `/revisions/${revId}/approve`, { comment: 'mine' });
    expect(byB.status, JSON.stringify(byB.body)).toBe(403);
    expect(byB.body.detail).toMatch(/you (imported|changed|submitted)/i);
    const byA = await post(a, `/revisions/${revId}/approve`, { comment: 'creator' });
    expect(byA.status).toBe(403);
    expect((await ctx.ds.getRepository(ProgramRevision).findOneByOrFail({ id: revId })).state).toBe('in-review');

    const asC = await c.a.get(`/api/revisions/${revId}`).expect(200);
    expect(asC.body.can.review).toBe(true);
    // the reviewer sees who changed it, and what each did, in order
    expect(asC.body.contributors).toEqual([
      { name: a.user.name, email: a.user.email, actions: ['create'] },
      { name: b.user.name, email: b.user.email, actions: ['import', 'settings', 'submit'] },
    ]);
    const byC = await post(c, `/revisions/${revId}/approve`, { comment: 'Checked on the drawing.' });
    expect(byC.status, JSON.stringify(byC.body)).toBe(200);
    expect(byC.body.state).toBe('released');
    const ev = await ctx.ds.getRepository(AuditEvent).findOneByOrFail({ action: 'revision.release' });
    const contributors = (ev.detail as { contributors: string[] }).contributors;
    expect([...contributors].sort()).toEqual([a.user.email, b.user.email].sort());
  });

  it('running the checks is not a change: an engineer who only ran them may still release', async () => {
    const a = await signedInAgent(ctx, ['engineer']);
    const b = await signedInAgent(ctx, ['engineer']);
    const revId = await createProgram(a, 'led-strip');
    expect((await upload(a, revId, sampleFile('led-strip/led-strip.csv'), 'led-strip.csv', await version(a, revId))).status).toBe(200);
    await a.a.put(`/api/revisions/${revId}/settings`).set('X-CSRF-Token', a.token).send({ settings: sampleSettings('led-strip/job.json'), version: await version(a, revId) }).expect(200);
    await b.a.post(`/api/revisions/${revId}/checks`).set('X-CSRF-Token', b.token).expect(200);
    await a.a.post(`/api/revisions/${revId}/submit`).set('X-CSRF-Token', a.token).expect(200);
    const byB = await post(b, `/revisions/${revId}/approve`, { comment: 'Looked at every finding.' });
    expect(byB.status, JSON.stringify(byB.body)).toBe(200);
  });

  it('a waiver alone makes its giver a contributor', async () => {
    const a = await signedInAgent(ctx, ['engineer']);
    const w = await signedInAgent(ctx, ['engineer']);
    const res = await post(a, '/programs', { name: 'fault-demo', product: 'Test fixture', board: 'F-1' });
    const revId = res.body.revisions[0].id;
    const up = await a.a.post(`/api/revisions/${revId}/centroid`).set('X-CSRF-Token', a.token).field('options', JSON.stringify(sampleSettings('faulty/job.json').import ?? {})).field('version', String(await version(a, revId))).attach('file', sampleFile('faulty/faulty.csv'), 'faulty.csv');
    expect(up.status, JSON.stringify(up.body)).toBe(200);
    await a.a.put(`/api/revisions/${revId}/settings`).set('X-CSRF-Token', a.token).send({ settings: sampleSettings('faulty/job.json'), version: await version(a, revId) }).expect(200);
    const checked = await a.a.post(`/api/revisions/${revId}/checks`).set('X-CSRF-Token', a.token).expect(200);
    const errors = checked.body.findings.filter((f: { severity: string }) => f.severity === 'error');
    for (const f of errors) expect((await post(w, `/revisions/${revId}/waivers`, { key: f.key, reason: 'Accepted for this fixture board' })).status).toBe(201);
    await a.a.post(`/api/revisions/${revId}/submit`).set('X-CSRF-Token', a.token).expect(200);
    const byW = await post(w, `/revisions/${revId}/approve`, { comment: '' });
    expect(byW.status, JSON.stringify(byW.body)).toBe(403);
    expect(byW.body.detail).toMatch(/waiv/i);
  });
});

describe('defect 5: concurrent creates with the same key give one 201 and 409s naming the field', () => {
  async function race(make: (i: number) => Promise<request.Response>) {
    const results = await Promise.all(Array.from({ length: 8 }, (_, i) => make(i)));
    const statuses = results.map((r) => r.status).sort();
    expect(statuses, JSON.stringify(results.map((r) => r.body))).toEqual([201, 409, 409, 409, 409, 409, 409, 409]);
    return results.filter((r) => r.status === 409);
  }
  const cases = ['led-strip', 'LED-STRIP', 'Led-Strip', 'led-STRIP', 'LED-strip', 'lEd-sTrIp', 'led-Strip', 'LeD-StRiP'];

  it('programs (names compared without case)', async () => {
    const eng = await signedInAgent(ctx, ['engineer']);
    const agents = await Promise.all(Array.from({ length: 8 }, () => signedInAgent(ctx, ['engineer'])));
    void eng;
    const conflicts = await race((i) => post(agents[i], '/programs', { name: cases[i], product: 'LED status strip', board: 'HCI-LS2 rev A' }));
    for (const c of conflicts) expect(c.body.errors.map((e: { path: string }) => e.path)).toEqual(['name']);
    expect(await ctx.ds.getRepository(Program).count()).toBe(1);
  });

  it('users (e-mail)', async () => {
    const conflicts = await race((i) => post(admin, '/users', { email: `Race.Test@${i % 2 ? 'EXAMPLE' : 'example'}.com`.replace('Race', i % 3 ? 'race' : 'RACE'), name: 'Racer', roles: ['operator'], password: 'tidal-lantern-quarry-58' }));
    for (const c of conflicts) expect(c.body.errors.map((e: { path: string }) => e.path)).toEqual(['email']);
    expect(await ctx.ds.getRepository(User).countBy({ email: 'race.test@example.com' })).toBe(1);
  });

  it('packages (names compared without case)', async () => {
    const lib = await signedInAgent(ctx, ['librarian']);
    const conflicts = await race((i) => post(lib, '/library/packages', { ...blankPackage(['RACE0603', 'race0603', 'Race0603', 'rACE0603'][i % 4]), nozzles: [], vision: null }));
    for (const c of conflicts) expect(c.body.errors.map((e: { path: string }) => e.path)).toEqual(['name']);
    expect(await ctx.ds.getRepository(LibraryPackage).createQueryBuilder('p').where(`lower(p.name) = 'race0603'`).getCount()).toBe(1);
  });

  it('aliases (patterns compared without case)', async () => {
    const lib = await signedInAgent(ctx, ['librarian']);
    const pkgId = (await ctx.ds.getRepository(LibraryPackage).find())[0].id;
    const conflicts = await race((i) => post(lib, '/library/aliases', { pattern: ['RACE-ALIAS', 'race-alias', 'Race-Alias', 'rACE-aLIAS'][i % 4], packageId: pkgId }));
    for (const c of conflicts) expect(c.body.errors.map((e: { path: string }) => e.path)).toEqual(['pattern']);
    expect(await ctx.ds.getRepository(LibraryAlias).countBy({ patternKey: 'race-alias' })).toBe(1);
  });

  it('nozzles (names compared without case)', async () => {
    const lib = await signedInAgent(ctx, ['librarian']);
    const conflicts = await race((i) => post(lib, '/library/nozzles', { name: ['RN-7', 'rn-7', 'Rn-7', 'rN-7'][i % 4], tipOuter: 0.7, tipInner: 0.35, holderRadius: 3, notes: '' }));
    for (const c of conflicts) expect(c.body.errors.map((e: { path: string }) => e.path)).toEqual(['name']);
    expect(await ctx.ds.getRepository(LibraryNozzle).createQueryBuilder('n').where(`lower(n.name) = 'rn-7'`).getCount()).toBe(1);
  });
});

describe('defect 5, continued: vision presets and machine profiles', () => {
  it.each([
    ['vision presets', '/library/vision-presets', (n: string) => ({ name: n, method: 'body-outline', lighting: 'top', sizeTolerancePct: 10, maxCentringOffset: 0.5, maxAngleCorrection: 5, notes: '' }), 'library_vision_presets'],
    ['machine profiles', '/library/machines', (n: string) => ({ name: n, reachX: 400, reachY: 300, nozzles: [], maxPartHeight: 10, notes: '' }), 'library_machines'],
  ])('%s: one 201, seven 409 naming the name, one row', async (_label, path, body, table) => {
    const lib = await signedInAgent(ctx, ['librarian']);
    const names = ['Race Preset', 'race preset', 'RACE PRESET', 'Race preset'];
    const results = await Promise.all(Array.from({ length: 8 }, (_, i) => post(lib, path, body(names[i % 4]))));
    expect(results.map((r) => r.status).sort(), JSON.stringify(results.map((r) => r.body))).toEqual([201, 409, 409, 409, 409, 409, 409, 409]);
    for (const r of results.filter((x) => x.status === 409)) expect(r.body.errors.map((e: { path: string }) => e.path)).toEqual(['name']);
    const [{ n }] = await ctx.ds.query(`SELECT count(*)::int AS n FROM ${table} WHERE lower(name) = 'race preset'`);
    expect(n).toBe(1);
  });
});

describe('defect 6: over-long strings answer 400 naming the field, never 500', () => {
  it('a centroid file with a 5,000-character name', async () => {
    const eng = await signedInAgent(ctx, ['engineer']);
    const revId = await createProgram(eng, 'long-names');
    const name = 'b'.repeat(4996) + '.csv';
    for (const path of ['centroid/preview', 'centroid']) {
      const res = await upload(eng, revId, sampleFile('led-strip/led-strip.csv'), name, await version(eng, revId), path);
      expect(res.status, `${path}: ${JSON.stringify(res.body)}`).toBe(400);
      expect(res.body.errors.map((e: { path: string }) => e.path)).toEqual(['file']);
      expect(res.body.detail).toMatch(/255/);
    }
  });

  it('a sign-in with a 254-character e-mail (the longest allowed) is refused with 401, not 500', async () => {
    const ag = await (await import('../helpers/test-app')).agent(ctx);
    const email = 'a'.repeat(64) + '@' + ('b'.repeat(60) + '.').repeat(3) + 'c'.repeat(6);
    expect(email.length).toBe(254);
    const res = await ag.a.post('/api/auth/sign-in').set('X-CSRF-Token', ag.token).send({ email, password: 'whatever-it-is' });
    expect(res.status, JSON.stringify(res.body)).toBe(401);
  });

  it('a centroid file with a 5,000-character footprint imports; the part stays unmatched, nothing answers 500', async () => {
    const eng = await signedInAgent(ctx, ['engineer']);
    const revId = await createProgram(eng, 'long-footprint');
    const csv = `Ref,X(mm),Y(mm),Rot,Side,Footprint\nR1,1,1,0,top,${'F'.repeat(5000)}\nR2,2,2,0,top,R0603\n`;
    const res = await upload(eng, revId, Buffer.from(csv), 'long-footprint.csv', await version(eng, revId));
    expect(res.status, JSON.stringify(res.body).slice(0, 400)).toBe(200);
    expect(res.body.imported.rows).toBe(2);
  });

  it.each([
    ['POST /programs', (ag: Agent) => post(ag, '/programs', { name: 'n'.repeat(5000), product: 'p', board: 'b' }), 'name'],
    ['POST /programs (product)', (ag: Agent) => post(ag, '/programs', { name: 'ok', product: 'p'.repeat(5000), board: 'b' }), 'product'],
    ['POST /tokens', (ag: Agent) => post(ag, '/tokens', { name: 't'.repeat(5000) }), 'name'],
    ['POST /library/proposals', (ag: Agent) => post(ag, '/library/proposals', { kind: 'alias', pattern: 'p'.repeat(5000), packageId: '00000000-0000-4000-8000-000000000000', footprint: 'x', note: '' }), 'pattern'],
  ])('%s', async (_label, send, field) => {
    const eng = await signedInAgent(ctx, ['engineer']);
    const res = await send(eng);
    expect(res.status, JSON.stringify(res.body)).toBe(400);
    expect(res.body.errors.map((e: { path: string }) => e.path)).toContain(field);
  });
});

describe('defect 7: operators see what run files and the set-up sheet need, nothing more', () => {
  it('an operator reads no library route and no unmatched queue; the run-file list shows released programs only', async () => {
    const eng = await signedInAgent(ctx, ['engineer']);
    await createProgram(eng, 'secret-draft-name');
    const op = await signedInAgent(ctx, ['operator']);
    for (const path of ['/library/packages', '/library/aliases', '/library/nozzles', '/library/vision-presets', '/library/machines', '/library/revisions', '/library/file', '/library/export', '/library/proposals', '/library/unmatched', '/library/match?footprint=R0603']) {
      const res = await op.a.get(`/api${path}`);
      expect(res.status, path).toBe(403);
    }
    const files = await op.a.get('/api/run-files').expect(200);
    expect(JSON.stringify(files.body)).not.toContain('secret-draft-name');
  });
});

describe('defect 8: with PostgreSQL down, routes answer 503 with Retry-After, and recover', () => {
  it('a pool whose server is gone answers 503 problem bodies; the same app recovers when the pool works again', async () => {
    const other = await startTestApp();
    try {
      const op = await signedInAgent(other, ['operator']);
      // As when PostgreSQL stops: the server ends the app's open connections (pg_terminate_backend,
      // from the other app's pool), and new ones are refused (the pool now points at a closed port).
      const pool = (other.ds.driver as unknown as { master: { options: { connectionString: string }; _clients: { processID: number }[] } }).master;
      const realUrl = pool.options.connectionString;
      pool.options.connectionString = realUrl.replace(/:\d+\//, ':1/'); // nothing listens on tcpmux (port 1) on this machine
      const pids = pool._clients.map((c) => c.processID);
      expect(pids.length).toBeGreaterThan(0);
      await ctx.ds.query('SELECT pg_terminate_backend(pid) FROM unnest($1::int[]) pid', [pids]);
      await new Promise((r) => setTimeout(r, 100));
      for (const path of ['/api/run-files', '/api/me', '/api/programs']) {
        const res = await op.a.get(path);
        expect(res.status, `${path}: ${res.status} ${JSON.stringify(res.body)}`).toBe(503);
        expect(res.headers['retry-after']).toMatch(/^\d+$/);
        expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
        expect(res.body).toMatchObject({ status: 503, title: 'Database unavailable' });
        expect(res.body.detail).toMatch(/database/i);
      }
      const anon = request.agent(other.app);
      const csrf = await anon.get('/api/auth/csrf');
      expect(csrf.status).toBe(200);
      const signIn = await anon.post('/api/auth/sign-in').set('X-CSRF-Token', csrf.body.token).send({ email: op.user.email, password: 'correct-horse-battery' });
      expect(signIn.status).toBe(503);
      const health = await request(other.app).get('/api/health');
      expect(health.status).toBe(503);
      expect(health.body.database.ok).toBe(false);

      pool.options.connectionString = realUrl;
      const back = await op.a.get('/api/run-files');
      expect(back.status, JSON.stringify(back.body)).toBe(200);
    } finally {
      await other.close();
    }
  });
});
