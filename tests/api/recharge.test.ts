/**
 * Recharge billing through the API: rates, a month's billing run worked out by hand (the
 * arithmetic is written beside each line), reconciliation of statements and the finance
 * journal, locking of a final month, voiding and re-running, accounts and who may charge them.
 *
 * Facility time zone America/Halifax: Atlantic Daylight Time (UTC−3) until 2026-11-01 02:00
 * local, Atlantic Standard Time (UTC−4) after (Canada follows the US rule: first Sunday of
 * November; Time Zone Database, IANA). The test clock stands at 2026-12-02, so November is over.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { makeAccount, makeBooking, makeContainer, makeInstrument, makeRate, makeUsage } from "../support/billing-factories";
import type { Account, Instrument, User } from "../../server/entities";
import type { BillingRunDto, StatementDto } from "@shared/schemas/recharge";
import { jobs, type JobDeps } from "../../server/jobs/scheduler";
import { ROUNDING_RULE } from "../../server/modules/recharge/statement-pdf";
import { lineReconciles } from "@shared/domain/charges";
import { readPdf } from "../support/pdf-text";
import Papa from "papaparse";

/** The facility's recovery account in this suite (RECOVERY_ACCOUNT), so the journal is seen to use the setting. */
const RECOVERY = "4700-CORE-RECOVERY";

/** A journal file's rows read back with papaparse. */
function journal(text: string): { header: string[]; rows: Record<string, string>[] } {
  const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true });
  return { header: parsed.meta.fields ?? [], rows: parsed.data };
}
const cents = (text: string) => (text === "" ? 0 : Math.round(Number(text) * 100));

let t: TestApp;
let manager: ApiClient;
let lead: ApiClient;
let member: ApiClient;
let leadUser: User;
let memberUser: User;
let otherUser: User;
let internal: Account;
let external: Account;
let ps: Instrument;
let cell: Instrument;

async function signedIn(u: User): Promise<ApiClient> {
  const c = new ApiClient(t.url);
  expect((await c.login(u.email, TEST_PASSWORD)).status).toBe(200);
  return c;
}

function statementOf(run: BillingRunDto, accountId: number): StatementDto {
  const s = run.statements.find((x) => x.accountId === accountId);
  if (!s) throw new Error(`no statement for account ${accountId}`);
  return s;
}

beforeAll(async () => {
  t = await startTestApp({ deps: { rateLimits: { login: { windowMs: 60_000, limit: 1000 } } }, env: { RECOVERY_ACCOUNT: RECOVERY } });
  const managerUser = await makeUser(t.ds, { roles: ["manager", "member"] });
  leadUser = await makeUser(t.ds, { roles: ["group_lead", "member"] });
  memberUser = await makeUser(t.ds, { roles: ["member"] });
  otherUser = await makeUser(t.ds, { roles: ["member"] });
  manager = await signedIn(managerUser);
  lead = await signedIn(leadUser);
  member = await signedIn(memberUser);

  internal = await makeAccount(t.ds, { code: "CHEM-0001", ownerId: leadUser.id, validFrom: "2026-01-01", validTo: "2027-12-31", members: [{ userId: memberUser.id }] });
  external = await makeAccount(t.ds, { code: "EXT-0001", kind: "external", customerClass: "commercial", billingEmail: "accounts@customer.example" });
  ps = await makeInstrument(t.ds, { kind: "potentiostat", name: "PS-1" });
  cell = await makeInstrument(t.ds, { kind: "interface_cell", name: "Cell A" });

  // Policy for the worked examples: 15-minute increment, 30-minute minimum, half of the booked
  // time for no-shows and late cancellations, consumables at cost + 10 %.
  const policy = await manager.request("PUT", "/api/billing/policy", {
    json: { roundingIncrementMinutes: 15, minimumMinutes: 30, noShowShare: 0.5, lateCancelShare: 0.5, cancellationWindowMinutes: 1440, consumableMarkupPercent: 10 },
  });
  expect(policy.status).toBe(200);
});

afterAll(async () => {
  await t.close();
});

describe("rates", () => {
  it("creates kind rates for each class and refuses an overlapping one with 422", async () => {
    const a = await manager.post("/api/rates", { instrumentKind: "potentiostat", customerClass: "internal", hourlyRateCents: 4000, effectiveFrom: "2026-01-01" });
    expect(a.status).toBe(201);
    expect(a.body.rate).toMatchObject({ instrumentKind: "potentiostat", hourlyRateCents: 4000, effectiveTo: null });
    expect((await manager.post("/api/rates", { instrumentKind: "potentiostat", customerClass: "commercial", hourlyRateCents: 12000, effectiveFrom: "2026-01-01" })).status).toBe(201);
    expect((await manager.post("/api/rates", { instrumentKind: "interface_cell", customerClass: "internal", hourlyRateCents: 1000, effectiveFrom: "2026-01-01" })).status).toBe(201);
    expect((await manager.post("/api/rates", { instrumentKind: "interface_cell", customerClass: "commercial", hourlyRateCents: 3000, effectiveFrom: "2026-01-01" })).status).toBe(201);

    const overlap = await manager.post("/api/rates", { instrumentKind: "potentiostat", customerClass: "internal", hourlyRateCents: 4500, effectiveFrom: "2026-06-01" });
    expect(overlap.status).toBe(422);
    expect(overlap.headers.get("content-type")).toContain("application/problem+json");
    // The same dates for another class are a different row of the schedule.
    const list = await member.get("/api/rates");
    expect(list.status).toBe(200);
    expect(list.body.total).toBe(4);
  });

  it("refuses a rate that ends before it starts, and one with neither instrument nor kind", async () => {
    expect((await manager.post("/api/rates", { instrumentKind: "support", customerClass: "internal", hourlyRateCents: 100, effectiveFrom: "2026-05-01", effectiveTo: "2026-04-01" })).status).toBe(422);
    expect((await manager.post("/api/rates", { customerClass: "internal", hourlyRateCents: 100, effectiveFrom: "2026-05-01" })).status).toBe(400);
  });
});

describe("a monthly billing run, worked by hand", () => {
  let run: BillingRunDto;
  let rateChange: Instrument;

  beforeAll(async () => {
    const u = memberUser.id;
    const a = internal.id;
    // 1. Rounding up: checked in 61 min → 75 min (next multiple of 15) × 4000/60 = 5000.
    await makeBooking(t.ds, { userId: u, accountId: a, instrumentIds: [ps.id], start: "2026-11-03T13:00:00Z", end: "2026-11-03T16:00:00Z", checkedInAt: "2026-11-03T14:00:00Z", checkedOutAt: "2026-11-03T15:01:00Z" });
    // 2. Minimum: checked in 10 min → 15 → below the 30-minute minimum → 30 × 4000/60 = 2000.
    await makeBooking(t.ds, { userId: u, accountId: a, instrumentIds: [ps.id], start: "2026-11-04T13:00:00Z", end: "2026-11-04T14:00:00Z", checkedInAt: "2026-11-04T13:00:00Z", checkedOutAt: "2026-11-04T13:10:00Z" });
    // 3. No-show: booked 120 min × 0.5 = 60 min × 4000/60 = 4000 (no minimum for a no-show).
    await makeBooking(t.ds, { userId: u, accountId: a, instrumentIds: [ps.id], start: "2026-11-05T13:00:00Z", end: "2026-11-05T15:00:00Z", status: "no_show" });
    // 4. Late cancellation: booked 90 min × 0.5 = 45 min × 4000/60 = 3000.
    await makeBooking(t.ds, { userId: u, accountId: a, instrumentIds: [ps.id], start: "2026-11-06T13:00:00Z", end: "2026-11-06T14:30:00Z", status: "cancelled", cancelledAt: "2026-11-06T10:00:00Z", lateCancel: true });
    // An early cancellation and a request never approved are not billed at all.
    await makeBooking(t.ds, { userId: u, accountId: a, instrumentIds: [ps.id], start: "2026-11-07T13:00:00Z", end: "2026-11-07T14:30:00Z", status: "cancelled", cancelledAt: "2026-11-01T10:00:00Z" });
    await makeBooking(t.ds, { userId: u, accountId: a, instrumentIds: [ps.id], start: "2026-11-08T13:00:00Z", end: "2026-11-08T14:30:00Z", status: "requested" });
    // 5. A rate change inside the month: this instrument's own internal rate is 6000/h until
    // 2026-11-15 (local) and 9000/h from then. Booked 2026-11-14 23:00 → 11-15 01:00 local
    // (03:00Z → 05:00Z): 60 min × 6000/60 = 6000, then 60 min × 9000/60 = 9000; 15000 in all.
    rateChange = await makeInstrument(t.ds, { kind: "potentiostat", name: "PS-2" });
    await makeRate(t.ds, { instrumentId: rateChange.id, customerClass: "internal", hourlyRateCents: 6000, effectiveFrom: "2026-01-01", effectiveTo: "2026-11-15" });
    await makeRate(t.ds, { instrumentId: rateChange.id, customerClass: "internal", hourlyRateCents: 9000, effectiveFrom: "2026-11-15" });
    await makeBooking(t.ds, { userId: u, accountId: a, instrumentIds: [rateChange.id], start: "2026-11-15T03:00:00Z", end: "2026-11-15T05:00:00Z" });
    // 6. Across the end of daylight saving: 00:30 ADT (UTC−3) → 03:30 AST (UTC−4) on 2026-11-01
    // reads as 3 hours on the wall clock but is 03:30Z → 07:30Z = 240 real minutes × 4000/60 = 16000.
    await makeBooking(t.ds, { userId: u, accountId: a, instrumentIds: [ps.id], start: "2026-11-01T00:30:00-03:00", end: "2026-11-01T03:30:00-04:00" });
    // 7. A consumable: cost 1234 cents + 10 % = 1357.4 → 1357 (half away from zero).
    const bottle = await makeContainer(t.ds);
    await makeUsage(t.ds, { containerId: bottle.id, userId: u, accountId: a, amount: 2.5, costCents: 1234, at: "2026-11-10T15:00:00Z" });
    // External commercial: a potentiostat and a cell together for 120 booked minutes:
    // 120 × 12000/60 = 24000 and 120 × 3000/60 = 6000; 30000 in all.
    await makeBooking(t.ds, { userId: otherUser.id, accountId: external.id, instrumentIds: [ps.id, cell.id], start: "2026-11-12T14:00:00Z", end: "2026-11-12T16:00:00Z" });
    // A booking in December belongs to December's run.
    await makeBooking(t.ds, { userId: u, accountId: a, instrumentIds: [ps.id], start: "2026-12-01T14:00:00Z", end: "2026-12-01T15:00:00Z" });
  });

  it("refuses a month that has not ended with 422", async () => {
    const r = await manager.post("/api/billing/runs", { period: "2026-12" });
    expect(r.status).toBe(422);
  });

  it("previews November without storing anything", async () => {
    const p = await manager.get("/api/billing/preview?period=2026-11");
    expect(p.status).toBe(200);
    expect(p.body.preview.total).toBe(46357 + 30000);
    expect((await manager.get("/api/billing/runs")).body.total).toBe(0);
  });

  it("finalises November: 201 with one statement per account whose total is the sum of its lines", async () => {
    const r = await manager.post("/api/billing/runs", { period: "2026-11" });
    expect(r.status, r.text).toBe(201);
    run = r.body.run;
    expect(run).toMatchObject({ period: "2026-11", status: "final" });
    const s = statementOf(run, internal.id);
    expect(s.currency).toBe("CAD");
    expect(s.lines.map((l) => l.amount)).toEqual([16000, 5000, 2000, 4000, 3000, 1357, 6000, 9000]);
    // 16000 + 5000 + 2000 + 4000 + 3000 + 1357 + 6000 + 9000 = 46357
    expect(s.total).toBe(46357);
    for (const st of run.statements) expect(st.total).toBe(st.lines.reduce((sum, l) => sum + l.amount, 0));
    const e = statementOf(run, external.id);
    expect(e.lines.map((l) => l.amount).sort((x, y) => x - y)).toEqual([6000, 24000]);
    expect(e.total).toBe(30000);
    // No payment service in this app: the invoice waits in the queue, the run is complete anyway.
    expect(e.invoiceStatus).toBe("queued");
  });

  it("leaves the statement PDFs to the mail-statements job, which mails each account owner one through the outbox", async () => {
    // The run itself renders no PDF: a large month would hold the manager's request for minutes.
    expect((await t.ds.query(`SELECT COUNT(*) AS n FROM outbound_mail`))[0].n).toBe(0);
    const job = jobs.find((j) => j.name === "mail-statements")!;
    const deps: JobDeps = { ds: t.ds, clock: t.clock, config: t.ctx.config, mailer: { async send() {}, close() {} } };
    expect(await job.run(deps)).toBeGreaterThanOrEqual(2);
    const rows: { to: string; subject: string; attachments: string }[] = await t.ds.query(`SELECT "to", subject, attachments FROM outbound_mail ORDER BY id`);
    const toLead = rows.find((m) => m.to === leadUser.email)!;
    expect(toLead.subject).toContain("2026-11");
    const att = JSON.parse(toLead.attachments) as { contentType: string; base64: string }[];
    expect(att[0].contentType).toBe("application/pdf");
    expect(Buffer.from(att[0].base64, "base64").subarray(0, 5).toString()).toBe("%PDF-");
    expect(rows.some((m) => m.to === "accounts@customer.example")).toBe(true);
  });

  it("gives every line its quantity, unit and the price of one unit, which multiply to its amount", async () => {
    const lines = run.statements.flatMap((st) => st.lines);
    for (const l of lines) expect(lineReconciles({ quantity: l.quantity, unit: l.unit, unitPriceCents: l.unitPriceCents, amountCents: l.amount }), l.description).toBe(true);
    const s = statementOf(run, internal.id);
    // Instrument time in hours at the hourly rate: 75 min = 1.25 h × 4000 = 5000; 240 min = 4 h × 4000 = 16000.
    expect(s.lines.filter((l) => l.kind === "instrument").map((l) => [l.quantity, l.unit, l.unitPriceCents, l.amount])).toEqual([
      ["4", "h", "4000", 16000],
      ["1.25", "h", "4000", 5000],
      ["0.5", "h", "4000", 2000],
      ["1", "h", "4000", 4000],
      ["0.75", "h", "4000", 3000],
      ["1", "h", "6000", 6000],
      ["1", "h", "9000", 9000],
    ]);
    // A usage logged with only its rounded cost (before usages kept it exactly): 1 each at 1234 × 1.1 = 1357.4 ¢ → 1357.
    expect(s.lines.find((l) => l.kind === "consumable")).toMatchObject({ quantity: "1", unit: "each", unitPriceCents: "1357.4", amount: 1357 });
  });

  it("writes a double-entry journal: the internal account debited, the recovery account credited, debits = credits = the internal total", async () => {
    const j = await manager.get(`/api/billing/runs/${run.id}/journal.csv`);
    expect(j.status).toBe(200);
    expect(j.headers.get("content-type")).toContain("text/csv");
    expect(j.headers.get("content-disposition")).toContain("journal-2026-11.csv");
    const { header, rows } = journal(j.text);
    expect(header).toEqual(["period", "account", "department", "debit", "credit", "currency", "description"]);
    // One internal statement (463.57) → its debit and the recovery account's credit; the external one is invoiced, not journalled.
    expect(rows.map((r) => [r.period, r.account, r.debit, r.credit, r.currency])).toEqual([
      ["2026-11", "CHEM-0001", "463.57", "", "CAD"],
      ["2026-11", RECOVERY, "", "463.57", "CAD"],
    ]);
    const internalTotal = run.statements.filter((s) => s.accountKind === "internal").reduce((a, s) => a + s.total, 0);
    expect(rows.reduce((a, r) => a + cents(r.debit), 0)).toBe(internalTotal);
    expect(rows.reduce((a, r) => a + cents(r.credit), 0)).toBe(internalTotal);
    expect(rows[0].description).toBe("Liquid Interfaces Core recharge 2026-11: Account 0 (8 lines)");
  });

  it("answers 409 for a second run of the same month", async () => {
    const again = await manager.post("/api/billing/runs", { period: "2026-11" });
    expect(again.status).toBe(409);
  });

  it("turns a change to a booking of the final month into a correction in the next month", async () => {
    // The no-show turns out to have been a completed session of 120 booked minutes:
    // 120 × 4000/60 = 8000 now, 4000 billed → a correction of +4000 in December.
    await t.ds.query(`UPDATE bookings SET status = 'completed', updatedAt = ? WHERE startsAt = ?`, ["2026-12-02T16:00:00.000Z", "2026-11-05T13:00:00.000Z"]);
    t.clock.set("2027-01-03T12:00:00Z");
    try {
      const p = await manager.get("/api/billing/preview?period=2026-12");
      expect(p.status).toBe(200);
      const s = (p.body.preview.statements as StatementDto[]).find((x) => x.accountId === internal.id)!;
      const correction = s.lines.find((l) => l.kind === "correction")!;
      expect(correction.amount).toBe(4000);
      // December: its own booking 60 min × 4000/60 = 4000, plus the correction 4000.
      expect(s.total).toBe(8000);
      // November's final statement is untouched.
      const nov = (await manager.get(`/api/billing/runs/${run.id}`)).body.run as BillingRunDto;
      expect(statementOf(nov, internal.id).total).toBe(46357);
    } finally {
      t.clock.set("2026-12-02T15:00:00.000Z");
      await t.ds.query(`UPDATE bookings SET status = 'no_show' WHERE startsAt = ?`, ["2026-11-05T13:00:00.000Z"]);
    }
  });

  it("voids the run, and the month may then be run again with the same totals", async () => {
    const v = await manager.post(`/api/billing/runs/${run.id}/void`, { reason: "Wrong policy loaded" });
    expect(v.status).toBe(200);
    expect(v.body.run.status).toBe("voided");
    expect(v.body.run.abilities).toMatchObject({ journal: true, reversal: true });
    const again = await manager.post("/api/billing/runs", { period: "2026-11" });
    expect(again.status).toBe(201);
    expect(statementOf(again.body.run, internal.id).total).toBe(46357);
    run = again.body.run;
  });

  it("shows the member their own charges and the group lead the spend on their account", async () => {
    const mine = await member.get("/api/billing/my-charges");
    expect(mine.status).toBe(200);
    expect(mine.body.sum).toBe(46357);
    const spend = await lead.get("/api/billing/spend");
    expect(spend.status).toBe(200);
    expect(spend.body.items).toEqual([expect.objectContaining({ period: "2026-11", accountId: internal.id, userId: memberUser.id, total: 46357 })]);
    const revenue = await manager.get("/api/billing/revenue?from=2026-11&to=2026-11");
    expect(revenue.body.byMonth).toEqual([{ period: "2026-11", internal: 46357, external: 30000, total: 76357 }]);
    const outstanding = await manager.get("/api/billing/outstanding");
    expect(outstanding.body.items.map((i: { accountId: number }) => i.accountId)).toEqual([external.id]);
  });

  it("lets the owner download the statement PDF and hides it from others with 404", async () => {
    const st = statementOf(run, internal.id);
    const pdf = await lead.get(`/api/billing/statements/${st.id}/statement.pdf`);
    expect(pdf.status).toBe(200);
    expect(pdf.headers.get("content-type")).toBe("application/pdf");
    expect((await member.get(`/api/billing/statements/${st.id}/statement.pdf`)).status).toBe(404);
  });

  it("prints the statement PDF as columns: date, description (whole), quantity, unit, unit price and amount, with subtotals, the total, the currency and the rounding rule", async () => {
    const st = statementOf(run, internal.id);
    const res = await fetch(`${t.url}/api/billing/statements/${st.id}/statement.pdf`, { headers: { cookie: lead.cookieHeader } });
    expect(res.status).toBe(200);
    const pdf = await readPdf(new Uint8Array(await res.arrayBuffer()));
    const flat = pdf.text.replace(/\s+/g, " ");
    expect(flat).toContain("Liquid Interfaces Core — statement for 2026-11");
    expect(flat).toContain(`Account: CHEM-0001 — ${internal.name}`);
    expect(flat).toContain("Currency: CAD. Dates in America/Halifax.");
    expect(flat).toContain("Settled by internal journal transfer.");
    expect(flat).toContain(`Amounts in CAD. ${ROUNDING_RULE}`);
    const rows = pdf.text.split("\n");
    const run6 = (cells: string[]) => rows.findIndex((_r, i) => cells.every((c, k) => rows[i + k] === c));
    expect(run6(["Date", "Description", "Quantity", "Unit", "Unit price (CAD)", "Amount (CAD)"])).toBeGreaterThan(0);
    // Wrapped, never cut off: every line's whole description (and the person) is on the page.
    const squeezed = pdf.text.replace(/\s+/g, "");
    for (const l of st.lines) expect(squeezed, l.description).toContain(l.description.replace(/\s+/g, ""));
    expect(flat).not.toContain("…");
    // The figures of each line as columns (quantity, unit, unit price, amount), worked above.
    expect(run6(["1.25", "h", "$40.00", "$50.00"])).toBeGreaterThan(0);
    expect(run6(["0.75", "h", "$40.00", "$30.00"])).toBeGreaterThan(0);
    // The consumable: 1 each at 1234 ¢ × 1.1 = 1357.4 ¢ = $13.574, amount $13.57.
    expect(run6(["1", "each", "$13.574", "$13.57"])).toBeGreaterThan(0);
    // Subtotals: PS-1 160 + 50 + 20 + 40 + 30 = $300.00; PS-2 60 + 90 = $150.00; consumables $13.57;
    // the total 300 + 150 + 13.57 = $463.57.
    expect(run6(["Subtotal, PS-1", "$300.00"])).toBeGreaterThan(0);
    expect(run6(["Subtotal, PS-2", "$150.00"])).toBeGreaterThan(0);
    expect(run6(["Subtotal, Consumables", "$13.57"])).toBeGreaterThan(0);
    expect(run6(["Total (sum of the subtotals)", "$463.57"])).toBeGreaterThan(0);
    // The first half of the rate-change session began at 23:00 on 14 November, Halifax time
    // (03:00Z on the 15th): the statement dates it by the facility's calendar.
    const first = rows.findIndex((r) => r.startsWith("PS-2, booking"));
    expect(rows[first - 1]).toBe("2026-11-14");
  });

  it("puts a manager's credit on the next open month's statement with its reason", async () => {
    const c = await manager.post(`/api/accounts/${internal.id}/adjustments`, { amountCents: -1500, reason: "Instrument fault on 3 Nov", period: "2026-11" });
    expect(c.status).toBe(201);
    // November is final, so the credit moves to December.
    expect(c.body.adjustment.period).toBe("2026-12");
  });
});

describe("monthly caps", () => {
  it("adds one credit line that brings a member's month down to the cap", async () => {
    const capped = await makeUser(t.ds);
    const acct = await makeAccount(t.ds, { ownerId: leadUser.id, members: [{ userId: capped.id, monthlyCapCents: 5000 }] });
    // 180 booked minutes × 4000/60 = 12000; cap 5000 → credit 5000 − 12000 = −7000.
    await makeBooking(t.ds, { userId: capped.id, accountId: acct.id, instrumentIds: [ps.id], start: "2026-10-06T13:00:00Z", end: "2026-10-06T16:00:00Z" });
    const p = await manager.get("/api/billing/preview?period=2026-10");
    const s = (p.body.preview.statements as StatementDto[]).find((x) => x.accountId === acct.id)!;
    expect(s.lines.map((l) => [l.kind, l.amount])).toEqual([["instrument", 12000], ["cap_credit", -7000]]);
    expect(s.total).toBe(5000);
  });
});

describe("accounts", () => {
  it("lists what each caller may charge, owns, or (manager) everything", async () => {
    const m = await member.get("/api/accounts");
    expect(m.status).toBe(200);
    expect(m.body.items.map((a: { id: number }) => a.id)).toEqual([internal.id]);
    const l = await lead.get("/api/accounts");
    expect(l.body.items.map((a: { code: string }) => a.code)).toContain("CHEM-0001");
    expect(l.body.items.every((a: { ownerId: number }) => a.ownerId === leadUser.id)).toBe(true);
    const all = await manager.get("/api/accounts");
    expect(all.body.total).toBeGreaterThanOrEqual(2);
  });

  it("lets the owning group lead add a member with a monthly cap, change it and remove them", async () => {
    const add = await lead.post(`/api/accounts/${internal.id}/members`, { email: otherUser.email, monthlyCapCents: 20000 });
    expect(add.status).toBe(201);
    expect(add.body.member).toMatchObject({ userId: otherUser.id, monthlyCapCents: 20000 });
    const other = await signedIn(otherUser);
    expect((await other.get("/api/accounts")).body.items.map((a: { id: number }) => a.id)).toContain(internal.id);
    expect((await lead.patch(`/api/accounts/${internal.id}/members/${otherUser.id}`, { monthlyCapCents: null })).status).toBe(200);
    expect((await lead.delete(`/api/accounts/${internal.id}/members/${otherUser.id}`)).status).toBe(204);
    expect((await other.get("/api/accounts")).body.items.map((a: { id: number }) => a.id)).not.toContain(internal.id);
  });

  it("refuses another lead's account with 404 and a closed account with 422", async () => {
    const otherLead = await makeUser(t.ds, { roles: ["group_lead"] });
    const theirs = await makeAccount(t.ds, { ownerId: otherLead.id });
    expect((await lead.get(`/api/accounts/${theirs.id}/members`)).status).toBe(404);
    const closed = await makeAccount(t.ds, { ownerId: leadUser.id, validFrom: "2024-01-01", validTo: "2025-12-31" });
    const r = await lead.post(`/api/accounts/${closed.id}/members`, { email: otherUser.email });
    expect(r.status).toBe(422);
  });
});

describe("the rate review", () => {
  it("computes the break-even rate per instrument (2 CFR 200.468) and applies it from a date", async () => {
    // Costs 12 000.00 (service contract) + 30 000.00 (staff) = 42 000.00; minus a subsidy of
    // 10 000.00 and a carried surplus of 2 000.00 = 30 000.00 to recover over 1 000 projected
    // hours → 30.00 per hour internal; × 1.5 external academic = 45.00; × 2 commercial = 60.00.
    const review = await manager.post("/api/rates/review", {
      factors: { external_academic: 1.5, commercial: 2 },
      instruments: [
        {
          instrumentId: cell.id,
          costLines: [
            { label: "Service contract", category: "service_contracts", amountCents: 1_200_000 },
            { label: "Technician effort", category: "salaries", amountCents: 3_000_000 },
          ],
          subsidyCents: 1_000_000,
          carriedBalanceCents: 200_000,
          projectedBillableHours: 1000,
        },
      ],
    });
    expect(review.status, review.text).toBe(200);
    expect(review.body.items[0]).toMatchObject({
      instrumentId: cell.id,
      totalCostCents: 4_200_000,
      recoverableCents: 3_000_000,
      breakEvenCents: 3000,
      proposed: { internal: 3000, external_academic: 4500, commercial: 6000 },
      current: { internal: 1000, commercial: 3000, external_academic: null },
    });

    const apply = await manager.post("/api/rates/apply", {
      effectiveFrom: "2027-01-01",
      rates: Object.entries(review.body.items[0].proposed).map(([customerClass, hourlyRateCents]) => ({ instrumentId: cell.id, customerClass, hourlyRateCents })),
    });
    expect(apply.status, apply.text).toBe(201);
    expect(apply.body.items.map((r: { effectiveFrom: string; hourlyRateCents: number }) => [r.effectiveFrom, r.hourlyRateCents])).toEqual([
      ["2027-01-01", 3000],
      ["2027-01-01", 4500],
      ["2027-01-01", 6000],
    ]);
    // Applying again from the same date would give the cell two rates at once.
    const twice = await manager.post("/api/rates/apply", { effectiveFrom: "2027-01-01", rates: [{ instrumentId: cell.id, customerClass: "internal", hourlyRateCents: 3100 }] });
    expect(twice.status).toBe(422);
  });
});
