/**
 * npm run user:create: the first administrator of a new facility (or anyone else) from the
 * command line. Run as a child process against the test app's database; the printed link's
 * token goes to the app's password-reset confirm route, as the person's browser would send it.
 */
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser } from "../support/factories";
import { runProgram } from "../support/processes";

let t: TestApp;
let env: Record<string, string>;

beforeAll(async () => {
  t = await startTestApp();
  env = { NODE_ENV: "test", PUBLIC_URL: "http://phasebook.test", DATABASE_PATH: path.join(t.dir, "test.sqlite") };
});
afterAll(async () => {
  await t.close();
});

const create = (...args: string[]) => runProgram("server/cli/user-create.ts", args, env);

describe("npm run user:create", () => {
  it("creates an administrator whose printed link sets the password, once, and who then signs in", async () => {
    const r = await create("--email", "Grace.Hopper@Kestrelbay.example", "--name", "Grace Hopper", "--role", "admin", "--role", "manager");
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toContain("Created Grace Hopper <grace.hopper@kestrelbay.example> with the roles admin, manager.");
    const token = /http:\/\/phasebook\.test\/reset-password\/([A-Za-z0-9_-]{40,})/.exec(r.stdout)?.[1];
    expect(token, r.stdout).toBeTruthy();

    const person = (await t.ds.query(`SELECT id, active FROM users WHERE email = ?`, ["grace.hopper@kestrelbay.example"]))[0];
    expect(person.active).toBe(1);
    const roles = (await t.ds.query(`SELECT role FROM user_roles WHERE userId = ? ORDER BY role`, [person.id])).map((x: { role: string }) => x.role);
    expect(roles).toEqual(["admin", "manager"]);
    const audit = await t.ds.query(`SELECT detail FROM audit_log WHERE action = 'user.created' AND entityId = ?`, [person.id]);
    expect(JSON.parse(audit[0].detail)).toMatchObject({ via: "command line", roles: ["admin", "manager"] });

    const browser = new ApiClient(t.url);
    // Nobody can sign in before the password is chosen: there is none to know.
    expect((await browser.login("grace.hopper@kestrelbay.example", "")).status).toBeGreaterThanOrEqual(400);
    const set = await browser.post("/api/auth/password-reset/confirm", { token, newPassword: "compiler-in-the-navy-1952" });
    expect(set.status, set.text).toBeLessThan(300);
    const again = await browser.post("/api/auth/password-reset/confirm", { token, newPassword: "another-password-entirely" });
    expect(again.status).toBe(422);
    expect(again.body.code).toBe("reset_link_invalid");

    const signedIn = new ApiClient(t.url);
    const login = await signedIn.login("grace.hopper@kestrelbay.example", "compiler-in-the-navy-1952");
    expect(login.status).toBe(200);
    expect(login.body.user.roles).toEqual(["admin", "manager"]);
    expect((await signedIn.get("/api/users?limit=1")).status).toBe(200);
  }, 90_000);

  it("writes the link as a reset row: the token's sha256, valid 24 hours unless --valid-hours says otherwise", async () => {
    const r = await create("--email", "lab.manager@kestrelbay.example", "--name", "Lab Manager", "--role", "manager", "--valid-hours", "72");
    expect(r.code, r.stderr).toBe(0);
    const token = /reset-password\/([A-Za-z0-9_-]+)/.exec(r.stdout)![1];
    const { createHash } = await import("node:crypto");
    const rows = await t.ds.query(
      `SELECT r.expiresAt, r.createdAt, r.usedAt FROM password_resets r JOIN users u ON u.id = r.userId WHERE u.email = ? AND r.tokenHash = ?`,
      ["lab.manager@kestrelbay.example", createHash("sha256").update(token).digest("hex")],
    );
    expect(rows).toHaveLength(1);
    expect(rows[0].usedAt).toBeNull();
    expect(Date.parse(rows[0].expiresAt) - Date.parse(rows[0].createdAt)).toBe(72 * 3600_000);
  }, 90_000);

  it("refuses an e-mail address that already has an account, in one sentence, creating nobody", async () => {
    const existing = await makeUser(t.ds, { email: "taken@kestrelbay.example" });
    const before = (await t.ds.query(`SELECT COUNT(*) AS n FROM users`))[0].n;
    const r = await create("--email", existing.email, "--name", "Someone Else", "--role", "member");
    expect(r.code).toBe(1);
    expect(r.stderr.trim()).toBe("Someone with the e-mail address taken@kestrelbay.example already has an account; nobody was created.");
    expect((await t.ds.query(`SELECT COUNT(*) AS n FROM users`))[0].n).toBe(before);
  }, 90_000);

  it("refuses an unknown role, a bad address or a missing name with exit code 2 and the usage", async () => {
    const role = await create("--email", "x@kestrelbay.example", "--name", "X", "--role", "superuser");
    expect(role.code).toBe(2);
    expect(role.stderr).toMatch(/^Nobody was created: --role: /);
    const email = await create("--email", "not-an-address", "--name", "X", "--role", "member");
    expect(email.code).toBe(2);
    expect(email.stderr).toContain("--email: Enter a valid e-mail address");
    const name = await create("--email", "x@kestrelbay.example", "--role", "member");
    expect(name.code).toBe(2);
    expect(name.stderr).toContain("Give --email, --name and at least one --role. Usage: npm run user:create");
    const password = await create("--email", "x@kestrelbay.example", "--name", "X", "--role", "member", "--password", "secret");
    expect(password.code).toBe(2);
    expect(password.stderr).toMatch(/Unknown option '--password'/);
    for (const r of [role, email, name, password]) expect(r.stderr.trim().split("\n")).toHaveLength(1);
  }, 120_000);
});
