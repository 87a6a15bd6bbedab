import type { MigrationInterface, QueryRunner } from "typeorm";

export class StockroomAndSafety1796173804700 implements MigrationInterface {
  name = "StockroomAndSafety1796173804700";

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE "container_movements" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "containerId" integer NOT NULL, "fromLocationId" integer, "toLocationId" integer, "userId" integer, "kind" text NOT NULL, "note" text NOT NULL DEFAULT (''), "at" text NOT NULL)`);
    await queryRunner.query(`CREATE INDEX "IDX_6e13ebbf4ce42b5348f5d6186d" ON "container_movements" ("containerId") `);
    await queryRunner.query(`CREATE TABLE "safety_data_sheets" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "chemicalId" integer NOT NULL, "originalName" text NOT NULL, "storedName" text NOT NULL, "sizeBytes" integer NOT NULL, "sha256" text NOT NULL, "supplier" text NOT NULL DEFAULT (''), "reviewedOn" text NOT NULL, "uploadedById" integer, "uploadedAt" text NOT NULL)`);
    await queryRunner.query(`CREATE INDEX "IDX_3180ec473761ebcc34b7f8ba5a" ON "safety_data_sheets" ("chemicalId") `);
    await queryRunner.query(`CREATE TABLE "solution_components" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "solutionContainerId" integer NOT NULL, "parentContainerId" integer NOT NULL, "role" text NOT NULL, "amount" real NOT NULL, "unit" text NOT NULL)`);
    await queryRunner.query(`CREATE INDEX "IDX_8643543147353ff767079fa6bd" ON "solution_components" ("solutionContainerId") `);
    await queryRunner.query(`CREATE INDEX "IDX_490ae3474af07233f5cb5fd35d" ON "solution_components" ("parentContainerId") `);
    await queryRunner.query(`CREATE TABLE "stock_alerts" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "kind" text NOT NULL, "subjectId" integer NOT NULL, "sentAt" text NOT NULL)`);
    await queryRunner.query(`CREATE INDEX "IDX_0330f511de9c101804dfb57170" ON "stock_alerts" ("kind", "subjectId") `);
    await queryRunner.query(`CREATE INDEX "IDX_25dc6607cd29c8e1e2e1d91096" ON "containers" ("expiresAt") `);
    await queryRunner.query(`CREATE INDEX "IDX_2fbfab299ba2d1255d6debe04e" ON "containers" ("lot") `);
    await queryRunner.query(`DROP INDEX "IDX_6e13ebbf4ce42b5348f5d6186d"`);
    await queryRunner.query(`CREATE TABLE "temporary_container_movements" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "containerId" integer NOT NULL, "fromLocationId" integer, "toLocationId" integer, "userId" integer, "kind" text NOT NULL, "note" text NOT NULL DEFAULT (''), "at" text NOT NULL, CONSTRAINT "FK_6e13ebbf4ce42b5348f5d6186de" FOREIGN KEY ("containerId") REFERENCES "containers" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_1edeb95cff0965a5e9ae620b97a" FOREIGN KEY ("fromLocationId") REFERENCES "locations" ("id") ON DELETE SET NULL ON UPDATE NO ACTION, CONSTRAINT "FK_81c569cfe8f53b400a537e2015a" FOREIGN KEY ("toLocationId") REFERENCES "locations" ("id") ON DELETE SET NULL ON UPDATE NO ACTION, CONSTRAINT "FK_db3dd23fe26ef0b9c893f1a7cc1" FOREIGN KEY ("userId") REFERENCES "users" ("id") ON DELETE SET NULL ON UPDATE NO ACTION)`);
    await queryRunner.query(`INSERT INTO "temporary_container_movements"("id", "containerId", "fromLocationId", "toLocationId", "userId", "kind", "note", "at") SELECT "id", "containerId", "fromLocationId", "toLocationId", "userId", "kind", "note", "at" FROM "container_movements"`);
    await queryRunner.query(`DROP TABLE "container_movements"`);
    await queryRunner.query(`ALTER TABLE "temporary_container_movements" RENAME TO "container_movements"`);
    await queryRunner.query(`CREATE INDEX "IDX_6e13ebbf4ce42b5348f5d6186d" ON "container_movements" ("containerId") `);
    await queryRunner.query(`DROP INDEX "IDX_3180ec473761ebcc34b7f8ba5a"`);
    await queryRunner.query(`CREATE TABLE "temporary_safety_data_sheets" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "chemicalId" integer NOT NULL, "originalName" text NOT NULL, "storedName" text NOT NULL, "sizeBytes" integer NOT NULL, "sha256" text NOT NULL, "supplier" text NOT NULL DEFAULT (''), "reviewedOn" text NOT NULL, "uploadedById" integer, "uploadedAt" text NOT NULL, CONSTRAINT "FK_3180ec473761ebcc34b7f8ba5af" FOREIGN KEY ("chemicalId") REFERENCES "chemicals" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_b8e7628f3aa715e5afa8c463baf" FOREIGN KEY ("uploadedById") REFERENCES "users" ("id") ON DELETE SET NULL ON UPDATE NO ACTION)`);
    await queryRunner.query(`INSERT INTO "temporary_safety_data_sheets"("id", "chemicalId", "originalName", "storedName", "sizeBytes", "sha256", "supplier", "reviewedOn", "uploadedById", "uploadedAt") SELECT "id", "chemicalId", "originalName", "storedName", "sizeBytes", "sha256", "supplier", "reviewedOn", "uploadedById", "uploadedAt" FROM "safety_data_sheets"`);
    await queryRunner.query(`DROP TABLE "safety_data_sheets"`);
    await queryRunner.query(`ALTER TABLE "temporary_safety_data_sheets" RENAME TO "safety_data_sheets"`);
    await queryRunner.query(`CREATE INDEX "IDX_3180ec473761ebcc34b7f8ba5a" ON "safety_data_sheets" ("chemicalId") `);
    await queryRunner.query(`DROP INDEX "IDX_8643543147353ff767079fa6bd"`);
    await queryRunner.query(`DROP INDEX "IDX_490ae3474af07233f5cb5fd35d"`);
    await queryRunner.query(`CREATE TABLE "temporary_solution_components" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "solutionContainerId" integer NOT NULL, "parentContainerId" integer NOT NULL, "role" text NOT NULL, "amount" real NOT NULL, "unit" text NOT NULL, CONSTRAINT "FK_8643543147353ff767079fa6bda" FOREIGN KEY ("solutionContainerId") REFERENCES "containers" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_490ae3474af07233f5cb5fd35de" FOREIGN KEY ("parentContainerId") REFERENCES "containers" ("id") ON DELETE RESTRICT ON UPDATE NO ACTION)`);
    await queryRunner.query(`INSERT INTO "temporary_solution_components"("id", "solutionContainerId", "parentContainerId", "role", "amount", "unit") SELECT "id", "solutionContainerId", "parentContainerId", "role", "amount", "unit" FROM "solution_components"`);
    await queryRunner.query(`DROP TABLE "solution_components"`);
    await queryRunner.query(`ALTER TABLE "temporary_solution_components" RENAME TO "solution_components"`);
    await queryRunner.query(`CREATE INDEX "IDX_8643543147353ff767079fa6bd" ON "solution_components" ("solutionContainerId") `);
    await queryRunner.query(`CREATE INDEX "IDX_490ae3474af07233f5cb5fd35d" ON "solution_components" ("parentContainerId") `);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX "IDX_490ae3474af07233f5cb5fd35d"`);
    await queryRunner.query(`DROP INDEX "IDX_8643543147353ff767079fa6bd"`);
    await queryRunner.query(`ALTER TABLE "solution_components" RENAME TO "temporary_solution_components"`);
    await queryRunner.query(`CREATE TABLE "solution_components" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "solutionContainerId" integer NOT NULL, "parentContainerId" integer NOT NULL, "role" text NOT NULL, "amount" real NOT NULL, "unit" text NOT NULL)`);
    await queryRunner.query(`INSERT INTO "solution_components"("id", "solutionContainerId", "parentContainerId", "role", "amount", "unit") SELECT "id", "solutionContainerId", "parentContainerId", "role", "amount", "unit" FROM "temporary_solution_components"`);
    await queryRunner.query(`DROP TABLE "temporary_solution_components"`);
    await queryRunner.query(`CREATE INDEX "IDX_490ae3474af07233f5cb5fd35d" ON "solution_components" ("parentContainerId") `);
    await queryRunner.query(`CREATE INDEX "IDX_8643543147353ff767079fa6bd" ON "solution_components" ("solutionContainerId") `);
    await queryRunner.query(`DROP INDEX "IDX_3180ec473761ebcc34b7f8ba5a"`);
    await queryRunner.query(`ALTER TABLE "safety_data_sheets" RENAME TO "temporary_safety_data_sheets"`);
    await queryRunner.query(`CREATE TABLE "safety_data_sheets" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "chemicalId" integer NOT NULL, "originalName" text NOT NULL, "storedName" text NOT NULL, "sizeBytes" integer NOT NULL, "sha256" text NOT NULL, "supplier" text NOT NULL DEFAULT (''), "reviewedOn" text NOT NULL, "uploadedById" integer, "uploadedAt" text NOT NULL)`);
    await queryRunner.query(`INSERT INTO "safety_data_sheets"("id", "chemicalId", "originalName", "storedName", "sizeBytes", "sha256", "supplier", "reviewedOn", "uploadedById", "uploadedAt") SELECT "id", "chemicalId", "originalName", "storedName", "sizeBytes", "sha256", "supplier", "reviewedOn", "uploadedById", "uploadedAt" FROM "temporary_safety_data_sheets"`);
    await queryRunner.query(`DROP TABLE "temporary_safety_data_sheets"`);
    await queryRunner.query(`CREATE INDEX "IDX_3180ec473761ebcc34b7f8ba5a" ON "safety_data_sheets" ("chemicalId") `);
    await queryRunner.query(`DROP INDEX "IDX_6e13ebbf4ce42b5348f5d6186d"`);
    await queryRunner.query(`ALTER TABLE "container_movements" RENAME TO "temporary_container_movements"`);
    await queryRunner.query(`CREATE TABLE "container_movements" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "containerId" integer NOT NULL, "fromLocationId" integer, "toLocationId" integer, "userId" integer, "kind" text NOT NULL, "note" text NOT NULL DEFAULT (''), "at" text NOT NULL)`);
    await queryRunner.query(`INSERT INTO "container_movements"("id", "containerId", "fromLocationId", "toLocationId", "userId", "kind", "note", "at") SELECT "id", "containerId", "fromLocationId", "toLocationId", "userId", "kind", "note", "at" FROM "temporary_container_movements"`);
    await queryRunner.query(`DROP TABLE "temporary_container_movements"`);
    await queryRunner.query(`CREATE INDEX "IDX_6e13ebbf4ce42b5348f5d6186d" ON "container_movements" ("containerId") `);
    await queryRunner.query(`DROP INDEX "IDX_2fbfab299ba2d1255d6debe04e"`);
    await queryRunner.query(`DROP INDEX "IDX_25dc6607cd29c8e1e2e1d91096"`);
    await queryRunner.query(`DROP INDEX "IDX_0330f511de9c101804dfb57170"`);
    await queryRunner.query(`DROP TABLE "stock_alerts"`);
    await queryRunner.query(`DROP INDEX "IDX_490ae3474af07233f5cb5fd35d"`);
    await queryRunner.query(`DROP INDEX "IDX_8643543147353ff767079fa6bd"`);
    await queryRunner.query(`DROP TABLE "solution_components"`);
    await queryRunner.query(`DROP INDEX "IDX_3180ec473761ebcc34b7f8ba5a"`);
    await queryRunner.query(`DROP TABLE "safety_data_sheets"`);
    await queryRunner.query(`DROP INDEX "IDX_6e13ebbf4ce42b5348f5d6186d"`);
    await queryRunner.query(`DROP TABLE "container_movements"`);
  }
}
