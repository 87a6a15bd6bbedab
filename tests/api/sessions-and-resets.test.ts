/**
 * What ends when a password changes (OWASP Session Management Cheat Sheet, "Renew the Session
 * ID After Any Privilege Level Change"; OWASP Forgot Password Cheat Sheet: single-use links,
 * a notice to the person), and the CSRF token that costs the server nothing (OWASP CSRF
 * Prevention Cheat Sheet, "Signed Double-Submit Cookie"; sessions are written only at sign-in).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { deliverDueMail } from "../../server/core/outbox";

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({ deps: { rateLimits: { login: { windowMs: 60_000, limit: 1000 }, reset: { windowMs: 60_000, limit: 1000 } } } });
});
afterAll(async () => {
  await t.close();
});

const sessionsOf = async (userId: number): Promise<number> => Number((await t.ds.query(`SELECT COUNT(*) AS n FROM sessions WHERE userId = ?`, [userId]))[0].n);
const allSessions = async (): Promise<number> => Number((await t.ds.query(`SELECT COUNT(*) AS n FROM sessions`))[0].n);

/** Asks for a reset link for the address and reads it from the mail, as the person would. */
async function resetLink(email: string): Promise<string> {
  const r = await new ApiClient(t.url).post("/api/auth/password-reset/request", { email });
  expect(r.status).toBe(202);
  await deliverDueMail(t.ds, t.ctx.mailer, t.clock.now(), "phasebook@test");
  const mail = t.sent.filter((m) => m.to === email && m.subject.startsWith("Reset")).at(-1)!;
  return /reset-password\/([A-Za-z0-9_-]+)/.exec(mail.text)![1];
}

describe("a password reset", () => {
  it("ends the person's older reset links and every session, and tells the person", async () => {
    const u = await makeUser(t.ds, { email: "two.links@kestrelbay.example" });
    const phone = new ApiClient(t.url);
    expect((await phone.login(u.email, TEST_PASSWORD)).status).toBe(200);
    const older = await resetLink(u.email);
    const newer = await resetLink(u.email);
    expect(older).not.toBe(newer);

    expect((await new ApiClient(t.url).post("/api/auth/password-reset/confirm", { token: newer, newPassword: "a-liquid-liquid-interface" })).status).toBe(204);
    const stale = await new ApiClient(t.url).post("/api/auth/password-reset/confirm", { token: older, newPassword: "someone-elses-choice-here" });
    expect(stale.status).toBe(422);
    expect(stale.body.code).toBe("reset_link_invalid");
    expect((await phone.get("/api/auth/me")).status).toBe(401);
    expect(await sessionsOf(u.id)).toBe(0);
    expect((await new ApiClient(t.url).login(u.email, "a-liquid-liquid-interface")).status).toBe(200);

    await deliverDueMail(t.ds, t.ctx.mailer, t.clock.now(), "phasebook@test");
    const notice = t.sent.filter((m) => m.to === u.email).at(-1)!;
    expect(notice.subject).toBe("Your Phasebook password was changed");
    expect(notice.text).toContain("older reset links no longer work");
  });
});

describe("a password change", () => {
  it("keeps the changing browser signed in on a new session id, and ends other sessions and open reset links", async () => {
    const u = await makeUser(t.ds, { email: "changing@kestrelbay.example" });
    const laptop = new ApiClient(t.url);
    const phone = new ApiClient(t.url);
    await laptop.login(u.email, TEST_PASSWORD);
    await phone.login(u.email, TEST_PASSWORD);
    const link = await resetLink(u.email);
    const before = laptop.cookieHeader;
    expect(await sessionsOf(u.id)).toBe(2);

    const r = await laptop.post("/api/auth/password", { currentPassword: TEST_PASSWORD, newPassword: "dichloroethane-under-the-hood" });
    expect(r.status).toBe(204);
    expect(laptop.cookieHeader).not.toBe(before);
    expect((await laptop.get("/api/auth/me")).status).toBe(200);
    expect((await phone.get("/api/auth/me")).status).toBe(401);
    expect(await sessionsOf(u.id)).toBe(1);
    // The laptop's CSRF token survives the new session id: a script fetches it once.
    expect((await laptop.post("/api/auth/logout")).status).toBe(204);

    const late = await new ApiClient(t.url).post("/api/auth/password-reset/confirm", { token: link, newPassword: "someone-elses-choice-here" });
    expect(late.status).toBe(422);
    expect(late.body.code).toBe("reset_link_invalid");
    expect((await new ApiClient(t.url).login(u.email, "dichloroethane-under-the-hood")).status).toBe(200);
  });
});

describe("GET /api/auth/csrf", () => {
  it("writes nothing to the database for 300 anonymous requests", async () => {
    await t.ds.query(`DELETE FROM sessions`);
    const tokens = new Set<string>();
    for (let i = 0; i < 300; i++) {
      const r = await new ApiClient(t.url).get("/api/auth/csrf");
      expect(r.status).toBe(200);
      // A cached copy would hand an old token out without its cookie.
      expect(r.headers.get("cache-control")).toBe("no-store");
      tokens.add(r.body.token);
    }
    expect(tokens.size).toBe(300);
    expect(await allSessions()).toBe(0);
  });

  it("gives one browser the same token until it signs out, and a session row only for the signed-in person", async () => {
    await t.ds.query(`DELETE FROM sessions`);
    const u = await makeUser(t.ds);
    const c = new ApiClient(t.url);
    const first = (await c.get("/api/auth/csrf")).body.token;
    expect((await c.get("/api/auth/csrf")).body.token).toBe(first);
    const cookie = c.cookieHeader;
    expect(cookie).toMatch(/phasebook\.csrf=/);
    expect(cookie).not.toMatch(/phasebook\.sid=/);
    expect(await allSessions()).toBe(0);

    c.csrf = first;
    expect((await c.login(u.email, TEST_PASSWORD)).status).toBe(200);
    expect(await allSessions()).toBe(1);
    expect((await c.post("/api/auth/logout")).status).toBe(204);
    expect(await allSessions()).toBe(0);
    expect(c.cookieHeader).toMatch(/phasebook\.sid=;|phasebook\.sid=$/);
    // Signing out dropped the token: the old one no longer works, a new one does.
    const stale = await c.post("/api/auth/password-reset/request", { email: u.email });
    expect(stale.status).toBe(403);
    expect(stale.body.code).toBe("csrf_invalid");
    const next = (await c.get("/api/auth/csrf")).body.token;
    expect(next).not.toBe(first);
    c.csrf = next;
    expect((await c.post("/api/auth/password-reset/request", { email: u.email })).status).toBe(202);
  });

  it("refuses the token without its cookie, and a cookie the server did not sign", async () => {
    const c = new ApiClient(t.url);
    const token = (await c.get("/api/auth/csrf")).body.token as string;
    const noCookie = await fetch(`${t.url}/api/auth/password-reset/request`, {
      method: "POST",
      headers: { "content-type": "application/json", "x-csrf-token": token },
      body: JSON.stringify({ email: "x@kestrelbay.example" }),
    });
    expect(noCookie.status).toBe(403);
    // A pair made up by another site: the same value in cookie and header, but not signed with the secret.
    const forged = `${"0".repeat(64)}.${"ab".repeat(32)}`;
    const made = await fetch(`${t.url}/api/auth/password-reset/request`, {
      method: "POST",
      headers: { "content-type": "application/json", "x-csrf-token": forged, cookie: `phasebook.csrf=${forged}` },
      body: JSON.stringify({ email: "x@kestrelbay.example" }),
    });
    expect(made.status).toBe(403);
    expect(((await made.json()) as { code: string }).code).toBe("csrf_invalid");
  });
});

describe("the CSRF cookie behind TLS", () => {
  it("is a __Host- cookie: Secure, httpOnly, SameSite=Strict, path /", async () => {
    const tls = await startTestApp({ env: { PUBLIC_URL: "https://phasebook.example.edu" } });
    try {
      const r = await fetch(`${tls.url}/api/auth/csrf`);
      const cookie = r.headers.getSetCookie().find((c) => c.startsWith("__Host-phasebook.csrf="));
      expect(cookie, r.headers.getSetCookie().join("\n")).toBeDefined();
      expect(cookie).toMatch(/; Secure/i);
      expect(cookie).toMatch(/; HttpOnly/i);
      expect(cookie).toMatch(/; SameSite=Strict/i);
      expect(cookie).toMatch(/; Path=\//i);
      expect(cookie).not.toMatch(/; Domain=/i);
    } finally {
      await tls.close();
    }
  });
});
