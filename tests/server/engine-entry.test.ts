// One revision, three front doors: the placement lists released through the API, written from
// the run the web client draws (GET /revisions/:id/run) and printed by the command line are the
// same bytes, with overrides of every kind (package, nozzle, vision preset) in play.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { main } from '../../server/cli';
import { readPlacementListCsv, writePlacementListCsv } from '../../shared/placement-list';
import { runResultFromJson } from '../../shared/pipeline';
import { SAMPLES, sampleFile, sampleLibrary, sampleSettings } from '../helpers/programs';
import { signedInAgent, startTestApp, truncateAll, type TestContext } from '../helpers/test-app';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp();
});
afterAll(() => ctx.close());

type Agent = Awaited<ReturnType<typeof signedInAgent>>;
let author: Agent;
let reviewer: Agent;

beforeEach(async () => {
  await truncateAll(ctx.ds);
  author = await signedInAgent(ctx, ['engineer']);
  reviewer = await signedInAgent(ctx, ['engineer']);
  const admin = await signedInAgent(ctx, ['admin']);
  const lib = await admin.a.post('/api/library/import').set('X-CSRF-Token', admin.token).send({ file: sampleLibrary(), mode: 'replace' });
  expect(lib.status, JSON.stringify(lib.body)).toBe(200);
});

const JOB = 'led-strip/job-overrides.json';

async function cli(...argv: string[]) {
  let stdout = '';
  let stderr = '';
  const code = await main(argv, { stdout: (s) => (stdout += s), stderr: (s) => (stderr += s) });
  return { code, stdout, stderr };
}

async function version(revId: string): Promise<number> {
  return (await author.a.get(`/api/revisions/${revId}`).expect(200)).body.version;
}

async function bytesOf(a: Agent, url: string): Promise<string> {
  const res = await a.a.get(url).buffer(true).parse((r, cb) => {
    const chunks: Buffer[] = [];
    r.on('data', (c: Buffer) => chunks.push(c));
    r.on('end', () => cb(null, Buffer.concat(chunks)));
  });
  expect(res.status).toBe(200);
  return (res.body as Buffer).toString('utf8');
}

describe('one engine entry: web, API and command line agree', () => {
  it('gives byte-identical placement lists for a revision with package, nozzle and vision overrides', async () => {
    const job = JSON.parse(readFileSync(join(SAMPLES, JOB), 'utf8'));
    const kinds = new Set(Object.values(job.overrides as Record<string, object>).flatMap((o) => Object.keys(o).filter((k) => k !== 'reason')));
    expect([...kinds].sort()).toEqual(['nozzle', 'package', 'vision']);

    const created = await author.a.post('/api/programs').set('X-CSRF-Token', author.token).send({ name: job.program, product: 'LED status strip', board: 'HCI-LS2 rev A' });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const revId = created.body.revisions[0].id as string;
    const up = await author.a
      .post(`/api/revisions/${revId}/centroid`)
      .set('X-CSRF-Token', author.token)
      .field('options', JSON.stringify({}))
      .field('version', String(await version(revId)))
      .attach('file', sampleFile('led-strip/led-strip.csv'), 'led-strip.csv');
    expect(up.status, JSON.stringify(up.body)).toBe(200);
    const set = await author.a.put(`/api/revisions/${revId}/settings`).set('X-CSRF-Token', author.token).send({ settings: sampleSettings(JOB), version: await version(revId) });
    expect(set.status, JSON.stringify(set.body)).toBe(200);
    const ov = await author.a.put(`/api/revisions/${revId}/overrides`).set('X-CSRF-Token', author.token).send({ overrides: job.overrides, version: await version(revId) });
    expect(ov.status, JSON.stringify(ov.body)).toBe(200);
    await author.a.post(`/api/revisions/${revId}/checks`).set('X-CSRF-Token', author.token).expect(200);
    await author.a.post(`/api/revisions/${revId}/submit`).set('X-CSRF-Token', author.token).expect(200);
    const released = await reviewer.a.post(`/api/revisions/${revId}/approve`).set('X-CSRF-Token', reviewer.token).send({ comment: 'Substitutions checked.' });
    expect(released.status, JSON.stringify(released.body)).toBe(200);

    for (const side of ['top', 'bottom'] as const) {
      // the API: the released run file
      const api = await bytesOf(author, `/api/run-files/${revId}/${side}.csv`);
      const { meta, placements } = await readPlacementListCsv(api);
      // the overrides took effect (names as the library spells them, whatever the case written)
      const byRef = new Map(placements.map((p) => [p.ref, p]));
      if (side === 'top') {
        expect(byRef.get('R3')).toMatchObject({ package: 'R0603' }); // footprint RES-0402-HC matches R0402 without the override
        expect(byRef.get('Q1')).toMatchObject({ nozzle: 'N10' }); // SOT-23 lists N07 first
        expect(byRef.get('D1')).toMatchObject({ vision: 'chip-medium' }); // LED0603 has chip-small
      }
      // the web: the run the client draws, written by the list writer with the same time stamp
      const web = runResultFromJson((await author.a.get(`/api/revisions/${revId}/run?side=${side}`).expect(200)).body);
      const fromWeb = (await writePlacementListCsv(web, { generated: meta.generated })).text;
      // the command line on the job file
      const out = await cli('panelize', join(SAMPLES, JOB), '--side', side, '--generated', meta.generated);
      expect(out.code, out.stderr).toBe(0);
      expect(fromWeb).toBe(api);
      expect(out.stdout).toBe(api);
    }
  });
});
