/**
 * Every API route × every role: allowed (anything but 401/403), or 401 for nobody signed in and
 * 403 for a role that may not. Who may is read from the routes' own declarations (the route
 * tables the app is built from); the contract's published "who" column is checked against those
 * declarations.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ROLES, type Role } from "@shared/schemas/auth";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { CONTRACT_ACCESS, PUBLIC, SIGNED_IN, examplePath, type Who } from "../support/role-matrix";
import { routeKey, type Access } from "../../server/http/route-table";

let t: TestApp;
const clients = new Map<Role, ApiClient>();

const asWho = (a: Access): Who => (a === "public" ? PUBLIC : a === "signed_in" ? SIGNED_IN : [...a].sort());

// The declarations, read from a built app (the same tables the router was built from).
const probe = await startTestApp();
const declared = new Map(probe.tables.flatMap((table) => table.routes.map((r) => [routeKey(r), asWho(r.access)] as const)));
const mounted = [...probe.routes];
await probe.close();

const matrix: Record<string, Who> = Object.fromEntries(declared);

beforeAll(async () => {
  t = await startTestApp({ deps: { rateLimits: { login: { windowMs: 60_000, limit: 1000 } } } });
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
  it("covers every mounted route: each is declared in a route table", () => {
    expect([...mounted].sort()).toEqual(Object.keys(matrix).sort());
  });

  it("declares what the published contract says of who may call its routes", () => {
    const norm = (w: Who) => (Array.isArray(w) ? [...w].sort() : w);
    for (const [key, who] of Object.entries(CONTRACT_ACCESS)) {
      expect(matrix[key], key).toBeDefined();
      expect(norm(matrix[key]), key).toEqual(norm(who));
    }
  });

  for (const [route, allowed] of Object.entries(matrix)) {
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
