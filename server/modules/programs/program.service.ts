// Programs and their revisions: reading them, creating them, and editing a draft (its centroid
// file, settings, overrides, checks and canvas underlay). The review steps, waivers and review
// notes are their own services (review.service.ts, waivers.service.ts) behind the same methods
// here; the state table they follow is review-state.ts.
import { In, type DataSource, type EntityManager } from 'typeorm';
import type { ImportResult, Side } from '../../../shared/core';
import { runResultToJson, type RunResultJson } from '../../../shared/pipeline';
import type { Finding } from '../../../shared/schemas/finding.schema';
import {
  revisionSettingsSchema,
  type CommentDto,
  type CreateProgramInput,
  type Override,
  type ProgramDto,
  type RevisionDetail,
  type ReviewSummaryDto,
  type RevisionSettings,
  type RevisionSummary,
  type WaiverDto,
} from '../../../shared/schemas/program.schema';
import { Program, ProgramRevision, ReleaseFile, RevisionComment, RevisionWaiver } from '../../db/entities/program.entity';
import { BadRequestError, ConflictError, NotFoundError } from '../../lib/errors';
import { contributorList, isContributor, recordContribution } from './contributors';
import { CENTROID_NAME_FALLBACK, runEngine, type EngineInput } from './engine';
import { readStoredImport } from './stored-import';
import type { ImportPreview, ReadImport } from './import-task';
import type { ProgramDeps } from './program-deps';
import { SUMMARY_COLUMNS, commentDto, programDto, releaseFileDto, revisionSummary, waiverDtos } from './program-dto';
import { loadRevision, revisionLabel, userRefs, type ServiceUser } from './revision-access';
import { assertEditable, assertVersion, canTake, isEditable, notesOpen } from './review-state';
import { ReviewService } from './review.service';
import { WaiverService, type CommentInput } from './waivers.service';

export type { LibrarySource } from './program-deps';
export type { ServiceUser } from './revision-access';

export const UPLOAD_LIMIT_BYTES = 20 * 1024 * 1024;
/** The import preview lists at most this many row errors. */
export const PREVIEW_ERROR_LIMIT = 200;

/** The most programs one page lists (GET /programs?limit=…). */
export const PROGRAM_PAGE_MAX = 500;

function nextLabel(label: string): string {
  // A … Z, then AA, AB, … (as drawing revisions are usually lettered)
  const chars = label.split('');
  let i = chars.length - 1;
  while (i >= 0) {
    if (chars[i] !== 'Z') {
      chars[i] = String.fromCharCode(chars[i].charCodeAt(0) + 1);
      return chars.join('');
    }
    chars[i] = 'A';
    i--;
  }
  return 'A' + chars.join('');
}

export class ProgramService {
  constructor(
    private readonly ds: DataSource,
    private readonly deps: ProgramDeps,
  ) {
    this.review = new ReviewService(ds, deps, (r) => this.engineInput(r));
    this.waivers = new WaiverService(ds, deps);
  }

  private readonly review: ReviewService;
  private readonly waivers: WaiverService;

  // ---- reading ------------------------------------------------------------------------------

  private userRefs(ids: (string | null)[]) {
    return userRefs(this.ds.manager, ids);
  }

  /** Error findings neither fixed nor waived, per revision (counted in the database). */
  private async openErrorCounts(ids: string[]): Promise<Map<string, number>> {
    if (!ids.length) return new Map();
    const rows: { id: string; n: number }[] = await this.ds.query(
      `SELECT r.id, count(f.value)::int AS n
         FROM program_revisions r
         LEFT JOIN LATERAL jsonb_array_elements(COALESCE(r.findings, '[]'::jsonb)) f ON f.value->>'severity' = 'error'
              AND NOT EXISTS (SELECT 1 FROM revision_waivers w WHERE w.revision_id = r.id AND (w.finding_key = f.value->>'key'
                   OR (w.scope = 'every-board' AND jsonb_array_length(f.value->'boards') = 1
                       AND w.finding_key = regexp_replace(f.value->>'key', '\\|\\d+:', '|*:', 'g'))))
        WHERE r.id = ANY($1) AND COALESCE((r.findings_summary->>'errors')::int, 0) > 0 GROUP BY r.id`,
      [ids],
    );
    return new Map(rows.map((x) => [x.id, x.n]));
  }

  /** One page of programs, most recently changed first, with the number of programs in all. */
  async listPrograms(page: { limit: number; offset: number } = { limit: PROGRAM_PAGE_MAX, offset: 0 }): Promise<{ items: ProgramDto[]; total: number }> {
    const [programs, total] = await this.ds.getRepository(Program).findAndCount({ order: { updatedAt: 'DESC', id: 'ASC' }, take: page.limit, skip: page.offset });
    const revisions = programs.length
      ? await this.ds.getRepository(ProgramRevision).find({ where: { programId: In(programs.map((p) => p.id)) }, order: { createdAt: 'ASC' }, select: SUMMARY_COLUMNS })
      : [];
    const ref = await this.userRefs([...programs.map((p) => p.ownerId), ...revisions.flatMap((r) => [r.authorId, r.reviewerId])]);
    const open = await this.openErrorCounts(revisions.map((r) => r.id));
    return { items: programs.map((p) => programDto(p, revisions.filter((r) => r.programId === p.id), ref, open)), total };
  }

  async getProgram(id: string): Promise<ProgramDto> {
    const p = await this.ds.getRepository(Program).findOneBy({ id });
    if (!p) throw new NotFoundError('The program');
    const revs = await this.ds.getRepository(ProgramRevision).find({ where: { programId: id }, order: { createdAt: 'ASC' }, select: SUMMARY_COLUMNS });
    const ref = await this.userRefs([p.ownerId, ...revs.flatMap((r) => [r.authorId, r.reviewerId])]);
    return programDto(p, revs, ref, await this.openErrorCounts(revs.map((r) => r.id)));
  }

  async getRevisionEntity(id: string, manager?: EntityManager, lock = false): Promise<ProgramRevision> {
    return loadRevision(manager ?? this.ds.manager, id, lock);
  }

  async getRevision(id: string, user: ServiceUser): Promise<RevisionDetail> {
    // Neither the file nor the import is loaded: the import's summary is counted by PostgreSQL
    // (importSummary), so a 200,000-row revision is not parsed on the event loop to be shown.
    const repo = this.ds.getRepository(ProgramRevision);
    const select = Object.fromEntries(repo.metadata.columns.filter((c) => c.propertyName !== 'imported' && c.propertyName !== 'centroidBytes').map((c) => [c.propertyName, true]));
    const r = await repo.findOne({ where: { id }, select });
    if (!r) throw new NotFoundError('The revision');
    const program = await this.ds.getRepository(Program).findOneByOrFail({ id: r.programId });
    const [waivers, comments, files] = await Promise.all([
      this.ds.getRepository(RevisionWaiver).find({ where: { revisionId: id }, order: { at: 'ASC' } }),
      this.ds.getRepository(RevisionComment).find({ where: { revisionId: id }, order: { at: 'ASC' } }),
      this.ds.getRepository(ReleaseFile).find({ where: { revisionId: id }, order: { side: 'DESC', format: 'ASC' }, select: { id: true, side: true, format: true, sha256: true, placements: true, revisionId: true } }),
    ]);
    const sizes: { id: string; n: number }[] = files.length ? await this.ds.query(`SELECT id, octet_length(bytes) AS n FROM release_files WHERE revision_id = $1`, [id]) : [];
    const ref = await this.userRefs([r.authorId, r.reviewerId]);
    const open = await this.openErrorCounts([r.id]);
    const imported = await this.importSummary(r.id);
    const isEngineer = user.roles.includes('engineer') || user.roles.includes('admin');
    const openRevision = await this.ds.getRepository(ProgramRevision).exists({ where: { programId: r.programId, state: In(['draft', 'in-review']) } });
    return {
      ...revisionSummary(r, ref, open),
      program: { id: program.id, name: program.name, product: program.product, board: program.board },
      settings: revisionSettingsSchema.parse(r.settings),
      centroidSha256: r.centroidSha256,
      imported,
      overrides: r.overrides as Record<string, Override>,
      findings: (r.findings as Finding[] | null) ?? null,
      findingsSummary: (r.findingsSummary as RevisionDetail['findingsSummary']) ?? null,
      waivers: waiverDtos(waivers, (r.findings as Finding[] | null) ?? []),
      comments: comments.map(commentDto),
      releaseFiles: files.map((f) => releaseFileDto(f, sizes.find((s) => s.id === f.id)?.n ?? 0)),
      reviewComment: r.reviewComment,
      reviewedAt: r.reviewedAt?.toISOString() ?? null,
      hasUnderlay: r.underlay !== null,
      contributors: await contributorList(this.ds.manager, r.id),
      can: {
        edit: isEngineer && isEditable(r.state),
        submit: isEngineer && canTake('submit', r.state),
        review: isEngineer && canTake('approve', r.state) && r.authorId !== user.id && !(await isContributor(this.ds.manager, r.id, user.id)),
        withdraw: isEngineer && canTake('withdraw', r.state),
        newRevision: isEngineer && r.state === 'released' && !openRevision,
      },
    };
  }

  /** What the revision page shows of the import (counts, mapping, extent), read in PostgreSQL. */
  private async importSummary(revisionId: string): Promise<RevisionDetail['imported']> {
    const placed = `NOT coalesce((p->>'dnp')::boolean, false)`;
    const rows: { meta: Pick<ImportResult, 'units' | 'columns' | 'headers' | 'dialect' | 'warnings'>; n: Record<string, number | null> }[] = await this.ds.query(
      `SELECT jsonb_build_object('units', i->'units', 'columns', i->'columns', 'headers', i->'headers', 'dialect', i->'dialect', 'warnings', i->'warnings') AS meta,
         (SELECT json_build_object('rows', count(*), 'dnp', count(*) FILTER (WHERE NOT ${placed}),
            'top', count(*) FILTER (WHERE ${placed} AND p->>'side' = 'top'), 'bottom', count(*) FILTER (WHERE ${placed} AND p->>'side' = 'bottom'),
            'minX', min((p->>'x')::float8) FILTER (WHERE ${placed}), 'maxX', max((p->>'x')::float8) FILTER (WHERE ${placed}),
            'minY', min((p->>'y')::float8) FILTER (WHERE ${placed}), 'maxY', max((p->>'y')::float8) FILTER (WHERE ${placed}))
          FROM jsonb_array_elements(i->'placements') p) AS n
       FROM (SELECT imported AS i FROM program_revisions WHERE id = $1) s WHERE i IS NOT NULL`,
      [revisionId],
    );
    if (rows.length === 0) return null;
    const { meta, n } = rows[0];
    return {
      rows: n.rows ?? 0,
      dnp: n.dnp ?? 0,
      top: n.top ?? 0,
      bottom: n.bottom ?? 0,
      units: meta.units,
      columns: meta.columns as Record<string, string>,
      headers: meta.headers,
      dialect: meta.dialect as unknown as Record<string, unknown>,
      warnings: meta.warnings.map((w) => ({ line: w.line, message: w.message })),
      extent: n.minX === null || n.minX === undefined ? null : { minX: n.minX, minY: n.minY!, maxX: n.maxX!, maxY: n.maxY! },
    };
  }

  // ---- writing ------------------------------------------------------------------------------

  // the state table's rules (review-state.ts)
  private assertEditable(r: ProgramRevision, what = 'changed') {
    assertEditable(r, what);
  }

  private assertVersion(r: ProgramRevision, version: number) {
    assertVersion(r, version);
  }

  async createProgram(input: CreateProgramInput, user: ServiceUser, ip: string | null): Promise<ProgramDto> {
    const id = await this.ds.transaction(async (m) => {
      const exists = await m.getRepository(Program).createQueryBuilder('p').where('lower(p.name) = lower(:n)', { n: input.name }).getExists();
      if (exists) throw new ConflictError(`A program named ${input.name} already exists.`, [{ path: 'name', message: 'Already in use' }]);
      const p = await m.getRepository(Program).save(m.getRepository(Program).create({ ...input, ownerId: user.id }));
      const first = await m.getRepository(ProgramRevision).save(
        m.getRepository(ProgramRevision).create({ programId: p.id, label: 'A', state: 'draft', authorId: user.id, settings: revisionSettingsSchema.parse({}) as never, overrides: {} }),
      );
      await recordContribution(m, first.id, user, 'create');
      await this.deps.audit.record(user, 'program.create', input.name, { product: input.product, board: input.board }, ip, m);
      return p.id;
    });
    return this.getProgram(id);
  }

  async newRevision(programId: string, user: ServiceUser, ip: string | null): Promise<RevisionSummary> {
    return this.ds.transaction(async (m) => {
      const repo = m.getRepository(ProgramRevision);
      const program = await m.getRepository(Program).findOne({ where: { id: programId }, lock: { mode: 'pessimistic_write' } });
      if (!program) throw new NotFoundError('The program');
      const revs = await repo.find({ where: { programId }, order: { createdAt: 'ASC' } });
      const open = revs.find((r) => r.state === 'draft' || r.state === 'in-review');
      if (open) throw new ConflictError(`Revision ${open.label} is still ${open.state === 'draft' ? 'a draft' : 'in review'}; finish or withdraw it first.`);
      const source = [...revs].reverse().find((r) => r.state === 'released');
      if (!source) throw new ConflictError('There is no released revision to start from.');
      const label = nextLabel(revs[revs.length - 1].label);
      const r = await repo.save(
        repo.create({
          programId,
          label,
          state: 'draft',
          authorId: user.id,
          settings: source.settings,
          centroidName: source.centroidName,
          centroidBytes: source.centroidBytes,
          centroidSha256: source.centroidSha256,
          imported: source.imported,
          overrides: source.overrides,
          underlay: source.underlay,
        }),
      );
      await recordContribution(m, r.id, user, 'create');
      await this.deps.audit.record(user, 'revision.create', `${program.name} ${label}`, { from: source.label }, ip, m);
      const ref = await this.userRefs([r.authorId]);
      return revisionSummary(r, ref);
    });
  }

  /**
   * Reads a file without saving: what the import would give (dialect, mapping, first rows) and
   * every row error with its line, from one pass of the engine's collecting import, in a worker
   * thread within the import time limit (check-pool.ts). A file-wide problem (no units, a missing
   * column, no rows) ends the list; alone, it is the answer's error.
   */
  async previewImport(revisionId: string, bytes: Buffer, fileName: string, importOptions: RevisionSettings['import'], cancel?: AbortSignal): Promise<ImportPreview> {
    // Only whether the revision exists: its stored file and import are not loaded for a preview.
    if (!(await this.ds.getRepository(ProgramRevision).exists({ where: { id: revisionId } }))) throw new NotFoundError('The revision');
    return this.deps.checks.preview({ bytes, fileName, importOptions, limit: PREVIEW_ERROR_LIMIT }, cancel);
  }

  /**
   * Stores the file and its placements in one transaction; a bad file changes nothing. The file
   * is read in a worker thread (parsing, the import's JSON text, the digest, unmatched
   * footprints), and the import is written as that text in one statement, so neither reading nor
   * writing a 200,000-row file holds the event loop. Nothing large is loaded here: the revision
   * is read for its state, version and overrides only.
   */
  async commitImport(revisionId: string, bytes: Buffer, fileName: string, importOptions: RevisionSettings['import'], version: number, user: ServiceUser, ip: string | null) {
    const light = { id: true, programId: true, label: true, state: true, version: true, settings: true, overrides: true } as const;
    const before = await this.ds.getRepository(ProgramRevision).findOne({ where: { id: revisionId }, select: light });
    if (!before) throw new NotFoundError('The revision');
    this.assertEditable(before, 'given a new centroid file');
    this.assertVersion(before, version);
    const library = await this.deps.library.getLibraryFile();
    const read = await this.deps.checks.readImport({ bytes, fileName, importOptions, overrides: before.overrides as Record<string, Override>, library });
    await this.ds.transaction(async (m) => {
      const r = await m.getRepository(ProgramRevision).findOne({ where: { id: revisionId }, select: light, lock: { mode: 'pessimistic_write' } });
      if (!r) throw new NotFoundError('The revision');
      this.assertEditable(r, 'given a new centroid file');
      // The same version as when the file was read: the overrides it filtered are still these.
      this.assertVersion(r, version);
      const settings = revisionSettingsSchema.parse({ ...r.settings, import: importOptions });
      await m.query(
        `UPDATE program_revisions SET settings = $2::jsonb, centroid_name = $3, centroid_bytes = $4, centroid_sha256 = $5, imported = $6::jsonb,
           placement_count = $7, overrides = $8::jsonb, findings = NULL, findings_summary = NULL, checked_at = NULL, version = version + 1, updated_at = now()
         WHERE id = $1`,
        [r.id, JSON.stringify(settings), fileName, bytes, read.sha256, read.importedJson, read.placed, JSON.stringify(read.overrides)],
      );
      const program = await m.getRepository(Program).findOneByOrFail({ id: r.programId });
      if (this.deps.library.recordUnmatchedFootprints && library && read.unmatched.length) {
        await this.deps.library.recordUnmatchedFootprints(m, `${program.name} ${r.label}`, read.unmatched);
      }
      await recordContribution(m, r.id, user, 'import');
      await this.deps.audit.record(user, 'revision.import', `${program.name} ${r.label}`, { file: fileName, rows: read.rows, sha256: read.sha256 }, ip, m);
    });
  }

  async updateSettings(revisionId: string, settings: RevisionSettings, version: number, user: ServiceUser, ip: string | null) {
    await this.ds.transaction(async (m) => {
      const r = await this.getRevisionEntity(revisionId, m, true);
      this.assertEditable(r);
      this.assertVersion(r, version);
      const importChanged = JSON.stringify(settings.import) !== JSON.stringify((r.settings as RevisionSettings).import ?? {});
      let reread: ReadImport | null = null;
      if (importChanged && r.centroidBytes) {
        // New import options re-read the stored file (in a worker thread, as an upload); a file
        // the options cannot read is an error.
        const fileName = r.centroidName ?? CENTROID_NAME_FALLBACK;
        reread = await this.deps.checks.readImport({ bytes: r.centroidBytes, fileName, importOptions: settings.import, overrides: {}, library: null });
      }
      r.settings = settings as never;
      r.findings = null;
      r.findingsSummary = null;
      r.checkedAt = null;
      await m.getRepository(ProgramRevision).save(r);
      // the import as its JSON text, written as it is (the version was counted by the save)
      if (reread) await m.query('UPDATE program_revisions SET imported = $2::jsonb, placement_count = $3 WHERE id = $1', [r.id, reread.importedJson, reread.placed]);
      await recordContribution(m, r.id, user, 'settings');
      await this.deps.audit.record(user, 'revision.settings', await this.label(r, m), {}, ip, m);
    });
  }

  async updateOverrides(revisionId: string, overrides: Record<string, Override>, version: number, user: ServiceUser, ip: string | null) {
    await this.ds.transaction(async (m) => {
      const r = await this.getRevisionEntity(revisionId, m, true);
      this.assertEditable(r);
      this.assertVersion(r, version);
      const imported = r.imported as unknown as ImportResult | null;
      if (!imported) throw new BadRequestError('Import a centroid file before overriding parts.');
      const refs = new Set(imported.placements.map((p) => p.ref));
      const unknown = Object.keys(overrides).filter((k) => !refs.has(k));
      if (unknown.length) throw new BadRequestError(`No part ${unknown.join(', ')} in the imported file.`, unknown.map((k) => ({ path: `overrides.${k}`, message: 'No such reference' })));
      r.overrides = overrides;
      r.findings = null;
      r.findingsSummary = null;
      r.checkedAt = null;
      await m.getRepository(ProgramRevision).save(r);
      await recordContribution(m, r.id, user, 'overrides');
      await this.deps.audit.record(user, 'revision.overrides', await this.label(r, m), { parts: Object.keys(overrides) }, ip, m);
    });
  }

  private label(r: ProgramRevision, m?: EntityManager) {
    return revisionLabel(m ?? this.ds.manager, r);
  }

  private async engineInput(r: ProgramRevision, manager?: EntityManager): Promise<EngineInput> {
    const settings = revisionSettingsSchema.parse(r.settings);
    // read back through its schema; an import of another engine version is derived again and kept
    const stored = readStoredImport({ imported: r.imported, centroidBytes: r.centroidBytes, centroidName: r.centroidName, settings });
    if (!stored) throw new BadRequestError('No centroid file yet: import one in the Import stage.');
    const { imported } = stored;
    if (stored.rederived) await (manager ?? this.ds.manager).query('UPDATE program_revisions SET imported = $2::jsonb WHERE id = $1', [r.id, JSON.stringify(imported)]);
    const program = await (manager ?? this.ds.manager).getRepository(Program).findOneByOrFail({ id: r.programId });
    return {
      settings,
      imported,
      overrides: r.overrides as Record<string, Override>,
      library: await this.deps.library.getLibraryFile(manager),
      program: program.name,
      revision: r.label,
      centroidName: r.centroidName ?? CENTROID_NAME_FALLBACK,
    };
  }

  /** One side of the panel as the engine computes it now (not stored: it is quick). */
  async run(revisionId: string, side: Side): Promise<RunResultJson> {
    const r = await this.getRevisionEntity(revisionId);
    return runResultToJson(runEngine(await this.engineInput(r), { sides: [side], check: false }).runs[0]);
  }

  /** Runs the checks in a worker thread, stores the findings with the revision. */
  async check(revisionId: string, user: ServiceUser, ip: string | null) {
    const r0 = await this.getRevisionEntity(revisionId);
    this.assertEditable(r0, 'checked again');
    const input = await this.engineInput(r0);
    const result = await this.deps.checks.run(input);
    await this.ds.transaction(async (m) => {
      const r = await this.getRevisionEntity(revisionId, m, true);
      this.assertEditable(r, 'checked again');
      if (r.version !== r0.version) throw new ConflictError('The revision changed while it was being checked; run the checks again.');
      r.findings = result.findings as never;
      r.findingsSummary = result.summary as never;
      r.checkedAt = new Date();
      await m.getRepository(ProgramRevision).save(r);
      await this.deps.audit.record(user, 'revision.check', await this.label(r, m), { errors: result.summary.errors, warnings: result.summary.warnings }, ip, m);
    });
  }

  // ---- review steps and summary (review.service.ts), waivers and notes (waivers.service.ts) ----

  /** Waives one finding, or (scope 'every-board') the finding's kind and refs on every board. */
  waive(revisionId: string, key: string, reason: string, user: ServiceUser, ip: string | null, scope: 'finding' | 'every-board' = 'finding'): Promise<WaiverDto> {
    return this.waivers.waive(revisionId, key, reason, user, ip, scope);
  }

  reviewSummary(revisionId: string): Promise<ReviewSummaryDto> {
    return this.review.reviewSummary(revisionId);
  }

  unwaive(revisionId: string, waiverId: string, user: ServiceUser, ip: string | null): Promise<void> {
    return this.waivers.unwaive(revisionId, waiverId, user, ip);
  }

  submit(revisionId: string, user: ServiceUser, ip: string | null): Promise<void> {
    return this.review.submit(revisionId, user, ip);
  }

  approve(revisionId: string, comment: string, user: ServiceUser, ip: string | null): Promise<void> {
    return this.review.approve(revisionId, comment, user, ip);
  }

  reject(revisionId: string, comment: string, user: ServiceUser, ip: string | null): Promise<void> {
    return this.review.reject(revisionId, comment, user, ip);
  }

  withdraw(revisionId: string, user: ServiceUser, ip: string | null): Promise<void> {
    return this.review.withdraw(revisionId, user, ip);
  }

  addComment(revisionId: string, input: CommentInput, user: ServiceUser, ip: string | null): Promise<CommentDto> {
    return this.waivers.addComment(revisionId, input, user, ip);
  }

  async setUnderlay(revisionId: string, side: Side, underlay: Record<string, unknown> | null, user: ServiceUser, ip: string | null) {
    await this.ds.transaction(async (m) => {
      const r = await this.getRevisionEntity(revisionId, m, true);
      if (!notesOpen(r.state)) throw new ConflictError(`Revision ${r.label} is ${r.state}: its underlay cannot change.`);
      r.underlay = { ...(r.underlay ?? {}), [side]: underlay };
      await m.getRepository(ProgramRevision).save(r);
      await this.deps.audit.record(user, 'revision.underlay', await this.label(r, m), { side, set: underlay !== null }, ip, m);
    });
  }

  async getUnderlays(revisionId: string): Promise<Record<string, unknown>> {
    const r = await this.getRevisionEntity(revisionId);
    return r.underlay ?? {};
  }
}

export { commentDto, releaseFileDto, waiverDtos } from './program-dto';
