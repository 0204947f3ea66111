import { MigrationInterface, QueryRunner } from "typeorm";

export class Library1796184383882 implements MigrationInterface {
    name = 'Library1796184383882'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE "library_packages" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "name" character varying(100) NOT NULL, "name_key" character varying(100) NOT NULL, "family" character varying(20) NOT NULL, "body_length" double precision NOT NULL, "body_width" double precision NOT NULL, "body_height" double precision NOT NULL, "offset_x" double precision NOT NULL DEFAULT '0', "offset_y" double precision NOT NULL DEFAULT '0', "courtyard" double precision NOT NULL DEFAULT '0.25', "rotation_offset" double precision NOT NULL DEFAULT '0', "polarised" boolean NOT NULL DEFAULT false, "overhang" boolean NOT NULL DEFAULT false, "nozzles" text array NOT NULL DEFAULT '{}', "vision" character varying(60), "tape_width" double precision, "tape_pitch" double precision, "feeder" character varying(10) NOT NULL DEFAULT 'tape', "pad_length" double precision, "pad_width" double precision, "pad_count" integer, "notes" text NOT NULL DEFAULT '', "updated_by" character varying(254), "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "version" integer NOT NULL DEFAULT '1', CONSTRAINT "PK_d80dcee458887e9c207069319d2" PRIMARY KEY ("id"))`);
        await queryRunner.query(`CREATE UNIQUE INDEX "uq_library_packages_name_key" ON "library_packages"  ("name_key") `);
        await queryRunner.query(`CREATE TABLE "library_aliases" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "pattern" character varying(200) NOT NULL, "pattern_key" character varying(200) NOT NULL, "package_id" uuid NOT NULL, "updated_by" character varying(254), "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "version" integer NOT NULL DEFAULT '1', CONSTRAINT "PK_053449f4721fab53b51becb62f9" PRIMARY KEY ("id"))`);
        await queryRunner.query(`CREATE UNIQUE INDEX "uq_library_aliases_pattern_key" ON "library_aliases"  ("pattern_key") `);
        await queryRunner.query(`CREATE INDEX "idx_library_aliases_package" ON "library_aliases"  ("package_id") `);
        await queryRunner.query(`CREATE TABLE "library_machines" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "name" character varying(60) NOT NULL, "reach_x" double precision NOT NULL, "reach_y" double precision NOT NULL, "nozzles" text array NOT NULL DEFAULT '{}', "max_part_height" double precision NOT NULL, "notes" text NOT NULL DEFAULT '', "updated_by" character varying(254), "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "version" integer NOT NULL DEFAULT '1', CONSTRAINT "PK_f026f1e85f2f8133547b46d8c52" PRIMARY KEY ("id"))`);
        await queryRunner.query(`CREATE UNIQUE INDEX "uq_library_machines_name" ON "library_machines"  ("name") `);
        await queryRunner.query(`CREATE TABLE "library_nozzles" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "name" character varying(40) NOT NULL, "tip_outer" double precision NOT NULL, "tip_inner" double precision, "holder_radius" double precision NOT NULL, "notes" text NOT NULL DEFAULT '', "updated_by" character varying(254), "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "version" integer NOT NULL DEFAULT '1', CONSTRAINT "PK_653cd9e3c3481924ac4a04af0d9" PRIMARY KEY ("id"))`);
        await queryRunner.query(`CREATE UNIQUE INDEX "uq_library_nozzles_name" ON "library_nozzles"  ("name") `);
        await queryRunner.query(`CREATE TABLE "library_proposals" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "kind" character varying(20) NOT NULL, "status" character varying(10) NOT NULL DEFAULT 'open', "proposer_id" uuid, "proposer_email" character varying(254) NOT NULL, "footprint" character varying(200), "package_id" uuid, "payload" jsonb NOT NULL, "note" text NOT NULL DEFAULT '', "decided_by_email" character varying(254), "decided_at" TIMESTAMP WITH TIME ZONE, "decision_comment" text, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "version" integer NOT NULL DEFAULT '1', CONSTRAINT "PK_473c5bf03f63c2b35d3ebf682ca" PRIMARY KEY ("id"))`);
        await queryRunner.query(`CREATE INDEX "idx_library_proposals_status" ON "library_proposals"  ("status") `);
        await queryRunner.query(`CREATE TABLE "library_revisions" ("id" BIGSERIAL NOT NULL, "at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "actor_id" uuid, "actor_email" character varying(254), "entity" character varying(20) NOT NULL, "entity_id" uuid, "entity_name" character varying(200) NOT NULL, "action" character varying(20) NOT NULL, "before" jsonb, "after" jsonb, CONSTRAINT "PK_cdc0e1d06435ec5131dea2462fb" PRIMARY KEY ("id"))`);
        await queryRunner.query(`CREATE INDEX "idx_library_revisions_at" ON "library_revisions"  ("at") `);
        await queryRunner.query(`CREATE INDEX "idx_library_revisions_entity" ON "library_revisions"  ("entity", "entity_id") `);
        await queryRunner.query(`CREATE TABLE "library_unmatched_footprints" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "footprint" character varying(200) NOT NULL, "footprint_key" character varying(200) NOT NULL, "programs" jsonb NOT NULL DEFAULT '{}', "first_seen" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "last_seen" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "resolved_at" TIMESTAMP WITH TIME ZONE, "resolved_package" character varying(100), "resolved_by" character varying(254), CONSTRAINT "PK_6bf5d281645c56d36e8326cde66" PRIMARY KEY ("id"))`);
        await queryRunner.query(`CREATE UNIQUE INDEX "uq_library_unmatched_key" ON "library_unmatched_footprints"  ("footprint_key") `);
        await queryRunner.query(`CREATE TABLE "library_vision_presets" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "name" character varying(60) NOT NULL, "method" character varying(20) NOT NULL, "lighting" character varying(10) NOT NULL, "size_tolerance_pct" double precision NOT NULL, "max_centring_offset" double precision NOT NULL, "max_angle_correction" double precision NOT NULL, "notes" text NOT NULL DEFAULT '', "updated_by" character varying(254), "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "version" integer NOT NULL DEFAULT '1', CONSTRAINT "PK_d8e1a80a8fa6ce2021063238bf0" PRIMARY KEY ("id"))`);
        await queryRunner.query(`CREATE UNIQUE INDEX "uq_library_vision_presets_name" ON "library_vision_presets"  ("name") `);
        await queryRunner.query(`ALTER TABLE "library_aliases" ADD CONSTRAINT "FK_3acc307af63bf62e840ae5705a4" FOREIGN KEY ("package_id") REFERENCES "library_packages"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE "library_aliases" DROP CONSTRAINT "FK_3acc307af63bf62e840ae5705a4"`);
        await queryRunner.query(`DROP INDEX "public"."uq_library_vision_presets_name"`);
        await queryRunner.query(`DROP TABLE "library_vision_presets"`);
        await queryRunner.query(`DROP INDEX "public"."uq_library_unmatched_key"`);
        await queryRunner.query(`DROP TABLE "library_unmatched_footprints"`);
        await queryRunner.query(`DROP INDEX "public"."idx_library_revisions_entity"`);
        await queryRunner.query(`DROP INDEX "public"."idx_library_revisions_at"`);
        await queryRunner.query(`DROP TABLE "library_revisions"`);
        await queryRunner.query(`DROP INDEX "public"."idx_library_proposals_status"`);
        await queryRunner.query(`DROP TABLE "library_proposals"`);
        await queryRunner.query(`DROP INDEX "public"."uq_library_nozzles_name"`);
        await queryRunner.query(`DROP TABLE "library_nozzles"`);
        await queryRunner.query(`DROP INDEX "public"."uq_library_machines_name"`);
        await queryRunner.query(`DROP TABLE "library_machines"`);
        await queryRunner.query(`DROP INDEX "public"."idx_library_aliases_package"`);
        await queryRunner.query(`DROP INDEX "public"."uq_library_aliases_pattern_key"`);
        await queryRunner.query(`DROP TABLE "library_aliases"`);
        await queryRunner.query(`DROP INDEX "public"."uq_library_packages_name_key"`);
        await queryRunner.query(`DROP TABLE "library_packages"`);
    }

}
