/**
 * The booking routes of the contract (API.md, "Instruments and bookings") against the real app
 * with a fixed clock: Wednesday 2 December 2026, 11:00 in America/Halifax (15:00 UTC, AST = UTC−4).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { makeAccount, makeInstrument, train } from "../support/schedule-factories";
import type { User } from "../../server/entities";

let t: TestApp;
let member: User;
let other: User;
let manager: User;
let memberApi: ApiClient;
let otherApi: ApiClient;
let managerApi: ApiClient;
let accountId: number;
let otherAccountId: number;

beforeAll(async () => {
  t = await startTestApp();
  member = await makeUser(t.ds, { roles: ["member"], name: "Mina Member" });
  other = await makeUser(t.ds, { roles: ["member"], name: "Otto Other" });
  manager = await makeUser(t.ds, { roles: ["manager", "member"], name: "Marta Manager" });
  accountId = (await makeAccount(t.ds, [member.id, other.id])).id;
  otherAccountId = (await makeAccount(t.ds, [other.id])).id;
  memberApi = new ApiClient(t.url);
  otherApi = new ApiClient(t.url);
  managerApi = new ApiClient(t.url);
  await memberApi.login(member.email, TEST_PASSWORD);
  await otherApi.login(other.email, TEST_PASSWORD);
  await managerApi.login(manager.email, TEST_PASSWORD);
});
afterAll(async () => {
  await t.close();
});

/** A wall-clock time in Halifax in December (AST, UTC−4). */
const dec = (day: number, hhmm: string) => `2026-12-${String(day).padStart(2, "0")}T${hhmm}:00-04:00`;

async function trainedInstrument(over: Parameters<typeof makeInstrument>[1] = {}, people: User[] = [member, other, manager]) {
  const i = await makeInstrument(t.ds, over);
  for (const p of people) await train(t.ds, p.id, i.id);
  return i;
}

function book(api: ApiClient, instrumentIds: number[], start: string, end: string, extra: Record<string, unknown> = {}) {
  return api.post("/api/bookings", { instrumentIds, start, end, accountId, purpose: "Ion transfer of TBA+ across water|DCE", ...extra });
}

async function countBookings(instrumentId: number): Promise<number> {
  return Number((await t.ds.query(`SELECT COUNT(*) n FROM booking_instruments WHERE instrumentId = ?`, [instrumentId]))[0].n);
}

describe("POST /api/bookings", () => {
  it("confirms a booking at once on an instrument without the approval rule", async () => {
    const cell = await trainedInstrument();
    const r = await book(memberApi, [cell.id], dec(7, "10:00"), dec(7, "12:00"));
    expect(r.status).toBe(201);
    expect(r.body.booking).toMatchObject({ status: "confirmed", instrumentIds: [cell.id], start: "2026-12-07T14:00:00.000Z", end: "2026-12-07T16:00:00.000Z" });
    const mail = await t.ds.query(`SELECT text FROM outbound_mail WHERE "to" = ? AND subject LIKE 'Booking confirmed%'`, [member.email]);
    expect(mail.length).toBeGreaterThan(0);
    expect(mail[0].text).toContain("Mon 7 Dec 2026, 10:00–12:00 (America/Halifax)");
  });

  it("answers 409 when the cleaning buffer overlaps, and allows back-to-back when the buffer fits", async () => {
    const cell = await trainedInstrument({ cleaningBufferMinutes: 30 });
    expect((await book(memberApi, [cell.id], dec(7, "10:00"), dec(7, "11:00"))).status).toBe(201);
    const inBuffer = await book(otherApi, [cell.id], dec(7, "11:15"), dec(7, "12:00"));
    expect(inBuffer.status).toBe(409);
    expect(inBuffer.headers.get("content-type")).toMatch(/application\/problem\+json/);
    expect(inBuffer.body.detail).toMatch(/30-minute cleaning buffer/);
    expect((await book(otherApi, [cell.id], dec(7, "11:30"), dec(7, "12:00"))).status).toBe(201);
    // The buffer also follows the new session: ending 15 minutes before an existing start is too close.
    expect((await book(otherApi, [cell.id], dec(7, "09:00"), dec(7, "09:45"))).status).toBe(409);
    expect((await book(otherApi, [cell.id], dec(7, "09:00"), dec(7, "09:30"))).status).toBe(201);
  });

  it("books a potentiostat and a cell together or not at all", async () => {
    const pot = await trainedInstrument({ kind: "potentiostat" });
    const cell = await trainedInstrument();
    expect((await book(otherApi, [cell.id], dec(8, "13:00"), dec(8, "14:00"))).status).toBe(201);
    const r = await book(memberApi, [pot.id, cell.id], dec(8, "12:00"), dec(8, "14:00"));
    expect(r.status).toBe(409);
    expect(await countBookings(pot.id)).toBe(0);
    const ok = await book(memberApi, [pot.id, cell.id], dec(8, "10:00"), dec(8, "12:00"));
    expect(ok.status).toBe(201);
    expect(ok.body.booking.instrumentIds).toEqual([pot.id, cell.id].sort((a, b) => a - b));
  });

  it("books a setup's instruments when given its id", async () => {
    const pot = await trainedInstrument({ kind: "potentiostat" });
    const cell = await trainedInstrument();
    const s = await managerApi.post("/api/setups", { name: `Rig ${pot.id}`, instrumentIds: [pot.id, cell.id] });
    expect(s.status).toBe(201);
    const r = await memberApi.post("/api/bookings", { setupId: s.body.setup.id, start: dec(9, "10:00"), end: dec(9, "11:00"), accountId, purpose: "" });
    expect(r.status).toBe(201);
    expect(r.body.booking.instrumentIds).toEqual([pot.id, cell.id].sort((a, b) => a - b));
  });

  it("answers 403 when the caller is not trained, or the training has lapsed by the booked end", async () => {
    const cell = await makeInstrument(t.ds);
    const none = await book(memberApi, [cell.id], dec(7, "10:00"), dec(7, "11:00"));
    expect(none.status).toBe(403);
    expect(none.body.errors[0].path).toBe("instrumentIds");
    await train(t.ds, member.id, cell.id, { expiresAt: "2026-12-07T14:30:00.000Z" });
    expect((await book(memberApi, [cell.id], dec(7, "10:00"), dec(7, "11:00"))).status).toBe(403);
    expect((await book(memberApi, [cell.id], dec(7, "09:00"), dec(7, "10:00"))).status).toBe(201);
    expect(await countBookings(cell.id)).toBe(1);
  });

  it("answers 403 for an account the caller may not charge", async () => {
    const cell = await trainedInstrument();
    const r = await book(memberApi, [cell.id], dec(7, "10:00"), dec(7, "11:00"), { accountId: otherAccountId });
    expect(r.status).toBe(403);
    expect(r.body.code).toBe("account_not_allowed");
  });

  it.each([
    ["the end comes before the start", dec(7, "11:00"), dec(7, "10:00"), "end"],
    ["it has no length", dec(7, "11:00"), dec(7, "11:00"), "end"],
    ["it is longer than the maximum", dec(7, "08:00"), dec(7, "13:00"), "end"],
    ["it starts in the past", dec(1, "10:00"), dec(1, "11:00"), "start"],
    ["it is closer than the lead time", dec(2, "12:00"), dec(2, "13:00"), "start"],
    ["it lies outside the bookable hours", dec(7, "17:00"), dec(7, "19:00"), "start"],
    ["it falls on a weekend", dec(5, "10:00"), dec(5, "11:00"), "start"],
  ])("answers 422 naming the field when %s", async (_why, start, end, path) => {
    const cell = await trainedInstrument({ maxLengthMinutes: 240, minLeadMinutes: 120 });
    const r = await book(memberApi, [cell.id], start, end);
    expect(r.status).toBe(422);
    expect(r.body.errors.map((e: { path: string }) => e.path)).toContain(path);
    expect(await countBookings(cell.id)).toBe(0);
  });

  it("answers 422 for an unknown instrument or one under maintenance", async () => {
    const unknown = await book(memberApi, [987654], dec(7, "10:00"), dec(7, "11:00"));
    expect(unknown.status).toBe(422);
    expect(unknown.body.errors[0].path).toBe("instrumentIds");
    const broken = await trainedInstrument({ status: "under_maintenance" });
    const r = await book(memberApi, [broken.id], dec(7, "10:00"), dec(7, "11:00"));
    expect(r.status).toBe(422);
    expect(r.body.detail).toMatch(/under maintenance/);
  });

  it.each([
    ["a time without an offset", "2026-12-07T10:00:00", "start"],
    ["a malformed date", "2026-13-45T10:00:00Z", "start"],
  ])("answers 400 for %s", async (_why, start, path) => {
    const cell = await trainedInstrument();
    const r = await book(memberApi, [cell.id], start, dec(7, "11:00"));
    expect(r.status).toBe(400);
    expect(r.body.errors.map((e: { path: string }) => e.path)).toContain(path);
  });

  it("gives exactly one 201 and N−1 409 to a storm of simultaneous requests for one slot", async () => {
    const cell = await trainedInstrument({ cleaningBufferMinutes: 30 });
    const N = 24;
    const clients = [memberApi, otherApi];
    const answers = await Promise.all(
      Array.from({ length: N }, (_, k) => book(clients[k % 2], [cell.id], dec(10, "10:00"), dec(10, `1${1 + (k % 3)}:00`))),
    );
    const statuses = answers.map((a) => a.status);
    expect(statuses.filter((s) => s === 201)).toHaveLength(1);
    expect(statuses.filter((s) => s === 409)).toHaveLength(N - 1);
    expect(await countBookings(cell.id)).toBe(1);
  });
});

describe("weekly series", () => {
  it("books every session, each at the same local time", async () => {
    const cell = await trainedInstrument();
    const r = await book(memberApi, [cell.id], dec(7, "10:00"), dec(7, "12:00"), { repeatWeeks: 3 });
    expect(r.status).toBe(201);
    expect(r.body.bookings.map((b: { start: string }) => b.start)).toEqual(["2026-12-07T14:00:00.000Z", "2026-12-14T14:00:00.000Z", "2026-12-21T14:00:00.000Z"]);
  });

  it("books nothing and names each failing session when any one fails", async () => {
    const cell = await trainedInstrument();
    expect((await book(otherApi, [cell.id], dec(21, "11:00"), dec(21, "12:00"))).status).toBe(201);
    const r = await book(memberApi, [cell.id], dec(7, "10:00"), dec(7, "12:00"), { repeatWeeks: 4 });
    expect(r.status).toBe(409);
    expect(r.body.occurrences).toHaveLength(1);
    expect(r.body.occurrences[0]).toMatchObject({ index: 2, start: "2026-12-21T14:00:00.000Z", status: 409 });
    expect(r.body.detail).toMatch(/1 of 4 weekly sessions/);
    expect(await countBookings(cell.id)).toBe(1);
  });

  it("keeps the local hour across the spring-forward change (America/Halifax, 14 March 2027)", async () => {
    const cell = await trainedInstrument();
    // Monday 8 March 2027 10:00 AST (UTC−4) and Monday 15 March 10:00 ADT (UTC−3): IANA tz database.
    const r = await book(memberApi, [cell.id], "2027-03-08T10:00:00-04:00", "2027-03-08T11:00:00-04:00", { repeatWeeks: 2 });
    expect(r.status).toBe(201);
    expect(r.body.bookings.map((b: { start: string }) => b.start)).toEqual(["2027-03-08T14:00:00.000Z", "2027-03-15T13:00:00.000Z"]);
    expect(r.body.bookings.map((b: { end: string }) => b.end)).toEqual(["2027-03-08T15:00:00.000Z", "2027-03-15T14:00:00.000Z"]);
  });
});

describe("time zones", () => {
  it("reads bookable hours as local hours on both sides of a DST change", async () => {
    const cell = await trainedInstrument();
    // 08:00 local is 12:00 UTC before 14 March 2027 and 11:00 UTC after it.
    expect((await book(memberApi, [cell.id], "2027-03-12T12:00:00Z", "2027-03-12T13:00:00Z")).status).toBe(201);
    expect((await book(memberApi, [cell.id], "2027-03-12T11:00:00Z", "2027-03-12T12:00:00Z")).status).toBe(422);
    expect((await book(memberApi, [cell.id], "2027-03-15T11:00:00Z", "2027-03-15T12:00:00Z")).status).toBe(201);
    expect((await book(memberApi, [cell.id], "2027-03-15T10:00:00Z", "2027-03-15T11:00:00Z")).status).toBe(422);
  });

  it("measures the maximum length in real elapsed time across the fall-back night", async () => {
    // Open all night on Sunday 7 November 2027, when 02:00 ADT falls back to 01:00 AST.
    const allDay = { sun: [{ from: "00:00", to: "24:00" }] };
    const cell = await trainedInstrument({ maxLengthMinutes: 180, bookableHours: allDay });
    // 00:00–03:00 local is 4 real hours that night: too long. 00:00–02:00 local is 3 real hours.
    expect((await book(memberApi, [cell.id], "2027-11-07T00:00:00-03:00", "2027-11-07T03:00:00-04:00")).status).toBe(422);
    expect((await book(memberApi, [cell.id], "2027-11-07T00:00:00-03:00", "2027-11-07T02:00:00-04:00")).status).toBe(201);
  });

  it("accepts the same instant written with any offset", async () => {
    const cell = await trainedInstrument();
    const a = await book(memberApi, [cell.id], "2026-12-08T14:00:00Z", "2026-12-08T15:00:00Z");
    expect(a.status).toBe(201);
    const b = await book(otherApi, [cell.id], "2026-12-08T15:30:00+01:00", "2026-12-08T16:30:00+01:00");
    expect(b.status).toBe(409);
  });
});

describe("approval", () => {
  it("holds a request until the manager approves it, then confirms it and mails the member", async () => {
    const micro = await trainedInstrument({ requiresApproval: true });
    const r = await book(memberApi, [micro.id], dec(9, "10:00"), dec(9, "11:00"));
    expect(r.status).toBe(201);
    expect(r.body.booking.status).toBe("requested");
    const queue = await managerApi.get(`/api/bookings?status=requested&mine=false&from=${encodeURIComponent(dec(1, "00:00"))}&to=${encodeURIComponent(dec(31, "00:00"))}`);
    expect(queue.body.items.map((b: { id: number }) => b.id)).toContain(r.body.booking.id);
    const a = await managerApi.post(`/api/bookings/${r.body.booking.id}/approve`);
    expect(a.status).toBe(200);
    expect(a.body.booking.status).toBe("confirmed");
    expect((await managerApi.post(`/api/bookings/${r.body.booking.id}/approve`)).status).toBe(409);
    const mails: { subject: string }[] = await t.ds.query(`SELECT subject FROM outbound_mail WHERE "to" = ? ORDER BY id`, [member.email]);
    expect(mails.map((m) => m.subject)).toEqual(expect.arrayContaining([expect.stringMatching(/request received/), expect.stringMatching(/Booking confirmed/)]));
  });

  it("answers 409 on approval when the request now conflicts", async () => {
    const cell = await trainedInstrument({ requiresApproval: true });
    const req = await book(memberApi, [cell.id], dec(9, "10:00"), dec(9, "11:00"));
    const later = await managerApi.post("/api/bookings", { instrumentIds: [cell.id], start: dec(9, "11:00"), end: dec(9, "12:00"), accountId: (await makeAccount(t.ds, [manager.id])).id });
    expect(later.status).toBe(201);
    // The manager then asks for a cleaning buffer: the waiting request would run into the next session.
    expect((await managerApi.patch(`/api/instruments/${cell.id}`, { cleaningBufferMinutes: 30 })).status).toBe(200);
    expect((await managerApi.post(`/api/bookings/${req.body.booking.id}/approve`)).status).toBe(409);
  });

  it("declines with a reason that the member receives", async () => {
    const cell = await trainedInstrument({ requiresApproval: true });
    const req = await book(memberApi, [cell.id], dec(10, "14:00"), dec(10, "15:00"));
    expect((await managerApi.post(`/api/bookings/${req.body.booking.id}/decline`, {})).status).toBe(400);
    const d = await managerApi.post(`/api/bookings/${req.body.booking.id}/decline`, { reason: "The film of the micro-hole is being replaced" });
    expect(d.status).toBe(200);
    expect(d.body.booking).toMatchObject({ status: "declined", declineReason: "The film of the micro-hole is being replaced" });
    // A declined request frees the slot.
    expect((await book(otherApi, [cell.id], dec(10, "14:00"), dec(10, "15:00"))).status).toBe(201);
  });

  it("refuses approval to a member", async () => {
    const cell = await trainedInstrument({ requiresApproval: true });
    const req = await book(memberApi, [cell.id], dec(11, "10:00"), dec(11, "11:00"));
    expect((await otherApi.post(`/api/bookings/${req.body.booking.id}/approve`)).status).toBe(403);
  });
});

describe("GET /api/bookings", () => {
  it("shows a member others' bookings as busy blocks without personal details, and managers everything", async () => {
    const cell = await trainedInstrument();
    const mine = await book(memberApi, [cell.id], dec(14, "10:00"), dec(14, "11:00"));
    const theirs = await book(otherApi, [cell.id], dec(14, "12:00"), dec(14, "13:00"));
    const q = `/api/bookings?instrumentId=${cell.id}&from=${encodeURIComponent(dec(14, "00:00"))}&to=${encodeURIComponent(dec(15, "00:00"))}`;
    const seen = await memberApi.get(q);
    expect(seen.status).toBe(200);
    expect(seen.body.total).toBe(2);
    const own = seen.body.items.find((b: { id: number }) => b.id === mine.body.booking.id);
    const busy = seen.body.items.find((b: { id: number }) => b.id === theirs.body.booking.id);
    expect(own).toMatchObject({ mine: true, busy: false, purpose: expect.any(String) });
    expect(busy).toEqual({ id: theirs.body.booking.id, status: "confirmed", instrumentIds: [cell.id], start: theirs.body.booking.start, end: theirs.body.booking.end, busy: true, mine: false });
    const all = await managerApi.get(q);
    expect(all.body.items.find((b: { id: number }) => b.id === theirs.body.booking.id)).toMatchObject({ userName: "Otto Other", busy: false });
  });

  it("finds a moved booking in one instrument's window at its new time only, and checks overlaps there", async () => {
    // One instrument's window reads the times copied onto booking_instruments; a move must carry them.
    const cell = await trainedInstrument({ cleaningBufferMinutes: 30 });
    const pot = await trainedInstrument({ kind: "potentiostat" });
    const b = await book(memberApi, [pot.id, cell.id], dec(16, "10:00"), dec(16, "11:00"));
    expect(b.status).toBe(201);
    const window = (id: number, day: number) =>
      memberApi.get(`/api/bookings?instrumentId=${id}&from=${encodeURIComponent(dec(day, "00:00"))}&to=${encodeURIComponent(dec(day + 1, "00:00"))}`);
    expect((await window(cell.id, 16)).body.items.map((x: { id: number }) => x.id)).toEqual([b.body.booking.id]);
    const moved = await memberApi.patch(`/api/bookings/${b.body.booking.id}`, { start: dec(17, "14:00"), end: dec(17, "15:00") });
    expect(moved.status).toBe(200);
    for (const id of [pot.id, cell.id]) {
      expect((await window(id, 16)).body.total).toBe(0);
      const seen = await window(id, 17);
      expect(seen.body.items).toHaveLength(1);
      expect(seen.body.items[0]).toMatchObject({ id: b.body.booking.id, start: "2026-12-17T18:00:00.000Z", end: "2026-12-17T19:00:00.000Z", instrumentIds: [pot.id, cell.id].sort((x, y) => x - y) });
    }
    // The old slot is free, the new one holds its cleaning buffer.
    expect((await book(otherApi, [cell.id], dec(16, "10:00"), dec(16, "11:00"))).status).toBe(201);
    expect((await book(otherApi, [cell.id], dec(17, "15:15"), dec(17, "16:00"))).status).toBe(409);
    // Cancelled and declined bookings stay in the window (as their state says) but hold nothing.
    await memberApi.post(`/api/bookings/${b.body.booking.id}/cancel`);
    expect((await window(cell.id, 17)).body.items[0]).toMatchObject({ id: b.body.booking.id, status: "cancelled" });
    expect((await book(otherApi, [cell.id], dec(17, "14:00"), dec(17, "15:00"))).status).toBe(201);
  });

  it("answers 400 without a window unless asking for one's own bookings", async () => {
    expect((await memberApi.get("/api/bookings")).status).toBe(400);
    expect((await memberApi.get("/api/bookings?mine=true")).status).toBe(200);
  });
});

describe("cancel, move, check-in, check-out and no-show", () => {
  it("lets the owner cancel before the start, flags a late cancellation, and refuses others", async () => {
    const cell = await trainedInstrument();
    const early = await book(memberApi, [cell.id], dec(9, "10:00"), dec(9, "11:00"));
    const late = await book(memberApi, [cell.id], dec(3, "10:00"), dec(3, "11:00"));
    expect((await otherApi.post(`/api/bookings/${early.body.booking.id}/cancel`)).status).toBe(403);
    const c1 = await memberApi.post(`/api/bookings/${early.body.booking.id}/cancel`);
    expect(c1.body.booking).toMatchObject({ status: "cancelled", lateCancel: false });
    // 23 hours before the start, inside the default 24-hour window.
    const c2 = await memberApi.post(`/api/bookings/${late.body.booking.id}/cancel`);
    expect(c2.body.booking).toMatchObject({ status: "cancelled", lateCancel: true });
  });

  it("lets the manager cancel anyone's booking with a reason", async () => {
    const cell = await trainedInstrument();
    const b = await book(memberApi, [cell.id], dec(9, "13:00"), dec(9, "14:00"));
    expect((await managerApi.post(`/api/bookings/${b.body.booking.id}/cancel`, {})).status).toBe(422);
    const c = await managerApi.post(`/api/bookings/${b.body.booking.id}/cancel`, { reason: "Potentiostat recalibration" });
    expect(c.status).toBe(200);
    expect(c.body.booking.cancelReason).toBe("Potentiostat recalibration");
  });

  it("moves the owner's booking after re-checking everything", async () => {
    const cell = await trainedInstrument({ cleaningBufferMinutes: 30 });
    const b = await book(memberApi, [cell.id], dec(15, "10:00"), dec(15, "11:00"));
    await book(otherApi, [cell.id], dec(15, "13:00"), dec(15, "14:00"));
    const id = b.body.booking.id;
    expect((await memberApi.patch(`/api/bookings/${id}`, { start: dec(15, "12:00"), end: dec(15, "13:00") })).status).toBe(409);
    expect((await memberApi.patch(`/api/bookings/${id}`, { start: dec(15, "17:00"), end: dec(15, "19:00") })).status).toBe(422);
    expect((await otherApi.patch(`/api/bookings/${id}`, { start: dec(15, "11:00"), end: dec(15, "12:00") })).status).toBe(403);
    const ok = await memberApi.patch(`/api/bookings/${id}`, { start: dec(15, "11:00"), end: dec(15, "12:30") });
    expect(ok.status).toBe(200);
    expect(ok.body.booking).toMatchObject({ start: "2026-12-15T15:00:00.000Z", end: "2026-12-15T16:30:00.000Z" });
  });

  it("records check-in and check-out times, and the manager records a no-show", async () => {
    const cell = await trainedInstrument();
    const used = await book(memberApi, [cell.id], dec(16, "10:00"), dec(16, "11:00"));
    const missed = await book(memberApi, [cell.id], dec(16, "13:00"), dec(16, "14:00"));
    const id = used.body.booking.id;
    expect((await memberApi.post(`/api/bookings/${id}/check-in`)).status).toBe(422);
    t.clock.set("2026-12-16T14:05:00.000Z");
    try {
      expect((await otherApi.post(`/api/bookings/${id}/check-in`)).status).toBe(403);
      const inn = await memberApi.post(`/api/bookings/${id}/check-in`);
      expect(inn.body.booking).toMatchObject({ status: "in_progress", checkedInAt: "2026-12-16T14:05:00.000Z" });
      t.clock.set("2026-12-16T14:50:00.000Z");
      const out = await memberApi.post(`/api/bookings/${id}/check-out`);
      expect(out.body.booking).toMatchObject({ status: "completed", checkedOutAt: "2026-12-16T14:50:00.000Z" });
      expect((await managerApi.post(`/api/bookings/${missed.body.booking.id}/no-show`)).status).toBe(422);
      t.clock.set("2026-12-16T17:40:00.000Z");
      const ns = await managerApi.post(`/api/bookings/${missed.body.booking.id}/no-show`);
      expect(ns.body.booking.status).toBe("no_show");
    } finally {
      t.clock.set("2026-12-02T15:00:00.000Z");
    }
  });
});
