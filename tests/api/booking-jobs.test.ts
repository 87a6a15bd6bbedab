/** The Schedule's timed jobs, each run as a function with a fixed clock. */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { makeAccount, makeInstrument, train } from "../support/schedule-factories";
import { markNoShows, sendBookingReminders, sendTrainingExpiryNotices } from "../../server/modules/schedule";
import type { User } from "../../server/entities";

let t: TestApp;
let member: User;
let api: ApiClient;
let accountId: number;

beforeAll(async () => {
  t = await startTestApp();
  member = await makeUser(t.ds, { roles: ["member"] });
  accountId = (await makeAccount(t.ds, [member.id])).id;
  api = new ApiClient(t.url);
  await api.login(member.email, TEST_PASSWORD);
});
afterAll(async () => {
  await t.close();
});

async function bookOn(start: string, end: string) {
  const cell = await makeInstrument(t.ds);
  await train(t.ds, member.id, cell.id);
  const r = await api.post("/api/bookings", { instrumentIds: [cell.id], start, end, accountId, purpose: "" });
  expect(r.status).toBe(201);
  return r.body.booking.id as number;
}

const mailsTo = async (email: string, like: string) =>
  Number((await t.ds.query(`SELECT COUNT(*) n FROM outbound_mail WHERE "to" = ? AND subject LIKE ?`, [email, like]))[0].n);

describe("sendBookingReminders", () => {
  it("reminds once of a booking that starts within the next 24 hours, and not of later ones", async () => {
    const soon = await bookOn("2026-12-03T10:00:00-04:00", "2026-12-03T11:00:00-04:00");
    await bookOn("2026-12-04T10:00:00-04:00", "2026-12-04T11:00:00-04:00");
    const now = new Date("2026-12-02T15:00:00Z");
    expect(await sendBookingReminders(t.ds, now, t.ctx.config)).toBe(1);
    expect(await sendBookingReminders(t.ds, now, t.ctx.config)).toBe(0);
    expect(await mailsTo(member.email, "Reminder:%")).toBe(1);
    const row = await t.ds.query(`SELECT reminderSentAt FROM bookings WHERE id = ?`, [soon]);
    expect(row[0].reminderSentAt).toBe(now.toISOString());
  });
});

describe("markNoShows", () => {
  it("marks a confirmed booking nobody checked in to once the 30-minute grace has passed", async () => {
    const id = await bookOn("2026-12-07T10:00:00-04:00", "2026-12-07T12:00:00-04:00");
    const status = async () => (await t.ds.query(`SELECT status FROM bookings WHERE id = ?`, [id]))[0].status;
    await markNoShows(t.ds, new Date("2026-12-07T14:29:00Z"), t.ctx.config);
    expect(await status()).toBe("confirmed");
    await markNoShows(t.ds, new Date("2026-12-07T14:31:00Z"), t.ctx.config);
    expect(await status()).toBe("no_show");
    expect(await mailsTo(member.email, "Recorded as a no-show%")).toBeGreaterThan(0);
  });

  it("leaves a booking that was checked in", async () => {
    const id = await bookOn("2026-12-08T10:00:00-04:00", "2026-12-08T12:00:00-04:00");
    t.clock.set("2026-12-08T14:10:00Z");
    try {
      expect((await api.post(`/api/bookings/${id}/check-in`)).status).toBe(200);
    } finally {
      t.clock.set("2026-12-02T15:00:00Z");
    }
    await markNoShows(t.ds, new Date("2026-12-08T15:00:00Z"), t.ctx.config);
    expect((await t.ds.query(`SELECT status FROM bookings WHERE id = ?`, [id]))[0].status).toBe("in_progress");
  });
});

describe("sendTrainingExpiryNotices", () => {
  it("tells a person once when a record expires within 30 days, and not about later or revoked ones", async () => {
    const person = await makeUser(t.ds, { roles: ["member"] });
    const i1 = await makeInstrument(t.ds);
    const i2 = await makeInstrument(t.ds);
    const i3 = await makeInstrument(t.ds);
    await train(t.ds, person.id, i1.id, { expiresAt: "2026-12-20T00:00:00.000Z" });
    await train(t.ds, person.id, i2.id, { expiresAt: "2027-02-20T00:00:00.000Z" });
    await train(t.ds, person.id, i3.id, { expiresAt: "2026-12-20T00:00:00.000Z", revokedAt: "2026-11-01T00:00:00.000Z" });
    const now = new Date("2026-12-02T15:00:00Z");
    await sendTrainingExpiryNotices(t.ds, now, t.ctx.config);
    await sendTrainingExpiryNotices(t.ds, now, t.ctx.config);
    const subjects: { subject: string }[] = await t.ds.query(`SELECT subject FROM outbound_mail WHERE "to" = ?`, [person.email]);
    expect(subjects.map((s) => s.subject)).toEqual([`Training on ${i1.name} expires on Sat 19 Dec 2026`]);
  });
});
