import { MigrationInterface, QueryRunner } from "typeorm";

export class Programs1796184636392 implements MigrationInterface {
    name = 'Programs1796184636392'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE "programs" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "name" character varying(80) NOT NULL, "product" character varying(120) NOT NULL, "board" character varying(120) NOT NULL, "owner_id" uuid NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "version" integer NOT NULL DEFAULT '1', CONSTRAINT "PK_d43c664bcaafc0e8a06dfd34e05" PRIMARY KEY ("id"))`);
        await queryRunner.query(`CREATE TABLE "program_revisions" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "program_id" uuid NOT NULL, "label" character varying(8) NOT NULL, "state" character varying(16) NOT NULL DEFAULT 'draft', "author_id" uuid NOT NULL, "settings" jsonb NOT NULL DEFAULT '{}', "centroid_name" character varying(255), "centroid_bytes" bytea, "centroid_sha256" character varying(64), "imported" jsonb, "overrides" jsonb NOT NULL DEFAULT '{}', "findings" jsonb, "findings_summary" jsonb, "checked_at" TIMESTAMP WITH TIME ZONE, "underlay" jsonb, "submitted_at" TIMESTAMP WITH TIME ZONE, "reviewer_id" uuid, "reviewed_at" TIMESTAMP WITH TIME ZONE, "review_comment" text, "released_at" TIMESTAMP WITH TIME ZONE, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "version" integer NOT NULL DEFAULT '1', CONSTRAINT "PK_63d7b9f3bbc316cf0e2b065358e" PRIMARY KEY ("id"))`);
        await queryRunner.query(`CREATE INDEX "idx_program_revisions_program" ON "program_revisions"  ("program_id") `);
        await queryRunner.query(`CREATE UNIQUE INDEX "uq_program_revisions_label" ON "program_revisions"  ("program_id", "label") `);
        await queryRunner.query(`CREATE TABLE "revision_waivers" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "revision_id" uuid NOT NULL, "finding_key" character varying(500) NOT NULL, "kind" character varying(32) NOT NULL, "reason" text NOT NULL, "user_id" uuid NOT NULL, "user_email" character varying(254) NOT NULL, "at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_035739c437d1daaf3bb64a37dda" PRIMARY KEY ("id"))`);
        await queryRunner.query(`CREATE UNIQUE INDEX "uq_revision_waivers_key" ON "revision_waivers"  ("revision_id", "finding_key") `);
        await queryRunner.query(`CREATE TABLE "revision_comments" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "revision_id" uuid NOT NULL, "side" character varying(8) NOT NULL, "x" double precision, "y" double precision, "kind" character varying(16) NOT NULL DEFAULT 'comment', "finding_key" character varying(500), "text" text NOT NULL, "user_id" uuid NOT NULL, "user_email" character varying(254) NOT NULL, "at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_2e52497f2386fbe0ac3f8f51b92" PRIMARY KEY ("id"))`);
        await queryRunner.query(`CREATE INDEX "idx_revision_comments_revision" ON "revision_comments"  ("revision_id") `);
        await queryRunner.query(`CREATE TABLE "release_files" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "revision_id" uuid NOT NULL, "side" character varying(8) NOT NULL, "format" character varying(8) NOT NULL, "bytes" bytea NOT NULL, "sha256" character varying(64) NOT NULL, "placements" integer NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_9089c7c35467bdbe87ada333f01" PRIMARY KEY ("id"))`);
        await queryRunner.query(`CREATE UNIQUE INDEX "uq_release_files" ON "release_files"  ("revision_id", "side", "format") `);
        await queryRunner.query(`CREATE TABLE "api_tokens" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "name" character varying(80) NOT NULL, "prefix" character varying(16) NOT NULL, "token_hash" character varying(64) NOT NULL, "created_by" uuid NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "last_used_at" TIMESTAMP WITH TIME ZONE, "revoked_at" TIMESTAMP WITH TIME ZONE, CONSTRAINT "PK_c587455266b5fa8dace7194caac" PRIMARY KEY ("id"))`);
        await queryRunner.query(`CREATE UNIQUE INDEX "uq_api_tokens_hash" ON "api_tokens"  ("token_hash") `);
        await queryRunner.query(`CREATE TABLE "problem_reports" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "revision_id" uuid NOT NULL, "user_id" uuid NOT NULL, "user_email" character varying(254) NOT NULL, "text" text NOT NULL, "at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_e2eab5c6c6d242af67bc5ec2e7d" PRIMARY KEY ("id"))`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP TABLE "problem_reports"`);
        await queryRunner.query(`DROP INDEX "public"."uq_api_tokens_hash"`);
        await queryRunner.query(`DROP TABLE "api_tokens"`);
        await queryRunner.query(`DROP INDEX "public"."uq_release_files"`);
        await queryRunner.query(`DROP TABLE "release_files"`);
        await queryRunner.query(`DROP INDEX "public"."idx_revision_comments_revision"`);
        await queryRunner.query(`DROP TABLE "revision_comments"`);
        await queryRunner.query(`DROP INDEX "public"."uq_revision_waivers_key"`);
        await queryRunner.query(`DROP TABLE "revision_waivers"`);
        await queryRunner.query(`DROP INDEX "public"."uq_program_revisions_label"`);
        await queryRunner.query(`DROP INDEX "public"."idx_program_revisions_program"`);
        await queryRunner.query(`DROP TABLE "program_revisions"`);
        await queryRunner.query(`DROP TABLE "programs"`);
    }

}
