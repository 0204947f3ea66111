import { MigrationInterface, QueryRunner } from "typeorm";

export class Platform1796183457559 implements MigrationInterface {
    name = 'Platform1796183457559'

    public async up(queryRunner: QueryRunner): Promise<void> {
        // Sessions (connect-pg-simple's table layout).
        await queryRunner.query(`CREATE TABLE "session" ("sid" varchar NOT NULL COLLATE "default", "sess" json NOT NULL, "expire" timestamp(6) NOT NULL, CONSTRAINT "session_pkey" PRIMARY KEY ("sid"))`);
        await queryRunner.query(`CREATE INDEX "IDX_session_expire" ON "session" ("expire")`);
        await queryRunner.query(`CREATE TABLE "audit_events" ("id" BIGSERIAL NOT NULL, "at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "actor_id" uuid, "actor_email" character varying(254), "action" character varying(64) NOT NULL, "target" character varying(200), "detail" jsonb NOT NULL DEFAULT '{}', "ip" character varying(64), CONSTRAINT "PK_910f64d901a5c3e9878f0d4a407" PRIMARY KEY ("id"))`);
        await queryRunner.query(`CREATE INDEX "idx_audit_events_action" ON "audit_events"  ("action") `);
        await queryRunner.query(`CREATE INDEX "idx_audit_events_at" ON "audit_events"  ("at") `);
        await queryRunner.query(`CREATE TABLE "mail_messages" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "mail_from" character varying(320) NOT NULL, "mail_to" text array NOT NULL, "subject" character varying(500) NOT NULL, "text" text NOT NULL, "html" text, "transport" character varying(16) NOT NULL, CONSTRAINT "PK_1bd6e76ef3b3d4aff7d0510a509" PRIMARY KEY ("id"))`);
        await queryRunner.query(`CREATE TABLE "users" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "email" character varying(254) NOT NULL, "name" character varying(120) NOT NULL, "password_hash" character varying(100) NOT NULL, "roles" text array NOT NULL DEFAULT '{}', "active" boolean NOT NULL DEFAULT true, "last_sign_in_at" TIMESTAMP WITH TIME ZONE, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "version" integer NOT NULL DEFAULT '1', CONSTRAINT "UQ_97672ac88f789774dd47f7c8be3" UNIQUE ("email"), CONSTRAINT "PK_a3ffb1c0c8416b9fc6f907b7433" PRIMARY KEY ("id"))`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP TABLE "users"`);
        await queryRunner.query(`DROP TABLE "mail_messages"`);
        await queryRunner.query(`DROP INDEX "public"."idx_audit_events_at"`);
        await queryRunner.query(`DROP INDEX "public"."idx_audit_events_action"`);
        await queryRunner.query(`DROP TABLE "audit_events"`);
        await queryRunner.query(`DROP TABLE "session"`);
    }

}
