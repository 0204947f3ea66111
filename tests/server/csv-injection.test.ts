import { createHash } from 'node:crypto';
import request from 'supertest';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { readPlacementListCsv } from '../../shared/placement-list';
import { ProgramRevision, ReleaseFile } from '../../server/db/entities/program.entity';
import { sampleFile, sampleLibrary, sampleSettings } from '../helpers/programs';
import { signedInAgent, startTestApp, truncateAll, type TestContext } from '../helpers/test-app';

/**
 * Issue "Reliability and scale", defect 4: spreadsheet formulas (OWASP "CSV Injection": cells
 * starting with = + - @ tab or CR) are refused at import and neutralised in every CSV we write.
 */
let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp();
});
afterAll(() => ctx.close());

type Agent = Awaited<ReturnType<typeof signedInAgent>>;
let author: Agent;
let reviewer: Agent;
let operator: Agent;
beforeEach(async () => {
  await truncateAll(ctx.ds);
  author = await signedInAgent(ctx, ['engineer']);
  reviewer = await signedInAgent(ctx, ['engineer']);
  operator = await signedInAgent(ctx, ['operator']);
  const admin = await signedInAgent(ctx, ['admin']);
  await admin.a.post('/api/library/import').set('X-CSRF-Token', admin.token).send({ file: sampleLibrary(), mode: 'replace' }).expect(200);
});

async function createProgram(name = 'led-strip') {
  const res = await author.a.post('/api/programs').set('X-CSRF-Token', author.token).send({ name, product: 'LED status strip', board: 'HCI-LS2 rev A' });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.revisions[0].id as string;
}
const version = async (revId: string) => (await author.a.get(`/api/revisions/${revId}`).expect(200)).body.version as number;
const upload = async (revId: string, file: Buffer, path = 'centroid') =>
  author.a.post(`/api/revisions/${revId}/${path}`).set('X-CSRF-Token', author.token).field('options', '{}').field('version', String(await version(revId))).attach('file', file, 'board.csv');

const download = (a: Agent, url: string) =>
  a.a.get(url).buffer(true).parse((res, cb) => {
    const chunks: Buffer[] = [];
    res.on('data', (c: Buffer) => chunks.push(c));
    res.on('end', () => cb(null, Buffer.concat(chunks)));
  });

describe('import refuses formula cells in text columns, naming line and column', () => {
  const csv = [
    'Ref,X(mm),Y(mm),Rot,Side,Footprint,Value',
    'R1,1,1,0,top,R0603,10k',
    '"=HYPERLINK(""http://x.example"",""R2"")",2,2,0,top,R0603,10k', // line 3: reference
    'R3,3,3,0,top,R0603,@SUM(1+1)*cmd', // line 4: value
    'R4,4,4,0,top,+cmd,10k', // line 5: footprint
    "R5,5,5,0,top,R0603,\"=cmd|' /C calc'!A0\"", // line 6: value
    'R6,-6,-6.5,0,top,R0603,-5', // negative numbers are numbers, not formulas
  ].join('\n');

  it('the commit answers 400 with the first one; nothing is stored', async () => {
    const revId = await createProgram();
    const res = await upload(revId, Buffer.from(csv));
    expect(res.status, JSON.stringify(res.body)).toBe(400);
    expect(res.body.detail).toMatch(/line 3/);
    expect(res.body.detail).toMatch(/column "Ref"/);
    expect(res.body.detail).toMatch(/formula/);
    expect((await ctx.ds.getRepository(ProgramRevision).findOneByOrFail({ id: revId })).imported).toBeNull();
  });

  it('the preview lists every one with its line and column', async () => {
    const revId = await createProgram();
    const res = await upload(revId, Buffer.from(csv), 'centroid/preview');
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.rowErrors.map((e: { line: number; column: string }) => [e.line, e.column])).toEqual([
      [3, 'Ref'],
      [4, 'Value'],
      [5, 'Footprint'],
      [6, 'Value'],
    ]);
    expect(res.body.rowErrors[0].message).toMatch(/starts with "=", which a spreadsheet would run as a formula/);
    expect(res.body.first.map((p: { ref: string }) => p.ref)).toEqual(['R1', 'R6']);
  });
});

describe('run files neutralise formula cells; the checksums cover the bytes served', () => {
  it('a draft imported before the rule, with a formula in a value, is released with the cell quoted and prefixed', async () => {
    const revId = await createProgram();
    expect((await upload(revId, sampleFile('led-strip/led-strip.csv'))).status).toBe(200);
    await author.a.put(`/api/revisions/${revId}/settings`).set('X-CSRF-Token', author.token).send({ settings: sampleSettings('led-strip/job.json'), version: await version(revId) }).expect(200);
    // as an import made before the rule existed would have stored it
    const rev = await ctx.ds.getRepository(ProgramRevision).findOneByOrFail({ id: revId });
    const imported = rev.imported as { placements: { ref: string; value: string; dnp: boolean }[] };
    const target = imported.placements.find((p) => !p.dnp)!;
    target.value = "=cmd|' /C calc'!A0";
    rev.imported = imported as never;
    await ctx.ds.getRepository(ProgramRevision).save(rev);
    await author.a.post(`/api/revisions/${revId}/checks`).set('X-CSRF-Token', author.token).expect(200);
    await author.a.post(`/api/revisions/${revId}/submit`).set('X-CSRF-Token', author.token).expect(200);
    const released = await reviewer.a.post(`/api/revisions/${revId}/approve`).set('X-CSRF-Token', reviewer.token).send({ comment: '' });
    expect(released.status, JSON.stringify(released.body)).toBe(200);
    const file = released.body.releaseFiles.find((f: { format: string; side: string }) => f.format === 'csv' && f.side === 'top');

    const dl = await download(operator, file.url);
    expect(dl.status).toBe(200);
    const bytes = dl.body as Buffer;
    const text = bytes.toString('utf8');
    expect(text).toContain(`"'=cmd|' /C calc'!A0"`);
    expect(text).not.toMatch(/,=cmd/);
    // every data line: no cell a spreadsheet would run (OWASP triggers at the start of a cell)
    for (const line of text.split('\n').filter((l) => l && !l.startsWith('#'))) expect(line).not.toMatch(/(^|,)[=+@\t\r]|(^|,)-[^\d.]/);
    // the list's digest (every byte after the metadata lines) and the whole file's, over what was served
    const body = text.split('\n').filter((l) => !l.startsWith('# ')).join('\n');
    expect(dl.headers['x-content-sha256']).toBe(createHash('sha256').update(body).digest('hex'));
    expect(dl.headers['x-content-sha256']).toBe(file.sha256);
    expect(dl.headers['x-file-sha256']).toBe(createHash('sha256').update(bytes).digest('hex'));
    expect(text).toContain(`# sha256: ${file.sha256}`);
    // the JSON list keeps the value as it is (JSON is not opened as a spreadsheet)
    const json = released.body.releaseFiles.find((f: { format: string; side: string }) => f.format === 'json' && f.side === 'top');
    const j = await operator.a.get(json.url).expect(200);
    expect(JSON.stringify(j.body)).toContain("=cmd|' /C calc'!A0");
  });

  it('a file released before the rule is served byte for byte with its own checksum, and still reads', async () => {
    const revId = await createProgram();
    expect((await upload(revId, sampleFile('led-strip/led-strip.csv'))).status).toBe(200);
    await author.a.put(`/api/revisions/${revId}/settings`).set('X-CSRF-Token', author.token).send({ settings: sampleSettings('led-strip/job.json'), version: await version(revId) }).expect(200);
    await author.a.post(`/api/revisions/${revId}/checks`).set('X-CSRF-Token', author.token).expect(200);
    await author.a.post(`/api/revisions/${revId}/submit`).set('X-CSRF-Token', author.token).expect(200);
    const released = await reviewer.a.post(`/api/revisions/${revId}/approve`).set('X-CSRF-Token', reviewer.token).send({ comment: '' });
    expect(released.status).toBe(200);
    const stored = await ctx.ds.getRepository(ReleaseFile).findOneByOrFail({ revisionId: revId, side: 'top', format: 'csv' });
    const dl = await download(operator, `/api/run-files/${revId}/top.csv`);
    expect(Buffer.compare(dl.body as Buffer, stored.bytes)).toBe(0);
    expect(dl.headers['x-content-sha256']).toBe(stored.sha256);
    const parsed = await readPlacementListCsv((dl.body as Buffer).toString('utf8'));
    expect(parsed.placements.length).toBe(stored.placements);
    void request;
  });
});
