import type { MigrationInterface, QueryRunner } from "typeorm";

export class LabelsAndStocks1796173796292 implements MigrationInterface {
  name = "LabelsAndStocks1796173796292";

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE "label_history" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "entityType" text NOT NULL, "entityId" integer NOT NULL, "token" text NOT NULL, "retiredAt" text NOT NULL, "retiredById" integer, "reason" text NOT NULL DEFAULT (''))`);
    await queryRunner.query(`CREATE UNIQUE INDEX "IDX_562fdd2d4db8015290f7430c06" ON "label_history" ("token") `);
    await queryRunner.query(`CREATE INDEX "IDX_10053a5cbd24bce50ef3f3a492" ON "label_history" ("entityType", "entityId") `);
    await queryRunner.query(`CREATE TABLE "label_stocks" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "name" text NOT NULL, "size" text NOT NULL, "pageWidthMm" real NOT NULL, "pageHeightMm" real NOT NULL, "labelWidthMm" real NOT NULL, "labelHeightMm" real NOT NULL, "columns" integer NOT NULL, "rows" integer NOT NULL, "marginTopMm" real NOT NULL DEFAULT (0), "marginLeftMm" real NOT NULL DEFAULT (0), "gapXMm" real NOT NULL DEFAULT (0), "gapYMm" real NOT NULL DEFAULT (0), "createdAt" text NOT NULL)`);
    await queryRunner.query(`CREATE UNIQUE INDEX "IDX_afa53aca98910da9f81b92a7d7" ON "label_stocks" ("name") `);
    await queryRunner.query(`DROP INDEX "IDX_562fdd2d4db8015290f7430c06"`);
    await queryRunner.query(`DROP INDEX "IDX_10053a5cbd24bce50ef3f3a492"`);
    await queryRunner.query(`CREATE TABLE "temporary_label_history" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "entityType" text NOT NULL, "entityId" integer NOT NULL, "token" text NOT NULL, "retiredAt" text NOT NULL, "retiredById" integer, "reason" text NOT NULL DEFAULT (''), CONSTRAINT "FK_e4e9570cc7d7256d457872d77a1" FOREIGN KEY ("retiredById") REFERENCES "users" ("id") ON DELETE SET NULL ON UPDATE NO ACTION)`);
    await queryRunner.query(`INSERT INTO "temporary_label_history"("id", "entityType", "entityId", "token", "retiredAt", "retiredById", "reason") SELECT "id", "entityType", "entityId", "token", "retiredAt", "retiredById", "reason" FROM "label_history"`);
    await queryRunner.query(`DROP TABLE "label_history"`);
    await queryRunner.query(`ALTER TABLE "temporary_label_history" RENAME TO "label_history"`);
    await queryRunner.query(`CREATE UNIQUE INDEX "IDX_562fdd2d4db8015290f7430c06" ON "label_history" ("token") `);
    await queryRunner.query(`CREATE INDEX "IDX_10053a5cbd24bce50ef3f3a492" ON "label_history" ("entityType", "entityId") `);
    // Common label stocks, by their dimensions in mm (common practice sizes; the manager adds others).
    const stocks: [string, string, number, number, number, number, number, number, number, number, number, number][] = [
      ["Roll, one bottle label 100 × 50 mm", "bottle", 100, 50, 100, 50, 1, 1, 0, 0, 0, 0],
      ["Roll, one vial label 40 × 20 mm", "vial", 40, 20, 40, 20, 1, 1, 0, 0, 0, 0],
      ["A4 sheet, 3 × 8 labels of 70 × 37 mm", "bottle", 210, 297, 70, 37, 3, 8, 0.5, 0, 0, 0],
      ["A4 sheet, 5 × 13 labels of 38.1 × 21.2 mm", "vial", 210, 297, 38.1, 21.2, 5, 13, 10.7, 4.75, 2.5, 0],
      ["US Letter sheet, 2 × 5 labels of 4 × 2 in", "bottle", 215.9, 279.4, 101.6, 50.8, 2, 5, 12.7, 3.96875, 4.7625, 0],
      ["US Letter sheet, 3 × 10 labels of 2.625 × 1 in", "vial", 215.9, 279.4, 66.675, 25.4, 3, 10, 12.7, 4.7625, 3.175, 0],
    ];
    for (const row of stocks) {
      await queryRunner.query(
        `INSERT INTO "label_stocks" ("name", "size", "pageWidthMm", "pageHeightMm", "labelWidthMm", "labelHeightMm", "columns", "rows", "marginTopMm", "marginLeftMm", "gapXMm", "gapYMm", "createdAt") VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, '2026-12-01T00:00:00.000Z')`,
        row,
      );
    }
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX "IDX_10053a5cbd24bce50ef3f3a492"`);
    await queryRunner.query(`DROP INDEX "IDX_562fdd2d4db8015290f7430c06"`);
    await queryRunner.query(`ALTER TABLE "label_history" RENAME TO "temporary_label_history"`);
    await queryRunner.query(`CREATE TABLE "label_history" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "entityType" text NOT NULL, "entityId" integer NOT NULL, "token" text NOT NULL, "retiredAt" text NOT NULL, "retiredById" integer, "reason" text NOT NULL DEFAULT (''))`);
    await queryRunner.query(`INSERT INTO "label_history"("id", "entityType", "entityId", "token", "retiredAt", "retiredById", "reason") SELECT "id", "entityType", "entityId", "token", "retiredAt", "retiredById", "reason" FROM "temporary_label_history"`);
    await queryRunner.query(`DROP TABLE "temporary_label_history"`);
    await queryRunner.query(`CREATE INDEX "IDX_10053a5cbd24bce50ef3f3a492" ON "label_history" ("entityType", "entityId") `);
    await queryRunner.query(`CREATE UNIQUE INDEX "IDX_562fdd2d4db8015290f7430c06" ON "label_history" ("token") `);
    await queryRunner.query(`DROP INDEX "IDX_afa53aca98910da9f81b92a7d7"`);
    await queryRunner.query(`DROP TABLE "label_stocks"`);
    await queryRunner.query(`DROP INDEX "IDX_10053a5cbd24bce50ef3f3a492"`);
    await queryRunner.query(`DROP INDEX "IDX_562fdd2d4db8015290f7430c06"`);
    await queryRunner.query(`DROP TABLE "label_history"`);
  }
}
