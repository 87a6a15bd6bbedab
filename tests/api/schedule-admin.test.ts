/** The manager's side of the Schedule: instruments and their rules, training, setups, accounts, utilisation, start page. */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { makeAccount, makeInstrument, train } from "../support/schedule-factories";
import type { User } from "../../server/entities";
import { dashboardDto } from "@shared/schemas/dashboard";

let t: TestApp;
let member: User;
let manager: User;
let lead: User;
let memberApi: ApiClient;
let managerApi: ApiClient;
let leadApi: ApiClient;
let accountId: number;

beforeAll(async () => {
  t = await startTestApp();
  member = await makeUser(t.ds, { roles: ["member"], name: "Pia Member" });
  manager = await makeUser(t.ds, { roles: ["manager", "member"] });
  lead = await makeUser(t.ds, { roles: ["group_lead", "member"] });
  accountId = (await makeAccount(t.ds, [member.id], { ownerId: lead.id })).id;
  await makeAccount(t.ds, [], { ownerId: null });
  memberApi = new ApiClient(t.url);
  managerApi = new ApiClient(t.url);
  leadApi = new ApiClient(t.url);
  await memberApi.login(member.email, TEST_PASSWORD);
  await managerApi.login(manager.email, TEST_PASSWORD);
  await leadApi.login(lead.email, TEST_PASSWORD);
});
afterAll(async () => {
  await t.close();
});

describe("instruments", () => {
  it("lets a manager add an instrument with rules, and refuses overlapping bookable windows naming the field", async () => {
    const r = await managerApi.post("/api/instruments", {
      name: "Sanderling – four-electrode potentiostat",
      kind: "potentiostat",
      fourElectrode: true,
      cleaningBufferMinutes: 10,
      bookableHours: { mon: [{ from: "08:00", to: "18:00" }] },
    });
    expect(r.status).toBe(201);
    expect(r.body.instrument).toMatchObject({ kind: "potentiostat", status: "in_service", cleaningBufferMinutes: 10, trainingRequired: true });
    const bad = await managerApi.patch(`/api/instruments/${r.body.instrument.id}`, {
      bookableHours: { tue: [{ from: "08:00", to: "12:00" }, { from: "11:00", to: "14:00" }] },
    });
    expect(bad.status).toBe(422);
    expect(bad.body.errors[0].path).toBe("bookableHours.tue.1");
    expect((await memberApi.post("/api/instruments", { name: "x", kind: "support" })).status).toBe(403);
  });

  it("tells the owners of upcoming bookings when an instrument goes under maintenance, and audits it", async () => {
    const cell = await makeInstrument(t.ds);
    await train(t.ds, member.id, cell.id);
    const b = await memberApi.post("/api/bookings", { instrumentIds: [cell.id], start: "2026-12-07T10:00:00-04:00", end: "2026-12-07T11:00:00-04:00", accountId });
    expect(b.status).toBe(201);
    const r = await managerApi.patch(`/api/instruments/${cell.id}`, { status: "under_maintenance", statusNote: "Cracked Luggin capillary" });
    expect(r.status).toBe(200);
    const mail: { subject: string; text: string }[] = await t.ds.query(`SELECT subject, text FROM outbound_mail WHERE "to" = ? AND subject LIKE ?`, [member.email, `${cell.name}%`]);
    expect(mail).toHaveLength(1);
    expect(mail[0].subject).toMatch(/under maintenance/);
    expect(mail[0].text).toContain("Cracked Luggin capillary");
    const auditRows = await t.ds.query(`SELECT action FROM audit_log WHERE entityType = 'instrument' AND entityId = ?`, [cell.id]);
    expect(auditRows.map((a: { action: string }) => a.action)).toContain("instrument.status_changed");
  });
});

describe("training", () => {
  it("lets a member ask for training, shows it in the manager's queue, and a grant closes the request", async () => {
    const glovebox = await makeInstrument(t.ds, { kind: "support" });
    const ask = await memberApi.post("/api/training/requests", { instrumentId: glovebox.id, note: "Weighing TBA TPFB" });
    expect(ask.status).toBe(201);
    expect((await memberApi.post("/api/training/requests", { instrumentId: glovebox.id })).status).toBe(409);
    const queue = await managerApi.get("/api/training/requests?status=open");
    expect(queue.body.items.find((r: { id: number }) => r.id === ask.body.request.id)).toMatchObject({ userName: "Pia Member", instrumentName: glovebox.name });
    const g = await managerApi.post("/api/training", { userId: member.id, instrumentId: glovebox.id, expiresAt: "2027-12-01T00:00:00Z", afterHours: false });
    expect(g.status).toBe(201);
    expect(g.body.record).toMatchObject({ state: "current", userId: member.id });
    expect((await managerApi.get("/api/training/requests?status=open")).body.items.some((r: { id: number }) => r.id === ask.body.request.id)).toBe(false);
  });

  it("lists records expiring within 30 days, and revoking one ends the person's right to book", async () => {
    const cell = await makeInstrument(t.ds);
    const g = await managerApi.post("/api/training", { userId: member.id, instrumentId: cell.id, expiresAt: "2026-12-20T00:00:00Z" });
    const soon = await managerApi.get("/api/training?expiringWithinDays=30");
    expect(soon.body.items.find((r: { id: number }) => r.id === g.body.record.id)).toMatchObject({ state: "expiring" });
    const book = () => memberApi.post("/api/bookings", { instrumentIds: [cell.id], start: "2026-12-08T10:00:00-04:00", end: "2026-12-08T11:00:00-04:00", accountId });
    expect((await managerApi.post(`/api/training/${g.body.record.id}/revoke`, { reason: "Left the hood sash open with DCE" })).status).toBe(200);
    expect((await book()).status).toBe(403);
  });

  it("shows a member only their own records", async () => {
    const stranger = await makeUser(t.ds, { roles: ["member"] });
    const cell = await makeInstrument(t.ds);
    await train(t.ds, stranger.id, cell.id);
    const mine = await memberApi.get("/api/training?userId=" + stranger.id);
    expect(mine.body.items.every((r: { userId: number }) => r.userId === member.id)).toBe(true);
  });
});

describe("GET /api/accounts", () => {
  it("answers a member the accounts they may charge, a lead those they own, a manager all", async () => {
    const m = await memberApi.get("/api/accounts");
    expect(m.body.items.map((a: { id: number }) => a.id)).toEqual([accountId]);
    expect(m.body.items[0].chargeable).toBe(true);
    const l = await leadApi.get("/api/accounts");
    expect(l.body.items.map((a: { id: number }) => a.id)).toEqual([accountId]);
    const all = await managerApi.get("/api/accounts");
    expect(all.body.total).toBeGreaterThanOrEqual(2);
  });
});

describe("utilisation report", () => {
  it("answers bookable, booked and used hours per instrument per month, and the same as CSV", async () => {
    const cell = await makeInstrument(t.ds, { name: "Utilisation cell", bookableHours: { mon: [{ from: "08:00", to: "18:00" }] } });
    await train(t.ds, member.id, cell.id);
    const b = await memberApi.post("/api/bookings", { instrumentIds: [cell.id], start: "2026-12-14T10:00:00-04:00", end: "2026-12-14T14:00:00-04:00", accountId });
    expect(b.status).toBe(201);
    const r = await managerApi.get(`/api/reports/utilisation?from=2026-12&to=2026-12&instrumentId=${cell.id}`);
    expect(r.status).toBe(200);
    // December 2026 has four Mondays (7, 14, 21, 28): 4 × 10 h bookable; 4 h booked.
    expect(r.body.items).toEqual([
      { instrumentId: cell.id, instrumentName: "Utilisation cell", period: "2026-12", bookableHours: 40, bookedHours: 4, usedHours: 0, bookedPct: 10, usedPct: 0 },
    ]);
    const csv = await managerApi.get(`/api/reports/utilisation.csv?from=2026-12&to=2026-12&instrumentId=${cell.id}`);
    expect(csv.headers.get("content-type")).toMatch(/text\/csv/);
    expect(csv.text).toBe("instrument,month,bookable_hours,booked_hours,used_hours,booked_percent,used_percent\r\nUtilisation cell,2026-12,40.00,4.00,0.00,10.0,0.0");
    expect((await memberApi.get("/api/reports/utilisation?from=2026-12&to=2026-12")).status).toBe(403);
  });
});

describe("GET /api/dashboard", () => {
  it("shows a member's next bookings and the manager's pending approvals", async () => {
    const micro = await makeInstrument(t.ds, { requiresApproval: true });
    await train(t.ds, member.id, micro.id);
    const before = (await managerApi.get("/api/dashboard")).body.manager.pendingApprovals;
    const b = await memberApi.post("/api/bookings", { instrumentIds: [micro.id], start: "2026-12-03T10:00:00-04:00", end: "2026-12-03T11:00:00-04:00", accountId });
    expect(b.status).toBe(201);
    const mine = (await memberApi.get("/api/dashboard")).body.member.nextBookings;
    expect(mine[0]).toMatchObject({ id: b.body.booking.id, status: "requested", instrumentNames: [micro.name] });
    expect((await managerApi.get("/api/dashboard")).body.manager.pendingApprovals).toBe(before + 1);
  });

  it("answers in the shared schema, with the manager's and safety sections only for those roles", async () => {
    const asMember = dashboardDto.parse((await memberApi.get("/api/dashboard")).body);
    expect(asMember.manager).toBeUndefined();
    expect(asMember.safety).toBeUndefined();
    const asManager = dashboardDto.parse((await managerApi.get("/api/dashboard")).body);
    expect(asManager.manager).toBeDefined();
    expect(asManager.safety).toBeDefined();
  });
});
