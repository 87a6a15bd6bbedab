/**
 * Running a real facility: the two ways to run as the configuration reads them, the nightly
 * backup job under a fixed clock, the administrator's status page, and the start-up check for
 * the demo password.
 */
import fs from "node:fs";
import { createHash } from "node:crypto";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { loadConfig, ConfigError } from "../../server/config";
import { runNightlyBackup } from "../../server/ops/nightly-backup";
import { accountsWithDemoPassword, DEMO_PASSWORD_CHECK_KEY } from "../../server/ops/demo-passwords";
import { DEMO_PASSWORD } from "../../server/db/seed/demo-people";
import { hashPassword } from "../../server/core/passwords";
import { enqueueMail } from "../../server/core/outbox";

let t: TestApp;
let admin: ApiClient;
let backups: string;

beforeAll(async () => {
  backups = fs.mkdtempSync(path.join(os.tmpdir(), "phasebook-nightly-"));
  t = await startTestApp({ env: { BACKUP_DIR: backups, BACKUP_KEEP: "3" } });
  const a = await makeUser(t.ds, { roles: ["admin"] });
  admin = new ApiClient(t.url);
  await admin.login(a.email, TEST_PASSWORD);
});
afterAll(async () => {
  await t.close();
  fs.rmSync(backups, { recursive: true, force: true });
});

describe("the configuration's two ways to run", () => {
  const base = { DATABASE_PATH: path.join(os.tmpdir(), "phasebook-config-test", "p.sqlite"), SESSION_SECRET: "x".repeat(40) };

  it("runs the demo by default outside production: demo seed and fakes on, no public-demo banner", () => {
    const c = loadConfig({ ...base, NODE_ENV: "development" });
    expect(c).toMatchObject({ DEMO_SEED: true, START_FAKES: true, publicDemo: false, PUBLIC_URL: "http://localhost:3000" });
  });

  it("turns the demo seed and the fakes off in production unless asked for, and requires PUBLIC_URL", () => {
    const c = loadConfig({ ...base, NODE_ENV: "production", PUBLIC_URL: "https://phasebook.example.edu/" });
    expect(c).toMatchObject({ DEMO_SEED: false, START_FAKES: false, publicDemo: false, PUBLIC_URL: "https://phasebook.example.edu" });
    expect(() => loadConfig({ ...base, NODE_ENV: "production" })).toThrow(/PUBLIC_URL: required in production/);
  });

  it("makes an explicit DEMO_SEED=1 in production a public demo", () => {
    const c = loadConfig({ ...base, NODE_ENV: "production", PUBLIC_URL: "https://demo.example", DEMO_SEED: "1", START_FAKES: "1" });
    expect(c).toMatchObject({ DEMO_SEED: true, START_FAKES: true, publicDemo: true });
  });

  it("lists every bad variable in one error", () => {
    let message = "";
    try {
      loadConfig({ ...base, NODE_ENV: "production", PORT: "70000", BACKUP_KEEP: "-1", DEMO_SEED: "perhaps", FACILITY_TZ: "Atlantis/Lost" });
    } catch (e) {
      expect(e).toBeInstanceOf(ConfigError);
      message = (e as Error).message;
    }
    for (const v of ["PORT:", "BACKUP_KEEP:", "DEMO_SEED:", "FACILITY_TZ: unknown time zone", "PUBLIC_URL: required in production"]) expect(message).toContain(v);
  });
});

describe("the nightly backup job", () => {
  const deps = (at: string, config: Partial<TestApp["ctx"]["config"]> = {}) => ({ ds: t.ds, now: () => new Date(at), config: { ...t.ctx.config, ...config } });

  it("waits for 02:00 facility time", async () => {
    // 05:30 UTC is 01:30 in Halifax (AST).
    expect(await runNightlyBackup(deps("2026-12-02T05:30:00Z"))).toBeNull();
    expect(fs.readdirSync(backups)).toEqual([]);
  });

  it("takes the night's backup into a folder named by the local date, removes dated folders beyond BACKUP_KEEP days, and records the result", async () => {
    for (const old of ["2026-11-28", "2026-11-29", "2026-11-30", "2026-12-01"]) fs.mkdirSync(path.join(backups, old));
    fs.mkdirSync(path.join(backups, "by-hand"));
    const status = await runNightlyBackup(deps("2026-12-02T07:00:00Z"));
    expect(status).toMatchObject({ ok: true, error: null, folder: path.join(backups, "2026-12-02"), removed: ["2026-11-28", "2026-11-29"] });
    expect(status!.bytes).toBeGreaterThan(10_000);
    expect(fs.readdirSync(backups).sort()).toEqual(["2026-11-30", "2026-12-01", "2026-12-02", "by-hand"]);
    const manifest = JSON.parse(fs.readFileSync(path.join(backups, "2026-12-02", "manifest.json"), "utf8"));
    expect(manifest.tables.users).toBeGreaterThanOrEqual(1);

    // The same night again: already taken, nothing to do.
    expect(await runNightlyBackup(deps("2026-12-02T09:00:00Z"))).toBeNull();

    const page = await admin.get("/api/system/status");
    expect(page.status).toBe(200);
    expect(page.body.backup).toEqual({
      // Scheduled only in production; this test app runs with NODE_ENV=test.
      scheduled: false,
      dir: backups,
      keepDays: 3,
      last: { at: "2026-12-02T07:00:00.000Z", ok: true, folder: path.join(backups, "2026-12-02"), bytes: status!.bytes, error: null },
    });
  });

  it("records a failure, removes nothing, and tries again on the next run", async () => {
    const blocked = path.join(backups, "not-a-folder");
    fs.writeFileSync(blocked, "a file where the backups should go");
    const failed = await runNightlyBackup(deps("2026-12-03T07:00:00Z", { BACKUP_DIR: blocked }));
    expect(failed).toMatchObject({ ok: false, bytes: null, removed: [] });
    expect(failed!.error).toBe(`BACKUP_DIR (${blocked}) is a file, not a folder`);
    const page = await admin.get("/api/system/status");
    expect(page.body.backup.last).toMatchObject({ ok: false, error: failed!.error });
    expect(fs.readdirSync(backups)).toContain("2026-11-30");
  });
});

describe("GET /api/system/status", () => {
  it("counts the outbox: waiting and given-up mail, with the oldest waiting", async () => {
    await t.ds.transaction((em) => enqueueMail(em, new Date("2026-12-01T10:00:00Z"), { to: "someone@kestrelbay.example", subject: "Waiting", text: "…" }));
    await t.ds.query(`INSERT INTO outbound_mail ("to", subject, text, attachments, status, attempts, nextAttemptAt, createdAt) VALUES (?, ?, ?, '[]', 'failed', 6, ?, ?)`, [
      "x@kestrelbay.example",
      "Gave up",
      "…",
      "2026-12-01T00:00:00Z",
      "2026-11-30T00:00:00Z",
    ]);
    const r = await admin.get("/api/system/status");
    expect(r.body.mode).toBe("development");
    expect(r.body.mail.via).toBe("none");
    expect(r.body.mail.pending).toBeGreaterThanOrEqual(1);
    expect(r.body.mail.failed).toBeGreaterThanOrEqual(1);
    expect(r.body.mail.oldestPendingAt <= "2026-12-01T10:00:00.000Z").toBe(true);
    expect(r.body.payments).toEqual({ via: "none", invoicesWaiting: 0 });
  });

  it("is for administrators only", async () => {
    const m = await makeUser(t.ds, { roles: ["manager", "member"] });
    const manager = new ApiClient(t.url);
    await manager.login(m.email, TEST_PASSWORD);
    expect((await manager.get("/api/system/status")).status).toBe(403);
    expect((await new ApiClient(t.url).get("/api/system/status")).status).toBe(401);
  });
});

describe("the production start's demo-password check", () => {
  it("names the active accounts with the demo password, and catches a password changed to it later", async () => {
    const app = await startTestApp();
    try {
      await makeUser(app.ds, { email: "a.demo@kestrelbay.example", password: DEMO_PASSWORD });
      await makeUser(app.ds, { email: "b.demo@kestrelbay.example", password: DEMO_PASSWORD });
      await makeUser(app.ds, { email: "off.demo@kestrelbay.example", password: DEMO_PASSWORD, active: false });
      const real = await makeUser(app.ds, { email: "real@kestrelbay.example", password: "a-real-long-passphrase" });
      expect(await accountsWithDemoPassword(app.ds)).toEqual(["a.demo@kestrelbay.example", "b.demo@kestrelbay.example"]);

      await app.ds.query(`UPDATE users SET passwordHash = ? WHERE id = ?`, [await hashPassword(DEMO_PASSWORD, 10), real.id]);
      expect(await accountsWithDemoPassword(app.ds)).toEqual(["a.demo@kestrelbay.example", "b.demo@kestrelbay.example", "real@kestrelbay.example"]);
    } finally {
      await app.close();
    }
  });

  it("compares only hashes it has not already found clean, so a restart does not pay bcrypt for everyone again", async () => {
    const app = await startTestApp();
    try {
      const clean = await makeUser(app.ds, { email: "clean@kestrelbay.example", password: "a-real-long-passphrase" });
      const demo = await makeUser(app.ds, { email: "demo@kestrelbay.example", password: DEMO_PASSWORD });
      expect(await accountsWithDemoPassword(app.ds)).toEqual(["demo@kestrelbay.example"]);
      const row = async () => JSON.parse((await app.ds.query(`SELECT value FROM settings WHERE "key" = ?`, [DEMO_PASSWORD_CHECK_KEY]))[0].value) as { notDemo: string[] };
      const fingerprint = (hash: string) => createHash("sha256").update(hash).digest("hex");
      expect((await row()).notDemo).toEqual([fingerprint(clean.passwordHash)]);
      // A hash the record lists is not compared again: listing the demo hash there (which the
      // check itself never does) makes the next check skip it.
      await app.ds.query(`UPDATE settings SET value = ? WHERE "key" = ?`, [JSON.stringify({ notDemo: [fingerprint(clean.passwordHash), fingerprint(demo.passwordHash)] }), DEMO_PASSWORD_CHECK_KEY]);
      expect(await accountsWithDemoPassword(app.ds)).toEqual([]);
    } finally {
      await app.close();
    }
  });
});
