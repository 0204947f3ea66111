import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Waivers get a scope: one finding (as before) or the same kind and refs on every board. */
export class WaiverScope1796185212011 implements MigrationInterface {
  name = 'WaiverScope1796185212011';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "revision_waivers" ADD "scope" character varying(16) NOT NULL DEFAULT 'finding'`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DELETE FROM "revision_waivers" WHERE "scope" <> 'finding'`);
    await queryRunner.query(`ALTER TABLE "revision_waivers" DROP COLUMN "scope"`);
  }
}
