/**
 * Sign-in hardening, used as a browser or a script would: the rate limits of OWASP's
 * Authentication Cheat Sheet ("Protect Against Automated Attacks", "Account Lockout") and NIST
 * SP 800-63B §5.2.2 ("Rate Limiting"), counted per normalised e-mail and client address; one
 * bcrypt cost for every hash and the stand-in of unknown e-mails (OWASP, "Authentication and
 * Error Messages"); the new-password rules of NIST SP 800-63B §5.1.1.2. The client address is
 * varied with X-Forwarded-For, which the app trusts from the loopback proxy only (addresses of
 * RFC 5737's documentation range: a header, no traffic goes there).
 */
import bcrypt from "bcryptjs";
import { dictionary } from "@zxcvbn-ts/language-common";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { checkCredentials, type RateLimits } from "../../server/modules/people";
import { BCRYPT_COST, dummyHash, hashCost, hashPassword } from "../../server/core/passwords";
import { createPersonWithLink } from "../../server/ops/create-person";

const LIFTED = { windowMs: 60_000, limit: 1000 };

function loginFrom(c: ApiClient, address: string, email: string, password: string) {
  return c.request("POST", "/api/auth/login", { json: { email, password }, headers: { "x-forwarded-for": address } });
}

async function withApp(rateLimits: Partial<RateLimits>, body: (t: TestApp) => Promise<void>) {
  const t = await startTestApp({ deps: { rateLimits } });
  try {
    await body(t);
  } finally {
    await t.close();
  }
}

describe("the sign-in rate limits", () => {
  it("counts an e-mail with spaces around it or in other letter case as the same e-mail", async () => {
    await withApp({ login: { windowMs: 60_000, limit: 3 } }, async (t) => {
      const c = new ApiClient(t.url);
      const codes = [];
      for (const email of ["member2@kestrelbay.example", " member2@kestrelbay.example", "MEMBER2@Kestrelbay.example  ", "member2@kestrelbay.example"]) {
        codes.push((await c.login(email, "a-wrong-guess")).status);
      }
      expect(codes).toEqual([401, 401, 401, 429]);
    });
  });

  it("stops several addresses hammering one e-mail, with a problem the client can show", async () => {
    await withApp({ login: LIFTED, loginPerEmail: { windowMs: 60_000, limit: 3 }, loginPerAddress: LIFTED }, async (t) => {
      await makeUser(t.ds, { email: "target@kestrelbay.example" });
      const c = new ApiClient(t.url);
      const codes = [];
      for (const address of ["192.0.2.1", "192.0.2.2", "192.0.2.3", "192.0.2.4"]) {
        codes.push((await loginFrom(c, address, " Target@kestrelbay.example", "a-wrong-guess")).status);
      }
      expect(codes).toEqual([401, 401, 401, 429]);
      // Locked for that e-mail from any address, even with the right password, until the window passes.
      const blocked = await loginFrom(c, "192.0.2.5", "target@kestrelbay.example", TEST_PASSWORD);
      expect(blocked.status).toBe(429);
      expect(blocked.headers.get("content-type")).toMatch(/application\/problem\+json/);
      expect(blocked.body.code).toBe("too_many_attempts");
      expect(Number(blocked.headers.get("retry-after"))).toBeGreaterThan(0);
      // Another e-mail is not affected.
      expect((await loginFrom(c, "192.0.2.5", "someone.else@kestrelbay.example", "a-wrong-guess")).status).toBe(401);
    });
  });

  it("stops one address trying many e-mails, and a successful sign-in does not count against it", async () => {
    await withApp({ login: LIFTED, loginPerEmail: LIFTED, loginPerAddress: { windowMs: 60_000, limit: 3 } }, async (t) => {
      const real = await makeUser(t.ds, { email: "real.member@kestrelbay.example" });
      const c = new ApiClient(t.url);
      const codes = [];
      codes.push((await loginFrom(c, "198.51.100.7", "guess1@kestrelbay.example", "a-wrong-guess")).status);
      codes.push((await loginFrom(c, "198.51.100.7", real.email, TEST_PASSWORD)).status);
      codes.push((await loginFrom(c, "198.51.100.7", "guess2@kestrelbay.example", "a-wrong-guess")).status);
      codes.push((await loginFrom(c, "198.51.100.7", "guess3@kestrelbay.example", "a-wrong-guess")).status);
      codes.push((await loginFrom(c, "198.51.100.7", "guess4@kestrelbay.example", "a-wrong-guess")).status);
      expect(codes).toEqual([401, 200, 401, 401, 429]);
      // Another address still signs in.
      expect((await loginFrom(new ApiClient(t.url), "198.51.100.8", real.email, TEST_PASSWORD)).status).toBe(200);
    });
  });

  it("answers 429 to password changes beyond the limit, whatever the current password given", async () => {
    await withApp({ passwordChange: { windowMs: 60_000, limit: 3 } }, async (t) => {
      const u = await makeUser(t.ds, { email: "guesser@kestrelbay.example" });
      const c = new ApiClient(t.url);
      expect((await c.login(u.email, TEST_PASSWORD)).status).toBe(200);
      const codes = [];
      for (let i = 0; i < 3; i++) codes.push((await c.post("/api/auth/password", { currentPassword: `guess-number-${i}`, newPassword: "a-sentence-about-cells" })).status);
      const fourth = await c.post("/api/auth/password", { currentPassword: TEST_PASSWORD, newPassword: "a-sentence-about-cells" });
      expect(codes).toEqual([422, 422, 422]);
      expect(fourth.status).toBe(429);
      expect(fourth.body.code).toBe("too_many_attempts");
      expect((await new ApiClient(t.url).login(u.email, TEST_PASSWORD)).status).toBe(200);
    });
  });
});

describe("one bcrypt cost for known and unknown e-mails", () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await startTestApp({ deps: { rateLimits: { login: LIFTED } } });
  });
  afterAll(async () => {
    await t.close();
  });

  it("compares an unknown e-mail with a stand-in hash of the app's cost, and a wrong password with the stored hash of the same cost", async () => {
    const cost = t.ctx.bcryptCost!;
    await makeUser(t.ds, { email: "known.person@kestrelbay.example" });
    const stored = (await t.ds.query(`SELECT passwordHash FROM users WHERE email = ?`, ["known.person@kestrelbay.example"]))[0].passwordHash;
    const unknown = await checkCredentials(t.ctx, "nobody.here@kestrelbay.example", "a-wrong-guess");
    const wrong = await checkCredentials(t.ctx, "known.person@kestrelbay.example", "a-wrong-guess");
    expect(unknown).toEqual({ user: null, check: { ok: false, against: "dummy", cost, rehash: false } });
    expect(wrong.user).toBeNull();
    expect(wrong.check).toEqual({ ok: false, against: "stored", cost, rehash: false });
    expect(hashCost(stored)).toBe(cost);
    // The stand-in is a real bcrypt hash of that cost that no password opens.
    const dummy = await dummyHash(cost);
    expect(bcrypt.getRounds(dummy)).toBe(cost);
    expect(await bcrypt.compare("", dummy)).toBe(false);
    // Without a cost given, everything uses the one configured cost.
    expect(bcrypt.getRounds(await dummyHash())).toBe(BCRYPT_COST);
    expect(bcrypt.getRounds(await hashPassword("anything-at-all"))).toBe(BCRYPT_COST);
  });

  it("rehashes a stored hash of another cost at the configured one on a successful sign-in, not on a failed one", async () => {
    const u = await makeUser(t.ds, { email: "old.hash@kestrelbay.example" });
    await t.ds.query(`UPDATE users SET passwordHash = ? WHERE id = ?`, [await hashPassword(TEST_PASSWORD, 4), u.id]);
    const read = async () => (await t.ds.query(`SELECT passwordHash FROM users WHERE id = ?`, [u.id]))[0].passwordHash as string;
    expect((await new ApiClient(t.url).login(u.email, "a-wrong-guess")).status).toBe(401);
    expect(hashCost(await read())).toBe(4);
    expect((await new ApiClient(t.url).login(u.email, TEST_PASSWORD)).status).toBe(200);
    const after = await read();
    expect(hashCost(after)).toBe(t.ctx.bcryptCost);
    expect(await bcrypt.compare(TEST_PASSWORD, after)).toBe(true);
  });

  it("gives a person made on the command line a placeholder hash of the configured cost", async () => {
    const made = await createPersonWithLink(t.ds, { email: "cli.person@kestrelbay.example", name: "Cli Person", roles: ["member"], validHours: 24 }, { now: t.clock.now(), publicUrl: "http://phasebook.test" });
    const hash = (await t.ds.query(`SELECT passwordHash FROM users WHERE id = ?`, [made.userId]))[0].passwordHash;
    expect(hashCost(hash)).toBe(BCRYPT_COST);
  });
});

describe("new passwords (NIST SP 800-63B §5.1.1.2)", () => {
  let t: TestApp;
  let admin: ApiClient;
  beforeAll(async () => {
    t = await startTestApp({ deps: { rateLimits: { login: LIFTED, passwordChange: LIFTED } } });
    const a = await makeUser(t.ds, { roles: ["admin"] });
    admin = new ApiClient(t.url);
    await admin.login(a.email, TEST_PASSWORD);
  });
  afterAll(async () => {
    await t.close();
  });

  let people = 0;
  // A 12-character entry of the package's list: the test fails if the list stops holding it.
  const COMMON_12 = "qwerty123456";

  it("takes a 12-character common password from the package's list", () => {
    expect(dictionary["passwords-common"]).toContain(COMMON_12);
    expect(COMMON_12).toHaveLength(12);
  });

  it.each([
    ["aaaaaaaaaa", 400, "bad_request"],
    [COMMON_12, 422, "password_too_common"],
    ["QWERTY123456", 422, "password_too_common"],
    ["phasebook-demo", 422, "password_too_common"],
    ["aaaaaaaaaaaa", 422, "password_repetitive"],
    ["Phasebook-2026!", 422, "password_guessable"],
    ["Chooser2-2026!", 422, "password_guessable"],
  ])("refuses %j when changing a password: %i %s on newPassword", async (newPassword, status, code) => {
    // The e-mail's local part, "chooser2.<n>", is "chooser" in letters: the context word of the last case.
    const u = await makeUser(t.ds, { email: `chooser2.${++people}@kestrelbay.example` });
    const c = new ApiClient(t.url);
    expect((await c.login(u.email, TEST_PASSWORD)).status).toBe(200);
    const r = await c.post("/api/auth/password", { currentPassword: TEST_PASSWORD, newPassword });
    expect(r.status, r.text).toBe(status);
    expect(r.body.code).toBe(code);
    expect(r.body.errors.map((e: { path: string }) => e.path)).toEqual(["newPassword"]);
    expect(r.body.errors[0].message).toMatch(/\w+ \w+/);
    // Nothing changed: the old password still signs in.
    expect((await new ApiClient(t.url).login(u.email, TEST_PASSWORD)).status).toBe(200);
  });

  it("refuses a common password from a reset link and as an administrator's first password, naming the field", async () => {
    await makeUser(t.ds, { email: "resetter@kestrelbay.example" });
    await new ApiClient(t.url).post("/api/auth/password-reset/request", { email: "resetter@kestrelbay.example" });
    const { deliverDueMail } = await import("../../server/core/outbox");
    await deliverDueMail(t.ds, t.ctx.mailer, t.clock.now(), "phasebook@test");
    const token = /reset-password\/([A-Za-z0-9_-]+)/.exec(t.sent.filter((m) => m.to === "resetter@kestrelbay.example").at(-1)!.text)![1];
    const r = await new ApiClient(t.url).post("/api/auth/password-reset/confirm", { token, newPassword: COMMON_12 });
    expect(r.status).toBe(422);
    expect(r.body.errors.map((e: { path: string }) => e.path)).toEqual(["newPassword"]);
    // The link was not spent on the refusal.
    expect((await new ApiClient(t.url).post("/api/auth/password-reset/confirm", { token, newPassword: "ferrocene-in-the-organic-phase" })).status).toBe(204);

    const made = await admin.post("/api/users", { name: "New Person", email: "new.person@kestrelbay.example", roles: ["member"], password: "phasebook-demo" });
    expect(made.status).toBe(422);
    expect(made.body.errors.map((e: { path: string }) => e.path)).toEqual(["password"]);
    const short = await admin.post("/api/users", { name: "New Person", email: "new.person@kestrelbay.example", roles: ["member"], password: "aaaaaaaaaa" });
    expect(short.status).toBe(400);
    expect(short.body.errors.map((e: { path: string }) => e.path)).toEqual(["password"]);
  });
});
