import { In, type DataSource, type EntityManager } from 'typeorm';
import { Assigner, unmatchedFootprints } from '../../../shared/library';
import type { ImportResult, Side } from '../../../shared/core';
import { runResultToJson, type RunResultJson } from '../../../shared/pipeline';
import type { Finding } from '../../../shared/schemas/finding.schema';
import type { LibraryFile } from '../../../shared/schemas/library-file.schema';
import { everyBoardKey, everyBoardKeyOfKey, waiverLookup } from '../../../shared/review';
import {
  revisionSettingsSchema,
  type CommentDto,
  type CreateProgramInput,
  type Override,
  type ProgramDto,
  type ReleaseFileDto,
  type RevisionDetail,
  type ReviewSummaryDto,
  type RevisionSettings,
  type RevisionSummary,
  type WaiverDto,
} from '../../../shared/schemas/program.schema';
import { Program, ProgramRevision, ReleaseFile, RevisionComment, RevisionWaiver, type RevisionState } from '../../db/entities/program.entity';
import { User } from '../../db/entities/user.entity';
import { BadRequestError, ConflictError, NotFoundError } from '../../lib/errors';
import type { AuditService } from '../audit/audit.service';
import type { Mailer } from '../mail/mailer';
import type { UserService } from '../users/user.service';
import type { CheckPool } from './check-pool';
import { assertIndependentReviewer, contributorList, contributorsOf, isContributor, recordContribution } from './contributors';
import { CENTROID_NAME_FALLBACK, runEngine, type EngineInput } from './engine';
import { readStoredImport } from './stored-import';
import type { ImportPreview, ReadImport } from './import-task';
import { buildReviewSummary, revisionChanges } from './review-summary';

/** Where programs get the shared package library (the library module provides it). */
export interface LibrarySource {
  getLibraryFile(manager?: EntityManager): Promise<LibraryFile | null>;
  recordUnmatchedFootprints?(manager: EntityManager, programLabel: string, items: { footprint: string; count: number }[]): Promise<void>;
}

export const UPLOAD_LIMIT_BYTES = 20 * 1024 * 1024;
/** The import preview lists at most this many row errors. */
export const PREVIEW_ERROR_LIMIT = 200;

const EDITABLE: RevisionState[] = ['draft'];

/** The most programs one page lists (GET /programs?limit=…). */
export const PROGRAM_PAGE_MAX = 500;

/** What lists and summaries show of a revision: never the file, the import, the findings or the underlay. */
const SUMMARY_COLUMNS = {
  id: true, programId: true, label: true, state: true, authorId: true, reviewerId: true, centroidName: true, placementCount: true,
  checkedAt: true, findingsSummary: true, submittedAt: true, releasedAt: true, createdAt: true, updatedAt: true, version: true,
} as const;

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

export interface ServiceUser {
  id: string;
  email: string;
  roles: string[];
}

export class ProgramService {
  constructor(
    private readonly ds: DataSource,
    private readonly deps: { audit: AuditService; mailer: Mailer; users: UserService; library: LibrarySource; checks: CheckPool; publicUrl: string },
  ) {}

  // ---- reading ------------------------------------------------------------------------------

  private async userRefs(ids: (string | null)[]) {
    const want = [...new Set(ids.filter((x): x is string => !!x))];
    const users = want.length ? await this.ds.getRepository(User).findBy({ id: In(want) }) : [];
    const map = new Map(users.map((u) => [u.id, { id: u.id, name: u.name, email: u.email }]));
    return (id: string | null) => (id ? (map.get(id) ?? null) : null);
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

  private summary(r: ProgramRevision, ref: (id: string | null) => { id: string; name: string; email: string } | null, open?: Map<string, number>): RevisionSummary {
    const s = r.findingsSummary as { errors?: number; warnings?: number } | null;
    return {
      id: r.id,
      programId: r.programId,
      label: r.label,
      state: r.state,
      author: ref(r.authorId),
      reviewer: ref(r.reviewerId),
      centroidName: r.centroidName,
      placements: r.placementCount,
      checkedAt: r.checkedAt?.toISOString() ?? null,
      errors: s?.errors ?? null,
      warnings: s?.warnings ?? null,
      // findings and their summary are stored and cleared together; lists load only the summary
      openErrors: !s ? null : (open?.get(r.id) ?? s.errors ?? null),
      submittedAt: r.submittedAt?.toISOString() ?? null,
      releasedAt: r.releasedAt?.toISOString() ?? null,
      createdAt: r.createdAt.toISOString(),
      updatedAt: r.updatedAt.toISOString(),
      version: r.version,
    };
  }

  /** One page of programs, most recently changed first, with the number of programs in all. */
  async listPrograms(page: { limit: number; offset: number } = { limit: PROGRAM_PAGE_MAX, offset: 0 }): Promise<{ items: ProgramDto[]; total: number }> {
    const [programs, total] = await this.ds.getRepository(Program).findAndCount({ order: { updatedAt: 'DESC', id: 'ASC' }, take: page.limit, skip: page.offset });
    const revisions = programs.length
      ? await this.ds.getRepository(ProgramRevision).find({ where: { programId: In(programs.map((p) => p.id)) }, order: { createdAt: 'ASC' }, select: SUMMARY_COLUMNS })
      : [];
    const ref = await this.userRefs([...programs.map((p) => p.ownerId), ...revisions.flatMap((r) => [r.authorId, r.reviewerId])]);
    const open = await this.openErrorCounts(revisions.map((r) => r.id));
    return { items: programs.map((p) => this.programDto(p, revisions.filter((r) => r.programId === p.id), ref, open)), total };
  }

  private programDto(p: Program, revs: ProgramRevision[], ref: (id: string | null) => { id: string; name: string; email: string } | null, open?: Map<string, number>): ProgramDto {
    return {
      id: p.id,
      name: p.name,
      product: p.product,
      board: p.board,
      owner: ref(p.ownerId),
      createdAt: p.createdAt.toISOString(),
      updatedAt: p.updatedAt.toISOString(),
      revisions: revs.map((r) => this.summary(r, ref, open)),
    };
  }

  async getProgram(id: string): Promise<ProgramDto> {
    const p = await this.ds.getRepository(Program).findOneBy({ id });
    if (!p) throw new NotFoundError('The program');
    const revs = await this.ds.getRepository(ProgramRevision).find({ where: { programId: id }, order: { createdAt: 'ASC' }, select: SUMMARY_COLUMNS });
    const ref = await this.userRefs([p.ownerId, ...revs.flatMap((r) => [r.authorId, r.reviewerId])]);
    return this.programDto(p, revs, ref, await this.openErrorCounts(revs.map((r) => r.id)));
  }

  async getRevisionEntity(id: string, manager?: EntityManager, lock = false): Promise<ProgramRevision> {
    const repo = (manager ?? this.ds.manager).getRepository(ProgramRevision);
    const r = await repo.findOne({ where: { id }, ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}) });
    if (!r) throw new NotFoundError('The revision');
    return r;
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
      ...this.summary(r, ref, open),
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
        edit: isEngineer && r.state === 'draft',
        submit: isEngineer && r.state === 'draft',
        review: isEngineer && r.state === 'in-review' && r.authorId !== user.id && !(await isContributor(this.ds.manager, r.id, user.id)),
        withdraw: isEngineer && (r.state === 'draft' || r.state === 'in-review'),
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

  private assertEditable(r: ProgramRevision, what = 'changed') {
    if (r.state === 'released' || r.state === 'superseded') {
      throw new ConflictError(`Revision ${r.label} is ${r.state} and cannot be ${what}. Start a new revision from it to make changes.`);
    }
    if (!EDITABLE.includes(r.state)) {
      throw new ConflictError(`Revision ${r.label} is ${r.state === 'in-review' ? 'in review' : r.state}; only a draft can be ${what}.`);
    }
  }

  private assertVersion(r: ProgramRevision, version: number) {
    if (r.version !== version) {
      throw new ConflictError(`Revision ${r.label} was changed by someone else since you opened it (version ${version}, now ${r.version}). Reload to see their change, then make yours again.`);
    }
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
      return this.summary(r, ref);
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

  private async label(r: ProgramRevision, m?: EntityManager) {
    const p = await (m ?? this.ds.manager).getRepository(Program).findOneByOrFail({ id: r.programId });
    return `${p.name} ${r.label}`;
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

  /**
   * Waives one finding, or (scope 'every-board') the finding's kind and refs on every board: one
   * decision that also covers boards added later. Waivers given before on single boards of that
   * kind and refs are folded into it (the audit keeps their reasons).
   */
  async waive(revisionId: string, key: string, reason: string, user: ServiceUser, ip: string | null, scope: 'finding' | 'every-board' = 'finding'): Promise<WaiverDto> {
    return this.ds.transaction(async (m) => {
      const r = await this.getRevisionEntity(revisionId, m, true);
      this.assertEditable(r, 'given waivers');
      const findings = (r.findings as Finding[] | null) ?? [];
      const finding = findings.find((f) => f.key === key);
      if (!finding) throw new NotFoundError('That finding (run the checks again: it may be fixed)');
      const repo = m.getRepository(RevisionWaiver);
      const existing = await repo.findBy({ revisionId });
      const covering = waiverLookup(existing)(finding);
      const label = await this.label(r, m);
      await recordContribution(m, r.id, user, 'waiver');
      if (scope === 'finding') {
        if (covering) throw new ConflictError(covering.scope === 'every-board' ? 'This finding is already waived on every board.' : 'This finding is already waived.');
        const w = await repo.save(repo.create({ revisionId, findingKey: key, scope: 'finding', kind: finding.kind, reason, userId: user.id, userEmail: user.email }));
        await this.deps.audit.record(user, 'finding.waive', label, { key, reason }, ip, m);
        return waiverDtos([w], findings)[0];
      }
      const pattern = everyBoardKey(finding);
      if (pattern === null) {
        throw new BadRequestError(`This ${finding.kind} finding is not within one board (it involves ${finding.refs.length ? 'parts of several boards' : finding.boards.length ? 'whole boards' : 'the panel'}), so it does not repeat per board: waive it on its own.`, [{ path: 'scope', message: 'Only for findings within one board' }]);
      }
      if (existing.some((w) => w.scope === 'every-board' && w.findingKey === pattern)) throw new ConflictError('This finding is already waived on every board.');
      const instances = findings.filter((f) => everyBoardKey(f) === pattern).length;
      const folded = existing.filter((w) => w.scope !== 'every-board' && everyBoardKeyOfKey(w.findingKey) === pattern);
      if (folded.length) await repo.delete({ id: In(folded.map((w) => w.id)) });
      const w = await repo.save(repo.create({ revisionId, findingKey: pattern, scope: 'every-board', kind: finding.kind, reason, userId: user.id, userEmail: user.email }));
      await this.deps.audit.record(
        user,
        'finding.waive',
        label,
        { key: pattern, scope: 'every-board', reason, covers: instances, replaced: folded.map((x) => ({ key: x.findingKey, reason: x.reason, by: x.userEmail })) },
        ip,
        m,
      );
      return waiverDtos([w], findings)[0];
    });
  }

  /** The review summary: findings by kind with their waivers, the overrides, the changes since the last release. */
  async reviewSummary(revisionId: string): Promise<ReviewSummaryDto> {
    const r = await this.getRevisionEntity(revisionId);
    const program = await this.ds.getRepository(Program).findOneByOrFail({ id: r.programId });
    const waivers = await this.ds.getRepository(RevisionWaiver).find({ where: { revisionId }, order: { at: 'ASC' } });
    // the last revision released before this one (this one's own release does not count)
    const base = await this.ds
      .getRepository(ProgramRevision)
      .createQueryBuilder('b')
      .select(['b.id', 'b.label', 'b.releasedAt', 'b.imported', 'b.settings', 'b.overrides'])
      .where('b.program_id = :p AND b.id <> :id AND b.released_at IS NOT NULL', { p: r.programId, id: r.id })
      .andWhere(r.releasedAt ? 'b.released_at < :at' : 'TRUE', { at: r.releasedAt })
      .orderBy('b.released_at', 'DESC')
      .limit(1)
      .getOne();
    const ref = await this.userRefs(waivers.map((w) => w.userId));
    // what the library gives each overridden part without its override (the machine's nozzles as the run has them)
    const machine = revisionSettingsSchema.parse(r.settings).machine;
    const assigner = new Assigner(await this.deps.library.getLibraryFile(), machine ? machine.nozzles : null);
    const choice = (footprint: string) => {
      const a = assigner.assign(footprint);
      return { package: a.pkg?.name ?? null, nozzle: a.nozzle, vision: a.vision };
    };
    return buildReviewSummary(r, program, waivers, (id) => ref(id)?.name ?? null, revisionChanges(r, base ?? null), choice);
  }

  async unwaive(revisionId: string, waiverId: string, user: ServiceUser, ip: string | null) {
    await this.ds.transaction(async (m) => {
      const r = await this.getRevisionEntity(revisionId, m, true);
      this.assertEditable(r, 'changed');
      const w = await m.getRepository(RevisionWaiver).findOneBy({ id: waiverId, revisionId });
      if (!w) throw new NotFoundError('The waiver');
      await m.getRepository(RevisionWaiver).delete({ id: w.id });
      await recordContribution(m, r.id, user, 'waiver');
      await this.deps.audit.record(user, 'finding.unwaive', await this.label(r, m), { key: w.findingKey }, ip, m);
    });
  }

  private async blockingFindings(revisionId: string, findings: Finding[], m: EntityManager): Promise<Finding[]> {
    const waiverOf = waiverLookup(await m.getRepository(RevisionWaiver).findBy({ revisionId }));
    return findings.filter((f) => f.severity === 'error' && !waiverOf(f));
  }

  async submit(revisionId: string, user: ServiceUser, ip: string | null) {
    let programLabel = '';
    await this.ds.transaction(async (m) => {
      const r = await this.getRevisionEntity(revisionId, m, true);
      this.assertEditable(r, 'submitted');
      if (!r.imported) throw new BadRequestError('Import a centroid file first.');
      if (!r.checkedAt || !r.findings) throw new BadRequestError('Run the checks (Verify stage) before submitting: the inputs changed since the last check.');
      const blocking = await this.blockingFindings(r.id, r.findings as Finding[], m);
      if (blocking.length) throw new ConflictError(`${blocking.length} error finding${blocking.length === 1 ? '' : 's'} neither fixed nor waived, e.g. ${blocking[0].message}. Fix or waive them in the Verify stage.`);
      r.state = 'in-review';
      r.submittedAt = new Date();
      r.reviewComment = null;
      await m.getRepository(ProgramRevision).save(r);
      programLabel = await this.label(r, m);
      await recordContribution(m, r.id, user, 'submit');
      await this.deps.audit.record(user, 'revision.submit', programLabel, {}, ip, m);
    });
    const engineers = (await this.deps.users.emailsWithRole('engineer')).filter((e) => e !== user.email);
    await this.deps.mailer.sendQuietly({
      to: engineers,
      subject: `Review requested: ${programLabel}`,
      text: `${user.email} asks for a review of ${programLabel}.\n\nOpen it: ${this.deps.publicUrl}/programs/revisions/${revisionId}/release\n\nA reviewer must not be the author. Look at the panel drawing and the findings before you approve.`,
    });
  }

  async approve(revisionId: string, comment: string, user: ServiceUser, ip: string | null) {
    const r0 = await this.getRevisionEntity(revisionId);
    if (r0.state !== 'in-review') throw new ConflictError(`Revision ${r0.label} is not in review (it is ${r0.state}).`);
    // Four-eyes: the releaser made none of the revision's changes (checked again below, in the transaction).
    await assertIndependentReviewer(this.ds.manager, r0, user);
    const input = await this.engineInput(r0);
    // Re-check with today's library: the list released is the list checked.
    // The lists released are the lists checked: one run gives both (in the check worker).
    const generated = new Date().toISOString().replace(/\.\d{3}Z$/, 'Z');
    const { check: result, files, withoutPackage } = await this.deps.checks.release(input, generated);
    for (const { side, count } of withoutPackage) {
      throw new ConflictError(`${count} placement${count === 1 ? ' has' : 's have'} no package on the ${side} side; the list is not releasable. Add the packages or aliases to the library, or override the parts.`);
    }
    let programLabel = '';
    let authorEmail: string | null = null;
    await this.ds.transaction(async (m) => {
      const r = await this.getRevisionEntity(revisionId, m, true);
      if (r.state !== 'in-review' || r.version !== r0.version) throw new ConflictError('The revision changed while it was being released; reload and review it again.');
      await assertIndependentReviewer(m, r, user);
      const contributors = (await contributorsOf(m, r.id)).map((c) => c.userEmail);
      const blocking = await this.blockingFindings(r.id, result.findings, m);
      r.findings = result.findings as never;
      r.findingsSummary = result.summary as never;
      r.checkedAt = new Date();
      if (blocking.length) {
        await m.getRepository(ProgramRevision).save(r);
        throw new ConflictError(`Re-checking found ${blocking.length} error finding${blocking.length === 1 ? '' : 's'} neither fixed nor waived (the library may have changed), e.g. ${blocking[0].message}. Reject it back to the author.`);
      }
      await m.getRepository(ProgramRevision).update({ programId: r.programId, state: 'released' }, { state: 'superseded' });
      for (const f of files) {
        await m.getRepository(ReleaseFile).insert({ revisionId: r.id, side: f.side, format: f.format, bytes: Buffer.from(f.text, 'utf8'), sha256: f.sha256, placements: f.placements });
      }
      r.state = 'released';
      r.reviewerId = user.id;
      r.reviewedAt = new Date();
      r.releasedAt = new Date();
      r.reviewComment = comment || null;
      await m.getRepository(ProgramRevision).save(r);
      programLabel = await this.label(r, m);
      authorEmail = (await m.getRepository(User).findOneBy({ id: r.authorId }))?.email ?? null;
      await this.deps.audit.record(user, 'revision.release', programLabel, { files: files.map((f) => ({ side: f.side, format: f.format, sha256: f.sha256 })), contributors }, ip, m);
    });
    const operators = await this.deps.users.emailsWithRole('operator');
    const sums = files.filter((f) => f.format === 'csv').map((f) => `  ${f.side}: ${f.placements} placements, SHA-256 ${f.sha256}`).join('\n');
    await this.deps.mailer.sendQuietly({
      to: operators,
      subject: `Released: ${programLabel}`,
      text: `${programLabel} was released by ${user.email}.\n\n${sums}\n\nRun files and the set-up sheet: ${this.deps.publicUrl}/run-files\n\nCheck the checksum on the machine's computer before loading, and follow the machine maker's safety instructions.`,
    });
    if (authorEmail) await this.deps.mailer.sendQuietly({ to: [authorEmail], subject: `Released: ${programLabel}`, text: `${user.email} approved and released ${programLabel}.${comment ? `\n\nComment:\n${comment}` : ''}` });
  }

  async reject(revisionId: string, comment: string, user: ServiceUser, ip: string | null) {
    let programLabel = '';
    let authorEmail: string | null = null;
    await this.ds.transaction(async (m) => {
      const r = await this.getRevisionEntity(revisionId, m, true);
      if (r.state !== 'in-review') throw new ConflictError(`Revision ${r.label} is not in review (it is ${r.state}).`);
      await assertIndependentReviewer(m, r, user, 'review it (to change it yourself, withdraw it and start again)');
      r.state = 'draft';
      r.reviewerId = user.id;
      r.reviewedAt = new Date();
      r.reviewComment = comment;
      await m.getRepository(ProgramRevision).save(r);
      programLabel = await this.label(r, m);
      authorEmail = (await m.getRepository(User).findOneBy({ id: r.authorId }))?.email ?? null;
      await this.deps.audit.record(user, 'revision.reject', programLabel, { comment }, ip, m);
    });
    if (authorEmail) {
      await this.deps.mailer.sendQuietly({
        to: [authorEmail],
        subject: `Changes requested: ${programLabel}`,
        text: `${user.email} sent ${programLabel} back to draft.\n\nComment:\n${comment}\n\nOpen it: ${this.deps.publicUrl}/programs/revisions/${revisionId}`,
      });
    }
  }

  async withdraw(revisionId: string, user: ServiceUser, ip: string | null) {
    await this.ds.transaction(async (m) => {
      const r = await this.getRevisionEntity(revisionId, m, true);
      if (r.state !== 'draft' && r.state !== 'in-review') throw new ConflictError(`Revision ${r.label} is ${r.state}; only a draft or a revision in review can be withdrawn.`);
      r.state = 'withdrawn';
      await m.getRepository(ProgramRevision).save(r);
      await this.deps.audit.record(user, 'revision.withdraw', await this.label(r, m), {}, ip, m);
    });
  }

  async addComment(revisionId: string, input: { side: Side; kind: 'comment' | 'checked'; x: number | null; y: number | null; findingKey: string | null; text: string }, user: ServiceUser, ip: string | null): Promise<CommentDto> {
    return this.ds.transaction(async (m) => {
      const r = await this.getRevisionEntity(revisionId, m, true);
      if (r.state !== 'draft' && r.state !== 'in-review') throw new ConflictError(`Revision ${r.label} is ${r.state}: review notes are closed.`);
      const c = await m.getRepository(RevisionComment).save(m.getRepository(RevisionComment).create({ revisionId, ...input, userId: user.id, userEmail: user.email }));
      await this.deps.audit.record(user, input.kind === 'checked' ? 'review.checked' : 'review.comment', await this.label(r, m), { text: input.text.slice(0, 200) }, ip, m);
      return commentDto(c);
    });
  }

  async setUnderlay(revisionId: string, side: Side, underlay: Record<string, unknown> | null, user: ServiceUser, ip: string | null) {
    await this.ds.transaction(async (m) => {
      const r = await this.getRevisionEntity(revisionId, m, true);
      if (r.state !== 'draft' && r.state !== 'in-review') throw new ConflictError(`Revision ${r.label} is ${r.state}: its underlay cannot change.`);
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

/** Centroid files are text: UTF-8 (a BOM is fine) or Latin-1 as older CAD tools write. */
/** The placed (not do-not-place) parts' centres: their bounding box in design coordinates (mm). */


/** Waivers as sent, each with the number of `findings` it covers. */
export function waiverDtos(waivers: readonly RevisionWaiver[], findings: readonly Finding[]): WaiverDto[] {
  const waiverOf = waiverLookup(waivers);
  const covers = new Map<RevisionWaiver, number>();
  for (const f of findings) {
    const w = waiverOf(f);
    if (w) covers.set(w, (covers.get(w) ?? 0) + 1);
  }
  return waivers.map((w) => ({
    id: w.id,
    findingKey: w.findingKey,
    scope: w.scope === 'every-board' ? 'every-board' : 'finding',
    kind: w.kind,
    reason: w.reason,
    userEmail: w.userEmail,
    at: w.at.toISOString(),
    covers: covers.get(w) ?? 0,
  }));
}

export function commentDto(c: RevisionComment): CommentDto {
  return { id: c.id, side: c.side as Side, kind: c.kind as 'comment' | 'checked', x: c.x, y: c.y, findingKey: c.findingKey, text: c.text, userEmail: c.userEmail, at: c.at.toISOString() };
}

export function releaseFileDto(f: Pick<ReleaseFile, 'revisionId' | 'side' | 'format' | 'sha256' | 'placements'>, bytes: number): ReleaseFileDto {
  return { side: f.side as Side, format: f.format as 'csv' | 'json', sha256: f.sha256, placements: f.placements, bytes, url: `/api/run-files/${f.revisionId}/${f.side}.${f.format}` };
}
