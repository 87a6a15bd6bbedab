/**
 * The hot paths read rows with prepared statements instead of TypeORM's finders
 * (server/db/prepared.ts). Those rows must look exactly like the entities TypeORM hydrates —
 * booleans as true/false, nulls as null — or a rule like "requires approval" would quietly
 * read 0 as "no". Checked on every row of the demo facility.
 */
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import type { DataSource, EntityTarget, ObjectLiteral } from "typeorm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openDatabase } from "../../server/db/data-source";
import { readEntities, readEntity } from "../../server/db/prepared";
import { seedDemo } from "../../server/db/seed/demo";
import { Account, Chemical, Container, Instrument, TrainingRecord } from "../../server/entities";

let dir: string;
let ds: DataSource;

beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "pb-prepared-"));
  ds = await openDatabase(path.join(dir, "demo.db"));
  await seedDemo(ds, { now: new Date("2026-12-02T15:00:00.000Z"), bcryptCost: 4 });
});
afterAll(async () => {
  await ds?.destroy();
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
});

const plain = (rows: object[]) => rows.map((r) => ({ ...r }));

describe("readEntities", () => {
  it.each([
    ["instruments", Instrument],
    ["accounts", Account],
    ["containers", Container],
    ["chemicals", Chemical],
    ["training_records", TrainingRecord],
  ] as [string, EntityTarget<ObjectLiteral>][])("reads every row of %s as TypeORM hydrates it", async (table, entity) => {
    const viaTypeorm = plain(await ds.getRepository(entity).find({ order: { id: "ASC" } }));
    expect(viaTypeorm.length).toBeGreaterThan(0);
    expect(plain(readEntities(ds, entity, `SELECT * FROM ${table} ORDER BY id`))).toEqual(viaTypeorm);
  });

  it("turns the stored 0/1 of a boolean column into false/true", async () => {
    const withApproval = await ds.getRepository(Instrument).findOneByOrFail({ requiresApproval: true });
    const raw = ds.driver as unknown as { databaseConnection: { prepare(s: string): { get(...a: unknown[]): { requiresApproval: unknown } } } };
    expect(raw.databaseConnection.prepare(`SELECT requiresApproval FROM instruments WHERE id = ?`).get(withApproval.id).requiresApproval).toBe(1);
    expect(readEntity(ds, Instrument, `SELECT * FROM instruments WHERE id = ?`, withApproval.id)?.requiresApproval).toBe(true);
    expect(readEntity(ds, Instrument, `SELECT * FROM instruments WHERE id = ?`, -1)).toBeUndefined();
  });
});
