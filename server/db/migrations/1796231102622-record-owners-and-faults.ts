import type { MigrationInterface, QueryRunner } from "typeorm";

/**
 * Who a record belongs to, for the record policies: a person's and a container's external
 * organisation (null: the host institution), the manager's stated exception for a person of
 * another organisation on an account, and instrument fault reports. Columns are added in place
 * (SQLite's ADD/DROP COLUMN) rather than by rebuilding the tables other tables point at.
 */
export class RecordOwnersAndFaults1796231102622 implements MigrationInterface {
  name = "RecordOwnersAndFaults1796231102622";

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "users" ADD COLUMN "organisation" text`);
    await queryRunner.query(`ALTER TABLE "containers" ADD COLUMN "organisation" text`);
    await queryRunner.query(`ALTER TABLE "account_members" ADD COLUMN "exceptionReason" text`);
    await queryRunner.query(
      `CREATE TABLE "instrument_faults" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "instrumentId" integer NOT NULL, "reportedById" integer, "note" text NOT NULL, "reportedAt" text NOT NULL, "closedAt" text, "closedById" integer, "resolution" text NOT NULL DEFAULT (''), CONSTRAINT "FK_8597af27e12dc85047e7cda0cb1" FOREIGN KEY ("instrumentId") REFERENCES "instruments" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_7cf2ced34f912fe0663c4786eb0" FOREIGN KEY ("reportedById") REFERENCES "users" ("id") ON DELETE SET NULL ON UPDATE NO ACTION)`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_421009f6b2e2954d326f2d08b8" ON "instrument_faults" ("instrumentId", "closedAt") `);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX "IDX_421009f6b2e2954d326f2d08b8"`);
    await queryRunner.query(`DROP TABLE "instrument_faults"`);
    await queryRunner.query(`ALTER TABLE "account_members" DROP COLUMN "exceptionReason"`);
    await queryRunner.query(`ALTER TABLE "containers" DROP COLUMN "organisation"`);
    await queryRunner.query(`ALTER TABLE "users" DROP COLUMN "organisation"`);
  }
}
