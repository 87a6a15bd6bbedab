/**
 * Recharge's record policies through the API: accounts (who sees one, who decides who charges
 * it, the organisation rule for new members and the manager's stated exceptions), statements
 * (who lists and downloads them, who may pay) and billing runs (void once, not after a payment;
 * a month billed once unless voided). Each record carries the abilities its policy gives the
 * caller, and every refusal leaves nothing written.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { accountPage, accountResponse, billingRunResponse, statementPage, type StatementListItemDto } from "@shared/schemas/recharge";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { makeAccount, makeBooking, makeInstrument, makeRate } from "../support/billing-factories";
import type { Account, User } from "../../server/entities";

const TIDEWATER = "Tidewater Marine Research";
const WHY = "Joint electrolyte study with the host lab, agreed with the PI";

let t: TestApp;
let manager: ApiClient;
let lead: ApiClient;
let member: ApiClient;
let customer: ApiClient;
let leadAsMember: ApiClient;
let safety: ApiClient;
let leadUser: User;
let memberUser: User;
let customerUser: User;
let hostNewcomer: User;
let customerNewcomer: User;
let internal: Account;
let external: Account;

async function signedIn(u: User): Promise<ApiClient> {
  const c = new ApiClient(t.url);
  expect((await c.login(u.email, TEST_PASSWORD)).status).toBe(200);
  return c;
}

async function personOf(organisation: string | null, roles: ("member" | "group_lead" | "manager" | "safety_officer")[] = ["member"]): Promise<User> {
  const u = await makeUser(t.ds, { roles });
  if (organisation) await t.ds.query(`UPDATE users SET organisation = ? WHERE id = ?`, [organisation, u.id]);
  return u;
}

const membersOf = async (accountId: number): Promise<{ userId: number; exceptionReason: string | null }[]> =>
  t.ds.query(`SELECT userId, exceptionReason FROM account_members WHERE accountId = ? ORDER BY userId`, [accountId]);
const auditCount = async (): Promise<number> => Number((await t.ds.query(`SELECT COUNT(*) AS n FROM audit_log`))[0].n);

beforeAll(async () => {
  t = await startTestApp({ deps: { rateLimits: { login: { windowMs: 60_000, limit: 1000 } } } });
  leadUser = await personOf(null, ["group_lead", "member"]);
  memberUser = await personOf(null);
  customerUser = await personOf(TIDEWATER);
  const leadAsMemberUser = await personOf(null, ["group_lead", "member"]);
  hostNewcomer = await personOf(null);
  customerNewcomer = await personOf(TIDEWATER);
  manager = await signedIn(await personOf(null, ["manager", "member"]));
  lead = await signedIn(leadUser);
  member = await signedIn(memberUser);
  customer = await signedIn(customerUser);
  leadAsMember = await signedIn(leadAsMemberUser);
  safety = await signedIn(await personOf(null, ["safety_officer"]));

  internal = await makeAccount(t.ds, { code: "POL-CHEM", ownerId: leadUser.id, members: [{ userId: memberUser.id }, { userId: leadAsMemberUser.id }] });
  external = await makeAccount(t.ds, {
    code: "POL-EXT-TMR",
    kind: "external",
    customerClass: "commercial",
    organisation: TIDEWATER,
    billingEmail: "ap@tidewater.example",
    members: [{ userId: customerUser.id }],
  });
});

afterAll(async () => {
  await t.close();
});

describe("accounts and their abilities", () => {
  it("sends each account with what the caller may do with it, instead of canManageMembers", async () => {
    const asLead = accountResponse.parse((await lead.get(`/api/accounts/${internal.id}`)).body).account;
    expect(asLead.abilities).toMatchObject({ view: true, manageMembers: true, addMember: true, makeException: false, edit: false, adjust: false, charge: true });
    expect(asLead).not.toHaveProperty("canManageMembers");
    const asMember = accountResponse.parse((await member.get(`/api/accounts/${internal.id}`)).body).account;
    expect(asMember.abilities).toMatchObject({ manageMembers: false, addMember: false, charge: true });
    const asManager = accountResponse.parse((await manager.get(`/api/accounts/${internal.id}`)).body).account;
    expect(Object.values(asManager.abilities).every(Boolean)).toBe(true);
  });

  it("answers 404 for an account the caller neither owns nor may charge", async () => {
    for (const c of [customer, safety]) expect((await c.get(`/api/accounts/${internal.id}`)).status).toBe(404);
    expect((await member.get(`/api/accounts/${external.id}`)).status).toBe(404);
  });

  it("refuses a group lead who only charges the account the member list with 403, saying why", async () => {
    const r = await leadAsMember.get(`/api/accounts/${internal.id}/members`);
    expect(r.status).toBe(403);
    expect(r.body.code).toBe("not_account_owner");
    expect(r.body.detail).toContain("POL-CHEM");
  });
});

describe("POST /api/accounts/:id/members: the organisation rule", () => {
  it("lets the group lead add a host-institution person", async () => {
    const r = await lead.post(`/api/accounts/${internal.id}/members`, { email: hostNewcomer.email });
    expect(r.status, r.text).toBe(201);
    expect(r.body.member).toEqual({ userId: hostNewcomer.id, name: hostNewcomer.name, email: hostNewcomer.email, monthlyCapCents: null, exceptionReason: null });
  });

  it("answers 422 external_person_internal_account when the group lead adds an external customer's person, and writes nothing", async () => {
    const before = { members: await membersOf(internal.id), audit: await auditCount() };
    const r = await lead.post(`/api/accounts/${internal.id}/members`, { email: customerNewcomer.email });
    expect(r.status).toBe(422);
    expect(r.body.code).toBe("external_person_internal_account");
    expect(r.headers.get("content-type")).toContain("application/problem+json");
    expect({ members: await membersOf(internal.id), audit: await auditCount() }).toEqual(before);
  });

  it("answers 403 exception_manager_only when a group lead sends an exception, and writes nothing", async () => {
    const before = await membersOf(internal.id);
    const r = await lead.post(`/api/accounts/${internal.id}/members`, { email: customerNewcomer.email, exceptionReason: WHY });
    expect(r.status).toBe(403);
    expect(r.body.code).toBe("exception_manager_only");
    expect(await membersOf(internal.id)).toEqual(before);
  });

  it("answers the manager 422 too until the exception is stated", async () => {
    const r = await manager.post(`/api/accounts/${internal.id}/members`, { email: customerNewcomer.email });
    expect(r.status).toBe(422);
    expect(r.body.code).toBe("external_person_internal_account");
  });

  it("refuses an exception of fewer than a few words with 400 naming the field", async () => {
    const r = await manager.post(`/api/accounts/${internal.id}/members`, { email: customerNewcomer.email, exceptionReason: "because" });
    expect(r.status).toBe(400);
    expect(r.body.errors.map((e: { path: string }) => e.path)).toContain("exceptionReason");
  });

  it("adds the person when the manager states the exception: kept on the membership, audited and shown in the member list", async () => {
    const r = await manager.post(`/api/accounts/${internal.id}/members`, { email: customerNewcomer.email, exceptionReason: WHY });
    expect(r.status, r.text).toBe(201);
    expect(r.body.member).toMatchObject({ userId: customerNewcomer.id, exceptionReason: WHY });
    const [entry] = await t.ds.query(`SELECT detail FROM audit_log WHERE action = 'account.member_added' AND entityId = ? ORDER BY id DESC LIMIT 1`, [internal.id]);
    expect(JSON.parse(entry.detail)).toMatchObject({ userId: customerNewcomer.id, exceptionReason: WHY, personOrganisation: TIDEWATER });
    const list = await lead.get(`/api/accounts/${internal.id}/members`);
    expect(list.body.items.find((m: { userId: number }) => m.userId === customerNewcomer.id)).toMatchObject({ exceptionReason: WHY });
    // The excused person may now charge it, and finds it in their list.
    const newcomer = await signedIn(customerNewcomer);
    const theirs = accountPage.parse((await newcomer.get("/api/accounts")).body).items;
    expect(theirs.find((a) => a.id === internal.id)?.abilities.charge).toBe(true);
  });

  it("keeps the manager's exception when the group lead later changes the person's cap", async () => {
    const r = await lead.post(`/api/accounts/${internal.id}/members`, { email: customerNewcomer.email, monthlyCapCents: 5000 });
    expect(r.status).toBe(200);
    expect(r.body.member).toMatchObject({ monthlyCapCents: 5000, exceptionReason: WHY });
  });

  it("answers 422 internal_person_external_account for a host person on the customer's account", async () => {
    const r = await manager.post(`/api/accounts/${external.id}/members`, { email: hostNewcomer.email });
    expect(r.status).toBe(422);
    expect(r.body.code).toBe("internal_person_external_account");
  });

  it("no longer offers a customer's person an internal account they were put on without an exception", async () => {
    const stray = await personOf(TIDEWATER);
    await t.ds.query(`INSERT INTO account_members (accountId, userId) VALUES (?, ?)`, [internal.id, stray.id]);
    const c = await signedIn(stray);
    expect(accountPage.parse((await c.get("/api/accounts")).body).items.map((a) => a.id)).not.toContain(internal.id);
    const one = accountResponse.parse((await c.get(`/api/accounts/${internal.id}`)).body).account;
    expect(one.abilities.charge).toBe(false);
  });
});

describe("statements and billing runs", () => {
  let runId: number;
  let statements: { internal: number; external: number };

  beforeAll(async () => {
    const ps = await makeInstrument(t.ds, { kind: "potentiostat" });
    await makeRate(t.ds, { instrumentKind: "potentiostat", customerClass: "internal", hourlyRateCents: 4000, effectiveFrom: "2026-01-01" });
    await makeRate(t.ds, { instrumentKind: "potentiostat", customerClass: "commercial", hourlyRateCents: 12000, effectiveFrom: "2026-01-01" });
    await makeBooking(t.ds, { userId: memberUser.id, accountId: internal.id, instrumentIds: [ps.id], start: "2026-11-03T13:00:00Z", end: "2026-11-03T14:00:00Z" });
    await makeBooking(t.ds, { userId: customerUser.id, accountId: external.id, instrumentIds: [ps.id], start: "2026-11-04T13:00:00Z", end: "2026-11-04T14:00:00Z" });
    const r = await manager.post("/api/billing/runs", { period: "2026-11" });
    expect(r.status, r.text).toBe(201);
    const run = billingRunResponse.parse(r.body).run;
    runId = run.id;
    statements = {
      internal: run.statements.find((s) => s.accountId === internal.id)!.id!,
      external: run.statements.find((s) => s.accountId === external.id)!.id!,
    };
    // No payment service here: the external invoice is queued. Give it an open invoice, as the service would.
    await t.ds.query(`UPDATE statements SET invoiceStatus = 'open', invoiceUrl = 'https://pay.example/in_pol' WHERE id = ?`, [statements.external]);
  });

  const listed = async (c: ApiClient): Promise<StatementListItemDto[]> => statementPage.parse((await c.get("/api/billing/statements?limit=500")).body).items;

  it("lists to each person exactly the statements they may download, each with its abilities", async () => {
    const mine = (items: StatementListItemDto[]) => items.filter((s) => s.runId === runId).map((s) => s.id).sort();
    expect(mine(await listed(manager))).toEqual([statements.internal, statements.external].sort());
    expect(mine(await listed(lead))).toEqual([statements.internal]);
    expect(mine(await listed(customer))).toEqual([statements.external]);
    // A member of an internal account sees their own lines on My charges, not the statement.
    expect(mine(await listed(member))).toEqual([]);
    expect(mine(await listed(safety))).toEqual([]);
    for (const c of [manager, lead, customer]) for (const s of await listed(c)) expect(s.abilities.download).toBe(true);
    const ext = (await listed(customer)).find((s) => s.id === statements.external)!;
    expect(ext.abilities).toEqual({ download: true, pay: true });
    const int = (await listed(lead)).find((s) => s.id === statements.internal)!;
    expect(int.abilities).toEqual({ download: true, pay: false });
  });

  it("gives the PDF to those the list shows it to, and 404 to everyone else", async () => {
    const status = async (c: ApiClient, id: number) => (await c.get(`/api/billing/statements/${id}/statement.pdf`)).status;
    expect(await status(lead, statements.internal)).toBe(200);
    expect(await status(customer, statements.external)).toBe(200);
    expect(await status(member, statements.internal)).toBe(404);
    expect(await status(customer, statements.internal)).toBe(404);
    expect(await status(lead, statements.external)).toBe(404);
    expect(await status(safety, statements.external)).toBe(404);
  });

  it("sends the run with its abilities, and answers a second run of the month 409 period_final naming the run", async () => {
    const run = billingRunResponse.parse((await manager.get(`/api/billing/runs/${runId}`)).body).run;
    expect(run.abilities).toEqual({ void: true, journal: true, reversal: false });
    expect(run.statements.find((s) => s.id === statements.external)!.abilities).toEqual({ download: true, pay: true });
    const again = await manager.post("/api/billing/runs", { period: "2026-11" });
    expect(again.status).toBe(409);
    expect(again.body).toMatchObject({ code: "period_final", runId });
  });

  it("refuses to void a run with a paid invoice (409 invoice_paid) and says so in its abilities", async () => {
    await t.ds.query(`UPDATE statements SET invoiceStatus = 'paid' WHERE id = ?`, [statements.external]);
    try {
      const run = billingRunResponse.parse((await manager.get(`/api/billing/runs/${runId}`)).body).run;
      expect(run.abilities.void).toBe(false);
      expect(run.statements.find((s) => s.id === statements.external)!.abilities!.pay).toBe(false);
      const r = await manager.post(`/api/billing/runs/${runId}/void`, { reason: "Wrong rates loaded" });
      expect(r.status).toBe(409);
      expect(r.body.code).toBe("invoice_paid");
      expect((await t.ds.query(`SELECT status FROM billing_runs WHERE id = ?`, [runId]))[0].status).toBe("final");
    } finally {
      await t.ds.query(`UPDATE statements SET invoiceStatus = 'open' WHERE id = ?`, [statements.external]);
    }
  });

  it("voids a run once: a voided run answers 409 already_void, can no longer be voided and its month may run again", async () => {
    const v = await manager.post(`/api/billing/runs/${runId}/void`, { reason: "Wrong rates loaded" });
    expect(v.status, v.text).toBe(200);
    const voided = billingRunResponse.parse(v.body).run;
    expect(voided.abilities).toEqual({ void: false, journal: true, reversal: true });
    const again = await manager.post(`/api/billing/runs/${runId}/void`, { reason: "Once more" });
    expect(again.status).toBe(409);
    expect(again.body.code).toBe("already_void");
    // The customer's statement of a voided run is still theirs to read, not to pay.
    expect((await listed(customer)).find((s) => s.id === statements.external)!.abilities).toEqual({ download: true, pay: false });
    expect((await manager.post("/api/billing/runs", { period: "2026-11" })).status).toBe(201);
  });
});
