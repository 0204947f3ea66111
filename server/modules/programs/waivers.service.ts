// Waivers of findings (one finding, or its kind and refs on every board) and review notes
// (comments and "checked" marks on the canvas). Waivers change a draft only; notes stay open
// while the revision is in review (review-state.ts).
import { In, type DataSource } from 'typeorm';
import type { Side } from '../../../shared/core';
import { everyBoardKey, everyBoardKeyOfKey, waiverLookup } from '../../../shared/review';
import type { Finding } from '../../../shared/schemas/finding.schema';
import type { CommentDto, WaiverDto } from '../../../shared/schemas/program.schema';
import { RevisionComment, RevisionWaiver } from '../../db/entities/program.entity';
import { BadRequestError, ConflictError, NotFoundError } from '../../lib/errors';
import { recordContribution } from './contributors';
import type { ProgramDeps } from './program-deps';
import { commentDto, waiverDtos } from './program-dto';
import { loadRevision, revisionLabel, type ServiceUser } from './revision-access';
import { assertEditable, notesOpen } from './review-state';

export interface CommentInput {
  side: Side;
  kind: 'comment' | 'checked';
  x: number | null;
  y: number | null;
  findingKey: string | null;
  text: string;
}

export class WaiverService {
  constructor(
    private readonly ds: DataSource,
    private readonly deps: Pick<ProgramDeps, 'audit'>,
  ) {}

  /**
   * Waives one finding, or (scope 'every-board') the finding's kind and refs on every board: one
   * decision that also covers boards added later. Waivers given before on single boards of that
   * kind and refs are folded into it (the audit keeps their reasons).
   */
  async waive(revisionId: string, key: string, reason: string, user: ServiceUser, ip: string | null, scope: 'finding' | 'every-board' = 'finding'): Promise<WaiverDto> {
    return this.ds.transaction(async (m) => {
      const r = await loadRevision(m, revisionId, true);
      assertEditable(r, 'given waivers');
      const findings = (r.findings as Finding[] | null) ?? [];
      const finding = findings.find((f) => f.key === key);
      if (!finding) throw new NotFoundError('That finding (run the checks again: it may be fixed)');
      const repo = m.getRepository(RevisionWaiver);
      const existing = await repo.findBy({ revisionId });
      const covering = waiverLookup(existing)(finding);
      const label = await revisionLabel(m, r);
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

  async unwaive(revisionId: string, waiverId: string, user: ServiceUser, ip: string | null) {
    await this.ds.transaction(async (m) => {
      const r = await loadRevision(m, revisionId, true);
      assertEditable(r, 'changed');
      const w = await m.getRepository(RevisionWaiver).findOneBy({ id: waiverId, revisionId });
      if (!w) throw new NotFoundError('The waiver');
      await m.getRepository(RevisionWaiver).delete({ id: w.id });
      await recordContribution(m, r.id, user, 'waiver');
      await this.deps.audit.record(user, 'finding.unwaive', await revisionLabel(m, r), { key: w.findingKey }, ip, m);
    });
  }

  async addComment(revisionId: string, input: CommentInput, user: ServiceUser, ip: string | null): Promise<CommentDto> {
    return this.ds.transaction(async (m) => {
      const r = await loadRevision(m, revisionId, true);
      if (!notesOpen(r.state)) throw new ConflictError(`Revision ${r.label} is ${r.state}: review notes are closed.`);
      const c = await m.getRepository(RevisionComment).save(m.getRepository(RevisionComment).create({ revisionId, ...input, userId: user.id, userEmail: user.email }));
      await this.deps.audit.record(user, input.kind === 'checked' ? 'review.checked' : 'review.comment', await revisionLabel(m, r), { text: input.text.slice(0, 200) }, ip, m);
      return commentDto(c);
    });
  }
}
