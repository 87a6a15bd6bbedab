/**
 * Backups and restores, as an operator runs them (npm run backup / npm run restore, here the
 * same programs as child processes) against the real app on a temporary database.
 *
 * The acceptance case: a backup taken while bookings are being created restores into an empty
 * folder; the copy passes PRAGMA integrity_check, the app starts on it, and it holds every
 * booking whose create was acknowledged (201) before the backup began. Bookings acknowledged
 * after that instant may or may not be in it, and nothing is asserted about them.
 */
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import Database from "better-sqlite3";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { makeAccount, makeInstrument, train } from "../support/schedule-factories";
import { runProgram, startMain } from "../support/processes";

let t: TestApp;
const dirs: string[] = [];

function folder(): string {
  const d = fs.mkdtempSync(path.join(os.tmpdir(), "phasebook-backup-"));
  dirs.push(d);
  return d;
}

beforeAll(async () => {
  t = await startTestApp({ deps: { rateLimits: { login: { windowMs: 60_000, limit: 1000 } } } });
});
afterAll(async () => {
  await t.close();
  for (const d of dirs) fs.rmSync(d, { recursive: true, force: true });
});

const backup = (target: string, databasePath = path.join(t.dir, "test.sqlite")) => runProgram("server/cli/backup.ts", [target], { DATABASE_PATH: databasePath });
const restore = (from: string, databasePath: string, ...flags: string[]) => runProgram("server/cli/restore.ts", [from, ...flags], { DATABASE_PATH: databasePath });

/** One-hour slots on weekdays of December 2026, 08:00–18:00 in Halifax (AST, UTC−4). */
function slots(instrumentIds: number[]): { instrumentId: number; start: string; end: string }[] {
  const out: { instrumentId: number; start: string; end: string }[] = [];
  for (let day = 7; day <= 31; day++) {
    const weekday = new Date(Date.UTC(2026, 11, day)).getUTCDay();
    if (weekday === 0 || weekday === 6) continue;
    for (let hour = 8; hour < 18; hour++) {
      for (const instrumentId of instrumentIds) {
        const at = (h: number) => `2026-12-${String(day).padStart(2, "0")}T${String(h).padStart(2, "0")}:00:00-04:00`;
        out.push({ instrumentId, start: at(hour), end: at(hour + 1) });
      }
    }
  }
  return out;
}

describe("a backup taken during a burst of booking creates", () => {
  it("restores into an empty folder a database that passes integrity_check, starts the app, and holds every booking acknowledged before the backup began", async () => {
    const members = await Promise.all([1, 2, 3, 4, 5].map((n) => makeUser(t.ds, { roles: ["member"], name: `Burst Member ${n}` })));
    const instruments = await Promise.all([1, 2, 3, 4, 5].map(() => makeInstrument(t.ds)));
    for (const m of members) for (const i of instruments) await train(t.ds, m.id, i.id);
    const account = await makeAccount(t.ds, members.map((m) => m.id));
    const apis = members.map(() => new ApiClient(t.url));
    await Promise.all(apis.map((api, n) => api.login(members[n].email, TEST_PASSWORD)));
    await Promise.all(apis.map((api) => api.fetchCsrf()));

    const free = slots(instruments.map((i) => i.id));
    let next = 0;
    const acked: { id: number; at: number }[] = [];
    const refused: string[] = [];
    async function createOne(): Promise<void> {
      const n = next++;
      const s = free[n];
      const r = await apis[n % apis.length].post("/api/bookings", { instrumentIds: [s.instrumentId], start: s.start, end: s.end, accountId: account.id, purpose: "Backup burst" });
      if (r.status === 201) acked.push({ id: r.body.booking.id, at: Date.now() });
      else refused.push(`${r.status} ${r.text}`);
    }

    // The burst: 50 creates at once, then a steady stream of creates for as long as the backup runs.
    const target = path.join(folder(), "backup");
    const first = Array.from({ length: 50 }, () => createOne());
    let backupDone = false;
    const running = backup(target).finally(() => (backupDone = true));
    const stream = Array.from({ length: 8 }, async () => {
      while (!backupDone && next < free.length) await createOne();
    });
    const [result] = await Promise.all([running, ...first, ...stream]);
    expect(result.code, result.stderr).toBe(0);
    expect(refused).toEqual([]);

    const manifest = JSON.parse(fs.readFileSync(path.join(target, "manifest.json"), "utf8"));
    const began = Date.parse(manifest.startedAt);
    const before = acked.filter((a) => a.at < began);
    const after = acked.filter((a) => a.at >= began);
    expect(before.length).toBeGreaterThanOrEqual(50);
    // Creates were in flight while the backup ran, not only before it: the stream stops only when
    // the backup process has exited, so these were sent while it was copying or checking.
    expect(after.length).toBeGreaterThan(0);
    expect(Math.min(...acked.map((a) => a.at))).toBeLessThan(began);

    const restoredDir = path.join(folder(), "restored-data");
    const restoredDb = path.join(restoredDir, "phasebook.sqlite");
    const r = await restore(target, restoredDb);
    expect(r.code, r.stderr).toBe(0);

    const raw = new Database(restoredDb, { readonly: true });
    expect(raw.pragma("integrity_check", { simple: true })).toBe("ok");
    raw.close();

    const restored = await startTestApp({ databasePath: restoredDb });
    try {
      expect((await new ApiClient(restored.url).get("/api/health")).body).toEqual({ status: "ok", db: "ok" });
      const ids = new Set<number>((await restored.ds.query(`SELECT id FROM bookings`)).map((b: { id: number }) => b.id));
      expect(ids.size).toBe(manifest.tables.bookings);
      const missing = before.filter((a) => !ids.has(a.id)).map((a) => a.id);
      expect(missing).toEqual([]);
      // The secrets came back too: a session signed before the backup is still good on the restored app.
      const again = new ApiClient(restored.url);
      Object.assign(again, { cookies: (apis[0] as unknown as { cookies: Map<string, string> }).cookies });
      const seen = await again.get(`/api/bookings/${before[0].id}`);
      expect(seen.status, seen.text).toBe(200);
    } finally {
      await restored.close();
    }
  }, 180_000);
});

describe("npm run backup", () => {
  it("writes the database, the secrets, the uploaded files and a manifest with checksums of every file", async () => {
    fs.mkdirSync(path.join(t.dir, "sds"), { recursive: true });
    fs.writeFileSync(path.join(t.dir, "sds", "sheet-1.pdf"), "%PDF-1.4 test sheet\n");
    const target = path.join(folder(), "b");
    const r = await backup(target);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toContain(`Backup written to ${target}`);
    const manifest = JSON.parse(fs.readFileSync(path.join(target, "manifest.json"), "utf8"));
    expect(manifest.schemaVersion).toMatch(/^[A-Za-z]+\d{13}$/);
    expect(manifest.tables.users).toBe(Number((await t.ds.query(`SELECT COUNT(*) AS n FROM users`))[0].n));
    const files = manifest.files.map((f: { path: string }) => f.path);
    expect(files).toEqual(expect.arrayContaining(["phasebook.sqlite", "secrets/session-secret", "sds/sheet-1.pdf"]));
    for (const f of manifest.files) {
      const { createHash } = await import("node:crypto");
      expect(createHash("sha256").update(fs.readFileSync(path.join(target, f.path))).digest("hex")).toBe(f.sha256);
    }
    expect(fs.statSync(path.join(target, "secrets", "session-secret")).mode & 0o077).toBe(0);
  }, 90_000);

  it("refuses a folder that is not empty, in one sentence", async () => {
    const target = folder();
    fs.writeFileSync(path.join(target, "earlier.txt"), "keep me");
    const r = await backup(target);
    expect(r.code).toBe(1);
    expect(r.stderr.trim()).toBe(`The folder ${target} is not empty; give the backup a new folder so no earlier backup is overwritten.`);
    expect(fs.readdirSync(target)).toEqual(["earlier.txt"]);
  }, 90_000);
});

describe("npm run restore", () => {
  let good: string;
  beforeAll(async () => {
    good = path.join(folder(), "good");
    const r = await backup(good);
    expect(r.code, r.stderr).toBe(0);
  }, 90_000);

  function copyOf(dir: string): string {
    const to = path.join(folder(), "copy");
    fs.cpSync(dir, to, { recursive: true });
    return to;
  }

  it("refuses a data folder that is not empty, and with --force moves its contents aside first", async () => {
    const data = folder();
    fs.writeFileSync(path.join(data, "phasebook.sqlite"), "an older database");
    const refused = await restore(good, path.join(data, "phasebook.sqlite"));
    expect(refused.code).toBe(1);
    expect(refused.stderr.trim()).toMatch(/^The data folder .* is not empty \(phasebook\.sqlite\); restore into an empty folder, or add --force/);
    expect(fs.readFileSync(path.join(data, "phasebook.sqlite"), "utf8")).toBe("an older database");

    const forced = await restore(good, path.join(data, "phasebook.sqlite"), "--force");
    expect(forced.code, forced.stderr).toBe(0);
    const aside = fs.readdirSync(data).find((e) => e.startsWith("replaced-"))!;
    expect(fs.readFileSync(path.join(data, aside, "phasebook.sqlite"), "utf8")).toBe("an older database");
    const db = new Database(path.join(data, "phasebook.sqlite"), { readonly: true });
    expect(db.pragma("integrity_check", { simple: true })).toBe("ok");
    db.close();
  }, 90_000);

  it("refuses a damaged backup and writes nothing", async () => {
    const damaged = copyOf(good);
    const file = path.join(damaged, "phasebook.sqlite");
    const bytes = fs.readFileSync(file);
    bytes[bytes.length - 100] ^= 0xff;
    fs.writeFileSync(file, bytes);
    const data = path.join(folder(), "data");
    const r = await restore(damaged, path.join(data, "phasebook.sqlite"));
    expect(r.code).toBe(1);
    expect(r.stderr.trim()).toMatch(/is damaged: phasebook\.sqlite does not match its checksum\. Nothing was restored\.$/);
    expect(fs.existsSync(data)).toBe(false);
  }, 90_000);

  it("refuses a backup whose schema this version does not know", async () => {
    const future = copyOf(good);
    const manifestFile = path.join(future, "manifest.json");
    const manifest = JSON.parse(fs.readFileSync(manifestFile, "utf8"));
    manifest.schemaVersion = "SomethingFromTheFuture2999999999999";
    fs.writeFileSync(manifestFile, JSON.stringify(manifest));
    const r = await restore(future, path.join(folder(), "data", "phasebook.sqlite"));
    expect(r.code).toBe(1);
    expect(r.stderr.trim()).toContain("schema SomethingFromTheFuture2999999999999, which this version of Phasebook does not know");
  }, 90_000);

  it("refuses while a server runs on the data folder, even with --force", async () => {
    const data = folder();
    const server = await startMain({ NODE_ENV: "development", DEMO_SEED: "0", START_FAKES: "0", DATABASE_PATH: path.join(data, "phasebook.sqlite") });
    try {
      const r = await restore(good, path.join(data, "phasebook.sqlite"), "--force");
      expect(r.code).toBe(1);
      expect(r.stderr.trim()).toMatch(new RegExp(`^A Phasebook server \\(process ${server.pid}\\) is running on .*; stop it before restoring`));
    } finally {
      await server.stop();
    }
    // Stopped, the server has removed its process-id file and the restore goes ahead.
    expect(fs.existsSync(path.join(data, "server.pid"))).toBe(false);
    const r = await restore(good, path.join(data, "phasebook.sqlite"), "--force");
    expect(r.code, r.stderr).toBe(0);
  }, 180_000);
});
