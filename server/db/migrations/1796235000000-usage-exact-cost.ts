import type { MigrationInterface, QueryRunner } from "typeorm";

/** A usage keeps its cost unrounded (quantity in the cost unit, price of one unit), so billing rounds once. */
export class UsageExactCost1796235000000 implements MigrationInterface {
  name = "UsageExactCost1796235000000";

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "container_usages" ADD COLUMN "costQuantity" text`);
    await queryRunner.query(`ALTER TABLE "container_usages" ADD COLUMN "costUnit" text`);
    await queryRunner.query(`ALTER TABLE "container_usages" ADD COLUMN "unitCostCents" text`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "container_usages" DROP COLUMN "unitCostCents"`);
    await queryRunner.query(`ALTER TABLE "container_usages" DROP COLUMN "costUnit"`);
    await queryRunner.query(`ALTER TABLE "container_usages" DROP COLUMN "costQuantity"`);
  }
}
