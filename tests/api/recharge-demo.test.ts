/**
 * The demo facility's last month billed end to end: every instrument kind × class has a rate,
 * each statement is the sum of its lines, and the finance journal adds up to the internal
 * statements to the cent.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DateTime } from "luxon";
import { seedDemo } from "../../server/db/seed/demo";
import { DEMO_BILLING_POLICY } from "../../server/db/seed/demo-rates";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import type { BillingRunDto } from "@shared/schemas/recharge";

let t: TestApp;
let manager: ApiClient;

beforeAll(async () => {
  t = await startTestApp({ deps: { rateLimits: { login: { windowMs: 60_000, limit: 1000 } } } });
  // The app's cost, as the seed and the app share one in production.
  await seedDemo(t.ds, { now: t.clock.now(), bcryptCost: t.ctx.bcryptCost });
  manager = new ApiClient(t.url);
  expect((await manager.login("manager@kestrelbay.example", "phasebook-demo")).status).toBe(200);
});

afterAll(async () => {
  await t.close();
});

describe("the demo's recharge data", () => {
  it("has a rate for every instrument kind and customer class", async () => {
    const rates = (await manager.get("/api/rates")).body.items as { instrumentKind: string; customerClass: string }[];
    const pairs = new Set(rates.map((r) => `${r.instrumentKind}|${r.customerClass}`));
    for (const kind of ["potentiostat", "interface_cell", "support"]) {
      for (const cls of ["internal", "external_academic", "commercial"]) expect(pairs.has(`${kind}|${cls}`), `${kind} ${cls}`).toBe(true);
    }
  });

  it("prices with the billing settings the demo wrote (the seed keeps the settings' key itself)", async () => {
    const r = await manager.get("/api/billing/policy");
    expect(r.status).toBe(200);
    expect(r.body.policy).toEqual(DEMO_BILLING_POLICY);
  });

  it("bills last month with totals that reconcile to the cent", async () => {
    const period = DateTime.fromJSDate(t.clock.now(), { zone: "America/Halifax" }).minus({ months: 1 }).toFormat("yyyy-MM");
    const r = await manager.post("/api/billing/runs", { period });
    expect(r.status, r.text).toBe(201);
    const run = r.body.run as BillingRunDto;
    const tidewater = run.statements.find((s) => s.accountCode === "EXT-0001-TMR");
    expect(tidewater?.total).toBeGreaterThan(0);
    for (const s of run.statements) expect(s.total).toBe(s.lines.reduce((a, l) => a + l.amount, 0));
    const internalTotal = run.statements.filter((s) => s.accountKind === "internal").reduce((a, s) => a + s.total, 0);
    expect(internalTotal).toBeGreaterThan(0);
    const csv = (await manager.get(`/api/billing/runs/${run.id}/journal.csv`)).text.trim().split("\r\n").slice(1);
    const journal = csv.reduce((a, row) => a + Math.round(Number(row.split(",")[3]) * 100), 0);
    expect(journal).toBe(internalTotal);
  });
});
