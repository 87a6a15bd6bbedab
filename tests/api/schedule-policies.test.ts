/**
 * The Schedule's record rules through the API (issue 9): every booking shown in full carries the
 * booking policy's `abilities`, refusals carry stable codes, charging an account asks Recharge's
 * account policy, anyone signed in reports an instrument fault (202) while only the manager closes
 * it and changes the status, and the Scan page's booking line carries the same abilities.
 * Fixed clock: Wednesday 2 December 2026, 11:00 in America/Halifax (15:00 UTC).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { makeAccount, makeInstrument, train } from "../support/schedule-factories";
import { AccountMember, type User } from "../../server/entities";

const CUSTOMER = "Tidewater Metals Recovery Ltd";

let t: TestApp;
let member: User;
let other: User;
let external: User;
let manager: User;
let memberApi: ApiClient;
let otherApi: ApiClient;
let externalApi: ApiClient;
let managerApi: ApiClient;
let accountId: number;

beforeAll(async () => {
  t = await startTestApp();
  member = await makeUser(t.ds, { roles: ["member"], name: "Mina Member" });
  other = await makeUser(t.ds, { roles: ["member"], name: "Otto Other" });
  external = await makeUser(t.ds, { roles: ["member"], name: "Bea Buyer", organisation: CUSTOMER });
  manager = await makeUser(t.ds, { roles: ["manager", "member"], name: "Marta Manager" });
  accountId = (await makeAccount(t.ds, [member.id, other.id])).id;
  memberApi = new ApiClient(t.url);
  otherApi = new ApiClient(t.url);
  externalApi = new ApiClient(t.url);
  managerApi = new ApiClient(t.url);
  await memberApi.login(member.email, TEST_PASSWORD);
  await otherApi.login(other.email, TEST_PASSWORD);
  await externalApi.login(external.email, TEST_PASSWORD);
  await managerApi.login(manager.email, TEST_PASSWORD);
});
afterAll(async () => {
  await t.close();
});

const dec = (day: number, hhmm: string) => `2026-12-${String(day).padStart(2, "0")}T${hhmm}:00-04:00`;

async function trainedCell(over: Parameters<typeof makeInstrument>[1] = {}) {
  const i = await makeInstrument(t.ds, over);
  for (const p of [member, other, external, manager]) await train(t.ds, p.id, i.id);
  return i;
}

const book = (api: ApiClient, instrumentId: number, start: string, end: string, account = accountId) =>
  api.post("/api/bookings", { instrumentIds: [instrumentId], start, end, accountId: account, purpose: "Ion transfer across water|DCE" });

describe("abilities on bookings", () => {
  it("answers the owner's new booking with what they may do now, and the manager's view of it with theirs", async () => {
    const cell = await trainedCell({ requiresApproval: true });
    const r = await book(memberApi, cell.id, dec(9, "10:00"), dec(9, "11:00"));
    expect(r.status).toBe(201);
    expect(r.body.booking.abilities).toEqual({ cancel: true, move: true, checkIn: false, checkOut: false, approve: false, decline: false, noShow: false });
    const seen = await managerApi.get(`/api/bookings/${r.body.booking.id}`);
    expect(seen.body.booking.abilities).toEqual({ cancel: true, move: true, checkIn: false, checkOut: false, approve: true, decline: true, noShow: false });
    // Someone else gets a busy block, which offers nothing and says nothing of who or what.
    const busy = await otherApi.get(`/api/bookings/${r.body.booking.id}`);
    expect(busy.body.booking).toEqual(expect.objectContaining({ busy: true }));
    expect(busy.body.booking.abilities).toBeUndefined();
  });

  it("opens check-in 15 minutes before the start, in the list of one's own bookings too", async () => {
    const cell = await trainedCell();
    const r = await book(memberApi, cell.id, dec(16, "10:00"), dec(16, "11:00"));
    const id = r.body.booking.id;
    const mine = async () => (await memberApi.get("/api/bookings?mine=true")).body.items.find((b: { id: number }) => b.id === id);
    expect((await mine()).abilities.checkIn).toBe(false);
    t.clock.set("2026-12-16T13:50:00.000Z");
    try {
      expect((await mine()).abilities).toMatchObject({ checkIn: true, cancel: true, move: true });
      const inn = await memberApi.post(`/api/bookings/${id}/check-in`);
      expect(inn.body.booking.abilities).toMatchObject({ checkIn: false, checkOut: true, cancel: false, move: false });
    } finally {
      t.clock.set("2026-12-02T15:00:00.000Z");
    }
  });

  it("follows the booking settings' check-in opening", async () => {
    const cell = await trainedCell();
    const r = await book(memberApi, cell.id, dec(17, "10:00"), dec(17, "11:00"));
    expect((await managerApi.request("PUT", "/api/bookings/policy", { json: { lateCancelHours: 24, noShowGraceMinutes: 30, checkInEarlyMinutes: 60 } })).status).toBe(200);
    t.clock.set("2026-12-17T13:20:00.000Z");
    try {
      const b = (await memberApi.get(`/api/bookings/${r.body.booking.id}`)).body.booking;
      expect(b.abilities.checkIn).toBe(true);
      expect((await memberApi.post(`/api/bookings/${r.body.booking.id}/check-in`)).status).toBe(200);
    } finally {
      t.clock.set("2026-12-02T15:00:00.000Z");
      await managerApi.request("PUT", "/api/bookings/policy", { json: { lateCancelHours: 24, noShowGraceMinutes: 30, checkInEarlyMinutes: 15 } });
    }
  });
});

describe("booking refusals", () => {
  it("says whose booking it is (403 not_your_booking) and changes nothing", async () => {
    const cell = await trainedCell();
    const r = await book(memberApi, cell.id, dec(10, "10:00"), dec(10, "11:00"));
    for (const [method, path, body] of [
      ["post", "cancel", {}],
      ["post", "check-in", {}],
      ["patch", "", { start: dec(10, "12:00"), end: dec(10, "13:00") }],
    ] as const) {
      const res = await otherApi.request(method.toUpperCase(), `/api/bookings/${r.body.booking.id}${path ? `/${path}` : ""}`, { json: body });
      expect(res.status, path).toBe(403);
      expect(res.body.code).toBe("not_your_booking");
      expect(res.headers.get("content-type")).toMatch(/application\/problem\+json/);
    }
    expect((await memberApi.get(`/api/bookings/${r.body.booking.id}`)).body.booking).toMatchObject({ status: "confirmed", start: r.body.booking.start });
  });

  it("asks the manager for a reason when cancelling someone else's booking (422 reason_required, naming the field)", async () => {
    const cell = await trainedCell();
    const r = await book(memberApi, cell.id, dec(11, "10:00"), dec(11, "11:00"));
    const bare = await managerApi.post(`/api/bookings/${r.body.booking.id}/cancel`, {});
    expect(bare.status).toBe(422);
    expect(bare.body.code).toBe("reason_required");
    expect(bare.body.errors[0].path).toBe("reason");
    expect((await memberApi.get(`/api/bookings/${r.body.booking.id}`)).body.booking.status).toBe("confirmed");
  });

  it("refuses to approve a request that is already over (422 booking_over), though it may still be declined", async () => {
    const cell = await trainedCell({ requiresApproval: true });
    const r = await book(memberApi, cell.id, dec(3, "10:00"), dec(3, "11:00"));
    expect(r.body.booking.status).toBe("requested");
    t.clock.set("2026-12-03T16:00:00.000Z");
    try {
      const seen = (await managerApi.get(`/api/bookings/${r.body.booking.id}`)).body.booking;
      expect(seen.abilities).toMatchObject({ approve: false, decline: true });
      const a = await managerApi.post(`/api/bookings/${r.body.booking.id}/approve`);
      expect(a.status).toBe(422);
      expect(a.body.code).toBe("booking_over");
      expect((await managerApi.post(`/api/bookings/${r.body.booking.id}/decline`, { reason: "The slot has passed" })).status).toBe(200);
    } finally {
      t.clock.set("2026-12-02T15:00:00.000Z");
    }
  });
});

describe("charging an account when booking (Recharge's account policy)", () => {
  it("refuses an external customer's person on an internal account (403 account_not_allowed, saying why) until the manager makes a stated exception", async () => {
    const cell = await trainedCell();
    const internal = await makeAccount(t.ds, [external.id]);
    const refused = await book(externalApi, cell.id, dec(14, "10:00"), dec(14, "11:00"), internal.id);
    expect(refused.status).toBe(403);
    expect(refused.body.code).toBe("account_not_allowed");
    expect(refused.body.detail).toMatch(/Tidewater Metals Recovery Ltd/);
    const count = async () => Number((await t.ds.query(`SELECT COUNT(*) n FROM booking_instruments WHERE instrumentId = ?`, [cell.id]))[0].n);
    expect(await count()).toBe(0);
    await t.ds.getRepository(AccountMember).update({ accountId: internal.id, userId: external.id }, { exceptionReason: "Joint grant with the host group, approved by the director" });
    expect((await book(externalApi, cell.id, dec(14, "10:00"), dec(14, "11:00"), internal.id)).status).toBe(201);
  });

  it("lets the customer's person charge the customer's own account, and not a member someone else's", async () => {
    const cell = await trainedCell();
    const theirs = await makeAccount(t.ds, [external.id], { kind: "external", customerClass: "commercial", organisation: CUSTOMER });
    expect((await book(externalApi, cell.id, dec(15, "10:00"), dec(15, "11:00"), theirs.id)).status).toBe(201);
    const notMine = await book(memberApi, cell.id, dec(15, "13:00"), dec(15, "14:00"), theirs.id);
    expect(notMine.status).toBe(403);
    expect(notMine.body.code).toBe("account_not_allowed");
  });

  it("keeps 422 for an unknown or closed account", async () => {
    const cell = await trainedCell();
    const unknown = await book(memberApi, cell.id, dec(15, "10:00"), dec(15, "11:00"), 987654);
    expect(unknown.status).toBe(422);
    expect(unknown.body.code).toBe("unknown_account");
    const closed = await makeAccount(t.ds, [member.id], { validTo: "2026-12-10" });
    const late = await book(memberApi, cell.id, dec(15, "10:00"), dec(15, "11:00"), closed.id);
    expect(late.status).toBe(422);
    expect(late.body.code).toBe("account_closed");
  });
});

describe("instrument faults and status", () => {
  it("lets anyone signed in report a fault (202, stored, mailed to the manager) and shows it on the instrument; the status stays", async () => {
    const cell = await makeInstrument(t.ds);
    const r = await externalApi.post(`/api/instruments/${cell.id}/faults`, { note: "Reference electrode lead reads open circuit" });
    expect(r.status).toBe(202);
    expect(r.body.fault).toMatchObject({ note: "Reference electrode lead reads open circuit", reportedBy: "Bea Buyer", closedAt: null, resolution: "" });
    const asMember = await memberApi.get(`/api/instruments/${cell.id}`);
    expect(asMember.body.instrument.status).toBe("in_service");
    expect(asMember.body.instrument.openFaults).toEqual([expect.objectContaining({ id: r.body.fault.id, reportedBy: "Bea Buyer" })]);
    expect(asMember.body.instrument.abilities).toMatchObject({ reportFault: true, takeOutOfService: false, returnToService: false, closeFault: false, edit: false });
    const asManager = await managerApi.get(`/api/instruments/${cell.id}`);
    expect(asManager.body.instrument.abilities).toMatchObject({ reportFault: true, takeOutOfService: true, returnToService: false, closeFault: true, edit: true });
    const mail: { subject: string }[] = await t.ds.query(`SELECT subject FROM outbound_mail WHERE "to" = ? AND subject = ?`, [manager.email, `Fault reported: ${cell.name}`]);
    expect(mail).toHaveLength(1);
  });

  it("answers 400 to a report without words, 404 for an unknown instrument and 409 for a retired one", async () => {
    const cell = await makeInstrument(t.ds);
    const bare = await memberApi.post(`/api/instruments/${cell.id}/faults`, { note: "" });
    expect(bare.status).toBe(400);
    expect(bare.body.errors[0].path).toBe("note");
    expect((await memberApi.post(`/api/instruments/987654/faults`, { note: "Display is dark" })).status).toBe(404);
    const old = await makeInstrument(t.ds, { status: "retired" });
    const r = await memberApi.post(`/api/instruments/${old.id}/faults`, { note: "Display is dark" });
    expect(r.status).toBe(409);
    expect(r.body.code).toBe("instrument_retired");
  });

  it("lets only the manager close a report, saying what was done", async () => {
    const cell = await makeInstrument(t.ds);
    const f = (await memberApi.post(`/api/instruments/${cell.id}/faults`, { note: "Cell leaks at the Luggin joint" })).body.fault;
    const path = `/api/instruments/${cell.id}/faults/${f.id}/close`;
    expect((await memberApi.post(path, { resolution: "Regreased the joint" })).status).toBe(403);
    expect((await managerApi.post(path, { resolution: "x" })).status).toBe(400);
    const other = await makeInstrument(t.ds);
    expect((await managerApi.post(`/api/instruments/${other.id}/faults/${f.id}/close`, { resolution: "Regreased the joint" })).status).toBe(404);
    const c = await managerApi.post(path, { resolution: "Regreased the joint" });
    expect(c.status).toBe(200);
    expect(c.body.fault).toMatchObject({ id: f.id, closedBy: "Marta Manager", resolution: "Regreased the joint" });
    expect(c.body.fault.closedAt).toBe("2026-12-02T15:00:00.000Z");
    expect((await memberApi.get(`/api/instruments/${cell.id}`)).body.instrument.openFaults).toEqual([]);
  });

  it("lets only the manager take an instrument out of service and back, with abilities that follow the status", async () => {
    const cell = await makeInstrument(t.ds);
    expect((await memberApi.patch(`/api/instruments/${cell.id}`, { status: "under_maintenance" })).status).toBe(403);
    expect((await externalApi.patch(`/api/instruments/${cell.id}`, { status: "under_maintenance" })).status).toBe(403);
    const out = await managerApi.patch(`/api/instruments/${cell.id}`, { status: "under_maintenance", statusNote: "Cracked capillary" });
    expect(out.status).toBe(200);
    expect(out.body.instrument.abilities).toMatchObject({ takeOutOfService: false, returnToService: true });
    const back = await managerApi.patch(`/api/instruments/${cell.id}`, { status: "in_service" });
    expect(back.body.instrument).toMatchObject({ status: "in_service", abilities: { takeOutOfService: true, returnToService: false } });
    const list = await memberApi.get(`/api/instruments?limit=500`);
    expect(list.body.items.find((i: { id: number }) => i.id === cell.id).abilities).toMatchObject({ reportFault: true, edit: false });
  });
});

describe("the Scan page's booking line", () => {
  it("carries the booking policy's abilities and its rule of who sees a booking in full", async () => {
    const cell = await trainedCell();
    const mine = await book(memberApi, cell.id, dec(2, "11:10"), dec(2, "12:00"));
    expect(mine.status).toBe(201);
    const theirs = await book(otherApi, cell.id, dec(2, "13:00"), dec(2, "14:00"));
    expect(theirs.status).toBe(201);
    t.clock.set("2026-12-02T15:20:00.000Z");
    try {
      const scan = await memberApi.get(`/api/scan/${cell.labelToken}`);
      expect(scan.body.record.currentBooking).toMatchObject({ id: mine.body.booking.id, abilities: { checkIn: true, checkOut: false } });
      expect(scan.body.record.nextBooking.abilities).toEqual({ cancel: false, move: false, checkIn: false, checkOut: false, approve: false, decline: false, noShow: false });
      expect((await memberApi.post(`/api/bookings/${mine.body.booking.id}/check-in`)).status).toBe(200);
      const after = await memberApi.get(`/api/scan/${cell.labelToken}`);
      expect(after.body.record.currentBooking.abilities).toMatchObject({ checkIn: false, checkOut: true });
      // Who booked it follows the Schedule's rule: the manager sees it, an administrator does not.
      const admin = await makeUser(t.ds, { roles: ["admin"] });
      const adminApi = new ApiClient(t.url);
      await adminApi.login(admin.email, TEST_PASSWORD);
      expect((await adminApi.get(`/api/scan/${cell.labelToken}`)).body.record.nextBooking).toMatchObject({ id: null, who: null, mine: false });
      expect((await managerApi.get(`/api/scan/${cell.labelToken}`)).body.record.nextBooking).toMatchObject({ id: theirs.body.booking.id, who: "Otto Other" });
    } finally {
      t.clock.set("2026-12-02T15:00:00.000Z");
    }
  });
});

describe("strict ids in the Schedule's queries", () => {
  it.each(["1.5", "true", "1e3", "-1"])("answers 400 naming the field for instrumentId=%s", async (bad) => {
    const r = await managerApi.get(`/api/reports/utilisation?from=2026-12&to=2026-12&instrumentId=${bad}`);
    expect(r.status).toBe(400);
    expect(r.body.errors.map((e: { path: string }) => e.path)).toContain("query.instrumentId");
  });
});
