/**
 * The Recharge views after a finalised month: revenue by month, instrument and department
 * (manager), spend per account and member (the owning group lead), a member's own charges and
 * payments outstanding. Every answer is parsed with its shared schema, and the numbers of each
 * view add up to the run's statements to the cent.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { makeAccount, makeBooking, makeInstrument, makeRate } from "../support/billing-factories";
import type { Account, User } from "../../server/entities";
import {
  accountPage,
  billingPreviewResponse,
  billingRunPage,
  billingRunResponse,
  myChargesDto,
  outstandingDto,
  ratePage,
  revenueReportDto,
  spendReportDto,
  statementPage,
  type BillingRunDto,
} from "@shared/schemas/recharge";

let t: TestApp;
let manager: ApiClient;
let lead: ApiClient;
let member: ApiClient;
let memberA: User;
let memberB: User;
let chem: Account;
let earth: Account;
let noDept: Account;
let ext: Account;
let run: BillingRunDto;

async function signedIn(u: User): Promise<ApiClient> {
  const c = new ApiClient(t.url);
  expect((await c.login(u.email, TEST_PASSWORD)).status).toBe(200);
  return c;
}

const sum = (xs: number[]) => xs.reduce((a, b) => a + b, 0);

beforeAll(async () => {
  t = await startTestApp({ deps: { rateLimits: { login: { windowMs: 60_000, limit: 1000 } } } });
  const m = await makeUser(t.ds, { roles: ["manager", "member"] });
  const leadUser = await makeUser(t.ds, { roles: ["group_lead", "member"] });
  const otherLead = await makeUser(t.ds, { roles: ["group_lead", "member"] });
  memberA = await makeUser(t.ds, { roles: ["member"] });
  memberB = await makeUser(t.ds, { roles: ["member"] });
  manager = await signedIn(m);
  lead = await signedIn(leadUser);
  member = await signedIn(memberA);

  const [{ id: chemistry }] = await t.ds.query(`INSERT INTO departments (code, name) VALUES ('CHEM', 'Chemistry') RETURNING id`);
  const [{ id: earthSci }] = await t.ds.query(`INSERT INTO departments (code, name) VALUES ('EES', 'Earth and Environmental Sciences') RETURNING id`);
  chem = await makeAccount(t.ds, { code: "VIEW-CHEM", ownerId: leadUser.id, departmentId: chemistry, members: [{ userId: memberA.id }, { userId: memberB.id }] });
  earth = await makeAccount(t.ds, { code: "VIEW-EES", ownerId: otherLead.id, departmentId: earthSci, members: [{ userId: memberB.id }] });
  noDept = await makeAccount(t.ds, { code: "VIEW-NODEPT", ownerId: otherLead.id });
  ext = await makeAccount(t.ds, { code: "VIEW-EXT", kind: "external", customerClass: "commercial", billingEmail: "ap@harbour.example" });
  const ps = await makeInstrument(t.ds, { kind: "potentiostat", name: "PS-View" });
  await makeRate(t.ds, { instrumentKind: "potentiostat", customerClass: "internal", hourlyRateCents: 6000, effectiveFrom: "2026-01-01" });
  await makeRate(t.ds, { instrumentKind: "potentiostat", customerClass: "commercial", hourlyRateCents: 12000, effectiveFrom: "2026-01-01" });
  const book = (userId: number, accountId: number, day: string, minutes: number) =>
    makeBooking(t.ds, {
      userId,
      accountId,
      instrumentIds: [ps.id],
      start: `2026-11-${day}T14:00:00Z`,
      end: new Date(Date.parse(`2026-11-${day}T14:00:00Z`) + minutes * 60_000).toISOString(),
    });
  // Booked time at 6000/h internal, 12000/h commercial (no check-in, so the booked minutes bill):
  await book(memberA.id, chem.id, "10", 60); //  60 × 6000/60 =  6000
  await book(memberB.id, chem.id, "11", 30); //  30 × 6000/60 =  3000
  await book(memberB.id, earth.id, "12", 90); //  90 × 6000/60 =  9000
  await book(memberB.id, noDept.id, "13", 60); // 60 × 6000/60 =  6000
  await book(memberB.id, ext.id, "16", 60); //   60 × 12000/60 = 12000
  const credit = await manager.post(`/api/accounts/${chem.id}/adjustments`, { amountCents: -500, reason: "Cell cracked during the run", period: "2026-11" });
  expect(credit.status, credit.text).toBe(201);
  // Statements: CHEM 6000 + 3000 − 500 = 8500; EES 9000; no department 6000; external 12000.
  // The month: 8500 + 9000 + 6000 + 12000 = 35500, of which internal 23500.

  const preview = await manager.get("/api/billing/preview?period=2026-11");
  expect(billingPreviewResponse.parse(preview.body).preview.total).toBe(35500);
  const r = await manager.post("/api/billing/runs", { period: "2026-11" });
  expect(r.status, r.text).toBe(201);
  run = billingRunResponse.parse(r.body).run;
});

afterAll(async () => {
  await t.close();
});

describe("answers of the Recharge routes", () => {
  it("match the shared schemas the client parses them with", async () => {
    expect(billingRunPage.parse((await manager.get("/api/billing/runs")).body).total).toBe(1);
    expect(billingRunResponse.parse((await manager.get(`/api/billing/runs/${run.id}`)).body).run.id).toBe(run.id);
    expect(statementPage.parse((await manager.get("/api/billing/statements")).body).total).toBe(4);
    expect(statementPage.parse((await lead.get("/api/billing/statements")).body).items.map((s) => s.accountCode)).toEqual(["VIEW-CHEM"]);
    expect(accountPage.parse((await manager.get("/api/accounts?limit=500")).body).total).toBeGreaterThanOrEqual(4);
    expect(ratePage.parse((await member.get("/api/rates")).body).total).toBe(2);
  });
});

describe("GET /api/billing/revenue", () => {
  it("gives the finalised month's total equal to the run's statements' total, split by kind, instrument and department", async () => {
    const rev = revenueReportDto.parse((await manager.get("/api/billing/revenue")).body);
    const statementsTotal = sum(run.statements.map((s) => s.total));
    expect(statementsTotal).toBe(35500);
    const nov = rev.byMonth.find((m) => m.period === "2026-11")!;
    expect(nov).toEqual({ period: "2026-11", internal: 23500, external: 12000, total: statementsTotal });
    expect(sum(rev.byInstrument.map((i) => i.total))).toBe(statementsTotal);
    // PS-View: 6000 + 3000 + 9000 + 6000 + 12000 = 36000 over 60 + 30 + 90 + 60 + 60 = 300 min = 5 h;
    // the −500 credit belongs to no instrument.
    expect(rev.byInstrument).toContainEqual({ instrumentId: expect.any(Number), name: "PS-View", total: 36000, hours: 5 });
    expect(rev.byInstrument).toContainEqual({ instrumentId: null, name: "Consumables, adjustments and credits", total: -500, hours: 0 });
    const byName = Object.fromEntries(rev.byDepartment.map((d) => [d.name, d.total]));
    expect(byName).toEqual({ Chemistry: 8500, "Earth and Environmental Sciences": 9000, "Internal, no department": 6000, "External customers": 12000 });
  });

  it("leaves a voided run out", async () => {
    const again = await manager.post("/api/billing/runs/" + run.id + "/void", { reason: "checking the revenue view" });
    expect(again.status).toBe(200);
    const rev = revenueReportDto.parse((await manager.get("/api/billing/revenue")).body);
    expect(rev.byMonth.find((m) => m.period === "2026-11")).toBeUndefined();
    const redo = await manager.post("/api/billing/runs", { period: "2026-11" });
    expect(redo.status).toBe(201);
    run = billingRunResponse.parse(redo.body).run;
    expect(revenueReportDto.parse((await manager.get("/api/billing/revenue")).body).byMonth[0].total).toBe(35500);
  });

  it("is the manager's alone: 403 for a group lead and a member", async () => {
    expect((await lead.get("/api/billing/revenue")).status).toBe(403);
    expect((await member.get("/api/billing/revenue")).status).toBe(403);
  });
});

describe("GET /api/billing/spend", () => {
  it("shows a group lead only their own accounts, per member, adding up to the statement", async () => {
    const spend = spendReportDto.parse((await lead.get("/api/billing/spend")).body);
    expect(new Set(spend.items.map((i) => i.accountCode))).toEqual(new Set(["VIEW-CHEM"]));
    const perMember = Object.fromEntries(spend.items.map((i) => [i.userId ?? "account", i.total]));
    expect(perMember).toEqual({ [memberA.id]: 6000, [memberB.id]: 3000, account: -500 });
    expect(sum(spend.items.map((i) => i.total))).toBe(run.statements.find((s) => s.accountId === chem.id)!.total);
  });

  it("shows the manager every account, adding up to the run's total, and refuses a member with 403", async () => {
    const spend = spendReportDto.parse((await manager.get("/api/billing/spend")).body);
    expect(sum(spend.items.map((i) => i.total))).toBe(run.total);
    expect((await member.get("/api/billing/spend")).status).toBe(403);
  });
});

describe("GET /api/billing/my-charges", () => {
  it("lists only the caller's own lines, with their sum", async () => {
    const mine = myChargesDto.parse((await member.get("/api/billing/my-charges")).body);
    expect(mine.items).toHaveLength(1);
    expect(mine.items[0]).toMatchObject({ accountCode: "VIEW-CHEM", kind: "instrument", amount: 6000, period: "2026-11" });
    expect(mine.sum).toBe(6000);
  });
});

describe("GET /api/billing/outstanding", () => {
  it("lists the external statement still to be paid, and nothing internal", async () => {
    const out = outstandingDto.parse((await manager.get("/api/billing/outstanding")).body);
    expect(out.items.map((o) => [o.accountCode, o.total, o.invoiceStatus])).toEqual([["VIEW-EXT", 12000, "queued"]]);
    expect(out.sum).toBe(12000);
    expect((await lead.get("/api/billing/outstanding")).status).toBe(403);
  });
});
