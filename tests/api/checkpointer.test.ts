/**
 * WAL checkpoints run in a thread of their own (server/db/checkpointer.ts): while it runs, the
 * server's connection never checkpoints inside a COMMIT, yet the log is still copied into the
 * database; once it stops, the connection checkpoints by itself again.
 */
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterEach, expect, it } from "vitest";
import type { DataSource } from "typeorm";
import { openDatabase } from "../../server/db/data-source";
import { connectionOf } from "../../server/db/prepared";
import { startCheckpointer } from "../../server/db/checkpointer";

let ds: DataSource | undefined;
let dir: string | undefined;
afterEach(async () => {
  await ds?.destroy();
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
  ds = undefined;
});

it("copies the log into the database from its own thread, and hands checkpoints back when stopped", async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "phasebook-checkpoint-"));
  ds = await openDatabase(path.join(dir, "db.sqlite"));
  const db = connectionOf(ds);
  const checkpointer = await startCheckpointer(ds, 50);
  expect(db.pragma("wal_autocheckpoint", { simple: true })).toBe(0);
  const insert = db.prepare(`INSERT INTO audit_log (at, actorId, action, entityType, entityId, detail) VALUES ('2026-12-02', NULL, 'test', 'test', NULL, ?)`);
  // About 3,000 pages of log: past the 1,000 pages at which the connection would have checkpointed itself.
  for (let i = 0; i < 300; i++) db.transaction(() => { for (let k = 0; k < 10; k++) insert.run("x".repeat(3000)); })();
  // Only a checkpoint writes pages into the database file itself (the commits went to the log).
  const file = path.join(dir, "db.sqlite");
  const deadline = Date.now() + 10_000;
  while (fs.statSync(file).size < 10_000_000 && Date.now() < deadline) await new Promise((r) => setTimeout(r, 50));
  expect(fs.statSync(`${file}-wal`).size).toBeGreaterThan(10_000_000);
  expect(fs.statSync(file).size).toBeGreaterThan(10_000_000);
  await checkpointer.stop();
  expect(db.pragma("wal_autocheckpoint", { simple: true })).toBe(1000);
});

it("does nothing for a database in memory", async () => {
  ds = await openDatabase(":memory:");
  const checkpointer = await startCheckpointer(ds);
  await checkpointer.stop();
  expect(connectionOf(ds).pragma("wal_autocheckpoint", { simple: true })).toBe(1000);
});
