/**
 * The finance journal of a billing run, double entry (every debit has an equal credit, so debits
 * = credits; common practice): per internal statement its account debited and the facility's
 * recovery account (RECOVERY_ACCOUNT) credited, a credit statement with the sides swapped; stored
 * with the run; a voided run's journal marked VOID, and its reversal with the sides swapped.
 * Amounts worked by hand beside each check.
 */
import Papa from "papaparse";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BillingRunDto } from "@shared/schemas/recharge";
import { Department } from "../../server/entities";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { makeAccount, makeBooking, makeInstrument, makeRate } from "../support/billing-factories";

const RECOVERY = "4700-CORE-RECOVERY";
const COLUMNS = ["period", "account", "department", "debit", "credit", "currency", "description"];

let t: TestApp;
let manager: ApiClient;
let run: BillingRunDto;

function journal(text: string): { first: string; header: string[]; rows: Record<string, string>[] } {
  const lines = text.split("\r\n");
  const start = /^"?VOID/.test(lines[0]) ? 1 : 0;
  const parsed = Papa.parse<Record<string, string>>(lines.slice(start).join("\r\n"), { header: true, skipEmptyLines: true });
  return { first: lines[0], header: parsed.meta.fields ?? [], rows: parsed.data };
}
const sides = (rows: Record<string, string>[]) => rows.map((r) => [r.account, r.department, r.debit, r.credit]);
const cents = (text: string) => (text === "" ? 0 : Math.round(Number(text) * 100));

beforeAll(async () => {
  t = await startTestApp({ env: { RECOVERY_ACCOUNT: RECOVERY } });
  const m = await makeUser(t.ds, { roles: ["manager"] });
  const u = await makeUser(t.ds, { roles: ["member"] });
  manager = new ApiClient(t.url);
  expect((await manager.login(m.email, TEST_PASSWORD)).status).toBe(200);
  const chem = await t.ds.getRepository(Department).save({ code: "CHEM", name: "Chemistry" });
  const a = await makeAccount(t.ds, { code: "CHEM-1001", name: "Grant A", departmentId: chem.id, members: [{ userId: u.id }] });
  const b = await makeAccount(t.ds, { code: "CHEM-2002", name: "Grant B", departmentId: chem.id });
  const ext = await makeAccount(t.ds, { code: "EXT-9001", kind: "external", customerClass: "commercial" });
  const ps = await makeInstrument(t.ds, { kind: "potentiostat" });
  await makeRate(t.ds, { instrumentKind: "potentiostat", customerClass: "internal", hourlyRateCents: 4000, effectiveFrom: "2026-01-01" });
  await makeRate(t.ds, { instrumentKind: "potentiostat", customerClass: "commercial", hourlyRateCents: 12000, effectiveFrom: "2026-01-01" });
  // Grant A: 90 booked minutes = 1.5 h × 4000 = 6000. The customer: 60 min × 12000 = 12000 (invoiced, not journalled).
  await makeBooking(t.ds, { userId: u.id, accountId: a.id, instrumentIds: [ps.id], start: "2026-11-10T14:00:00Z", end: "2026-11-10T15:30:00Z" });
  await makeBooking(t.ds, { userId: u.id, accountId: ext.id, instrumentIds: [ps.id], start: "2026-11-11T14:00:00Z", end: "2026-11-11T15:00:00Z" });
  // Grant B: only a credit of 25.00, so its statement's total is −2500.
  expect((await manager.post(`/api/accounts/${b.id}/adjustments`, { amountCents: -2500, reason: "Refund for a failed run", period: "2026-11" })).status).toBe(201);
  const r = await manager.post("/api/billing/runs", { period: "2026-11" });
  expect(r.status, r.text).toBe(201);
  run = r.body.run;
});

afterAll(async () => {
  await t.close();
});

describe("the journal of a finalised run", () => {
  it("debits each internal account and credits the recovery account, swapping the sides for a credit, and balances", async () => {
    const r = await manager.get(`/api/billing/runs/${run.id}/journal.csv`);
    expect(r.status).toBe(200);
    expect(r.headers.get("content-disposition")).toContain("journal-2026-11.csv");
    const { header, rows } = journal(r.text);
    expect(header).toEqual(COLUMNS);
    expect(sides(rows)).toEqual([
      ["CHEM-1001", "CHEM", "60.00", ""],
      [RECOVERY, "", "", "60.00"],
      ["CHEM-2002", "CHEM", "", "25.00"],
      [RECOVERY, "", "25.00", ""],
    ]);
    // Debits 60.00 + 25.00 = 85.00 = credits 60.00 + 25.00; the accounts' net, 60.00 − 25.00 = 35.00, is the internal statements' total.
    expect(rows.reduce((a, x) => a + cents(x.debit), 0)).toBe(8500);
    expect(rows.reduce((a, x) => a + cents(x.credit), 0)).toBe(8500);
    const internalTotal = run.statements.filter((s) => s.accountKind === "internal").reduce((a, s) => a + s.total, 0);
    expect(internalTotal).toBe(3500);
    const net = rows.filter((x) => x.account !== RECOVERY).reduce((a, x) => a + cents(x.debit) - cents(x.credit), 0);
    expect(net).toBe(internalTotal);
    expect(rows.every((x) => x.period === "2026-11" && x.currency === "CAD")).toBe(true);
  });

  it("keeps the journal as it was written when an account's code changes afterwards", async () => {
    await t.ds.query(`UPDATE accounts SET code = 'CHEM-1001-RENAMED' WHERE code = 'CHEM-1001'`);
    try {
      const { rows } = journal((await manager.get(`/api/billing/runs/${run.id}/journal.csv`)).text);
      expect(rows[0].account).toBe("CHEM-1001");
    } finally {
      await t.ds.query(`UPDATE accounts SET code = 'CHEM-1001' WHERE code = 'CHEM-1001-RENAMED'`);
    }
  });

  it("builds the journal of a run finalised before journals were stored from its statements, balanced the same way", async () => {
    const stored = await t.ds.query(`SELECT * FROM journal_lines WHERE runId = ?`, [run.id]);
    await t.ds.query(`UPDATE billing_runs SET recoveryAccount = NULL WHERE id = ?`, [run.id]);
    await t.ds.query(`DELETE FROM journal_lines WHERE runId = ?`, [run.id]);
    try {
      const { rows } = journal((await manager.get(`/api/billing/runs/${run.id}/journal.csv`)).text);
      expect(sides(rows)).toEqual([
        ["CHEM-1001", "CHEM", "60.00", ""],
        [RECOVERY, "", "", "60.00"],
        ["CHEM-2002", "CHEM", "", "25.00"],
        [RECOVERY, "", "25.00", ""],
      ]);
    } finally {
      for (const l of stored) await t.ds.query(`INSERT INTO journal_lines (${Object.keys(l).join(", ")}) VALUES (${Object.keys(l).map(() => "?").join(", ")})`, Object.values(l));
      await t.ds.query(`UPDATE billing_runs SET recoveryAccount = ? WHERE id = ?`, [RECOVERY, run.id]);
    }
  });

  it("has no reversal while the run stands: 409 run_not_void", async () => {
    const r = await manager.get(`/api/billing/runs/${run.id}/reversal.csv`);
    expect(r.status).toBe(409);
    expect(r.body.code).toBe("run_not_void");
    expect(run.abilities).toEqual({ void: true, journal: true, reversal: false });
  });
});

describe("a voided run's journal and its reversal", () => {
  beforeAll(async () => {
    t.clock.set("2026-12-03T15:00:00.000Z");
    const v = await manager.post(`/api/billing/runs/${run.id}/void`, { reason: "Wrong rates loaded" });
    expect(v.status, v.text).toBe(200);
    expect(v.body.run.abilities).toEqual({ void: false, journal: true, reversal: true });
  });

  it("marks the journal VOID in its file name, on a first line before the header and on every row", async () => {
    const r = await manager.get(`/api/billing/runs/${run.id}/journal.csv`);
    expect(r.status).toBe(200);
    expect(r.headers.get("content-disposition")).toContain("journal-2026-11-VOID.csv");
    const { first, header, rows } = journal(r.text);
    expect(first).toMatch(/^"?VOID: billing run #\d+ for 2026-11 was voided on 2026-12-03 \(Wrong rates loaded\)\. Do not post these lines/);
    expect(first).toContain("journal-2026-11-reversal.csv");
    expect(header).toEqual(COLUMNS);
    expect(rows).toHaveLength(4);
    for (const x of rows) expect(x.description).toMatch(/\[VOID RUN\]$/);
  });

  it("writes the reversal: the same lines with debit and credit swapped, balancing too", async () => {
    const r = await manager.get(`/api/billing/runs/${run.id}/reversal.csv`);
    expect(r.status).toBe(200);
    expect(r.headers.get("content-disposition")).toContain("journal-2026-11-reversal.csv");
    const { first, header, rows } = journal(r.text);
    expect(first.startsWith("period,")).toBe(true);
    expect(header).toEqual(COLUMNS);
    expect(sides(rows)).toEqual([
      ["CHEM-1001", "CHEM", "", "60.00"],
      [RECOVERY, "", "60.00", ""],
      ["CHEM-2002", "CHEM", "25.00", ""],
      [RECOVERY, "", "", "25.00"],
    ]);
    expect(rows[0].description).toMatch(/^Reversal of billing run #\d+ \(voided 2026-12-03\): /);
    expect(rows.reduce((a, x) => a + cents(x.debit), 0)).toBe(rows.reduce((a, x) => a + cents(x.credit), 0));
  });

  it("journals the month again when it is run again", async () => {
    const again = await manager.post("/api/billing/runs", { period: "2026-11" });
    expect(again.status).toBe(201);
    const { rows } = journal((await manager.get(`/api/billing/runs/${again.body.run.id}/journal.csv`)).text);
    expect(sides(rows)).toEqual([
      ["CHEM-1001", "CHEM", "60.00", ""],
      [RECOVERY, "", "", "60.00"],
      ["CHEM-2002", "CHEM", "", "25.00"],
      [RECOVERY, "", "25.00", ""],
    ]);
  });
});
