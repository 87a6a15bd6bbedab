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
  t = await startTestApp({ deps: { rateLimits: { login: { windowMs: 60_000, limit: 1000 } } } });
  // The app's cost, as the seed and the app share one in production.
  await seedDemo(t.ds, { now: new Date(TEST_NOW), bcryptCost: t.ctx.bcryptCost });
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
    const classIandII = ub1.limits.find((l: { classes: string[] }) => l.classes.join("+") === "IA+IB+IC+II");
    expect(classIandII).toMatchObject({ maxLitres: 10, finding: "over" });
    expect(ub1.overLimit).toBe(true);
    // 3 × 2.5 L + 1.85 L of 1,2-dichloroethane, 0.8 L trifluorotoluene, 1.6 L acetone (demo containers).
    expect(classIandII.totalLitres).toBeCloseTo(7.5 + 1.85 + 0.8 + 1.6, 6);
    const room = r.body.items.find((l: { id: number }) => l.id === ub1.parentId);
    expect(room.litresByClass.IB).toBeGreaterThanOrEqual(ub1.litresByClass.IB);
    const dash = await safety.get("/api/dashboard");
    expect(dash.body.safety.locationsOverLimit).toBeGreaterThanOrEqual(1);
  });

  it("totals every demo location by NFPA 30 class exactly as a hand computation from its containers", async () => {
    // NFPA 30 classes by closed-cup flash point (FP) and boiling point (BP), in °C from the standard's °F:
    // IA FP < 22.8 and BP < 37.8; IB FP < 22.8 and BP ≥ 37.8; IC 22.8 ≤ FP < 37.8; II 37.8 ≤ FP < 60;
    // IIIA 60 ≤ FP < 93; IIIB FP ≥ 93. A prepared solution burns as its solvent.
    const cls = (fp: number | null, bp: number | null): string | null => {
      if (fp === null) return null;
      if (fp < 22.8) return bp === null ? null : bp < 37.8 ? "IA" : "IB";
      if (fp < 37.8) return "IC";
      if (fp < 60) return "II";
      if (fp < 93) return "IIIA";
      return "IIIB";
    };
    const rows: { locationId: number; quantity: number; unit: string; fp: number | null; bp: number | null; density: number | null }[] = await t.ds.query(
      `SELECT c.locationId, c.quantity, c.unit,
              COALESCE(sv.flashPointC, ch.flashPointC) AS fp,
              CASE WHEN sv.id IS NULL THEN ch.boilingPointC ELSE sv.boilingPointC END AS bp,
              CASE WHEN sv.id IS NULL THEN ch.densityGPerMl ELSE sv.densityGPerMl END AS density
         FROM containers c JOIN chemicals ch ON ch.id = c.chemicalId
         LEFT JOIN solution_components sc ON sc.solutionContainerId = c.id AND sc.role = 'solvent'
         LEFT JOIN containers p ON p.id = sc.parentContainerId LEFT JOIN chemicals sv ON sv.id = p.chemicalId
        WHERE c.status NOT IN ('empty','disposed') AND c.locationId IS NOT NULL`,
    );
    const parents = new Map<number, number | null>((await t.ds.query(`SELECT id, parentId FROM locations`)).map((l: { id: number; parentId: number | null }) => [l.id, l.parentId]));
    const hand = new Map<number, Record<string, number>>();
    for (const r of rows) {
      const c = cls(r.fp, r.bp);
      if (c === null) continue;
      const litres = r.unit === "mL" ? r.quantity / 1000 : r.unit === "L" ? r.quantity : r.unit === "g" && r.density ? r.quantity / r.density / 1000 : null;
      if (litres === null) continue;
      for (let at: number | null = r.locationId; at !== null; at = parents.get(at) ?? null) {
        const sums = hand.get(at) ?? {};
        sums[c] = (sums[c] ?? 0) + litres;
        hand.set(at, sums);
      }
    }
    const safety = await as("safety@kestrelbay.example");
    const items: { id: number; path: string; litresByClass: Record<string, number> }[] = (await safety.get("/api/safety/locations")).body.items;
    for (const l of items) {
      for (const c of ["IA", "IB", "IC", "II", "IIIA", "IIIB"]) expect(l.litresByClass[c], `${l.path}, Class ${c}`).toBeCloseTo(hand.get(l.id)?.[c] ?? 0, 6);
    }
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
