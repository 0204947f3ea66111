// Trusting a review on the server: the review summary, waivers that cover every board, and where a
// package is used before a shared edit changes it.
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { reviewSummarySchema, revisionDetailSchema } from '../../shared/schemas/program.schema';
import { packageUsageSchema } from '../../shared/schemas/library.schema';
import { AuditEvent } from '../../server/db/entities/audit-event.entity';
import { sampleFile, sampleLibrary, sampleSettings } from '../helpers/programs';
import { signedInAgent, startTestApp, truncateAll, type TestContext } from '../helpers/test-app';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp();
});
afterAll(() => ctx.close());

type Agent = Awaited<ReturnType<typeof signedInAgent>>;
let author: Agent;
let reviewer: Agent;
let librarian: Agent;
let operator: Agent;

beforeEach(async () => {
  await truncateAll(ctx.ds);
  author = await signedInAgent(ctx, ['engineer']);
  reviewer = await signedInAgent(ctx, ['engineer']);
  librarian = await signedInAgent(ctx, ['librarian']);
  operator = await signedInAgent(ctx, ['operator']);
  const admin = await signedInAgent(ctx, ['admin']);
  const lib = await admin.a.post('/api/library/import').set('X-CSRF-Token', admin.token).send({ file: sampleLibrary(), mode: 'replace' });
  expect(lib.status, JSON.stringify(lib.body)).toBe(200);
});

type Finding = { key: string; kind: string; severity: string; refs: string[]; boards: number[] };

async function detail(a: Agent, revId: string) {
  const res = await a.a.get(`/api/revisions/${revId}`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return revisionDetailSchema.parse(res.body);
}

async function summary(a: Agent, revId: string) {
  const res = await a.a.get(`/api/revisions/${revId}/review-summary`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return reviewSummarySchema.parse(res.body);
}

async function upload(revId: string, file: Buffer, name: string, options: unknown = {}) {
  const d = await detail(author, revId);
  const res = await author.a.post(`/api/revisions/${revId}/centroid`).set('X-CSRF-Token', author.token).field('options', JSON.stringify(options)).field('version', String(d.version)).attach('file', file, name);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
}

async function putSettings(revId: string, settings: unknown) {
  const d = await detail(author, revId);
  const res = await author.a.put(`/api/revisions/${revId}/settings`).set('X-CSRF-Token', author.token).send({ settings, version: d.version });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
}

async function check(revId: string) {
  const res = await author.a.post(`/api/revisions/${revId}/checks`).set('X-CSRF-Token', author.token);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
}

const waive = (revId: string, key: string, reason: string, scope?: 'finding' | 'every-board') =>
  author.a.post(`/api/revisions/${revId}/waivers`).set('X-CSRF-Token', author.token).send({ key, reason, ...(scope ? { scope } : {}) });

async function openErrorsInList(revId: string): Promise<number | null> {
  const res = await author.a.get('/api/programs').expect(200);
  for (const p of res.body.items) for (const r of p.revisions) if (r.id === revId) return r.openErrors;
  throw new Error('revision not listed');
}

/** samples/faulty: two boards, each fault planted once per board (see its README). */
async function prepareFaulty() {
  const res = await author.a.post('/api/programs').set('X-CSRF-Token', author.token).send({ name: 'fault-demo', product: 'Test fixture', board: 'F-1' });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  const revId: string = res.body.revisions[0].id;
  await upload(revId, sampleFile('faulty/faulty.csv'), 'faulty.csv', sampleSettings('faulty/job.json').import ?? {});
  await putSettings(revId, sampleSettings('faulty/job.json'));
  await check(revId);
  return revId;
}

describe('a waiver on every board: one decision for the same finding on each board', () => {
  it('one decision covers the same kind and refs on every board, boards added later included, and folds the single-board waivers', async () => {
    const revId = await prepareFaulty();
    const d0 = await detail(author, revId);
    const overlaps = (d0.findings as Finding[]).filter((f) => f.kind === 'body-overlap');
    // samples/faulty/README.md: body-overlap 1:R1,1:R2 and 2:R1,2:R2
    expect(overlaps.map((f) => f.refs)).toEqual([['1:R1', '1:R2'], ['2:R1', '2:R2']]);
    const open0 = await openErrorsInList(revId);

    // a waiver on board 1 alone first, then the decision for every board from board 2's finding
    expect((await waive(revId, overlaps[0].key, 'Board 1 only: stacked footprint')).status).toBe(201);
    const every = await waive(revId, overlaps[1].key, 'R1/R2 are a stacked footprint by design', 'every-board');
    expect(every.status, JSON.stringify(every.body)).toBe(201);
    expect(every.body).toMatchObject({ scope: 'every-board', findingKey: 'body-overlap|*:R1|*:R2', covers: 2 });

    const d1 = await detail(author, revId);
    expect(d1.waivers).toHaveLength(1); // one decision; the board-1 waiver was folded into it
    expect(d1.waivers[0]).toMatchObject({ scope: 'every-board', covers: 2, reason: 'R1/R2 are a stacked footprint by design', userEmail: author.user.email });
    expect(await openErrorsInList(revId)).toBe(open0! - 2); // the list's count (SQL) agrees
    const audit = await ctx.ds.getRepository(AuditEvent).findOneOrFail({ where: { action: 'finding.waive' }, order: { at: 'DESC' } });
    expect(JSON.stringify(audit)).toContain('Board 1 only: stacked footprint'); // the folded reason is kept

    // a single board of it cannot be waived again; a finding between boards has no every-board form
    expect((await waive(revId, overlaps[0].key, 'once more please')).status).toBe(409);
    const boardOverlap = (d1.findings as Finding[]).find((f) => f.kind === 'board-overlap')!;
    const bad = await waive(revId, boardOverlap.key, 'boards touch on purpose', 'every-board');
    expect(bad.status).toBe(400);
    expect(bad.body.detail).toMatch(/does not repeat per board/);

    // a third board appears (panel made taller): its R1/R2 overlap is covered by the same waiver
    const settings = sampleSettings('faulty/job.json');
    const panel = settings.panel as { height: number; instances: { x: number; y: number; rotation: number }[] };
    panel.height = 80;
    panel.instances.push({ x: 5, y: 42, rotation: 0 });
    await putSettings(revId, settings);
    await check(revId);
    const d2 = await detail(author, revId);
    const overlaps2 = (d2.findings as Finding[]).filter((f) => f.kind === 'body-overlap');
    expect(overlaps2.map((f) => f.boards[0])).toEqual([1, 2, 3]);
    expect(d2.waivers).toEqual([expect.objectContaining({ scope: 'every-board', covers: 3 })]);
    const s = await summary(author, revId);
    const kind = s.byKind.find((k) => k.kind === 'body-overlap')!;
    expect(kind).toMatchObject({ count: 3, waived: 3 });
    expect(kind.waivers).toEqual([expect.objectContaining({ scope: 'every-board', refs: ['R1', 'R2'], covers: 3 })]);
    expect(await openErrorsInList(revId)).toBe(s.findings!.openErrors);

    // removing the one decision opens every board again
    await author.a.delete(`/api/revisions/${revId}/waivers/${d2.waivers[0].id}`).set('X-CSRF-Token', author.token).expect(204);
    expect((await summary(author, revId)).byKind.find((k) => k.kind === 'body-overlap')).toMatchObject({ count: 3, waived: 0 });
  });

  it('submission counts every-board waivers: with the rest waived, the revision goes to review', async () => {
    const revId = await prepareFaulty();
    const findings = (await detail(author, revId)).findings as Finding[];
    const blocked = await author.a.post(`/api/revisions/${revId}/submit`).set('X-CSRF-Token', author.token);
    expect(blocked.status).toBe(409);
    const done = new Set<string>();
    for (const f of findings.filter((x) => x.severity === 'error')) {
      if (done.has(f.key)) continue;
      const perBoard = f.boards.length === 1 && f.refs.length > 0 && findings.some((g) => g !== f && g.kind === f.kind && g.refs.join() === f.refs.map((r) => r.replace(/^\d+:/, `${g.boards[0]}:`)).join());
      const res = await waive(revId, f.key, `accepted for the fixture: ${f.kind}`, perBoard ? 'every-board' : 'finding');
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      for (const g of findings) if (perBoard && g.kind === f.kind && g.refs.map((r) => r.replace(/^\d+:/, '')).join() === f.refs.map((r) => r.replace(/^\d+:/, '')).join()) done.add(g.key);
      done.add(f.key);
    }
    const s = await summary(author, revId);
    expect(s.findings!.openErrors).toBe(0);
    // fewer decisions than error findings: the repeated ones were waived once
    const decisions = s.byKind.flatMap((k) => k.waivers).length;
    expect(decisions).toBeLessThan(s.findings!.errors);
    const ok = await author.a.post(`/api/revisions/${revId}/submit`).set('X-CSRF-Token', author.token);
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
  });
});

describe('the review summary before release: findings with their waivers, overrides, parts changed since the last release', () => {
  it('lists findings by kind with each waiver (reason, who, when), every override with its reason, and says "first release"', async () => {
    const revId = await prepareFaulty();
    const d = await detail(author, revId);
    const noPkg = (d.findings as Finding[]).find((f) => f.kind === 'no-package')!;
    expect((await waive(revId, noPkg.key, 'J9 is fitted by hand after reflow', 'every-board')).status).toBe(201);
    const ov = await author.a
      .put(`/api/revisions/${revId}/overrides`)
      .set('X-CSRF-Token', author.token)
      .send({ overrides: { C3: { nozzle: 'N07', reason: 'N05 tips wear fast on this line' } }, version: (await detail(author, revId)).version });
    expect(ov.status, JSON.stringify(ov.body)).toBe(200);
    await check(revId);

    const s = await summary(reviewer, revId); // the reviewer reads it
    expect(s).toMatchObject({ programName: 'fault-demo', label: 'A', state: 'draft' });
    expect(s.findings).toMatchObject({ total: (await detail(author, revId)).findings!.length });
    const kinds = s.byKind.map((k) => k.kind);
    expect(kinds).toContain('body-overlap');
    expect(kinds.indexOf('body-overlap')).toBeLessThan(kinds.indexOf('no-package')); // report order
    const np = s.byKind.find((k) => k.kind === 'no-package')!;
    expect(np).toMatchObject({ severity: 'error', count: 2, waived: 2 });
    expect(np.waivers).toHaveLength(1);
    expect(np.waivers[0]).toMatchObject({ scope: 'every-board', refs: ['J9'], reason: 'J9 is fitted by hand after reflow', userEmail: author.user.email, userName: author.user.name, covers: 2 });
    expect(Date.parse(np.waivers[0].at)).not.toBeNaN();
    // samples/faulty/README.md: C3 is a C0402 whose nozzle is N05; the override and what the library gives without it
    expect(s.overrides).toEqual([{ ref: 'C3', package: null, nozzle: 'N07', vision: null, reason: 'N05 tips wear fast on this line', footprint: expect.any(String), instead: expect.objectContaining({ package: 'C0402', nozzle: 'N05' }) }]);
    expect(s.changes).toEqual({ since: null, added: [], removed: [], moved: [], changed: [], settings: [], overrides: [] });
    // operators do not read revisions
    expect((await operator.a.get(`/api/revisions/${revId}/review-summary`)).status).toBe(403);
  });

  it('counts parts added, removed and moved against the last released revision', async () => {
    const res = await author.a.post('/api/programs').set('X-CSRF-Token', author.token).send({ name: 'led-strip', product: 'LED status strip', board: 'HCI-LS2 rev A' });
    const revA: string = res.body.revisions[0].id;
    await upload(revA, sampleFile('led-strip/led-strip.csv'), 'led-strip.csv');
    await putSettings(revA, sampleSettings('led-strip/job.json'));
    await check(revA);
    await author.a.post(`/api/revisions/${revA}/submit`).set('X-CSRF-Token', author.token).expect(200);
    const rel = await reviewer.a.post(`/api/revisions/${revA}/approve`).set('X-CSRF-Token', reviewer.token).send({ comment: '' });
    expect(rel.status, JSON.stringify(rel.body)).toBe(200);

    const nb = await author.a.post(`/api/programs/${res.body.id}/revisions`).set('X-CSRF-Token', author.token);
    expect(nb.status, JSON.stringify(nb.body)).toBe(201);
    const revB: string = nb.body.id;
    // B: D2 moved 10 mil in X, R3 removed, D7 added, Q1's value changed
    const text = sampleFile('led-strip/led-strip.csv')
      .toString('utf8')
      .replace('D2;LED-0603-HC;850,0;', 'D2;LED-0603-HC;860,0;')
      .replace(/R3;RES-0402-HC;[^\r\n]*/, 'D7;LED-0603-HC;2350,0;330,0;0,0;Top;RED 625nm;HCI-D-LED-RED;Yes')
      .replace('NMOS-30V;', 'NMOS-40V;');
    await upload(revB, Buffer.from(text, 'utf8'), 'led-strip-b.csv', sampleSettings('led-strip/job.json').import);
    const s = await summary(author, revB);
    expect(s.changes.since).toMatchObject({ revisionId: revA, label: 'A' });
    expect(s.changes).toMatchObject({ added: ['D7'], removed: ['R3'], moved: ['D2'], changed: ['Q1'], settings: [], overrides: [] });
    // the released revision A compares with nothing before it
    expect((await summary(author, revA)).changes.since).toBeNull();
  });
});

describe('package usage is listed before a shared package is edited', () => {
  it('lists the revisions in work and released that place the package; released ones are not affected', async () => {
    const res = await author.a.post('/api/programs').set('X-CSRF-Token', author.token).send({ name: 'led-strip', product: 'LED status strip', board: 'HCI-LS2 rev A' });
    const revA: string = res.body.revisions[0].id;
    await upload(revA, sampleFile('led-strip/led-strip.csv'), 'led-strip.csv');
    await putSettings(revA, sampleSettings('led-strip/job.json'));
    await check(revA);
    await author.a.post(`/api/revisions/${revA}/submit`).set('X-CSRF-Token', author.token).expect(200);
    expect((await reviewer.a.post(`/api/revisions/${revA}/approve`).set('X-CSRF-Token', reviewer.token).send({ comment: '' })).status).toBe(200);
    const revB: string = (await author.a.post(`/api/programs/${res.body.id}/revisions`).set('X-CSRF-Token', author.token).expect(201)).body.id;

    const packages = (await librarian.a.get('/api/library/packages').expect(200)).body.items as { id: string; name: string; aliases: { pattern: string }[] }[];
    const led = packages.find((p) => p.name === 'LED0603')!; // matches LED-0603-HC through its pattern LED-0603*
    expect(led).toBeDefined();
    // B places R1 with the LED package by override
    const ov = await author.a.put(`/api/revisions/${revB}/overrides`).set('X-CSRF-Token', author.token).send({ overrides: { R1: { package: led.name, reason: 'test: same body as the LEDs' } }, version: (await detail(author, revB)).version });
    expect(ov.status, JSON.stringify(ov.body)).toBe(200);

    const u = await librarian.a.get(`/api/library/packages/${led.id}/usage`);
    expect(u.status, JSON.stringify(u.body)).toBe(200);
    const usage = packageUsageSchema.parse(u.body);
    expect(usage).toMatchObject({ packageId: led.id, inWork: 1, released: 1 });
    const [b, a] = usage.revisions; // in work first
    expect(b).toMatchObject({ revisionId: revB, label: 'B', state: 'draft', programName: 'led-strip', parts: 7, viaOverride: 1, affected: true });
    expect(b.refs).toEqual(['D1', 'D2', 'D3', 'D4', 'D5', 'D6', 'R1']);
    expect(a).toMatchObject({ revisionId: revA, label: 'A', state: 'released', parts: 6, viaOverride: 0, affected: false });

    // a package nobody uses: nothing listed
    const unused = packages.find((p) => p.name === 'QFN-32-5x5')!; // no part of the LED strip has it
    const none = packageUsageSchema.parse((await author.a.get(`/api/library/packages/${unused.id}/usage`).expect(200)).body);
    expect(none).toMatchObject({ revisions: [], inWork: 0, released: 0 });

    expect((await operator.a.get(`/api/library/packages/${led.id}/usage`)).status).toBe(403);
    expect((await librarian.a.get('/api/library/packages/00000000-0000-4000-8000-000000000000/usage')).status).toBe(404);
  });
});

describe('the new routes in the API description', () => {
  it('names their answers: the review summary and the package usage', async () => {
    const res = await author.a.get('/api/openapi.json').expect(200);
    const summary = res.body.paths['/revisions/{id}/review-summary']?.get;
    const usage = res.body.paths['/library/packages/{id}/usage']?.get;
    expect(summary?.summary).toMatch(/waivers/);
    expect(JSON.stringify(summary?.responses?.['200'])).toMatch(/unusedWaivers/);
    expect(usage?.summary).toMatch(/in work and released/);
    expect(JSON.stringify(usage?.responses?.['200'])).toMatch(/viaOverride/);
  });
});
