import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Reliability (written by hand):
 * - names unique without case where the services compare them without case: programs, nozzles,
 *   vision presets, machine profiles (a unique index on lower(name)); names that a race already
 *   doubled get " (2)", " (3)", … so that the index can be built;
 * - revision_contributors: everyone who changed a revision, for the four-eyes rule (filled for
 *   existing revisions from their authors and the audit log);
 * - program_revisions.placement_count: what lists show, so that they never read the import;
 * - rate_limit_hits: the sign-in limiter's counters, shared by every instance and kept over restarts;
 * - app_state: small facts about the installation, e.g. when the demo seed ran.
 */
export class Reliability1796201900000 implements MigrationInterface {
  name = 'Reliability1796201900000';

  public async up(q: QueryRunner): Promise<void> {
    for (const [table, width] of [['programs', 80], ['library_nozzles', 40], ['library_vision_presets', 60], ['library_machines', 60]] as const) {
      await q.query(
        `UPDATE "${table}" t SET "name" = left(t."name", ${width - 6}) || ' (' || d.n || ')'
           FROM (SELECT "id", row_number() OVER (PARTITION BY lower("name") ORDER BY "created_at", "id") AS n FROM "${table}") d
          WHERE d."id" = t."id" AND d.n > 1`,
      );
    }
    await q.query(`CREATE UNIQUE INDEX "uq_programs_name_ci" ON "programs" (lower("name"))`);
    await q.query(`DROP INDEX "public"."uq_library_nozzles_name"`);
    await q.query(`CREATE UNIQUE INDEX "uq_library_nozzles_name_ci" ON "library_nozzles" (lower("name"))`);
    await q.query(`DROP INDEX "public"."uq_library_vision_presets_name"`);
    await q.query(`CREATE UNIQUE INDEX "uq_library_vision_presets_name_ci" ON "library_vision_presets" (lower("name"))`);
    await q.query(`DROP INDEX "public"."uq_library_machines_name"`);
    await q.query(`CREATE UNIQUE INDEX "uq_library_machines_name_ci" ON "library_machines" (lower("name"))`);

    await q.query(
      `CREATE TABLE "revision_contributors" ("revision_id" uuid NOT NULL, "user_id" uuid NOT NULL, "user_email" character varying(254) NOT NULL, "actions" text array NOT NULL DEFAULT '{}', "first_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "last_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_revision_contributors" PRIMARY KEY ("revision_id", "user_id"))`,
    );
    // Existing revisions: the author, and whoever the audit log says changed them.
    await q.query(
      `INSERT INTO "revision_contributors" ("revision_id", "user_id", "user_email", "actions", "first_at", "last_at")
       SELECT r."id", u."id", u."email", ARRAY['create'], r."created_at", r."created_at"
         FROM "program_revisions" r JOIN "users" u ON u."id" = r."author_id"`,
    );
    await q.query(
      `INSERT INTO "revision_contributors" ("revision_id", "user_id", "user_email", "actions", "first_at", "last_at")
       SELECT r."id", e."actor_id", max(e."actor_email"),
              array_agg(DISTINCT CASE e."action" WHEN 'revision.import' THEN 'import' WHEN 'revision.settings' THEN 'settings' WHEN 'revision.overrides' THEN 'overrides'
                                                 WHEN 'finding.waive' THEN 'waiver' WHEN 'finding.unwaive' THEN 'waiver' ELSE 'submit' END),
              min(e."at"), max(e."at")
         FROM "audit_events" e
         JOIN "programs" p ON e."target" LIKE p."name" || ' %'
         JOIN "program_revisions" r ON r."program_id" = p."id" AND e."target" = p."name" || ' ' || r."label"
        WHERE e."actor_id" IS NOT NULL AND e."actor_email" IS NOT NULL AND e."at" >= r."created_at"
          AND e."action" IN ('revision.import', 'revision.settings', 'revision.overrides', 'finding.waive', 'finding.unwaive', 'revision.submit')
        GROUP BY r."id", e."actor_id"
       ON CONFLICT ("revision_id", "user_id") DO UPDATE
          SET "actions" = (SELECT array_agg(DISTINCT a ORDER BY a) FROM unnest("revision_contributors"."actions" || EXCLUDED."actions") a),
              "last_at" = EXCLUDED."last_at"`,
    );

    await q.query(`ALTER TABLE "program_revisions" ADD "placement_count" integer NOT NULL DEFAULT '0'`);
    await q.query(
      `UPDATE "program_revisions" SET "placement_count" =
         (SELECT count(*) FROM jsonb_array_elements("imported"->'placements') p WHERE COALESCE((p->>'dnp')::boolean, false) = false)
        WHERE "imported" IS NOT NULL AND jsonb_typeof("imported"->'placements') = 'array'`,
    );

    await q.query(`CREATE TABLE "rate_limit_hits" ("key" character varying(300) NOT NULL, "hits" integer NOT NULL, "reset_at" TIMESTAMP WITH TIME ZONE NOT NULL, CONSTRAINT "PK_rate_limit_hits" PRIMARY KEY ("key"))`);
    await q.query(`CREATE INDEX "idx_rate_limit_hits_reset" ON "rate_limit_hits" ("reset_at")`);
    await q.query(`CREATE TABLE "app_state" ("key" character varying(64) NOT NULL, "value" jsonb NOT NULL, "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_app_state" PRIMARY KEY ("key"))`);
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE "app_state"`);
    await q.query(`DROP INDEX "public"."idx_rate_limit_hits_reset"`);
    await q.query(`DROP TABLE "rate_limit_hits"`);
    await q.query(`ALTER TABLE "program_revisions" DROP COLUMN "placement_count"`);
    await q.query(`DROP TABLE "revision_contributors"`);
    await q.query(`DROP INDEX "public"."uq_library_machines_name_ci"`);
    await q.query(`CREATE UNIQUE INDEX "uq_library_machines_name" ON "library_machines" ("name")`);
    await q.query(`DROP INDEX "public"."uq_library_vision_presets_name_ci"`);
    await q.query(`CREATE UNIQUE INDEX "uq_library_vision_presets_name" ON "library_vision_presets" ("name")`);
    await q.query(`DROP INDEX "public"."uq_library_nozzles_name_ci"`);
    await q.query(`CREATE UNIQUE INDEX "uq_library_nozzles_name" ON "library_nozzles" ("name")`);
    await q.query(`DROP INDEX "public"."uq_programs_name_ci"`);
  }
}
