/**
 * The schema as the migrations build it: exactly what the entities describe (nothing left for
 * a new migration), the triggers that keep booking_instruments' copies of the booking times,
 * and every migration undoing cleanly back to an empty database.
 */
import { afterEach, describe, expect, it } from "vitest";
import type { DataSource } from "typeorm";
import { createDataSource, openDatabase } from "../../server/db/data-source";
import { migrations } from "../../server/db/migrations";

let ds: DataSource | undefined;
afterEach(async () => {
  await ds?.destroy();
  ds = undefined;
});

describe("the migrations", () => {
  it("build the schema the entities describe, with nothing left over for a new migration", async () => {
    ds = await openDatabase(":memory:");
    const log = await ds.driver.createSchemaBuilder().log();
    expect(log.upQueries.map((q) => q.query)).toEqual([]);
  });

  it("install the triggers that copy a booking's times onto its instruments", async () => {
    ds = await openDatabase(":memory:");
    const triggers = (await ds.query(`SELECT name FROM sqlite_master WHERE type = 'trigger' ORDER BY name`)).map((r: { name: string }) => r.name);
    expect(triggers).toEqual(["booking_instruments_take_times", "bookings_times_follow"]);
  });

  it("undo one by one back to a database without tables of ours", async () => {
    ds = await openDatabase(":memory:");
    for (let i = 0; i < migrations.length; i++) await ds.undoLastMigration({ transaction: "each" });
    const left = (await ds.query(`SELECT name FROM sqlite_master WHERE type IN ('table', 'trigger') AND name NOT LIKE 'sqlite_%' AND name <> 'migrations'`)).map(
      (r: { name: string }) => r.name,
    );
    expect(left).toEqual([]);
    // And build again from nothing.
    await ds.runMigrations({ transaction: "each" });
    expect((await ds.driver.createSchemaBuilder().log()).upQueries).toEqual([]);
  });
});

// createDataSource is what the migration generator uses; it must not synchronise on its own.
it("leaves synchronize off", () => {
  expect(createDataSource(":memory:").options.synchronize).toBe(false);
});
