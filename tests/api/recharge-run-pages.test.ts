/**
 * The finalising billing run reads a month page by page and writes its lines as they are priced.
 * These tests hold it to the preview: the same lines whatever the page size, nothing left behind
 * when a run is refused half-way, and the stored statements equal to what the preview showed.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { makeAccount, makeBooking, makeContainer, makeInstrument, makeRate, makeUsage } from "../support/billing-factories";
import { computeMonth } from "../../server/modules/recharge/month-stream";
import type { Account } from "../../server/entities";
import type { BillingRunDto, StatementDto } from "@shared/schemas/recharge";

let t: TestApp;
let manager: ApiClient;
let lab: Account;
let other: Account;
const TZ = "America/Halifax";

beforeAll(async () => {
  t = await startTestApp();
  const m = await makeUser(t.ds, { roles: ["manager", "member"] });
  const u = await makeUser(t.ds, { roles: ["member"] });
  manager = new ApiClient(t.url);
  expect((await manager.login(m.email, TEST_PASSWORD)).status).toBe(200);
  lab = await makeAccount(t.ds, { code: "PAGE-LAB" });
  other = await makeAccount(t.ds, { code: "PAGE-OTHER" });
  const ps = await makeInstrument(t.ds, { kind: "potentiostat" });
  const ps2 = await makeInstrument(t.ds, { kind: "potentiostat" });
  const cell = await makeInstrument(t.ds, { kind: "interface_cell" });
  await makeRate(t.ds, { instrumentKind: "potentiostat", customerClass: "internal", hourlyRateCents: 4000, effectiveFrom: "2026-01-01" });
  await makeRate(t.ds, { instrumentKind: "interface_cell", customerClass: "internal", hourlyRateCents: 1000, effectiveFrom: "2026-01-01" });
  // Seven bookings, three of them starting at the same instant (ties across page edges), one
  // holding two instruments: eight instrument lines.
  const same = "2026-11-10T14:00:00Z";
  await makeBooking(t.ds, { userId: u.id, accountId: lab.id, instrumentIds: [ps.id, cell.id], start: same, end: "2026-11-10T15:00:00Z" });
  await makeBooking(t.ds, { userId: u.id, accountId: other.id, instrumentIds: [ps2.id], start: same, end: "2026-11-10T16:00:00Z" });
  await makeBooking(t.ds, { userId: u.id, accountId: lab.id, instrumentIds: [cell.id], start: same, end: "2026-11-10T14:30:00Z", status: "no_show" });
  for (const day of ["03", "05", "19", "27"]) {
    await makeBooking(t.ds, { userId: u.id, accountId: day < "10" ? lab.id : other.id, instrumentIds: [ps.id], start: `2026-11-${day}T13:00:00Z`, end: `2026-11-${day}T14:15:00Z` });
  }
  // Nine usages, four logged at the same instant.
  const bottle = await makeContainer(t.ds);
  for (let i = 0; i < 9; i++) {
    const at = i < 4 ? "2026-11-12T12:00:00Z" : `2026-11-${String(13 + i).padStart(2, "0")}T12:00:00Z`;
    await makeUsage(t.ds, { containerId: bottle.id, userId: u.id, accountId: i % 2 ? lab.id : other.id, amount: 1 + i, costCents: 100 + i, at });
  }
});

afterAll(async () => {
  await t.close();
});

describe("a billing run read in pages", () => {
  it("prices the same lines in the same order with pages of two rows as with one page", async () => {
    const small = await t.ds.transaction((em) => computeMonth(em, { period: "2026-11", tz: TZ, pageSize: { bookings: 2, usages: 2 } }));
    const whole = await t.ds.transaction((em) => computeMonth(em, { period: "2026-11", tz: TZ, pageSize: { bookings: 1000, usages: 1000 } }));
    expect(small.statements).toEqual(whole.statements);
    // 7 bookings, one on two instruments → 8 instrument lines; 9 consumable lines.
    const lines = whole.statements.flatMap((s) => s.lines);
    expect(lines.filter((l) => l.kind === "instrument")).toHaveLength(8);
    expect(lines.filter((l) => l.kind === "consumable")).toHaveLength(9);
    expect(new Set(lines.filter((l) => l.usageId != null).map((l) => l.usageId)).size).toBe(9);
  });

  it("refuses a month with an unpriced charge with 422 and leaves no run, statement or line behind", async () => {
    const support = await makeInstrument(t.ds, { kind: "support" });
    const u = await makeUser(t.ds, { roles: ["member"] });
    // The last booking of the month, so every other line has been written when the gap shows.
    const b = await makeBooking(t.ds, { userId: u.id, accountId: lab.id, instrumentIds: [support.id], start: "2026-11-30T13:00:00Z", end: "2026-11-30T14:00:00Z" });
    const r = await manager.post("/api/billing/runs", { period: "2026-11" });
    expect(r.status).toBe(422);
    expect(r.body.code).toBe("missing_rates");
    for (const table of ["billing_runs", "statements", "charge_lines"]) {
      expect((await t.ds.query(`SELECT COUNT(*) AS n FROM ${table}`))[0].n, table).toBe(0);
    }
    await t.ds.query(`DELETE FROM booking_instruments WHERE bookingId = ?`, [b.id]);
    await t.ds.query(`DELETE FROM bookings WHERE id = ?`, [b.id]);
  });

  it("stores exactly the statements and lines the preview showed", async () => {
    const preview = await manager.get("/api/billing/preview?period=2026-11");
    expect(preview.status).toBe(200);
    const r = await manager.post("/api/billing/runs", { period: "2026-11" });
    expect(r.status, r.text).toBe(201);
    const run = r.body.run as BillingRunDto;
    const shown = preview.body.preview.statements as StatementDto[];
    expect(run.statements.map((s) => s.accountId)).toEqual(shown.map((s) => s.accountId));
    for (const s of run.statements) {
      const p = shown.find((x) => x.accountId === s.accountId)!;
      expect(s.total).toBe(p.total);
      expect(s.lines.map((l) => [l.kind, l.description, l.amount, l.at])).toEqual(p.lines.map((l) => [l.kind, l.description, l.amount, l.at]));
      expect(s.total).toBe(s.lines.reduce((sum, l) => sum + l.amount, 0));
    }
    expect(run.total).toBe(run.statements.reduce((sum, s) => sum + s.total, 0));
  });
});
