// Proposals: an engineer proposes a new package, an alias or a change; a librarian approves
// (optionally editing) or rejects with a comment. Mail goes to the librarians on a new proposal
// and to the proposer on the decision.
import type { DataSource } from 'typeorm';
import { PackageMatcher } from '../../../shared/library';
import type { ApproveProposalInput, CreatePackageInput, PackageInput, ProposalDto, ProposalInput } from '../../../shared/schemas/library.schema';
import { LibraryPackage } from '../../db/entities/library-package.entity';
import { LibraryProposal } from '../../db/entities/library-proposal.entity';
import { ConflictError, NotFoundError } from '../../lib/errors';
import type { AuditActor, AuditService } from '../audit/audit.service';
import type { Mailer } from '../mail/mailer';
import type { UserService } from '../users/user.service';
import type { LibraryService } from './library.service';

function toDto(p: LibraryProposal, packageName: string | null): ProposalDto {
  return {
    id: p.id, kind: p.kind, status: p.status, proposerEmail: p.proposerEmail, footprint: p.footprint, packageId: p.packageId,
    packageName, payload: p.payload, note: p.note, decidedByEmail: p.decidedByEmail, decidedAt: p.decidedAt ? p.decidedAt.toISOString() : null,
    decisionComment: p.decisionComment, createdAt: p.createdAt.toISOString(), version: p.version,
  };
}

function summary(p: { kind: string; payload: Record<string, unknown>; footprint: string | null }, packageName: string | null): string {
  const pkg = p.payload.package as { name?: string } | undefined;
  if (p.kind === 'new-package') return `new package ${pkg?.name ?? '?'}${p.footprint ? ` for footprint ${p.footprint}` : ''}`;
  if (p.kind === 'alias') return `alias ${String(p.payload.pattern)} → ${packageName ?? '?'}`;
  return `change to package ${packageName ?? pkg?.name ?? '?'}`;
}

function footprintMatches(pkg: { name: string; aliases: string[] }, footprint: string): boolean {
  return new PackageMatcher([{ ...pkg, body: { length: 1, width: 1, height: 1, offsetX: 0, offsetY: 0 }, rotationOffset: 0, overhang: false, nozzles: [] }]).match(footprint).pkg !== null;
}

export class ProposalService {
  constructor(
    private readonly ds: DataSource,
    private readonly library: LibraryService,
    private readonly audit: AuditService,
    private readonly users: UserService,
    private readonly mailer: Mailer,
    private readonly publicUrl: string,
  ) {}

  private async names(ids: (string | null)[]): Promise<Map<string, string>> {
    const want = [...new Set(ids.filter((x): x is string => !!x))];
    if (!want.length) return new Map();
    const rows = await this.ds.getRepository(LibraryPackage).createQueryBuilder('p').select(['p.id', 'p.name']).where('p.id IN (:...ids)', { ids: want }).getMany();
    return new Map(rows.map((r) => [r.id, r.name]));
  }

  async list(): Promise<ProposalDto[]> {
    const rows = await this.ds.getRepository(LibraryProposal).find({ order: { createdAt: 'DESC' }, take: 500 });
    const names = await this.names(rows.map((r) => r.packageId));
    const order = { open: 0, approved: 1, rejected: 1 } as const;
    return rows.map((r) => toDto(r, r.packageId ? (names.get(r.packageId) ?? null) : null)).sort((a, b) => order[a.status] - order[b.status]);
  }

  async create(input: ProposalInput, actor: AuditActor & { name?: string }, ip: string | null): Promise<ProposalDto> {
    const saved = await this.ds.transaction(async (m) => {
      let packageId: string | null = null;
      let packageName: string | null = null;
      if (input.kind !== 'new-package') {
        const p = await m.getRepository(LibraryPackage).findOneBy({ id: input.packageId });
        if (!p) throw new NotFoundError('The package');
        packageId = p.id;
        packageName = p.name;
      }
      const payload: Record<string, unknown> = input.kind === 'alias' ? { pattern: input.pattern } : { package: input.package };
      const row = m.getRepository(LibraryProposal).create({
        kind: input.kind, status: 'open', proposerId: actor.id, proposerEmail: actor.email ?? '', footprint: input.kind === 'change' ? null : input.footprint || null,
        packageId, payload, note: input.note,
      });
      await m.getRepository(LibraryProposal).save(row);
      await this.audit.record(actor, 'library.proposal.create', summary(row, packageName).slice(0, 200), { id: row.id }, ip, m);
      return toDto(row, packageName);
    });
    const librarians = await this.users.emailsWithRole('librarian');
    const what = summary(saved, saved.packageName);
    await this.mailer.sendQuietly({
      to: librarians,
      subject: `Library proposal: ${what}`,
      text: [
        `${actor.name ?? actor.email} proposes a ${what}.`,
        saved.note ? `\nTheir note:\n${saved.note}\n` : '',
        `Approve it (you may edit it first) or reject it with a comment under Library → Proposals:`,
        `${this.publicUrl}/library/proposals`,
      ].join('\n'),
    });
    return saved;
  }

  async decide(id: string, decision: 'approve' | 'reject', input: ApproveProposalInput & { comment?: string }, actor: AuditActor, ip: string | null): Promise<ProposalDto> {
    const result = await this.ds.transaction(async (m) => {
      const repo = m.getRepository(LibraryProposal);
      const row = await repo.findOne({ where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!row) throw new NotFoundError('The proposal');
      if (row.status !== 'open') throw new ConflictError(`This proposal was already ${row.status} by ${row.decidedByEmail ?? 'someone'}. Reload the list.`);
      let packageName: string | null = null;
      if (decision === 'approve') {
        if (row.kind === 'new-package') {
          let pkg = (input.package ?? row.payload.package) as CreatePackageInput;
          // From an unmatched footprint: the package must match it, else the footprint becomes an alias.
          if (row.footprint && !footprintMatches(pkg, row.footprint)) pkg = { ...pkg, aliases: [...pkg.aliases, row.footprint] };
          const created = await this.library.createPackageIn(m, pkg, actor, ip);
          packageName = created.name;
          row.packageId = created.id;
          if (input.package) row.payload = { ...row.payload, approvedAs: input.package };
        } else if (row.kind === 'alias') {
          const pattern = input.pattern ?? String(row.payload.pattern);
          const a = await this.library.createAliasIn(m, { pattern, packageId: row.packageId! }, actor, ip);
          packageName = a.packageName;
          if (input.pattern) row.payload = { ...row.payload, approvedAs: input.pattern };
        } else {
          const current = await m.getRepository(LibraryPackage).findOneBy({ id: row.packageId! });
          if (!current) throw new NotFoundError('The package');
          const { aliases: _a, ...fields } = (input.package ?? row.payload.package) as CreatePackageInput;
          const updated = await this.library.updatePackageIn(m, current.id, { ...(fields as PackageInput), version: current.version }, actor, ip);
          packageName = updated.name;
          if (input.package) row.payload = { ...row.payload, approvedAs: input.package };
        }
        if (row.footprint && packageName) {
          await m.query('UPDATE "library_unmatched_footprints" SET "resolved_at" = now(), "resolved_package" = $2, "resolved_by" = $3 WHERE "footprint_key" = $1 AND "resolved_at" IS NULL', [row.footprint.toLowerCase(), packageName, actor.email]);
        }
        await this.library.resolveOthers(m, actor.email);
      } else if (row.packageId) {
        packageName = (await m.getRepository(LibraryPackage).findOneBy({ id: row.packageId }))?.name ?? null;
      }
      row.status = decision === 'approve' ? 'approved' : 'rejected';
      row.decidedByEmail = actor.email;
      row.decidedAt = new Date();
      row.decisionComment = input.comment?.trim() || null;
      await repo.save(row);
      await this.audit.record(actor, `library.proposal.${decision}`, summary(row, packageName).slice(0, 200), { id: row.id }, ip, m);
      return toDto(row, packageName);
    });
    const what = summary(result, result.packageName);
    const verb = result.status === 'approved' ? 'approved' : 'rejected';
    await this.mailer.sendQuietly({
      to: [result.proposerEmail],
      subject: `Your library proposal was ${verb}: ${what}`,
      text: [
        `${actor.email} ${verb} your proposal (${what}).`,
        result.decisionComment ? `\nTheir comment:\n${result.decisionComment}\n` : '',
        result.status === 'approved' ? 'It is in the library now; programs pick it up the next time they are checked.' : 'Nothing was changed in the library.',
        `${this.publicUrl}/library/proposals`,
      ].join('\n'),
    });
    return result;
  }
}

