import type { MigrationInterface, QueryRunner } from "typeorm";

/**
 * Run plans (issue 12): the manager's additions to the ion table, the ions an electrolyte gives
 * on chemicals, an interface cell's radius and fill volumes on instruments, run plans and the
 * reservations they hold. Columns are added in place (SQLite's ADD/DROP COLUMN), not by
 * rebuilding the tables others point at; the new tables are created with their keys at once.
 */
export class RunPlansAndReservations1796239193256 implements MigrationInterface {
  name = "RunPlansAndReservations1796239193256";

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE "ion_transfer_solvents" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "key" text NOT NULL, "name" text NOT NULL, "aliases" text NOT NULL DEFAULT ('[]'), "casNumber" text, "source" text NOT NULL, "createdById" integer, "createdAt" text NOT NULL)`);
    await queryRunner.query(`CREATE UNIQUE INDEX "IDX_43dfe0bd326edd869c540b8256" ON "ion_transfer_solvents" ("key") `);
    await queryRunner.query(`CREATE TABLE "ion_transfer_ions" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "solventKey" text NOT NULL, "ion" text NOT NULL, "name" text NOT NULL DEFAULT (''), "charge" integer NOT NULL, "standardPotentialV" real NOT NULL, "source" text NOT NULL, "diffusionAqueousCm2PerS" real, "diffusionOrganicCm2PerS" real, "createdById" integer, "createdAt" text NOT NULL)`);
    await queryRunner.query(`CREATE UNIQUE INDEX "IDX_ccef33ed5aeaa73208a269b83c" ON "ion_transfer_ions" ("solventKey", "ion") `);
    await queryRunner.query(`ALTER TABLE "chemicals" ADD COLUMN "ions" text`);
    await queryRunner.query(`ALTER TABLE "instruments" ADD COLUMN "interfaceRadiusCm" real`);
    await queryRunner.query(`ALTER TABLE "instruments" ADD COLUMN "aqueousFillMl" real`);
    await queryRunner.query(`ALTER TABLE "instruments" ADD COLUMN "organicFillMl" real`);
    await queryRunner.query(`CREATE TABLE "run_plans" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "authorId" integer NOT NULL, "bookingId" integer, "cellId" integer, "title" text NOT NULL, "solvent" text NOT NULL, "input" text NOT NULL, "createdAt" text NOT NULL, "updatedAt" text NOT NULL, CONSTRAINT "FK_b5848ead8916cec0a8d99442984" FOREIGN KEY ("authorId") REFERENCES "users" ("id") ON DELETE RESTRICT ON UPDATE NO ACTION, CONSTRAINT "FK_ed2e504d3c6960b9c24dbafa02b" FOREIGN KEY ("bookingId") REFERENCES "bookings" ("id") ON DELETE SET NULL ON UPDATE NO ACTION, CONSTRAINT "FK_4249526e3ac2d3c741ea0117328" FOREIGN KEY ("cellId") REFERENCES "instruments" ("id") ON DELETE SET NULL ON UPDATE NO ACTION)`);
    await queryRunner.query(`CREATE INDEX "IDX_b5848ead8916cec0a8d9944298" ON "run_plans" ("authorId") `);
    await queryRunner.query(`CREATE INDEX "IDX_ed2e504d3c6960b9c24dbafa02" ON "run_plans" ("bookingId") `);
    await queryRunner.query(`CREATE INDEX "IDX_4249526e3ac2d3c741ea011732" ON "run_plans" ("cellId") `);
    await queryRunner.query(`CREATE TABLE "reservations" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "containerId" integer NOT NULL, "bookingId" integer NOT NULL, "runPlanId" integer, "amount" real NOT NULL, "drawn" real NOT NULL DEFAULT (0), "unit" text NOT NULL, "state" text NOT NULL DEFAULT ('held'), "note" text NOT NULL DEFAULT (''), "usageId" integer, "createdById" integer, "createdAt" text NOT NULL, "closedAt" text, CONSTRAINT "FK_b571e74439c215bc2c71c29830e" FOREIGN KEY ("containerId") REFERENCES "containers" ("id") ON DELETE RESTRICT ON UPDATE NO ACTION, CONSTRAINT "FK_92359d237a9b0e7293af2d888fe" FOREIGN KEY ("bookingId") REFERENCES "bookings" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_92e6cbcd06d298f864a9b7996f7" FOREIGN KEY ("runPlanId") REFERENCES "run_plans" ("id") ON DELETE SET NULL ON UPDATE NO ACTION)`);
    await queryRunner.query(`CREATE INDEX "IDX_92359d237a9b0e7293af2d888f" ON "reservations" ("bookingId") `);
    await queryRunner.query(`CREATE INDEX "IDX_92e6cbcd06d298f864a9b7996f" ON "reservations" ("runPlanId") `);
    await queryRunner.query(`CREATE INDEX "IDX_b7f95b6e6b5fb887d344905511" ON "reservations" ("containerId", "state") `);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX "IDX_b7f95b6e6b5fb887d344905511"`);
    await queryRunner.query(`DROP INDEX "IDX_92e6cbcd06d298f864a9b7996f"`);
    await queryRunner.query(`DROP INDEX "IDX_92359d237a9b0e7293af2d888f"`);
    await queryRunner.query(`DROP TABLE "reservations"`);
    await queryRunner.query(`DROP INDEX "IDX_4249526e3ac2d3c741ea011732"`);
    await queryRunner.query(`DROP INDEX "IDX_ed2e504d3c6960b9c24dbafa02"`);
    await queryRunner.query(`DROP INDEX "IDX_b5848ead8916cec0a8d9944298"`);
    await queryRunner.query(`DROP TABLE "run_plans"`);
    await queryRunner.query(`ALTER TABLE "instruments" DROP COLUMN "organicFillMl"`);
    await queryRunner.query(`ALTER TABLE "instruments" DROP COLUMN "aqueousFillMl"`);
    await queryRunner.query(`ALTER TABLE "instruments" DROP COLUMN "interfaceRadiusCm"`);
    await queryRunner.query(`ALTER TABLE "chemicals" DROP COLUMN "ions"`);
    await queryRunner.query(`DROP INDEX "IDX_ccef33ed5aeaa73208a269b83c"`);
    await queryRunner.query(`DROP TABLE "ion_transfer_ions"`);
    await queryRunner.query(`DROP INDEX "IDX_43dfe0bd326edd869c540b8256"`);
    await queryRunner.query(`DROP TABLE "ion_transfer_solvents"`);
  }
}
