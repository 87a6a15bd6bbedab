import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { OutboundMail } from "../../server/entities";
import { deliverDueMail } from "../../server/core/outbox";

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(async () => {
  await t.close();
});

describe("GET /api/health", () => {
  it("answers ok for the service and the database", async () => {
    const r = await new ApiClient(t.url).get("/api/health");
    expect(r.status).toBe(200);
    expect(r.body).toEqual({ status: "ok", db: "ok" });
  });
});

describe("the session routes of API.md, used as a script would", () => {
  it("signs in with the CSRF token and a cookie, answers me, and signs out", async () => {
    const u = await makeUser(t.ds, { roles: ["member", "manager"], email: "script@kestrelbay.example" });
    const c = new ApiClient(t.url);
    const csrf = await c.get("/api/auth/csrf");
    expect(csrf.status).toBe(200);
    expect(typeof csrf.body.token).toBe("string");
    c.csrf = csrf.body.token;

    const login = await c.login("script@kestrelbay.example", TEST_PASSWORD);
    expect(login.status).toBe(200);
    expect(login.body.user).toEqual({ id: u.id, email: u.email, name: u.name, roles: ["manager", "member"], groupId: null, leadOf: [], organisation: null });
    const cookie = login.headers.get("set-cookie") ?? "";
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);

    const me = await c.get("/api/auth/me");
    expect(me.status).toBe(200);
    expect(me.body.user.email).toBe("script@kestrelbay.example");

    // The token fetched before sign-in still works after it: a script fetches it once.
    const out = await c.post("/api/auth/logout");
    expect(out.status).toBe(204);
    expect((await c.get("/api/auth/me")).status).toBe(401);
  });

  it("accepts the e-mail in any letter case", async () => {
    await makeUser(t.ds, { email: "mixed.case@kestrelbay.example" });
    const r = await new ApiClient(t.url).login("Mixed.Case@KestrelBay.example", TEST_PASSWORD);
    expect(r.status).toBe(200);
  });

  it("gives the same 401 for an unknown e-mail and a wrong password", async () => {
    await makeUser(t.ds, { email: "known@kestrelbay.example" });
    const wrong = await new ApiClient(t.url).login("known@kestrelbay.example", "not-the-password");
    const unknown = await new ApiClient(t.url).login("nobody@kestrelbay.example", "not-the-password");
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.headers.get("content-type")).toMatch(/application\/problem\+json/);
    expect({ ...wrong.body, type: 0 }).toEqual({ ...unknown.body, type: 0 });
  });

  it("answers 400 naming each missing field", async () => {
    const r = await new ApiClient(t.url).post("/api/auth/login", { email: "" });
    expect(r.status).toBe(400);
    expect(r.headers.get("content-type")).toMatch(/application\/problem\+json/);
    expect(r.body.errors.map((e: { path: string }) => e.path).sort()).toEqual(["email", "password"]);
    expect(r.body).toMatchObject({ status: 400, title: expect.any(String), type: expect.any(String) });
  });

  it("answers 401 from me when not signed in", async () => {
    const r = await new ApiClient(t.url).get("/api/auth/me");
    expect(r.status).toBe(401);
    expect(r.body.status).toBe(401);
  });

  it("refuses a state change without the CSRF token with 403", async () => {
    await makeUser(t.ds, { email: "nocsrf@kestrelbay.example" });
    const c = new ApiClient(t.url);
    const r = await c.post("/api/auth/login", { email: "nocsrf@kestrelbay.example", password: TEST_PASSWORD }, { csrf: false });
    expect(r.status).toBe(403);
    expect(r.body.code).toBe("csrf_invalid");
  });

  it("refuses a token from another session", async () => {
    const a = new ApiClient(t.url);
    const b = new ApiClient(t.url);
    await a.fetchCsrf();
    await b.fetchCsrf();
    b.csrf = a.csrf;
    const r = await b.post("/api/auth/password-reset/request", { email: "x@kestrelbay.example" });
    expect(r.status).toBe(403);
  });

  it("refuses a deactivated person with the same 401", async () => {
    await makeUser(t.ds, { email: "gone@kestrelbay.example", active: false });
    const r = await new ApiClient(t.url).login("gone@kestrelbay.example", TEST_PASSWORD);
    expect(r.status).toBe(401);
  });
});

describe("request limits", () => {
  it("answers 413 for a body over the size limit", async () => {
    const c = new ApiClient(t.url);
    const r = await c.post("/api/auth/login", { email: "a@b.c", password: "x".repeat(300_000) });
    expect(r.status).toBe(413);
    expect(r.body.status).toBe(413);
  });

  it("answers 400 for malformed JSON", async () => {
    const c = new ApiClient(t.url);
    await c.fetchCsrf();
    const r = await c.request("POST", "/api/auth/login", { body: "{nope", headers: { "content-type": "application/json" } });
    expect(r.status).toBe(400);
  });

  it("answers a JSON 404 for an unknown /api route, never the page", async () => {
    const r = await new ApiClient(t.url).get("/api/no-such-thing");
    expect(r.status).toBe(404);
    expect(r.headers.get("content-type")).toMatch(/application\/problem\+json/);
  });

  it("sends security headers", async () => {
    const r = await new ApiClient(t.url).get("/api/health");
    expect(r.headers.get("x-content-type-options")).toBe("nosniff");
    expect(r.headers.get("content-security-policy")).toContain("default-src 'self'");
    // The calendar's arrow icons are an embedded font; without data: they render as empty boxes.
    expect(r.headers.get("content-security-policy")).toContain("font-src 'self' data:");
  });
});

describe("POST /api/auth/password", () => {
  it("changes the password, refuses a wrong current one, and ends the person's other sessions", async () => {
    await makeUser(t.ds, { email: "changer@kestrelbay.example" });
    const phone = new ApiClient(t.url);
    const laptop = new ApiClient(t.url);
    await phone.login("changer@kestrelbay.example", TEST_PASSWORD);
    await laptop.login("changer@kestrelbay.example", TEST_PASSWORD);

    const bad = await laptop.post("/api/auth/password", { currentPassword: "wrong-one", newPassword: "a-new-long-password" });
    expect(bad.status).toBe(422);
    expect(bad.body.errors[0].path).toBe("currentPassword");

    const short = await laptop.post("/api/auth/password", { currentPassword: TEST_PASSWORD, newPassword: "short" });
    expect(short.status).toBe(400);

    const ok = await laptop.post("/api/auth/password", { currentPassword: TEST_PASSWORD, newPassword: "a-new-long-password" });
    expect(ok.status).toBe(204);
    expect((await laptop.get("/api/auth/me")).status).toBe(200);
    expect((await phone.get("/api/auth/me")).status).toBe(401);
    expect((await new ApiClient(t.url).login("changer@kestrelbay.example", "a-new-long-password")).status).toBe(200);
  });
});

describe("password reset by e-mail link", () => {
  it("mails a single-use link that works once and within the hour", async () => {
    await makeUser(t.ds, { email: "forgetful@kestrelbay.example" });
    const c = new ApiClient(t.url);
    const asked = await c.post("/api/auth/password-reset/request", { email: "forgetful@kestrelbay.example" });
    expect(asked.status).toBe(202);
    const unknown = await c.post("/api/auth/password-reset/request", { email: "stranger@kestrelbay.example" });
    expect(unknown.status).toBe(202);

    await deliverDueMail(t.ds, t.ctx.mailer, t.clock.now(), "phasebook@test");
    const mail = t.sent.find((m) => m.to === "forgetful@kestrelbay.example");
    expect(mail).toBeDefined();
    expect(t.sent.some((m) => m.to === "stranger@kestrelbay.example")).toBe(false);
    const token = /reset-password\/([A-Za-z0-9_-]+)/.exec(mail!.text)![1];

    const ok = await c.post("/api/auth/password-reset/confirm", { token, newPassword: "brand-new-password" });
    expect(ok.status).toBe(204);
    const again = await c.post("/api/auth/password-reset/confirm", { token, newPassword: "another-password-1" });
    expect(again.status).toBe(422);
    expect((await new ApiClient(t.url).login("forgetful@kestrelbay.example", "brand-new-password")).status).toBe(200);
  });

  it("refuses a link older than an hour", async () => {
    await makeUser(t.ds, { email: "late@kestrelbay.example" });
    const c = new ApiClient(t.url);
    await c.post("/api/auth/password-reset/request", { email: "late@kestrelbay.example" });
    await deliverDueMail(t.ds, t.ctx.mailer, t.clock.now(), "phasebook@test");
    const mail = t.sent.filter((m) => m.to === "late@kestrelbay.example").at(-1)!;
    const token = /reset-password\/([A-Za-z0-9_-]+)/.exec(mail.text)![1];
    t.clock.advance(61 * 60 * 1000);
    try {
      const r = await c.post("/api/auth/password-reset/confirm", { token, newPassword: "brand-new-password" });
      expect(r.status).toBe(422);
      expect(r.body.code).toBe("reset_link_invalid");
    } finally {
      t.clock.advance(-61 * 60 * 1000);
    }
  });
});

describe("the mail outbox", () => {
  it("keeps a mail pending and retries later when the mail server is down", async () => {
    await makeUser(t.ds, { email: "outage@kestrelbay.example" });
    const c = new ApiClient(t.url);
    const r = await c.post("/api/auth/password-reset/request", { email: "outage@kestrelbay.example" });
    expect(r.status).toBe(202);
    const down = { send: async () => Promise.reject(new Error("connect ECONNREFUSED")), close() {} };
    const first = await deliverDueMail(t.ds, down, t.clock.now(), "phasebook@test");
    expect(first.failed).toBeGreaterThan(0);
    const row = await t.ds.getRepository(OutboundMail).findOneByOrFail({ to: "outage@kestrelbay.example" });
    expect(row.status).toBe("pending");
    expect(row.attempts).toBe(1);
    // Not retried before its backoff (1 minute) has passed.
    expect((await deliverDueMail(t.ds, t.ctx.mailer, t.clock.now(), "phasebook@test")).sent).toBe(0);
    const later = new Date(t.clock.now().getTime() + 2 * 60_000);
    expect((await deliverDueMail(t.ds, t.ctx.mailer, later, "phasebook@test")).sent).toBe(1);
    expect((await t.ds.getRepository(OutboundMail).findOneByOrFail({ id: row.id })).status).toBe("sent");
  });
});

describe("GET /api/facility", () => {
  it("names the facility's time zone and currency from the configuration", async () => {
    const r = await new ApiClient(t.url).get("/api/facility");
    expect(r.status).toBe(200);
    expect(r.body).toEqual({ name: "Liquid Interfaces Core", timeZone: "America/Halifax", currency: "CAD", publicDemo: false });
  });
});
