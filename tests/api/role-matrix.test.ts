/**
 * Every API route × every role: allowed (anything but 401/403), or 401 for nobody signed in and
 * 403 for a role that may not. A route missing from the matrix fails the first test, so new
 * routes must state who may call them.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ROLES, type Role } from "@shared/schemas/auth";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { ROLE_MATRIX, PUBLIC, SIGNED_IN, examplePath } from "../support/role-matrix";

let t: TestApp;
const clients = new Map<Role, ApiClient>();

beforeAll(async () => {
  t = await startTestApp({ deps: { loginRateLimit: { windowMs: 60_000, limit: 1000 } } });
  for (const role of ROLES) {
    const u = await makeUser(t.ds, { roles: [role], email: `matrix-${role}@kestrelbay.example` });
    const c = new ApiClient(t.url);
    const r = await c.login(u.email, TEST_PASSWORD);
    expect(r.status).toBe(200);
    clients.set(role, c);
  }
});
afterAll(async () => {
  await t.close();
});

describe("the role matrix", () => {
  it("names every route the app has, and no route it lacks", () => {
    expect([...t.routes].sort()).toEqual(Object.keys(ROLE_MATRIX).sort());
  });

  for (const [route, allowed] of Object.entries(ROLE_MATRIX)) {
    const [method, pattern] = route.split(" ");
    const path = examplePath(pattern);

    it(`${route}: nobody signed in gets ${allowed === PUBLIC ? "through" : "401"}`, async () => {
      const anon = new ApiClient(t.url);
      const r = await anon.request(method, path, { json: method === "GET" ? undefined : {} });
      if (allowed === PUBLIC) expect([401, 403]).not.toContain(r.status);
      else expect(r.status).toBe(401);
    });

    for (const role of ROLES) {
      const may = allowed === PUBLIC || allowed === SIGNED_IN || (allowed as Role[]).includes(role);
      it(`${route}: ${role} is ${may ? "allowed" : "refused with 403"}`, async () => {
        const c = clients.get(role)!;
        // Signing out is allowed, but it would end this client's session for the other checks.
        if (route === "POST /api/auth/logout") {
          const fresh = new ApiClient(t.url);
          await fresh.login(`matrix-${role}@kestrelbay.example`, TEST_PASSWORD);
          const r = await fresh.post(path);
          expect(r.status).toBe(204);
          return;
        }
        const r = await c.request(method, path, { json: method === "GET" ? undefined : {} });
        if (may) expect([401, 403], `${route} as ${role} answered ${r.status}: ${r.text.slice(0, 200)}`).not.toContain(r.status);
        else expect(r.status, `${route} as ${role}`).toBe(403);
      });
    }
  }
});
