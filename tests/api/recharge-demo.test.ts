/**
 * The demo facility's recharge data: a rate for every instrument kind × class, the billing
 * settings, and a billed month (the month before last) with statements that reconcile line by
 * line, a balanced journal (double entry: debits = credits = the internal statements' total;
 * common practice), one external invoice paid and one open on the fake payment service. The
 * month the seed billed is held to what the billing run itself computes for it, line by line;
 * and last month still bills afterwards, without corrections of the billed month.
 */
import fs from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import Papa from "papaparse";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DateTime } from "luxon";
import { lineReconciles } from "@shared/domain/charges";
import type { BillingRunDto, BillingRunSummaryDto, ChargeLineDto, StatementDto } from "@shared/schemas/recharge";
import { seedDemo } from "../../server/db/seed/demo";
import { DEMO_BILLING_POLICY } from "../../server/db/seed/demo-rates";
import { startFakePayments, type FakePayments } from "../../fakes/payments/server";
import { createPaymentsClient } from "../../server/integrations/payments";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";

const RECOVERY = "4510-LIC-RECOVERY";

let dir: string;
let fake: FakePayments;
let t: TestApp;
let manager: ApiClient;
let billed: BillingRunDto;

const monthsAgo = (n: number) => DateTime.fromJSDate(t.clock.now(), { zone: "America/Halifax" }).minus({ months: n }).toFormat("yyyy-MM");
const cents = (text: string) => (text === "" ? 0 : Math.round(Number(text) * 100));

/** The journal's rows read back with papaparse, after any VOID line. */
function journalRows(text: string): Record<string, string>[] {
  return Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true }).data;
}

/** A line's figures without its id, description or date: what pricing decides. */
const figures = (l: ChargeLineDto) => [l.kind, l.bookingId, l.instrumentId, l.usageId, l.userId, l.quantity, l.unit, l.unitPriceCents, l.amount].join("|");

beforeAll(async () => {
  dir = await fs.mkdtemp(path.join(os.tmpdir(), "phasebook-recharge-demo-"));
  fake = await startFakePayments({ port: 0, dataPath: path.join(dir, "payments.json"), webhookSecret: "whsec_demo_suite" });
  const payments = createPaymentsClient({ secretKey: "sk_test_phasebook_demo", apiBase: fake.url, webhookSecret: "whsec_demo_suite" });
  t = await startTestApp({ deps: { payments, rateLimits: { login: { windowMs: 60_000, limit: 1000 } } } });
  // The app's cost, as the seed and the app share one in production.
  await seedDemo(t.ds, { now: t.clock.now(), bcryptCost: t.ctx.bcryptCost });
  manager = new ApiClient(t.url);
  expect((await manager.login("manager@kestrelbay.example", "phasebook-demo")).status).toBe(200);
});

afterAll(async () => {
  await t.close();
  await fake.close();
  await fs.rm(dir, { recursive: true, force: true });
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
});

describe("the demo's billed month", () => {
  it("is the month before last, final, with statements whose totals are the sums of lines that each reconcile", async () => {
    const runs = (await manager.get("/api/billing/runs")).body.items as BillingRunSummaryDto[];
    expect(runs.map((r) => [r.period, r.status])).toEqual([[monthsAgo(2), "final"]]);
    expect(runs[0].abilities).toEqual({ void: false, journal: true, reversal: false });
    billed = (await manager.get(`/api/billing/runs/${runs[0].id}`)).body.run;
    expect(billed.statements.length).toBeGreaterThanOrEqual(4);
    for (const s of billed.statements) {
      expect(s.total, s.accountCode).toBe(s.lines.reduce((a, l) => a + l.amount, 0));
      for (const l of s.lines) {
        expect(["h", "mL", "g", "each"], l.description).toContain(l.unit);
        expect(lineReconciles({ quantity: l.quantity, unit: l.unit, unitPriceCents: l.unitPriceCents, amountCents: l.amount }), l.description).toBe(true);
      }
    }
    expect(billed.total).toBe(billed.statements.reduce((a, s) => a + s.total, 0));
    const kinds = new Set(billed.statements.flatMap((s) => s.lines.map((l) => l.kind)));
    expect([...kinds]).toEqual(expect.arrayContaining(["instrument", "consumable"]));
  });

  it("holds exactly the lines the billing run itself computes for that month", async () => {
    const p = await manager.get(`/api/billing/preview?period=${monthsAgo(2)}`);
    expect(p.status, p.text).toBe(200);
    const preview = p.body.preview.statements as StatementDto[];
    expect(preview.map((s) => [s.accountCode, s.total])).toEqual(billed.statements.map((s) => [s.accountCode, s.total]));
    for (const s of billed.statements) {
      const computed = preview.find((x) => x.accountId === s.accountId)!;
      expect(s.lines.map(figures).sort(), s.accountCode).toEqual(computed.lines.map(figures).sort());
    }
  });

  it("has a journal that balances: each internal account debited, the recovery account credited, both the internal statements' total", async () => {
    const r = await manager.get(`/api/billing/runs/${billed.id}/journal.csv`);
    expect(r.status).toBe(200);
    expect(r.headers.get("content-disposition")).toContain(`journal-${monthsAgo(2)}.csv`);
    const rows = journalRows(r.text);
    const internal = billed.statements.filter((s) => s.accountKind === "internal" && s.total !== 0);
    const internalTotal = internal.reduce((a, s) => a + s.total, 0);
    const debits = rows.reduce((a, row) => a + cents(row.debit), 0);
    const credits = rows.reduce((a, row) => a + cents(row.credit), 0);
    expect(debits).toBe(credits);
    expect(debits).toBe(internalTotal);
    expect(rows.filter((row) => row.account === RECOVERY).map((row) => cents(row.credit)).sort()).toEqual(internal.map((s) => s.total).sort());
    expect(rows.filter((row) => row.account !== RECOVERY).map((row) => row.account).sort()).toEqual(internal.map((s) => s.accountCode).sort());
  });

  it("has one external invoice paid and one that the payment service opens, with a page to pay it", async () => {
    const external = billed.statements.filter((s) => s.accountKind === "external");
    const paid = external.find((s) => s.accountCode === "EXT-0002-NCU")!;
    expect(paid).toMatchObject({ invoiceStatus: "paid", invoiceNumber: expect.stringMatching(/^[A-Z0-9]{8}-\d{4}$/) });
    expect(paid.paidAt).not.toBeNull();
    const tidewater = external.find((s) => s.accountCode === "EXT-0001-TMR")!;
    expect(tidewater.invoiceStatus).toBe("queued");
    // The send-invoices job's work, done now: the queued invoice goes to the payment service.
    const retry = await manager.post("/api/billing/invoices/retry");
    expect(retry.body).toEqual({ done: 1, failed: 0 });
    const after = (await manager.get(`/api/billing/runs/${billed.id}`)).body.run as BillingRunDto;
    const open = after.statements.find((s) => s.accountCode === "EXT-0001-TMR")!;
    expect(open.invoiceStatus).toBe("open");
    expect(open.invoiceUrl).toMatch(new RegExp(`^${fake.url}/invoices/in_`));
    expect(after.statements.find((s) => s.accountCode === "EXT-0002-NCU")!.invoiceStatus).toBe("paid");
  });

  it("leaves last month to bill: it bills without correcting the billed month, and its journal balances too", async () => {
    const r = await manager.post("/api/billing/runs", { period: monthsAgo(1) });
    expect(r.status, r.text).toBe(201);
    const run = r.body.run as BillingRunDto;
    expect(run.statements.flatMap((s) => s.lines).filter((l) => l.kind === "correction")).toEqual([]);
    for (const l of run.statements.flatMap((s) => s.lines)) {
      expect(lineReconciles({ quantity: l.quantity, unit: l.unit, unitPriceCents: l.unitPriceCents, amountCents: l.amount }), l.description).toBe(true);
    }
    const rows = journalRows((await manager.get(`/api/billing/runs/${run.id}/journal.csv`)).text);
    const internalTotal = run.statements.filter((s) => s.accountKind === "internal").reduce((a, s) => a + s.total, 0);
    expect(rows.reduce((a, row) => a + cents(row.debit), 0)).toBe(internalTotal);
    expect(rows.reduce((a, row) => a + cents(row.credit), 0)).toBe(internalTotal);
    expect(run.statements.find((s) => s.accountCode === "EXT-0001-TMR")?.total).toBeGreaterThan(0);
  });
});
