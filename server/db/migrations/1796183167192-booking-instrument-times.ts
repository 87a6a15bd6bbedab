import type { MigrationInterface, QueryRunner } from "typeorm";

/**
 * Copies each booking's startMs/endMs onto its booking_instruments rows, indexed by
 * (instrumentId, startMs), and keeps the copies right with two triggers: one fills a new row
 * from its booking, the other follows every change of a booking's times. One instrument's week
 * then reads a handful of index entries instead of every booking in the window.
 */
export class BookingInstrumentTimes1796183167192 implements MigrationInterface {
  name = "BookingInstrumentTimes1796183167192";

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX "IDX_d32233e4aa28b6719b773e02d7"`);
    await queryRunner.query(`CREATE TABLE "temporary_booking_instruments" ("bookingId" integer NOT NULL, "instrumentId" integer NOT NULL, "startMs" integer NOT NULL DEFAULT (0), "endMs" integer NOT NULL DEFAULT (0), CONSTRAINT "FK_30018ab78932beff01f128f6bcb" FOREIGN KEY ("instrumentId") REFERENCES "instruments" ("id") ON DELETE RESTRICT ON UPDATE NO ACTION, CONSTRAINT "FK_28f3a9eee513538aca8a654ce8e" FOREIGN KEY ("bookingId") REFERENCES "bookings" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, PRIMARY KEY ("bookingId", "instrumentId"))`);
    await queryRunner.query(`INSERT INTO "temporary_booking_instruments"("bookingId", "instrumentId", "startMs", "endMs") SELECT bi."bookingId", bi."instrumentId", b."startMs", b."endMs" FROM "booking_instruments" bi JOIN "bookings" b ON b."id" = bi."bookingId"`);
    await queryRunner.query(`DROP TABLE "booking_instruments"`);
    await queryRunner.query(`ALTER TABLE "temporary_booking_instruments" RENAME TO "booking_instruments"`);
    await queryRunner.query(`CREATE INDEX "IDX_d32233e4aa28b6719b773e02d7" ON "booking_instruments" ("instrumentId", "bookingId") `);
    await queryRunner.query(`CREATE INDEX "IDX_5f26a7924d12a31e251549261b" ON "booking_instruments" ("instrumentId", "startMs") `);
    await queryRunner.query(
      `CREATE TRIGGER "booking_instruments_take_times" AFTER INSERT ON "booking_instruments" BEGIN
         UPDATE "booking_instruments"
            SET "startMs" = (SELECT "startMs" FROM "bookings" WHERE "id" = NEW."bookingId"),
                "endMs" = (SELECT "endMs" FROM "bookings" WHERE "id" = NEW."bookingId")
          WHERE "bookingId" = NEW."bookingId" AND "instrumentId" = NEW."instrumentId";
       END`,
    );
    await queryRunner.query(
      `CREATE TRIGGER "bookings_times_follow" AFTER UPDATE OF "startMs", "endMs" ON "bookings" BEGIN
         UPDATE "booking_instruments" SET "startMs" = NEW."startMs", "endMs" = NEW."endMs" WHERE "bookingId" = NEW."id";
       END`,
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TRIGGER "bookings_times_follow"`);
    await queryRunner.query(`DROP TRIGGER "booking_instruments_take_times"`);
    await queryRunner.query(`DROP INDEX "IDX_5f26a7924d12a31e251549261b"`);
    await queryRunner.query(`DROP INDEX "IDX_d32233e4aa28b6719b773e02d7"`);
    await queryRunner.query(`ALTER TABLE "booking_instruments" RENAME TO "temporary_booking_instruments"`);
    await queryRunner.query(`CREATE TABLE "booking_instruments" ("bookingId" integer NOT NULL, "instrumentId" integer NOT NULL, CONSTRAINT "FK_30018ab78932beff01f128f6bcb" FOREIGN KEY ("instrumentId") REFERENCES "instruments" ("id") ON DELETE RESTRICT ON UPDATE NO ACTION, CONSTRAINT "FK_28f3a9eee513538aca8a654ce8e" FOREIGN KEY ("bookingId") REFERENCES "bookings" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, PRIMARY KEY ("bookingId", "instrumentId"))`);
    await queryRunner.query(`INSERT INTO "booking_instruments"("bookingId", "instrumentId") SELECT "bookingId", "instrumentId" FROM "temporary_booking_instruments"`);
    await queryRunner.query(`DROP TABLE "temporary_booking_instruments"`);
    await queryRunner.query(`CREATE INDEX "IDX_d32233e4aa28b6719b773e02d7" ON "booking_instruments" ("instrumentId", "bookingId") `);
  }
}
