/**
 * Starting Phasebook as an operator does (server/main.ts in a child process): the two ways to
 * run, and every refusal as one sentence with a non-zero exit code and no stack trace.
 */
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { openDatabase } from "../../server/db/data-source";
import { DEMO_PASSWORD } from "../../server/db/seed/demo-people";
import { makeUser } from "../support/factories";
import { ApiClient } from "../support/http-client";
import { holdPort, runProgram, startMain, type Finished, type RunningMain } from "../support/processes";

const dirs: string[] = [];
const running: RunningMain[] = [];
afterAll(async () => {
  for (const r of running) await r.stop();
  for (const d of dirs) fs.rmSync(d, { recursive: true, force: true });
});

function dataFolder(): string {
  const d = fs.mkdtempSync(path.join(os.tmpdir(), "phasebook-start-"));
  dirs.push(d);
  return d;
}

/** One sentence on stderr: one line, no stack frames. */
function expectOneSentence(r: Finished): string {
  const text = r.stderr.trim();
  expect(text.split("\n"), text).toHaveLength(1);
  expect(text).not.toMatch(/\n\s+at |Error:/);
  return text;
}

const DEV = { NODE_ENV: "development", DEMO_SEED: "0", START_FAKES: "0" };

describe("a port already in use", () => {
  it("stops start-up with one sentence naming PORT", async () => {
    const held = await holdPort();
    try {
      const r = await runProgram("server/main.ts", [], { ...DEV, PORT: String(held.port), HOST: "127.0.0.1", DATABASE_PATH: path.join(dataFolder(), "p.sqlite") });
      expect(r.code).toBe(1);
      const sentence = expectOneSentence(r);
      expect(sentence).toContain(`port ${held.port} (PORT) is already in use`);
      expect(sentence).toContain("set PORT to a free port");
    } finally {
      await held.release();
    }
  }, 90_000);

  it("names FAKE_SMTP_PORT when the fake mailbox's port is taken", async () => {
    const held = await holdPort();
    try {
      const r = await runProgram("server/main.ts", [], {
        ...DEV,
        START_FAKES: "1",
        PORT: "0",
        HOST: "127.0.0.1",
        FAKE_SMTP_PORT: String(held.port),
        FAKE_MAILBOX_HTTP_PORT: "0",
        FAKE_PAYMENTS_PORT: "0",
        DATABASE_PATH: path.join(dataFolder(), "p.sqlite"),
      });
      expect(r.code).toBe(1);
      const sentence = expectOneSentence(r);
      expect(sentence).toContain(`port ${held.port} (FAKE_SMTP_PORT) is already in use`);
      expect(sentence).toContain("set FAKE_SMTP_PORT to a free port");
    } finally {
      await held.release();
    }
  }, 90_000);

  it("names every busy port's variable at once: the app's and the fake payment API's", async () => {
    const app = await holdPort();
    const pay = await holdPort();
    try {
      const r = await runProgram("server/main.ts", [], {
        ...DEV,
        START_FAKES: "1",
        PORT: String(app.port),
        HOST: "127.0.0.1",
        FAKE_SMTP_PORT: "0",
        FAKE_MAILBOX_HTTP_PORT: "0",
        FAKE_PAYMENTS_PORT: String(pay.port),
        DATABASE_PATH: path.join(dataFolder(), "p.sqlite"),
      });
      expect(r.code).toBe(1);
      const sentence = expectOneSentence(r);
      expect(sentence).toContain(`${app.port} (PORT)`);
      expect(sentence).toContain(`${pay.port} (FAKE_PAYMENTS_PORT)`);
      expect(sentence).toContain("set PORT, FAKE_PAYMENTS_PORT to free ports");
    } finally {
      await app.release();
      await pay.release();
    }
  }, 90_000);
});

describe("production (NODE_ENV=production)", () => {
  it("lists every bad variable at once, PUBLIC_URL among them, and exits 2", async () => {
    const r = await runProgram("server/main.ts", [], {
      NODE_ENV: "production",
      PORT: "not-a-port",
      FACILITY_TZ: "Mars/Olympus_Mons",
      BACKUP_KEEP: "0",
      DATABASE_PATH: path.join(dataFolder(), "p.sqlite"),
    });
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/^Phasebook cannot start; fix these environment variables:/);
    for (const v of ["PORT:", "FACILITY_TZ: unknown time zone", "BACKUP_KEEP:", "PUBLIC_URL: required in production"]) expect(r.stderr).toContain(v);
    expect(r.stderr).not.toMatch(/\n\s+at /);
  }, 90_000);

  it("refuses to start while an active account has the demo password, naming it", async () => {
    const dir = dataFolder();
    const ds = await openDatabase(path.join(dir, "p.sqlite"));
    await makeUser(ds, { email: "still.demo@kestrelbay.example", password: DEMO_PASSWORD, roles: ["admin"] });
    await makeUser(ds, { email: "gone.demo@kestrelbay.example", password: DEMO_PASSWORD, active: false });
    await makeUser(ds, { email: "real.person@kestrelbay.example", password: "a-long-real-passphrase" });
    await ds.destroy();
    const r = await runProgram("server/main.ts", [], { NODE_ENV: "production", PUBLIC_URL: "https://phasebook.example.edu", PORT: "0", HOST: "127.0.0.1", DATABASE_PATH: path.join(dir, "p.sqlite") });
    expect(r.code).toBe(1);
    const sentence = expectOneSentence(r);
    expect(sentence).toContain("this account still has the published demo password: still.demo@kestrelbay.example.");
    expect(sentence).not.toContain("gone.demo");
    expect(sentence).not.toContain("real.person");
  }, 90_000);

  it("on a new data folder: healthy, no demo, mail waits in the outbox, and user:create makes an administrator who sets a password through the link", async () => {
    const dir = dataFolder();
    // Plain http, so the test's client keeps the session cookie (https would make it Secure).
    const env = { NODE_ENV: "production", PUBLIC_URL: "http://phasebook.example.edu", DATABASE_PATH: path.join(dir, "phasebook.sqlite") };
    const server = await startMain(env);
    running.push(server);
    const log = server.output();
    expect(log).toMatch(/mode: production\n/);
    expect(log).toContain("mail: NOT CONFIGURED: mail waits in the outbox until SMTP_URL is set");
    expect(log).toContain("payments: NOT CONFIGURED: card invoices wait until STRIPE_SECRET_KEY is set");
    expect(log).not.toContain("Demo sign-ins");
    expect(log).not.toContain("fake mailbox");

    const anyone = new ApiClient(server.url);
    expect((await anyone.get("/api/health")).body).toEqual({ status: "ok", db: "ok" });
    expect((await anyone.get("/api/facility")).body.publicDemo).toBe(false);
    expect((await anyone.login("admin@kestrelbay.example", DEMO_PASSWORD)).status).toBe(401);

    const made = await runProgram("server/cli/user-create.ts", ["--email", "Ada.Admin@Kestrelbay.example", "--name", "Ada Admin", "--role", "admin"], env);
    expect(made.code, made.stderr).toBe(0);
    const token = /http:\/\/phasebook\.example\.edu\/reset-password\/([A-Za-z0-9_-]+)/.exec(made.stdout)?.[1];
    expect(token).toBeTruthy();
    const set = await anyone.post("/api/auth/password-reset/confirm", { token, newPassword: "interfacial-tension-at-the-ities" });
    expect(set.status, set.text).toBeLessThan(300);
    const admin = new ApiClient(server.url);
    expect((await admin.login("ada.admin@kestrelbay.example", "interfacial-tension-at-the-ities")).status).toBe(200);

    // Mail someone asks for now waits in the outbox, counted on the administrator's status page.
    expect((await anyone.post("/api/auth/password-reset/request", { email: "ada.admin@kestrelbay.example" })).status).toBeLessThan(300);
    await new Promise((r) => setTimeout(r, 6_000));
    const status = await admin.get("/api/system/status");
    expect(status.status).toBe(200);
    expect(status.body.mode).toBe("production");
    expect(status.body.mail).toMatchObject({ via: "none", failed: 0 });
    expect(status.body.mail.pending).toBeGreaterThanOrEqual(1);
    expect(status.body.payments.via).toBe("none");
    expect(status.body.backup).toMatchObject({ scheduled: false, dir: null, last: null });
  }, 180_000);

  it("runs an explicit DEMO_SEED=1 as a public demo: seeded, demo sign-ins work, and /api/facility says publicDemo", async () => {
    const dir = dataFolder();
    const server = await startMain({ NODE_ENV: "production", DEMO_SEED: "1", PUBLIC_URL: "http://demo.phasebook.example", DATABASE_PATH: path.join(dir, "phasebook.sqlite") });
    running.push(server);
    expect(server.output()).toContain("mode: production, PUBLIC DEMO");
    expect(server.output()).toContain("demo scenario seeded");
    const c = new ApiClient(server.url);
    expect((await c.get("/api/facility")).body.publicDemo).toBe(true);
    expect((await c.login("admin@kestrelbay.example", DEMO_PASSWORD)).status).toBe(200);
    expect((await c.get("/api/system/status")).body.mode).toBe("public_demo");
    await server.stop();
  }, 240_000);
});
