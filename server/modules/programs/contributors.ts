import type { EntityManager } from 'typeorm';
import { RevisionContributor } from '../../db/entities/revision-contributor.entity';
import { ForbiddenError } from '../../lib/errors';

/**
 * What a person did to a revision; each is recorded once per person. Running the checks is not a
 * change (approval runs them again), nor are review notes or the canvas underlay.
 */
export type Contribution = 'create' | 'import' | 'settings' | 'overrides' | 'waiver' | 'submit';

const DONE: Record<Contribution, string> = {
  create: 'created it',
  import: 'imported its centroid file',
  settings: 'changed its settings',
  overrides: 'overrode parts',
  waiver: 'waived findings',
  submit: 'submitted it',
};

/**
 * Records that `user` changed the revision (in the caller's transaction): one row per person,
 * their actions merged. The four-eyes rule reads these rows at approval and release.
 */
export async function recordContribution(m: EntityManager, revisionId: string, user: { id: string; email: string }, action: Contribution): Promise<void> {
  await m.query(
    `INSERT INTO "revision_contributors" ("revision_id", "user_id", "user_email", "actions") VALUES ($1, $2, $3, ARRAY[$4]::text[])
     ON CONFLICT ("revision_id", "user_id") DO UPDATE
        SET "actions" = CASE WHEN $4 = ANY("revision_contributors"."actions") THEN "revision_contributors"."actions" ELSE "revision_contributors"."actions" || ARRAY[$4]::text[] END,
            "user_email" = EXCLUDED."user_email", "last_at" = now()`,
    [revisionId, user.id, user.email, action],
  );
}

/** Everyone who changed the revision, first contributor first. */
export async function contributorsOf(m: EntityManager, revisionId: string): Promise<RevisionContributor[]> {
  return m.getRepository(RevisionContributor).find({ where: { revisionId }, order: { firstAt: 'ASC', userEmail: 'ASC' } });
}

/** Everyone who changed the revision, with their names, for the review page. */
export async function contributorList(m: EntityManager, revisionId: string): Promise<{ name: string; email: string; actions: string[] }[]> {
  return m.query(
    `SELECT COALESCE(u."name", c."user_email") AS name, c."user_email" AS email, c."actions" AS actions
       FROM "revision_contributors" c LEFT JOIN "users" u ON u."id" = c."user_id"
      WHERE c."revision_id" = $1 ORDER BY c."first_at", c."user_email"`,
    [revisionId],
  );
}

/** True when `userId` changed the revision in any way. */
export async function isContributor(m: EntityManager, revisionId: string, userId: string): Promise<boolean> {
  return m.getRepository(RevisionContributor).existsBy({ revisionId, userId });
}

/**
 * The four-eyes rule: whoever approves and releases a revision made none of its changes. The
 * revision's author (who created it) always counts, recorded or not.
 */
export async function assertIndependentReviewer(m: EntityManager, revision: { id: string; label: string; authorId: string }, user: { id: string }, verb = 'review and release it'): Promise<void> {
  const mine = await m.getRepository(RevisionContributor).findOneBy({ revisionId: revision.id, userId: user.id });
  if (!mine && revision.authorId !== user.id) return;
  const did = mine?.actions.length ? mine.actions.map((a) => DONE[a as Contribution] ?? a) : ['created it'];
  const list = did.length > 1 ? `${did.slice(0, -1).join(', ')} and ${did[did.length - 1]}` : did[0];
  throw new ForbiddenError(`You ${list}: another engineer, who made none of revision ${revision.label}'s changes, must ${verb}.`);
}
