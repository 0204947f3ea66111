// Programs, revisions, waivers, review notes and release files as the API answers them.
import type { Side } from '../../../shared/core';
import { waiverLookup } from '../../../shared/review';
import type { Finding } from '../../../shared/schemas/finding.schema';
import type { CommentDto, ProgramDto, ReleaseFileDto, RevisionSummary, WaiverDto } from '../../../shared/schemas/program.schema';
import type { Program, ProgramRevision, ReleaseFile, RevisionComment, RevisionWaiver } from '../../db/entities/program.entity';
import type { UserRef } from './revision-access';

/** What lists and summaries show of a revision: never the file, the import, the findings or the underlay. */
export const SUMMARY_COLUMNS = {
  id: true, programId: true, label: true, state: true, authorId: true, reviewerId: true, centroidName: true, placementCount: true,
  checkedAt: true, findingsSummary: true, submittedAt: true, releasedAt: true, createdAt: true, updatedAt: true, version: true,
} as const;

/** A revision in a list; `open` holds the error findings neither fixed nor waived, per revision id. */
export function revisionSummary(r: ProgramRevision, ref: UserRef, open?: Map<string, number>): RevisionSummary {
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

export function programDto(p: Program, revs: ProgramRevision[], ref: UserRef, open?: Map<string, number>): ProgramDto {
  return {
    id: p.id,
    name: p.name,
    product: p.product,
    board: p.board,
    owner: ref(p.ownerId),
    createdAt: p.createdAt.toISOString(),
    updatedAt: p.updatedAt.toISOString(),
    revisions: revs.map((r) => revisionSummary(r, ref, open)),
  };
}

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
