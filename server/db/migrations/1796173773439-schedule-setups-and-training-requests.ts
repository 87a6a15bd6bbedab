import type { MigrationInterface, QueryRunner } from "typeorm";

export class ScheduleSetupsAndTrainingRequests1796173773439 implements MigrationInterface {
  name = "ScheduleSetupsAndTrainingRequests1796173773439";

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE "setups" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "name" text NOT NULL, "description" text NOT NULL DEFAULT (''), "createdAt" text NOT NULL)`);
    await queryRunner.query(`CREATE UNIQUE INDEX "IDX_5780bd8c342cc9e21314a7d488" ON "setups" ("name") `);
    await queryRunner.query(`CREATE TABLE "setup_instruments" ("setupId" integer NOT NULL, "instrumentId" integer NOT NULL, "position" integer NOT NULL DEFAULT (0), PRIMARY KEY ("setupId", "instrumentId"))`);
    await queryRunner.query(`CREATE TABLE "training_requests" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "userId" integer NOT NULL, "instrumentId" integer NOT NULL, "note" text NOT NULL DEFAULT (''), "status" text NOT NULL DEFAULT ('open'), "createdAt" text NOT NULL, "closedAt" text, "closedById" integer)`);
    await queryRunner.query(`CREATE INDEX "IDX_e7a47401844c86fe587c3167f5" ON "training_requests" ("userId") `);
    await queryRunner.query(`CREATE INDEX "IDX_ae76601289869173b8d64faeef" ON "training_requests" ("status") `);
    await queryRunner.query(`DROP INDEX "IDX_0ed0a62cb9e710927672b84293"`);
    await queryRunner.query(`CREATE TABLE "temporary_training_records" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "userId" integer NOT NULL, "instrumentId" integer NOT NULL, "grantedAt" text NOT NULL, "expiresAt" text, "afterHours" boolean NOT NULL DEFAULT (0), "revokedAt" text, "grantedById" integer, "notes" text NOT NULL DEFAULT (''), "expiryNoticeSentAt" text, CONSTRAINT "FK_16edd13dc387e29f62ec2a3ad99" FOREIGN KEY ("grantedById") REFERENCES "users" ("id") ON DELETE SET NULL ON UPDATE NO ACTION, CONSTRAINT "FK_fd8c86267579a84e063756ac198" FOREIGN KEY ("instrumentId") REFERENCES "instruments" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_00811346fea551d91903d342f3f" FOREIGN KEY ("userId") REFERENCES "users" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`);
    await queryRunner.query(`INSERT INTO "temporary_training_records"("id", "userId", "instrumentId", "grantedAt", "expiresAt", "afterHours", "revokedAt", "grantedById", "notes") SELECT "id", "userId", "instrumentId", "grantedAt", "expiresAt", "afterHours", "revokedAt", "grantedById", "notes" FROM "training_records"`);
    await queryRunner.query(`DROP TABLE "training_records"`);
    await queryRunner.query(`ALTER TABLE "temporary_training_records" RENAME TO "training_records"`);
    await queryRunner.query(`CREATE INDEX "IDX_0ed0a62cb9e710927672b84293" ON "training_records" ("userId", "instrumentId") `);
    await queryRunner.query(`CREATE TABLE "temporary_setup_instruments" ("setupId" integer NOT NULL, "instrumentId" integer NOT NULL, "position" integer NOT NULL DEFAULT (0), CONSTRAINT "FK_7026fb202e097d0434c36651b11" FOREIGN KEY ("setupId") REFERENCES "setups" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_9a3c88ea5d6ee2bd02405ba9f93" FOREIGN KEY ("instrumentId") REFERENCES "instruments" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, PRIMARY KEY ("setupId", "instrumentId"))`);
    await queryRunner.query(`INSERT INTO "temporary_setup_instruments"("setupId", "instrumentId", "position") SELECT "setupId", "instrumentId", "position" FROM "setup_instruments"`);
    await queryRunner.query(`DROP TABLE "setup_instruments"`);
    await queryRunner.query(`ALTER TABLE "temporary_setup_instruments" RENAME TO "setup_instruments"`);
    await queryRunner.query(`DROP INDEX "IDX_e7a47401844c86fe587c3167f5"`);
    await queryRunner.query(`DROP INDEX "IDX_ae76601289869173b8d64faeef"`);
    await queryRunner.query(`CREATE TABLE "temporary_training_requests" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "userId" integer NOT NULL, "instrumentId" integer NOT NULL, "note" text NOT NULL DEFAULT (''), "status" text NOT NULL DEFAULT ('open'), "createdAt" text NOT NULL, "closedAt" text, "closedById" integer, CONSTRAINT "FK_e7a47401844c86fe587c3167f5f" FOREIGN KEY ("userId") REFERENCES "users" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_340ecea0e4a1f3f91b54b9bce6d" FOREIGN KEY ("instrumentId") REFERENCES "instruments" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`);
    await queryRunner.query(`INSERT INTO "temporary_training_requests"("id", "userId", "instrumentId", "note", "status", "createdAt", "closedAt", "closedById") SELECT "id", "userId", "instrumentId", "note", "status", "createdAt", "closedAt", "closedById" FROM "training_requests"`);
    await queryRunner.query(`DROP TABLE "training_requests"`);
    await queryRunner.query(`ALTER TABLE "temporary_training_requests" RENAME TO "training_requests"`);
    await queryRunner.query(`CREATE INDEX "IDX_e7a47401844c86fe587c3167f5" ON "training_requests" ("userId") `);
    await queryRunner.query(`CREATE INDEX "IDX_ae76601289869173b8d64faeef" ON "training_requests" ("status") `);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX "IDX_ae76601289869173b8d64faeef"`);
    await queryRunner.query(`DROP INDEX "IDX_e7a47401844c86fe587c3167f5"`);
    await queryRunner.query(`ALTER TABLE "training_requests" RENAME TO "temporary_training_requests"`);
    await queryRunner.query(`CREATE TABLE "training_requests" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "userId" integer NOT NULL, "instrumentId" integer NOT NULL, "note" text NOT NULL DEFAULT (''), "status" text NOT NULL DEFAULT ('open'), "createdAt" text NOT NULL, "closedAt" text, "closedById" integer)`);
    await queryRunner.query(`INSERT INTO "training_requests"("id", "userId", "instrumentId", "note", "status", "createdAt", "closedAt", "closedById") SELECT "id", "userId", "instrumentId", "note", "status", "createdAt", "closedAt", "closedById" FROM "temporary_training_requests"`);
    await queryRunner.query(`DROP TABLE "temporary_training_requests"`);
    await queryRunner.query(`CREATE INDEX "IDX_ae76601289869173b8d64faeef" ON "training_requests" ("status") `);
    await queryRunner.query(`CREATE INDEX "IDX_e7a47401844c86fe587c3167f5" ON "training_requests" ("userId") `);
    await queryRunner.query(`ALTER TABLE "setup_instruments" RENAME TO "temporary_setup_instruments"`);
    await queryRunner.query(`CREATE TABLE "setup_instruments" ("setupId" integer NOT NULL, "instrumentId" integer NOT NULL, "position" integer NOT NULL DEFAULT (0), PRIMARY KEY ("setupId", "instrumentId"))`);
    await queryRunner.query(`INSERT INTO "setup_instruments"("setupId", "instrumentId", "position") SELECT "setupId", "instrumentId", "position" FROM "temporary_setup_instruments"`);
    await queryRunner.query(`DROP TABLE "temporary_setup_instruments"`);
    await queryRunner.query(`DROP INDEX "IDX_0ed0a62cb9e710927672b84293"`);
    await queryRunner.query(`ALTER TABLE "training_records" RENAME TO "temporary_training_records"`);
    await queryRunner.query(`CREATE TABLE "training_records" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "userId" integer NOT NULL, "instrumentId" integer NOT NULL, "grantedAt" text NOT NULL, "expiresAt" text, "afterHours" boolean NOT NULL DEFAULT (0), "revokedAt" text, "grantedById" integer, "notes" text NOT NULL DEFAULT (''), CONSTRAINT "FK_16edd13dc387e29f62ec2a3ad99" FOREIGN KEY ("grantedById") REFERENCES "users" ("id") ON DELETE SET NULL ON UPDATE NO ACTION, CONSTRAINT "FK_fd8c86267579a84e063756ac198" FOREIGN KEY ("instrumentId") REFERENCES "instruments" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_00811346fea551d91903d342f3f" FOREIGN KEY ("userId") REFERENCES "users" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`);
    await queryRunner.query(`INSERT INTO "training_records"("id", "userId", "instrumentId", "grantedAt", "expiresAt", "afterHours", "revokedAt", "grantedById", "notes") SELECT "id", "userId", "instrumentId", "grantedAt", "expiresAt", "afterHours", "revokedAt", "grantedById", "notes" FROM "temporary_training_records"`);
    await queryRunner.query(`DROP TABLE "temporary_training_records"`);
    await queryRunner.query(`CREATE INDEX "IDX_0ed0a62cb9e710927672b84293" ON "training_records" ("userId", "instrumentId") `);
    await queryRunner.query(`DROP INDEX "IDX_ae76601289869173b8d64faeef"`);
    await queryRunner.query(`DROP INDEX "IDX_e7a47401844c86fe587c3167f5"`);
    await queryRunner.query(`DROP TABLE "training_requests"`);
    await queryRunner.query(`DROP TABLE "setup_instruments"`);
    await queryRunner.query(`DROP INDEX "IDX_5780bd8c342cc9e21314a7d488"`);
    await queryRunner.query(`DROP TABLE "setups"`);
  }
}
