import { createHash, randomBytes } from 'node:crypto';
import { In, IsNull, type DataSource } from 'typeorm';
import type { ApiTokenDto, RunFileDto } from '../../../shared/schemas/program.schema';
import { ApiToken, ProblemReport, Program, ProgramRevision, ReleaseFile } from '../../db/entities/program.entity';
import { User } from '../../db/entities/user.entity';
import { ConflictError, NotFoundError } from '../../lib/errors';
import type { AuditService } from '../audit/audit.service';
import type { Mailer } from '../mail/mailer';
import { releaseFileDto, type ServiceUser } from './program.service';

const TOKEN_PREFIX = 'pwt_';

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

/** What the run-file routes read of a revision: never its file, import, findings or underlay. */
const RUN_FILE_COLUMNS = { id: true, programId: true, label: true, state: true, authorId: true, reviewerId: true, settings: true, releasedAt: true } as const;

export class RunFileService {
  constructor(
    private readonly ds: DataSource,
    private readonly deps: { audit: AuditService; mailer: Mailer; publicUrl: string },
  ) {}

  /** Released and superseded revisions, newest release first. */
  async list(): Promise<RunFileDto[]> {
    const revs = await this.ds.getRepository(ProgramRevision).find({
      where: { state: In(['released', 'superseded']) },
      order: { releasedAt: 'DESC' },
      select: { id: true, programId: true, label: true, state: true, releasedAt: true, authorId: true, reviewerId: true },
    });
    if (!revs.length) return [];
    const programs = await this.ds.getRepository(Program).findBy({ id: In([...new Set(revs.map((r) => r.programId))]) });
    const files = await this.ds.query(`SELECT id, revision_id AS "revisionId", side, format, sha256, placements, octet_length(bytes) AS n FROM release_files WHERE revision_id = ANY($1) ORDER BY side DESC, format`, [revs.map((r) => r.id)]);
    const users = await this.ds.getRepository(User).findBy({ id: In([...new Set(revs.flatMap((r) => [r.authorId, r.reviewerId]).filter((x): x is string => !!x))]) });
    const ref = (id: string | null) => {
      const u = users.find((x) => x.id === id);
      return u ? { id: u.id, name: u.name, email: u.email } : null;
    };
    return revs.map((r) => {
      const p = programs.find((x) => x.id === r.programId)!;
      return {
        revisionId: r.id,
        programId: p.id,
        programName: p.name,
        product: p.product,
        board: p.board,
        label: r.label,
        state: r.state as 'released' | 'superseded',
        releasedAt: r.releasedAt?.toISOString() ?? null,
        author: ref(r.authorId),
        reviewer: ref(r.reviewerId),
        files: files.filter((f: { revisionId: string }) => f.revisionId === r.id).map((f: ReleaseFile & { n: number }) => releaseFileDto(f, Number(f.n))),
      };
    });
  }

  async file(revisionId: string, side: string, format: string): Promise<{ file: ReleaseFile; name: string }> {
    const f = await this.ds.getRepository(ReleaseFile).findOneBy({ revisionId, side, format });
    if (!f) throw new NotFoundError(`The ${side} ${format.toUpperCase()} run file of this revision`);
    const r = await this.ds.getRepository(ProgramRevision).findOneOrFail({ where: { id: revisionId }, select: { id: true, programId: true, label: true } });
    const p = await this.ds.getRepository(Program).findOneByOrFail({ id: r.programId });
    const safe = p.name.replace(/[^A-Za-z0-9._-]+/g, '-');
    return { file: f, name: `${safe}-${r.label}-${side}.${format}` };
  }

  /** What the printable set-up sheet needs: the released lists, the machine, the program. */
  async setupSheet(revisionId: string) {
    const r = await this.ds.getRepository(ProgramRevision).findOne({ where: { id: revisionId }, select: RUN_FILE_COLUMNS });
    if (!r || (r.state !== 'released' && r.state !== 'superseded')) throw new NotFoundError('The run file');
    const p = await this.ds.getRepository(Program).findOneByOrFail({ id: r.programId });
    const files = await this.ds.getRepository(ReleaseFile).find({ where: { revisionId, format: 'json' }, order: { side: 'DESC' } });
    const settings = r.settings as { machine?: unknown; panel?: unknown; board?: unknown };
    return {
      program: { id: p.id, name: p.name, product: p.product, board: p.board },
      revision: { id: r.id, label: r.label, state: r.state, releasedAt: r.releasedAt?.toISOString() ?? null },
      machine: settings.machine ?? null,
      sides: files.map((f) => ({ side: f.side, sha256: f.sha256, list: JSON.parse(f.bytes.toString('utf8')) as unknown })),
    };
  }

  async reportProblem(revisionId: string, text: string, user: ServiceUser, ip: string | null) {
    const r = await this.ds.getRepository(ProgramRevision).findOne({ where: { id: revisionId }, select: RUN_FILE_COLUMNS });
    if (!r || (r.state !== 'released' && r.state !== 'superseded')) throw new NotFoundError('The run file');
    const p = await this.ds.getRepository(Program).findOneByOrFail({ id: r.programId });
    await this.ds.transaction(async (m) => {
      await m.getRepository(ProblemReport).insert({ revisionId, userId: user.id, userEmail: user.email, text });
      await this.deps.audit.record(user, 'run-file.problem', `${p.name} ${r.label}`, { text: text.slice(0, 200) }, ip, m);
    });
    const author = await this.ds.getRepository(User).findOneBy({ id: r.authorId });
    if (author) {
      await this.deps.mailer.sendQuietly({
        to: [author.email],
        subject: `Problem reported on ${p.name} ${r.label}`,
        text: `${user.email} reported a problem with the run file of ${p.name} ${r.label}:\n\n${text}\n\nOpen the program: ${this.deps.publicUrl}/programs/${p.id}`,
      });
    }
  }

  // ---- tokens for line computers ------------------------------------------------------------

  async listTokens(): Promise<ApiTokenDto[]> {
    const rows = await this.ds.getRepository(ApiToken).find({ order: { createdAt: 'DESC' } });
    return rows.map(tokenDto);
  }

  async createToken(name: string, user: ServiceUser, ip: string | null): Promise<{ token: string; item: ApiTokenDto }> {
    const token = TOKEN_PREFIX + randomBytes(24).toString('base64url');
    const row = await this.ds.transaction(async (m) => {
      const t = await m.getRepository(ApiToken).save(m.getRepository(ApiToken).create({ name, prefix: token.slice(0, 10), tokenHash: hashToken(token), createdBy: user.id }));
      await this.deps.audit.record(user, 'token.create', name, { prefix: t.prefix }, ip, m);
      return t;
    });
    return { token, item: tokenDto(row) };
  }

  async revokeToken(id: string, user: ServiceUser, ip: string | null) {
    await this.ds.transaction(async (m) => {
      const t = await m.getRepository(ApiToken).findOneBy({ id });
      if (!t) throw new NotFoundError('The token');
      if (t.revokedAt) throw new ConflictError('This token is already revoked.');
      t.revokedAt = new Date();
      await m.getRepository(ApiToken).save(t);
      await this.deps.audit.record(user, 'token.revoke', t.name, { prefix: t.prefix }, ip, m);
    });
  }

  /** The live token with this value, or null. */
  async findToken(token: string): Promise<ApiToken | null> {
    if (!token.startsWith(TOKEN_PREFIX)) return null;
    const t = await this.ds.getRepository(ApiToken).findOneBy({ tokenHash: hashToken(token), revokedAt: IsNull() });
    if (t) await this.ds.getRepository(ApiToken).update({ id: t.id }, { lastUsedAt: new Date() });
    return t;
  }
}

function tokenDto(t: ApiToken): ApiTokenDto {
  return { id: t.id, name: t.name, prefix: t.prefix, createdAt: t.createdAt.toISOString(), lastUsedAt: t.lastUsedAt?.toISOString() ?? null, revokedAt: t.revokedAt?.toISOString() ?? null };
}
