import type { MigrationInterface, QueryRunner } from "typeorm";

export class Recharge1796174960945 implements MigrationInterface {
  name = "Recharge1796174960945";

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE "billing_adjustments" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "accountId" integer NOT NULL, "amountCents" integer NOT NULL, "reason" text NOT NULL, "period" text NOT NULL, "createdById" integer, "createdAt" text NOT NULL)`);
    await queryRunner.query(`CREATE INDEX "IDX_376cd82afe6415f2935d08dd9f" ON "billing_adjustments" ("accountId") `);
    await queryRunner.query(`CREATE TABLE "billing_runs" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "period" text NOT NULL, "status" text NOT NULL, "currency" text NOT NULL, "totalCents" integer NOT NULL, "createdById" integer, "createdAt" text NOT NULL, "voidedAt" text, "voidedById" integer, "voidReason" text)`);
    await queryRunner.query(`CREATE INDEX "IDX_60ad6f65ddbeb06819e9cb28dd" ON "billing_runs" ("period") `);
    await queryRunner.query(`CREATE TABLE "charge_lines" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "statementId" integer NOT NULL, "runId" integer NOT NULL, "accountId" integer NOT NULL, "kind" text NOT NULL, "bookingId" integer, "instrumentId" integer, "usageId" integer, "adjustmentId" integer, "userId" integer, "rateId" integer, "description" text NOT NULL, "quantity" real NOT NULL, "unit" text NOT NULL, "unitPriceCents" integer NOT NULL, "amountCents" integer NOT NULL, "at" text NOT NULL)`);
    await queryRunner.query(`CREATE INDEX "IDX_6f69563b50f0de444450759a30" ON "charge_lines" ("statementId") `);
    await queryRunner.query(`CREATE INDEX "IDX_2dae77fae8f329fb13b60b1ac9" ON "charge_lines" ("runId") `);
    await queryRunner.query(`CREATE INDEX "IDX_00ba2ed403f6d866c3b1f3ba2a" ON "charge_lines" ("bookingId") `);
    await queryRunner.query(`CREATE INDEX "IDX_837afbfc3c750aa65fe7b9ee38" ON "charge_lines" ("usageId") `);
    await queryRunner.query(`CREATE INDEX "IDX_8c969db11bab950ceb6945e370" ON "charge_lines" ("userId") `);
    await queryRunner.query(`CREATE TABLE "processed_events" ("id" text PRIMARY KEY NOT NULL, "type" text NOT NULL, "processedAt" text NOT NULL)`);
    await queryRunner.query(`CREATE TABLE "rates" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "instrumentId" integer, "instrumentKind" text, "customerClass" text NOT NULL, "hourlyRateCents" integer NOT NULL, "effectiveFrom" text NOT NULL, "effectiveTo" text, "minimumMinutes" integer, "roundingIncrementMinutes" integer, "afterHoursFactor" real, "note" text NOT NULL DEFAULT (''), "createdById" integer, "createdAt" text NOT NULL)`);
    await queryRunner.query(`CREATE INDEX "IDX_8768a2bad9ec72ae89ee5f7912" ON "rates" ("customerClass", "instrumentId", "instrumentKind") `);
    await queryRunner.query(`CREATE TABLE "statements" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "runId" integer NOT NULL, "accountId" integer NOT NULL, "period" text NOT NULL, "totalCents" integer NOT NULL, "currency" text NOT NULL, "invoiceStatus" text NOT NULL DEFAULT ('none'), "invoiceId" text, "invoiceNumber" text, "invoiceUrl" text, "invoiceAttempts" integer NOT NULL DEFAULT (0), "invoiceNextAttemptAt" text, "invoiceLastError" text, "paidAt" text, "mailedAt" text, "createdAt" text NOT NULL)`);
    await queryRunner.query(`CREATE INDEX "IDX_d73cca0435f78581d209d846d2" ON "statements" ("accountId") `);
    await queryRunner.query(`CREATE INDEX "IDX_9f8238ba1242840ec220067934" ON "statements" ("invoiceId") `);
    await queryRunner.query(`CREATE UNIQUE INDEX "IDX_8c7f8c8c4d058ab44a5339de3a" ON "statements" ("runId", "accountId") `);
    await queryRunner.query(`DROP INDEX "IDX_6f69563b50f0de444450759a30"`);
    await queryRunner.query(`DROP INDEX "IDX_2dae77fae8f329fb13b60b1ac9"`);
    await queryRunner.query(`DROP INDEX "IDX_00ba2ed403f6d866c3b1f3ba2a"`);
    await queryRunner.query(`DROP INDEX "IDX_837afbfc3c750aa65fe7b9ee38"`);
    await queryRunner.query(`DROP INDEX "IDX_8c969db11bab950ceb6945e370"`);
    await queryRunner.query(`CREATE TABLE "temporary_charge_lines" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "statementId" integer NOT NULL, "runId" integer NOT NULL, "accountId" integer NOT NULL, "kind" text NOT NULL, "bookingId" integer, "instrumentId" integer, "usageId" integer, "adjustmentId" integer, "userId" integer, "rateId" integer, "description" text NOT NULL, "quantity" real NOT NULL, "unit" text NOT NULL, "unitPriceCents" integer NOT NULL, "amountCents" integer NOT NULL, "at" text NOT NULL, CONSTRAINT "FK_6f69563b50f0de444450759a309" FOREIGN KEY ("statementId") REFERENCES "statements" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`);
    await queryRunner.query(`INSERT INTO "temporary_charge_lines"("id", "statementId", "runId", "accountId", "kind", "bookingId", "instrumentId", "usageId", "adjustmentId", "userId", "rateId", "description", "quantity", "unit", "unitPriceCents", "amountCents", "at") SELECT "id", "statementId", "runId", "accountId", "kind", "bookingId", "instrumentId", "usageId", "adjustmentId", "userId", "rateId", "description", "quantity", "unit", "unitPriceCents", "amountCents", "at" FROM "charge_lines"`);
    await queryRunner.query(`DROP TABLE "charge_lines"`);
    await queryRunner.query(`ALTER TABLE "temporary_charge_lines" RENAME TO "charge_lines"`);
    await queryRunner.query(`CREATE INDEX "IDX_6f69563b50f0de444450759a30" ON "charge_lines" ("statementId") `);
    await queryRunner.query(`CREATE INDEX "IDX_2dae77fae8f329fb13b60b1ac9" ON "charge_lines" ("runId") `);
    await queryRunner.query(`CREATE INDEX "IDX_00ba2ed403f6d866c3b1f3ba2a" ON "charge_lines" ("bookingId") `);
    await queryRunner.query(`CREATE INDEX "IDX_837afbfc3c750aa65fe7b9ee38" ON "charge_lines" ("usageId") `);
    await queryRunner.query(`CREATE INDEX "IDX_8c969db11bab950ceb6945e370" ON "charge_lines" ("userId") `);
    await queryRunner.query(`DROP INDEX "IDX_d73cca0435f78581d209d846d2"`);
    await queryRunner.query(`DROP INDEX "IDX_9f8238ba1242840ec220067934"`);
    await queryRunner.query(`DROP INDEX "IDX_8c7f8c8c4d058ab44a5339de3a"`);
    await queryRunner.query(`CREATE TABLE "temporary_statements" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "runId" integer NOT NULL, "accountId" integer NOT NULL, "period" text NOT NULL, "totalCents" integer NOT NULL, "currency" text NOT NULL, "invoiceStatus" text NOT NULL DEFAULT ('none'), "invoiceId" text, "invoiceNumber" text, "invoiceUrl" text, "invoiceAttempts" integer NOT NULL DEFAULT (0), "invoiceNextAttemptAt" text, "invoiceLastError" text, "paidAt" text, "mailedAt" text, "createdAt" text NOT NULL, CONSTRAINT "FK_37e0edd4b8bca31a7f721437012" FOREIGN KEY ("runId") REFERENCES "billing_runs" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`);
    await queryRunner.query(`INSERT INTO "temporary_statements"("id", "runId", "accountId", "period", "totalCents", "currency", "invoiceStatus", "invoiceId", "invoiceNumber", "invoiceUrl", "invoiceAttempts", "invoiceNextAttemptAt", "invoiceLastError", "paidAt", "mailedAt", "createdAt") SELECT "id", "runId", "accountId", "period", "totalCents", "currency", "invoiceStatus", "invoiceId", "invoiceNumber", "invoiceUrl", "invoiceAttempts", "invoiceNextAttemptAt", "invoiceLastError", "paidAt", "mailedAt", "createdAt" FROM "statements"`);
    await queryRunner.query(`DROP TABLE "statements"`);
    await queryRunner.query(`ALTER TABLE "temporary_statements" RENAME TO "statements"`);
    await queryRunner.query(`CREATE INDEX "IDX_d73cca0435f78581d209d846d2" ON "statements" ("accountId") `);
    await queryRunner.query(`CREATE INDEX "IDX_9f8238ba1242840ec220067934" ON "statements" ("invoiceId") `);
    await queryRunner.query(`CREATE UNIQUE INDEX "IDX_8c7f8c8c4d058ab44a5339de3a" ON "statements" ("runId", "accountId") `);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX "IDX_8c7f8c8c4d058ab44a5339de3a"`);
    await queryRunner.query(`DROP INDEX "IDX_9f8238ba1242840ec220067934"`);
    await queryRunner.query(`DROP INDEX "IDX_d73cca0435f78581d209d846d2"`);
    await queryRunner.query(`ALTER TABLE "statements" RENAME TO "temporary_statements"`);
    await queryRunner.query(`CREATE TABLE "statements" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "runId" integer NOT NULL, "accountId" integer NOT NULL, "period" text NOT NULL, "totalCents" integer NOT NULL, "currency" text NOT NULL, "invoiceStatus" text NOT NULL DEFAULT ('none'), "invoiceId" text, "invoiceNumber" text, "invoiceUrl" text, "invoiceAttempts" integer NOT NULL DEFAULT (0), "invoiceNextAttemptAt" text, "invoiceLastError" text, "paidAt" text, "mailedAt" text, "createdAt" text NOT NULL)`);
    await queryRunner.query(`INSERT INTO "statements"("id", "runId", "accountId", "period", "totalCents", "currency", "invoiceStatus", "invoiceId", "invoiceNumber", "invoiceUrl", "invoiceAttempts", "invoiceNextAttemptAt", "invoiceLastError", "paidAt", "mailedAt", "createdAt") SELECT "id", "runId", "accountId", "period", "totalCents", "currency", "invoiceStatus", "invoiceId", "invoiceNumber", "invoiceUrl", "invoiceAttempts", "invoiceNextAttemptAt", "invoiceLastError", "paidAt", "mailedAt", "createdAt" FROM "temporary_statements"`);
    await queryRunner.query(`DROP TABLE "temporary_statements"`);
    await queryRunner.query(`CREATE UNIQUE INDEX "IDX_8c7f8c8c4d058ab44a5339de3a" ON "statements" ("runId", "accountId") `);
    await queryRunner.query(`CREATE INDEX "IDX_9f8238ba1242840ec220067934" ON "statements" ("invoiceId") `);
    await queryRunner.query(`CREATE INDEX "IDX_d73cca0435f78581d209d846d2" ON "statements" ("accountId") `);
    await queryRunner.query(`DROP INDEX "IDX_8c969db11bab950ceb6945e370"`);
    await queryRunner.query(`DROP INDEX "IDX_837afbfc3c750aa65fe7b9ee38"`);
    await queryRunner.query(`DROP INDEX "IDX_00ba2ed403f6d866c3b1f3ba2a"`);
    await queryRunner.query(`DROP INDEX "IDX_2dae77fae8f329fb13b60b1ac9"`);
    await queryRunner.query(`DROP INDEX "IDX_6f69563b50f0de444450759a30"`);
    await queryRunner.query(`ALTER TABLE "charge_lines" RENAME TO "temporary_charge_lines"`);
    await queryRunner.query(`CREATE TABLE "charge_lines" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "statementId" integer NOT NULL, "runId" integer NOT NULL, "accountId" integer NOT NULL, "kind" text NOT NULL, "bookingId" integer, "instrumentId" integer, "usageId" integer, "adjustmentId" integer, "userId" integer, "rateId" integer, "description" text NOT NULL, "quantity" real NOT NULL, "unit" text NOT NULL, "unitPriceCents" integer NOT NULL, "amountCents" integer NOT NULL, "at" text NOT NULL)`);
    await queryRunner.query(`INSERT INTO "charge_lines"("id", "statementId", "runId", "accountId", "kind", "bookingId", "instrumentId", "usageId", "adjustmentId", "userId", "rateId", "description", "quantity", "unit", "unitPriceCents", "amountCents", "at") SELECT "id", "statementId", "runId", "accountId", "kind", "bookingId", "instrumentId", "usageId", "adjustmentId", "userId", "rateId", "description", "quantity", "unit", "unitPriceCents", "amountCents", "at" FROM "temporary_charge_lines"`);
    await queryRunner.query(`DROP TABLE "temporary_charge_lines"`);
    await queryRunner.query(`CREATE INDEX "IDX_8c969db11bab950ceb6945e370" ON "charge_lines" ("userId") `);
    await queryRunner.query(`CREATE INDEX "IDX_837afbfc3c750aa65fe7b9ee38" ON "charge_lines" ("usageId") `);
    await queryRunner.query(`CREATE INDEX "IDX_00ba2ed403f6d866c3b1f3ba2a" ON "charge_lines" ("bookingId") `);
    await queryRunner.query(`CREATE INDEX "IDX_2dae77fae8f329fb13b60b1ac9" ON "charge_lines" ("runId") `);
    await queryRunner.query(`CREATE INDEX "IDX_6f69563b50f0de444450759a30" ON "charge_lines" ("statementId") `);
    await queryRunner.query(`DROP INDEX "IDX_8c7f8c8c4d058ab44a5339de3a"`);
    await queryRunner.query(`DROP INDEX "IDX_9f8238ba1242840ec220067934"`);
    await queryRunner.query(`DROP INDEX "IDX_d73cca0435f78581d209d846d2"`);
    await queryRunner.query(`DROP TABLE "statements"`);
    await queryRunner.query(`DROP INDEX "IDX_8768a2bad9ec72ae89ee5f7912"`);
    await queryRunner.query(`DROP TABLE "rates"`);
    await queryRunner.query(`DROP TABLE "processed_events"`);
    await queryRunner.query(`DROP INDEX "IDX_8c969db11bab950ceb6945e370"`);
    await queryRunner.query(`DROP INDEX "IDX_837afbfc3c750aa65fe7b9ee38"`);
    await queryRunner.query(`DROP INDEX "IDX_00ba2ed403f6d866c3b1f3ba2a"`);
    await queryRunner.query(`DROP INDEX "IDX_2dae77fae8f329fb13b60b1ac9"`);
    await queryRunner.query(`DROP INDEX "IDX_6f69563b50f0de444450759a30"`);
    await queryRunner.query(`DROP TABLE "charge_lines"`);
    await queryRunner.query(`DROP INDEX "IDX_60ad6f65ddbeb06819e9cb28dd"`);
    await queryRunner.query(`DROP TABLE "billing_runs"`);
    await queryRunner.query(`DROP INDEX "IDX_376cd82afe6415f2935d08dd9f"`);
    await queryRunner.query(`DROP TABLE "billing_adjustments"`);
  }
}
