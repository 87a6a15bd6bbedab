import type { MigrationInterface, QueryRunner } from "typeorm";

/**
 * Storage limits by fire-code liquid class: each location holds a list of limits (a set of NFPA 30
 * classes, a volume, whether approved cabinets inside count). The two GHS-category limits a
 * location had become limits of the classes they covered: categories 1–3 (flash point ≤ 60 °C)
 * are Classes IA, IB, IC and II; category 4 (60–93 °C) is Class IIIA (UN GHS 2.6 and NFPA 30's
 * class thresholds). Cabinets inside counted toward the old limits, so they count toward these.
 */
export class StorageLimitsByClass1796233973566 implements MigrationInterface {
  name = "StorageLimitsByClass1796233973566";

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE "location_limits" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "locationId" integer NOT NULL, "classes" text NOT NULL, "maxLitres" real NOT NULL, "enteredVolume" real NOT NULL, "enteredUnit" text NOT NULL, "includesCabinets" boolean NOT NULL DEFAULT (1), "note" text NOT NULL DEFAULT (''), "createdAt" text NOT NULL, CONSTRAINT "FK_9868aa8fa05024a87d18a30e487" FOREIGN KEY ("locationId") REFERENCES "locations" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_9868aa8fa05024a87d18a30e48" ON "location_limits" ("locationId") `);
    const now = new Date().toISOString();
    await queryRunner.query(
      `INSERT INTO "location_limits" ("locationId", "classes", "maxLitres", "enteredVolume", "enteredUnit", "includesCabinets", "note", "createdAt")
       SELECT "id", '["IA","IB","IC","II"]', "flammableLimitLitres", "flammableLimitLitres", 'L', 1, 'Carried over from the flammable-liquid (GHS categories 1–3) limit.', ? FROM "locations" WHERE "flammableLimitLitres" IS NOT NULL`,
      [now],
    );
    await queryRunner.query(
      `INSERT INTO "location_limits" ("locationId", "classes", "maxLitres", "enteredVolume", "enteredUnit", "includesCabinets", "note", "createdAt")
       SELECT "id", '["IIIA"]', "combustibleLimitLitres", "combustibleLimitLitres", 'L', 1, 'Carried over from the combustible-liquid (GHS category 4) limit.', ? FROM "locations" WHERE "combustibleLimitLitres" IS NOT NULL`,
      [now],
    );
    await queryRunner.query(`ALTER TABLE "locations" DROP COLUMN "flammableLimitLitres"`);
    await queryRunner.query(`ALTER TABLE "locations" DROP COLUMN "combustibleLimitLitres"`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "locations" ADD COLUMN "flammableLimitLitres" real`);
    await queryRunner.query(`ALTER TABLE "locations" ADD COLUMN "combustibleLimitLitres" real`);
    await queryRunner.query(
      `UPDATE "locations" SET "flammableLimitLitres" = (SELECT MIN(l."maxLitres") FROM "location_limits" l WHERE l."locationId" = "locations"."id" AND l."classes" = '["IA","IB","IC","II"]')`,
    );
    await queryRunner.query(
      `UPDATE "locations" SET "combustibleLimitLitres" = (SELECT MIN(l."maxLitres") FROM "location_limits" l WHERE l."locationId" = "locations"."id" AND l."classes" = '["IIIA"]')`,
    );
    await queryRunner.query(`DROP INDEX "IDX_9868aa8fa05024a87d18a30e48"`);
    await queryRunner.query(`DROP TABLE "location_limits"`);
  }
}
