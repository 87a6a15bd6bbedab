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
    expect(triggers.filter((t: string) => t.startsWith("booking"))).toEqual(["booking_instruments_take_times", "bookings_times_follow"]);
  });

  it("install the full-text indexes of chemicals, containers and people, and the triggers that keep them in step", async () => {
    ds = await openDatabase(":memory:");
    const triggers = (await ds.query(`SELECT name FROM sqlite_master WHERE type = 'trigger' ORDER BY name`)).map((r: { name: string }) => r.name);
    expect(triggers).toEqual([
      "booking_instruments_take_times",
      "bookings_times_follow",
      "chemical_text_delete",
      "chemical_text_insert",
      "chemical_text_update",
      "container_text_delete",
      "container_text_insert",
      "container_text_update",
      "user_text_delete",
      "user_text_insert",
      "user_text_update",
    ]);
    const fts = (await ds.query(`SELECT name, sql FROM sqlite_master WHERE type = 'table' AND sql LIKE 'CREATE VIRTUAL TABLE%' ORDER BY name`)) as { name: string; sql: string }[];
    expect(fts.map((t) => t.name)).toEqual(["chemical_text", "container_text", "user_text"]);
    for (const t of fts) expect(t.sql).toContain("trigram");
    // In step: a chemical's synonyms are indexed one per line, and a change or a removal follows.
    await ds.query(`INSERT INTO chemicals (id, name, synonyms, casNumber, createdAt) VALUES (7, 'Lithium chloride', '["LiCl","Chlorure de lithium"]', '7447-41-8', '2026-01-01')`);
    const text = async () => ds!.query(`SELECT rowid, name, synonyms, casNumber, formula FROM chemical_text`);
    expect(await text()).toEqual([{ rowid: 7, name: "Lithium chloride", synonyms: "LiCl\nChlorure de lithium", casNumber: "7447-41-8", formula: "" }]);
    await ds.query(`UPDATE chemicals SET name = 'Lithium chloride, anhydrous', formula = 'ClLi' WHERE id = 7`);
    expect((await text())[0]).toMatchObject({ name: "Lithium chloride, anhydrous", formula: "ClLi" });
    await ds.query(`DELETE FROM chemicals WHERE id = 7`);
    expect(await text()).toEqual([]);
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
