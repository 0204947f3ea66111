import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { AuditEvent } from '../../server/db/entities/audit-event.entity';
import { LibraryAlias } from '../../server/db/entities/library-alias.entity';
import { LibraryPackage } from '../../server/db/entities/library-package.entity';
import { LibraryRevision } from '../../server/db/entities/library-revision.entity';
import { MailMessage } from '../../server/db/entities/mail-message.entity';
import { seedStarterLibrary } from '../../server/db/seed/starter-library';
import { getLibraryFile } from '../../server/modules/library/library.service';
import { recordUnmatchedFootprints } from '../../server/modules/library/unmatched.service';
import { libraryFileSchema } from '../../shared/schemas/library-file.schema';
import { blankPackage, type CreatePackageInput } from '../../shared/schemas/library.schema';
import { signedInAgent, startTestApp, truncateAll, type TestContext } from '../helpers/test-app';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp();
});
afterAll(() => ctx.close());
beforeEach(() => truncateAll(ctx.ds));

type Agent = Awaited<ReturnType<typeof signedInAgent>>;
const post = (ag: Agent, path: string, body: unknown) => ag.a.post(`/api${path}`).set('X-CSRF-Token', ag.token).send(body as object);
const put = (ag: Agent, path: string, body: unknown) => ag.a.put(`/api${path}`).set('X-CSRF-Token', ag.token).send(body as object);

function pkg(over: Partial<CreatePackageInput> = {}): CreatePackageInput {
  return { ...blankPackage('R0603-T'), nozzles: [], vision: null, ...over };
}

async function nozzle(ag: Agent, name: string, tipOuter: number) {
  const res = await post(ag, '/library/nozzles', { name, tipOuter, tipInner: tipOuter / 2, holderRadius: 3, notes: '' });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body;
}

describe('packages', () => {
  it('creates a package with aliases, writing a revision and an audit event; names are unique without case', async () => {
    const lib = await signedInAgent(ctx, ['librarian']);
    const res = await post(lib, '/library/packages', pkg({ name: 'R0603-T', aliases: ['RES-0603-T*'] }));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ name: 'R0603-T', version: 1, courtyard: 0.25, aliases: [{ pattern: 'RES-0603-T*' }] });
    const rev = await ctx.ds.getRepository(LibraryRevision).findOneByOrFail({ entity: 'package', action: 'create' });
    expect(rev).toMatchObject({ actorEmail: lib.user.email, entityName: 'R0603-T', before: null });
    expect(rev.after).toMatchObject({ bodyLength: 1.6, aliases: ['RES-0603-T*'] });
    expect(await ctx.ds.getRepository(AuditEvent).countBy({ action: 'library.package.create' })).toBe(1);
    const dup = await post(lib, '/library/packages', pkg({ name: 'r0603-t', aliases: [] }));
    expect(dup.status).toBe(409);
    expect(dup.body.errors).toEqual([{ path: 'name', message: 'R0603-T already exists' }]);
  });

  it.each([
    // EIA-481 (from memory): widths 8, 12, 16, 24, 32, 44, 56, 72 mm; pitch 2 mm on 8 mm tape only, else multiples of 4 mm
    [10, 4, 'tapeWidth'],
    [12, 2, 'tapePitch'],
    [8, 6, 'tapePitch'],
    [8, null, 'tapePitch'],
  ])('refuses tape %s mm with pitch %s mm (%s)', async (width, pitch, path) => {
    const lib = await signedInAgent(ctx, ['librarian']);
    const res = await post(lib, '/library/packages', pkg({ tapeWidth: width, tapePitch: pitch }));
    expect(res.status).toBe(400);
    expect(res.body.errors.map((e: { path: string }) => e.path)).toEqual([path]);
  });

  it.each([[8, 2], [8, 4], [12, 8], [24, 16], [72, 4]])('accepts tape %s mm at %s mm', async (width, pitch) => {
    const lib = await signedInAgent(ctx, ['librarian']);
    expect((await post(lib, '/library/packages', pkg({ tapeWidth: width, tapePitch: pitch }))).status).toBe(201);
  });

  it('refuses sizes of zero or less, field by field', async () => {
    const lib = await signedInAgent(ctx, ['librarian']);
    const res = await post(lib, '/library/packages', pkg({ bodyLength: 0, bodyWidth: -1 }));
    expect(res.status).toBe(400);
    expect(res.body.errors.map((e: { path: string }) => e.path).sort()).toEqual(['bodyLength', 'bodyWidth']);
  });

  it('warns, without refusing, when a nozzle tip is wider than the body’s smaller side; refuses an unknown nozzle', async () => {
    const lib = await signedInAgent(ctx, ['librarian']);
    await nozzle(lib, 'N14', 1.4);
    const res = await post(lib, '/library/packages', pkg({ name: 'C0402-T', bodyLength: 1.0, bodyWidth: 0.5, nozzles: ['N14'], tapeWidth: 8, tapePitch: 2 }));
    expect(res.status).toBe(201);
    expect(res.body.warnings).toEqual([{ path: 'nozzles.0', message: expect.stringMatching(/wider than the body's smaller side \(0\.500 mm\)/) }]);
    const bad = await post(lib, '/library/packages', pkg({ name: 'C0805-T', nozzles: ['N99'] }));
    expect(bad.status).toBe(400);
    expect(bad.body.errors[0].path).toBe('nozzles.0');
  });

  it('two librarians save the same package: the second gets 409 and nothing is lost', async () => {
    const a = await signedInAgent(ctx, ['librarian']);
    const b = await signedInAgent(ctx, ['librarian']);
    const created = (await post(a, '/library/packages', pkg({ name: 'SOT-23-T', family: 'SOT' }))).body;
    const { id, aliases: _a, warnings: _w, updatedAt: _u, updatedBy: _b, ...fields } = created;
    const first = await put(a, `/library/packages/${id}`, { ...fields, rotationOffset: -90 });
    expect(first.status, JSON.stringify(first.body)).toBe(200);
    expect(first.body.version).toBe(2);
    const second = await put(b, `/library/packages/${id}`, { ...fields, bodyHeight: 1.1 });
    expect(second.status).toBe(409);
    expect(second.body.detail).toMatch(/changed by someone else/);
    expect(second.body.detail).toMatch(/reload/i);
    const row = await ctx.ds.getRepository(LibraryPackage).findOneByOrFail({ id });
    expect(row).toMatchObject({ rotationOffset: -90, bodyHeight: 0.5, version: 2 }); // the first save stands
    const revs = await ctx.ds.getRepository(LibraryRevision).find({ where: { entityId: id }, order: { id: 'ASC' } });
    expect(revs.map((r) => r.action)).toEqual(['create', 'update']);
    expect(revs[1].before).toMatchObject({ rotationOffset: 0 });
    expect(revs[1].after).toMatchObject({ rotationOffset: -90 });
    // B reloads and saves again: now it works.
    const again = await put(b, `/library/packages/${id}`, { ...fields, rotationOffset: -90, bodyHeight: 1.1, version: 2 });
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ rotationOffset: -90, bodyHeight: 1.1, version: 3 });
  });

  it('engineers read but cannot edit; operators do not read (run files carry what they need)', async () => {
    const eng = await signedInAgent(ctx, ['engineer']);
    const op = await signedInAgent(ctx, ['operator']);
    expect((await post(eng, '/library/packages', pkg())).status).toBe(403);
    expect((await eng.a.get('/api/library/packages')).status).toBe(200);
    expect((await op.a.get('/api/library/packages')).status).toBe(403);
  });
});

describe('footprint matching through the API', () => {
  it('name, then exact alias, then the longest pattern (shared/schemas/README.md, "Library file")', async () => {
    const lib = await signedInAgent(ctx, ['librarian']);
    await post(lib, '/library/packages', pkg({ name: 'SOT-23', family: 'SOT', aliases: ['SOT-23*', 'SOT23'] })).expect(201);
    await post(lib, '/library/packages', pkg({ name: 'SOT-23-5', family: 'SOT', aliases: ['SOT-23-5*'] })).expect(201);
    await post(lib, '/library/packages', pkg({ name: 'SOT23-ODD', family: 'SOT', aliases: ['SOT-23-5-HC'] })).expect(201);
    const cases: [string, string | null, string | null][] = [
      ['sot-23', 'SOT-23', 'name'], // name, case-insensitive
      ['SOT23', 'SOT-23', 'alias'],
      ['SOT-23-5', 'SOT-23-5', 'name'], // a name beats the pattern SOT-23*
      ['SOT-23-5-HC', 'SOT23-ODD', 'alias'], // an exact alias beats both patterns
      ['SOT-23-5-N', 'SOT-23-5', 'pattern'], // SOT-23-5* (9 chars) before SOT-23* (7)
      ['SOT-23-3', 'SOT-23', 'pattern'],
      ['SOIC-8', null, null],
    ];
    for (const [footprint, name, by] of cases) {
      const res = await lib.a.get('/api/library/match').query({ footprint }).expect(200);
      expect([footprint, res.body.packageName, res.body.matchedBy]).toEqual([footprint, name, by]);
    }
  });

  it('refuses an alias that is another package’s name or already taken', async () => {
    const lib = await signedInAgent(ctx, ['librarian']);
    const a = (await post(lib, '/library/packages', pkg({ name: 'A1', aliases: ['FOO*'] }))).body;
    await post(lib, '/library/packages', pkg({ name: 'B1' })).expect(201);
    const taken = await post(lib, '/library/aliases', { pattern: 'foo*', packageId: a.id });
    expect(taken.status).toBe(409);
    const name = await post(lib, '/library/aliases', { pattern: 'B1', packageId: a.id });
    expect(name.status).toBe(409);
    expect(name.body.errors[0]).toMatchObject({ path: 'pattern', message: expect.stringMatching(/name of package B1/) });
  });
});

describe('library file: export and import', () => {
  it('export → import → export is byte-identical (starter library)', async () => {
    await seedStarterLibrary(ctx.ds);
    const lib = await signedInAgent(ctx, ['librarian']);
    const first = await lib.a.get('/api/library/export').buffer(true).parse((res, cb) => {
      let s = '';
      res.on('data', (c: Buffer) => (s += c.toString('utf8')));
      res.on('end', () => cb(null, s));
    });
    expect(first.status).toBe(200);
    expect(first.headers['content-disposition']).toMatch(/attachment; filename="placewright-library-/);
    const text = first.body as string;
    const parsed = libraryFileSchema.parse(JSON.parse(text)); // the engine reads it
    expect(parsed.packages.length).toBeGreaterThanOrEqual(60);
    const imp = await post(lib, '/library/import', { mode: 'replace', file: JSON.parse(text) });
    expect(imp.status, JSON.stringify(imp.body)).toBe(200);
    expect(imp.body).toMatchObject({ mode: 'replace', packages: parsed.packages.length });
    const second = await lib.a.get('/api/library/export').buffer(true).parse((res, cb) => {
      let s = '';
      res.on('data', (c: Buffer) => (s += c.toString('utf8')));
      res.on('end', () => cb(null, s));
    });
    expect(second.body).toBe(text);
    // merging the same file changes nothing either
    await post(lib, '/library/import', { mode: 'merge', file: JSON.parse(text) }).expect(200);
    const third = await getLibraryFile(ctx.ds.manager);
    expect(JSON.stringify(third)).toBe(JSON.stringify(libraryFileSchema.parse(JSON.parse(text))));
  });

  it('a bad file is refused with every problem named by its path, and nothing changes', async () => {
    await seedStarterLibrary(ctx.ds);
    const before = await ctx.ds.getRepository(LibraryPackage).count();
    const lib = await signedInAgent(ctx, ['librarian']);
    const file = {
      format: 'placewright-library/1',
      packages: [
        { name: 'X1', body: { length: 1, width: 1, height: 1 }, tape: { width: 12, pitch: 2 }, nozzles: ['N99'] },
        { name: 'x1', body: { length: -1, width: 1, height: 1 } },
      ],
      nozzles: [],
      visionPresets: [{ name: 'v', method: 'sparkle' }],
    };
    const res = await post(lib, '/library/import', { mode: 'replace', file });
    expect(res.status).toBe(400);
    const paths = res.body.errors.map((e: { path: string }) => e.path);
    expect(paths).toEqual(expect.arrayContaining(['packages.0.tape.pitch', 'packages.1.body.length', 'visionPresets.0.method']));
    expect(await ctx.ds.getRepository(LibraryPackage).count()).toBe(before);
  });

  it('getLibraryFile gives the engine a LibraryFile; /library/file serves it', async () => {
    await seedStarterLibrary(ctx.ds);
    const file = await getLibraryFile(ctx.ds.manager);
    expect(file.format).toBe('placewright-library/1');
    expect(file.packages.find((p) => p.name === 'SOT-23')).toMatchObject({ rotationOffset: -90, body: { length: 2.9, width: 1.3 } });
    const eng = await signedInAgent(ctx, ['engineer']);
    const res = await eng.a.get('/api/library/file').expect(200);
    expect(res.body.packages.length).toBe(file.packages.length);
  });
});

describe('CSV bulk import', () => {
  const header = 'name,family,length,width,height,nozzles,vision,tapeWidth,tapePitch,aliases';
  it('previews per-row errors with their line numbers; a commit with errors writes nothing', async () => {
    await seedStarterLibrary(ctx.ds);
    const lib = await signedInAgent(ctx, ['librarian']);
    const csv = [header, 'NEW-1,chip,1.6,0.8,0.5,N07,chip-small,8,4,NEW1-*', '', 'NEW-2,chip,0,0.8,0.5,,,12,2,', 'R0603,chip,1.6,0.8,0.45,N07,chip-small,8,4,', 'NEW-3,widget,1,1,1,N99,,8,4,'].join('\n');
    const prev = await post(lib, '/library/packages/csv/preview', { csv });
    expect(prev.status).toBe(200);
    const rows = prev.body.rows.map((r: { line: number; name: string; action: string; errors: { path: string }[] }) => [r.line, r.name, r.action, r.errors.map((e) => e.path).sort()]);
    expect(rows).toEqual([
      [2, 'NEW-1', 'create', []],
      [4, 'NEW-2', 'create', ['length', 'tapePitch']], // line 3 is blank and counted
      [5, 'R0603', 'update', []],
      [6, 'NEW-3', 'create', ['family']],
    ]);
    const before = await ctx.ds.getRepository(LibraryPackage).count();
    const commit = await post(lib, '/library/packages/csv', { csv });
    expect(commit.status).toBe(400);
    expect(commit.body.errors.map((e: { path: string }) => e.path)).toContain('line 4.length');
    expect(await ctx.ds.getRepository(LibraryPackage).count()).toBe(before);
    expect(await ctx.ds.getRepository(LibraryPackage).countBy({ name: 'NEW-1' })).toBe(0);
  });

  it('commits a clean file in one go (creates and updates)', async () => {
    await seedStarterLibrary(ctx.ds);
    const lib = await signedInAgent(ctx, ['librarian']);
    const csv = [header, 'NEW-1,chip,1.6,0.8,0.5,N07,chip-small,8,4,NEW1-*|NEW1_ALT', 'R0603,chip,1.6,0.8,0.55,N07,chip-small,8,4,'].join('\r\n');
    const res = await post(lib, '/library/packages/csv', { csv });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toEqual({ created: 1, updated: 1 });
    expect((await ctx.ds.getRepository(LibraryPackage).findOneByOrFail({ name: 'R0603' })).bodyHeight).toBe(0.55);
    expect(await ctx.ds.getRepository(LibraryAlias).countBy({ pattern: 'NEW1_ALT' })).toBe(1);
  });
});

describe('unmatched footprints and proposals', () => {
  it('records unmatched footprints per program and resolves one by creating a package from it', async () => {
    await seedStarterLibrary(ctx.ds);
    await ctx.ds.transaction((m) => recordUnmatchedFootprints(m, 'weather-ctl B', [{ footprint: 'TERMBLOCK-5MM', count: 2 }, { footprint: 'BUZZER-12MM', count: 1 }]));
    await ctx.ds.transaction((m) => recordUnmatchedFootprints(m, 'led-strip A', [{ footprint: 'termblock-5mm', count: 3 }]));
    await ctx.ds.transaction((m) => recordUnmatchedFootprints(m, 'weather-ctl B', [{ footprint: 'TERMBLOCK-5MM', count: 4 }])); // re-import replaces the count
    const lib = await signedInAgent(ctx, ['librarian']);
    const list = (await lib.a.get('/api/library/unmatched').expect(200)).body.items;
    expect(list.map((u: { footprint: string; count: number }) => [u.footprint, u.count])).toEqual([['TERMBLOCK-5MM', 7], ['BUZZER-12MM', 1]]);
    expect(list[0].programs).toEqual([{ label: 'led-strip A', count: 3 }, { label: 'weather-ctl B', count: 4 }]);
    const res = await post(lib, `/library/unmatched/${list[0].id}/create-package`, pkg({ name: 'TERM-2P-5.08', family: 'connector', nozzles: ['N40'], tapeWidth: null, tapePitch: null, feeder: 'tube' }));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.aliases.map((a: { pattern: string }) => a.pattern)).toEqual(['TERMBLOCK-5MM']);
    const after = (await lib.a.get('/api/library/unmatched').expect(200)).body.items;
    expect(after.find((u: { footprint: string }) => u.footprint === 'TERMBLOCK-5MM')).toMatchObject({ status: 'resolved', resolvedPackageName: 'TERM-2P-5.08' });
    const buzzer = after.find((u: { footprint: string }) => u.footprint === 'BUZZER-12MM');
    const sot = (await lib.a.get('/api/library/match').query({ footprint: 'SOT-23' })).body.packageId;
    const bad = await post(lib, `/library/unmatched/${buzzer.id}/add-alias`, { packageId: sot, pattern: 'BUZ*X' });
    expect(bad.status).toBe(400);
    const ok = await post(lib, `/library/unmatched/${buzzer.id}/add-alias`, { packageId: sot });
    expect(ok.status).toBe(201);
    expect((await lib.a.get('/api/library/match').query({ footprint: 'buzzer-12mm' })).body.packageName).toBe('SOT-23');
  });

  it('an engineer’s proposal round-trips with its two e-mails', async () => {
    await seedStarterLibrary(ctx.ds);
    const librarian = await signedInAgent(ctx, ['librarian']);
    const eng = await signedInAgent(ctx, ['engineer']);
    await ctx.ds.transaction((m) => recordUnmatchedFootprints(m, 'weather-ctl B', [{ footprint: 'BUZZER-12MM', count: 1 }]));
    const proposed = await post(eng, '/library/proposals', { kind: 'new-package', footprint: 'BUZZER-12MM', note: 'Magnetic buzzer on the weather board.', package: pkg({ name: 'BUZZER-12', family: 'other', bodyLength: 12, bodyWidth: 12, bodyHeight: 9.5, nozzles: ['N40'], tapeWidth: 24, tapePitch: 16, aliases: [] }) });
    expect(proposed.status, JSON.stringify(proposed.body)).toBe(201);
    expect(proposed.body).toMatchObject({ status: 'open', kind: 'new-package', proposerEmail: eng.user.email });
    let mails = await ctx.ds.getRepository(MailMessage).find({ order: { at: 'ASC' } });
    expect(mails).toHaveLength(1);
    expect(mails[0].to).toEqual([librarian.user.email]);
    expect(mails[0].subject).toMatch(/Library proposal: new package BUZZER-12 for footprint BUZZER-12MM/);
    // Engineers cannot decide.
    expect((await post(eng, `/library/proposals/${proposed.body.id}/approve`, {})).status).toBe(403);
    const edited = pkg({ name: 'BUZZER-12', family: 'other', bodyLength: 12, bodyWidth: 12, bodyHeight: 9.7, nozzles: ['N40'], tapeWidth: 24, tapePitch: 16, aliases: [] });
    const approved = await post(librarian, `/library/proposals/${proposed.body.id}/approve`, { package: edited, comment: 'Height from the maker’s drawing: 9.7 mm.' });
    expect(approved.status, JSON.stringify(approved.body)).toBe(200);
    expect(approved.body).toMatchObject({ status: 'approved', decidedByEmail: librarian.user.email, packageName: 'BUZZER-12' });
    expect((await ctx.ds.getRepository(LibraryPackage).findOneByOrFail({ name: 'BUZZER-12' })).bodyHeight).toBe(9.7);
    // the footprint now matches: it became the new package's alias
    expect((await librarian.a.get('/api/library/match').query({ footprint: 'BUZZER-12MM' })).body).toMatchObject({ packageName: 'BUZZER-12', matchedBy: 'alias' });
    const queue = (await librarian.a.get('/api/library/unmatched')).body.items;
    expect(queue[0]).toMatchObject({ footprint: 'BUZZER-12MM', status: 'resolved', resolvedPackageName: 'BUZZER-12' });
    mails = await ctx.ds.getRepository(MailMessage).find({ order: { at: 'ASC' } });
    expect(mails).toHaveLength(2);
    expect(mails[1].to).toEqual([eng.user.email]);
    expect(mails[1].subject).toMatch(/approved/);
    expect(mails[1].text).toMatch(/9\.7 mm/);
    // deciding twice is a conflict
    expect((await post(librarian, `/library/proposals/${proposed.body.id}/reject`, { comment: 'no' })).status).toBe(409);
  });

  it('a rejection needs a comment and mails the proposer', async () => {
    await seedStarterLibrary(ctx.ds);
    const librarian = await signedInAgent(ctx, ['librarian']);
    const eng = await signedInAgent(ctx, ['engineer']);
    const sot = (await librarian.a.get('/api/library/match').query({ footprint: 'SOT-23' })).body.packageId;
    const p = (await post(eng, '/library/proposals', { kind: 'alias', pattern: 'TR-SOT*', packageId: sot, footprint: null, note: '' })).body;
    expect((await post(librarian, `/library/proposals/${p.id}/reject`, { comment: ' ' })).status).toBe(400);
    const res = await post(librarian, `/library/proposals/${p.id}/reject`, { comment: 'TR-SOT* would catch SOT-89 parts too.' });
    expect(res.body.status).toBe('rejected');
    const mails = await ctx.ds.getRepository(MailMessage).find({ order: { at: 'ASC' } });
    expect(mails.map((m) => m.to[0])).toEqual([librarian.user.email, eng.user.email]);
    expect(mails[1].text).toMatch(/catch SOT-89/);
  });
});

describe('nozzles, presets, machines', () => {
  it('renaming a nozzle carries its packages along; deleting a used one is refused', async () => {
    const lib = await signedInAgent(ctx, ['librarian']);
    const n = await nozzle(lib, 'N07', 0.7);
    const p = (await post(lib, '/library/packages', pkg({ nozzles: ['N07'] }))).body;
    const ren = await put(lib, `/library/nozzles/${n.id}`, { name: 'N07B', tipOuter: 0.7, tipInner: 0.35, holderRadius: 3, notes: '', version: 1 });
    expect(ren.status, JSON.stringify(ren.body)).toBe(200);
    const after = (await lib.a.get(`/api/library/packages/${p.id}`)).body;
    expect(after.nozzles).toEqual(['N07B']);
    const del = await lib.a.delete(`/api/library/nozzles/${n.id}`).set('X-CSRF-Token', lib.token).send({ version: 2 });
    expect(del.status).toBe(409);
    expect(del.body.detail).toMatch(/still used by R0603-T/);
  });

  it('a vision preset keeps our own fields', async () => {
    const lib = await signedInAgent(ctx, ['librarian']);
    const res = await post(lib, '/library/vision-presets', { name: 'fine-pitch', method: 'lead-tips', lighting: 'side', sizeTolerancePct: 8, maxCentringOffset: 0.4, maxAngleCorrection: 3, notes: '' });
    expect(res.status).toBe(201);
    const bad = await post(lib, '/library/vision-presets', { name: 'x', method: 'sparkle', lighting: 'top', sizeTolerancePct: 200, maxCentringOffset: 0.4, maxAngleCorrection: 3, notes: '' });
    expect(bad.body.errors.map((e: { path: string }) => e.path).sort()).toEqual(['method', 'sizeTolerancePct']);
  });
});
