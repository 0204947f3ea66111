// The review of a revision: submit, approve (release), reject and withdraw, each a step of the
// state table (review-state.ts), and the summary a reviewer reads before approving. Mails go out
// after the transaction, quietly (a mail that cannot be sent does not undo the step).
import { type DataSource, type EntityManager } from 'typeorm';
import { Assigner } from '../../../shared/library';
import { waiverLookup } from '../../../shared/review';
import type { Finding } from '../../../shared/schemas/finding.schema';
import { revisionSettingsSchema, type ReviewSummaryDto } from '../../../shared/schemas/program.schema';
import { Program, ProgramRevision, ReleaseFile, RevisionWaiver } from '../../db/entities/program.entity';
import { User } from '../../db/entities/user.entity';
import { BadRequestError, ConflictError } from '../../lib/errors';
import { assertIndependentReviewer, contributorsOf, recordContribution } from './contributors';
import type { EngineInput } from './engine';
import type { ProgramDeps } from './program-deps';
import { loadRevision, revisionLabel, userRefs, type ServiceUser } from './revision-access';
import { buildReviewSummary, revisionChanges } from './review-summary';
import { REVIEW_STEPS, assertStep } from './review-state';

export class ReviewService {
  constructor(
    private readonly ds: DataSource,
    private readonly deps: ProgramDeps,
    /** The engine's input for a revision as stored (ProgramService builds it). */
    private readonly engineInput: (r: ProgramRevision) => Promise<EngineInput>,
  ) {}

  /** Error findings neither fixed nor waived. */
  private async blockingFindings(revisionId: string, findings: Finding[], m: EntityManager): Promise<Finding[]> {
    const waiverOf = waiverLookup(await m.getRepository(RevisionWaiver).findBy({ revisionId }));
    return findings.filter((f) => f.severity === 'error' && !waiverOf(f));
  }

  async submit(revisionId: string, user: ServiceUser, ip: string | null) {
    let programLabel = '';
    await this.ds.transaction(async (m) => {
      const r = await loadRevision(m, revisionId, true);
      assertStep('submit', r);
      if (!r.imported) throw new BadRequestError('Import a centroid file first.');
      if (!r.checkedAt || !r.findings) throw new BadRequestError('Run the checks (Verify stage) before submitting: the inputs changed since the last check.');
      const blocking = await this.blockingFindings(r.id, r.findings as Finding[], m);
      if (blocking.length) throw new ConflictError(`${blocking.length} error finding${blocking.length === 1 ? '' : 's'} neither fixed nor waived, e.g. ${blocking[0].message}. Fix or waive them in the Verify stage.`);
      r.state = REVIEW_STEPS.submit.to;
      r.submittedAt = new Date();
      r.reviewComment = null;
      await m.getRepository(ProgramRevision).save(r);
      programLabel = await revisionLabel(m, r);
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
    const r0 = await loadRevision(this.ds.manager, revisionId);
    assertStep('approve', r0);
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
      const r = await loadRevision(m, revisionId, true);
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
      r.state = REVIEW_STEPS.approve.to;
      r.reviewerId = user.id;
      r.reviewedAt = new Date();
      r.releasedAt = new Date();
      r.reviewComment = comment || null;
      await m.getRepository(ProgramRevision).save(r);
      programLabel = await revisionLabel(m, r);
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
      const r = await loadRevision(m, revisionId, true);
      assertStep('reject', r);
      await assertIndependentReviewer(m, r, user, 'review it (to change it yourself, withdraw it and start again)');
      r.state = REVIEW_STEPS.reject.to;
      r.reviewerId = user.id;
      r.reviewedAt = new Date();
      r.reviewComment = comment;
      await m.getRepository(ProgramRevision).save(r);
      programLabel = await revisionLabel(m, r);
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
      const r = await loadRevision(m, revisionId, true);
      assertStep('withdraw', r);
      r.state = REVIEW_STEPS.withdraw.to;
      await m.getRepository(ProgramRevision).save(r);
      await this.deps.audit.record(user, 'revision.withdraw', await revisionLabel(m, r), {}, ip, m);
    });
  }

  /** The review summary: findings by kind with their waivers, the overrides, the changes since the last release. */
  async reviewSummary(revisionId: string): Promise<ReviewSummaryDto> {
    const r = await loadRevision(this.ds.manager, revisionId);
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
    const ref = await userRefs(this.ds.manager, waivers.map((w) => w.userId));
    // what the library gives each overridden part without its override (the machine's nozzles as the run has them)
    const machine = revisionSettingsSchema.parse(r.settings).machine;
    const assigner = new Assigner(await this.deps.library.getLibraryFile(), machine ? machine.nozzles : null);
    const choice = (footprint: string) => {
      const a = assigner.assign(footprint);
      return { package: a.pkg?.name ?? null, nozzle: a.nozzle, vision: a.vision };
    };
    return buildReviewSummary(r, program, waivers, (id) => ref(id)?.name ?? null, revisionChanges(r, base ?? null), choice);
  }
}
