/**
 * Money rounded once, at the charge line (issue 11): a usage logged through the Stockroom keeps
 * its cost unrounded, and the billing run prices it as quantity × (unit cost × (1 + mark-up)),
 * rounded once to the cent, halves away from zero (a spreadsheet's ROUND; common practice in
 * invoicing). Expected values are worked by hand beside each check.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { lineReconciles } from "@shared/domain/charges";
import type { BillingRunDto } from "@shared/schemas/recharge";
import { Container } from "../../server/entities";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { makeAccount, makeBooking, makeInstrument, makeRate } from "../support/billing-factories";

let t: TestApp;
let manager: ApiClient;
let member: ApiClient;
let run: BillingRunDto;

beforeAll(async () => {
  // November, while the salt is used; December once it is billed.
  t = await startTestApp({ now: "2026-11-20T18:00:00.000Z" });
  const m = await makeUser(t.ds, { roles: ["manager"] });
  const u = await makeUser(t.ds, { roles: ["member"] });
  manager = new ApiClient(t.url);
  member = new ApiClient(t.url);
  expect((await manager.login(m.email, TEST_PASSWORD)).status).toBe(200);
  expect((await member.login(u.email, TEST_PASSWORD)).status).toBe(200);
  const policy = await manager.request("PUT", "/api/billing/policy", {
    json: { roundingIncrementMinutes: 15, minimumMinutes: 0, noShowShare: 0.5, lateCancelShare: 0.5, cancellationWindowMinutes: 1440, consumableMarkupPercent: 10 },
  });
  expect(policy.status).toBe(200);

  // Sodium chloride (CAS 7647-14-5) at 2 ¢ per g, a 500 g bottle of the facility's shared stock.
  const chem = await manager.post("/api/chemicals", { name: "Sodium chloride", casNumber: "7647-14-5", formula: "NaCl", unitCostCents: 2, costUnit: "g" });
  expect(chem.status, chem.text).toBe(201);
  const bottle = await t.ds.getRepository(Container).save({
    chemicalId: chem.body.chemical.id,
    quantity: 500,
    initialQuantity: 500,
    unit: "g",
    status: "in_use",
    labelToken: "salt-bottle-label-token-0001",
    createdAt: "2026-11-01T12:00:00.000Z",
  });

  // The member's booking names the account the salt is charged to: 60 booked minutes at 40.00 $/h.
  const account = await makeAccount(t.ds, { code: "CHEM-SALT", members: [{ userId: u.id }] });
  const ps = await makeInstrument(t.ds, { kind: "potentiostat", name: "PS-salt" });
  await makeRate(t.ds, { instrumentKind: "potentiostat", customerClass: "internal", hourlyRateCents: 4000, effectiveFrom: "2026-01-01" });
  const booking = await makeBooking(t.ds, { userId: u.id, accountId: account.id, instrumentIds: [ps.id], start: "2026-11-20T14:00:00Z", end: "2026-11-20T15:00:00Z" });

  const used = await member.post(`/api/containers/${bottle.id}/usage`, { amount: 0.7, unit: "g", bookingId: booking.id });
  expect(used.status, used.text).toBe(200);

  t.clock.set("2026-12-02T15:00:00.000Z");
  const r = await manager.post("/api/billing/runs", { period: "2026-11" });
  expect(r.status, r.text).toBe(201);
  run = r.body.run;
});

afterAll(async () => {
  await t.close();
});

describe("a usage's cost, rounded once at the charge line", () => {
  it("bills 0.7 g of salt at 2 ¢/g with a 10 % mark-up as 2 ¢, where rounding at the time of use and again after the mark-up gave 1 ¢", async () => {
    // By hand: 0.7 g × 2 ¢/g = 1.4 ¢ at cost; × 1.10 = 1.54 ¢ → 2 ¢, rounded once.
    // Rounded twice, as before: 1.4 ¢ → 1 ¢ at the time of use; 1 ¢ × 1.10 = 1.1 ¢ → 1 ¢.
    const twice = Math.round(Math.round(0.7 * 2) * 1.1);
    expect(twice).toBe(1);
    const line = run.statements.flatMap((s) => s.lines).find((l) => l.kind === "consumable")!;
    expect(line).toMatchObject({ quantity: "0.7", unit: "g", unitPriceCents: "2.2", amount: 2 });
    expect(line.amount).not.toBe(twice);
    // The usage kept its cost unrounded; its rounded figure (for display) is the 1 ¢ that used to be billed on.
    const [usage] = await t.ds.query(`SELECT costCents, costQuantity, costUnit, unitCostCents FROM container_usages`);
    expect(usage).toEqual({ costCents: 1, costQuantity: "0.7", costUnit: "g", unitCostCents: "2" });
  });

  it("reconciles every line of the month: quantity × unit price rounds to the amount", async () => {
    const lines = run.statements.flatMap((s) => s.lines);
    expect(lines.map((l) => [l.kind, l.quantity, l.unit, l.unitPriceCents, l.amount])).toEqual([
      // 60 min = 1 h × 4000 ¢ = 4000 ¢.
      ["instrument", "1", "h", "4000", 4000],
      ["consumable", "0.7", "g", "2.2", 2],
    ]);
    for (const l of lines) expect(lineReconciles({ quantity: l.quantity, unit: l.unit, unitPriceCents: l.unitPriceCents, amountCents: l.amount })).toBe(true);
    expect(run.statements[0].total).toBe(4002);
  });

  it("shows the member the line with its quantity, unit and unit price among their own charges", async () => {
    const mine = await member.get("/api/billing/my-charges");
    expect(mine.status).toBe(200);
    expect(mine.body.items.find((i: { kind: string }) => i.kind === "consumable")).toMatchObject({ quantity: "0.7", unit: "g", unitPriceCents: "2.2", amount: 2 });
    expect(mine.body.sum).toBe(4002);
  });
});
