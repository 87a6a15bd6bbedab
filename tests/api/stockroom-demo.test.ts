/**
 * The Stockroom and Safety review over the demo scenario, as the demo's people see them: the
 * over-limit under-bench cabinet, the prepared solution's lineage, and a contract-style script
 * (CSRF token from GET /api/auth/csrf) logging a usage.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTestApp, TEST_NOW, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { seedDemo } from "../../server/db/seed/demo";

let t: TestApp;
const DEMO_PASSWORD = "phasebook-demo";

beforeAll(async () => {
  t = await startTestApp({ deps: { loginRateLimit: { windowMs: 60_000, limit: 1000 } } });
  await seedDemo(t.ds, { now: new Date(TEST_NOW), bcryptCost: 4 });
});
afterAll(async () => {
  await t.close();
});

async function as(email: string): Promise<ApiClient> {
  const c = new ApiClient(t.url);
  expect((await c.login(email, DEMO_PASSWORD)).status).toBe(200);
  return c;
}

describe("the demo's Safety review", () => {
  it("shows the under-bench cabinet UB-1 over its 10 L example limit, and its room counting it", async () => {
    const safety = await as("safety@kestrelbay.example");
    const r = await safety.get("/api/safety/locations");
    const ub1 = r.body.items.find((l: { name: string }) => l.name.startsWith("Under-bench solvent cabinet UB-1"));
    expect(ub1).toMatchObject({ flammableLimitLitres: 10, overLimit: true, flammableOverLimit: true });
    // 3 × 2.5 L + 1.85 L of 1,2-dichloroethane, 0.8 L trifluorotoluene, 1.6 L acetone (demo containers).
    expect(ub1.flammableLitres).toBeCloseTo(7.5 + 1.85 + 0.8 + 1.6, 3);
    const room = r.body.items.find((l: { id: number }) => l.id === ub1.parentId);
    expect(room.flammableLitres).toBeGreaterThan(ub1.flammableLitres);
    const dash = await safety.get("/api/dashboard");
    expect(dash.body.safety.locationsOverLimit).toBeGreaterThanOrEqual(1);
  });

  it("gives the prepared LiCl solution its parent bottle as lineage", async () => {
    const member = await as("member@kestrelbay.example");
    const list = await member.get("/api/containers?kind=solution");
    expect(list.body.total).toBeGreaterThanOrEqual(1);
    const d = await member.get(`/api/containers/${list.body.items[0].id}`);
    expect(d.body.parents).toEqual([expect.objectContaining({ chemicalName: "Lithium chloride", role: "solute" })]);
  });

  it("lets the demo member log 5 mL of 1,2-dichloroethane (CAS 107-06-2) by script", async () => {
    const member = await as("member@kestrelbay.example");
    const chem = (await member.get("/api/chemicals?q=107-06-2")).body.items[0];
    const list = await member.get(`/api/containers?chemicalId=${chem.id}&status=in_use`);
    const bottle = list.body.items.find((c: { kind: string }) => c.kind === "bottle");
    const r = await member.post(`/api/containers/${bottle.id}/usage`, { amount: 5, unit: "mL" });
    expect(r.status, r.text).toBe(200);
    expect(r.body.container.quantity).toBeCloseTo(bottle.quantity - 5, 9);
  });
});
