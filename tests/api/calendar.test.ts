/**
 * Calendar feeds: the per-person secret feed and a booking's .ics, parsed with the independent
 * ical.js parser and checked against RFC 5545 line and property rules.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import ICAL from "ical.js";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { makeAccount, makeInstrument, train } from "../support/schedule-factories";
import type { User } from "../../server/entities";

let t: TestApp;
let member: User;
let api: ApiClient;
let feedUrl: string;
let bookingIds: number[] = [];

beforeAll(async () => {
  t = await startTestApp();
  member = await makeUser(t.ds, { roles: ["member"], name: "Ilse Interface" });
  const accountId = (await makeAccount(t.ds, [member.id])).id;
  api = new ApiClient(t.url);
  await api.login(member.email, TEST_PASSWORD);
  // A long instrument name and purpose make lines that must be folded.
  const cell = await makeInstrument(t.ds, { name: "Interface cell Ω – water | 1,2-dichloroethane, 1.53 cm², four-electrode, Luggin capillaries both sides" });
  await train(t.ds, member.id, cell.id);
  const r = await api.post("/api/bookings", {
    instrumentIds: [cell.id],
    start: "2026-12-07T10:00:00-04:00",
    end: "2026-12-07T12:30:00-04:00",
    accountId,
    purpose: "Tetrabutylammonium transfer, scan rates 5–100 mV/s; then TPAs⁺ as the reference ion — long purpose for folding",
    repeatWeeks: 2,
  });
  expect(r.status).toBe(201);
  bookingIds = r.body.bookings.map((b: { id: number }) => b.id);
  feedUrl = (await api.get("/api/calendar/me")).body.url;
});
afterAll(async () => {
  await t.close();
});

async function fetchFeed(url: string) {
  const path = new URL(url).pathname;
  const res = await fetch(t.url + path);
  return { status: res.status, type: res.headers.get("content-type") ?? "", bytes: Buffer.from(await res.arrayBuffer()) };
}

/** RFC 5545 §3.1: lines end in CRLF, and no line is longer than 75 octets excluding the CRLF. */
function checkLines(bytes: Buffer) {
  const text = bytes.toString("utf8");
  expect(text.endsWith("\r\n")).toBe(true);
  expect(/[^\r]\n/.test(text)).toBe(false);
  for (const line of text.split("\r\n")) expect(Buffer.byteLength(line, "utf8")).toBeLessThanOrEqual(75);
  return text;
}

describe("GET /api/calendar/:token.ics", () => {
  it("answers text/calendar that ical.js parses, one VEVENT per booking", async () => {
    const feed = await fetchFeed(feedUrl);
    expect(feed.status).toBe(200);
    expect(feed.type).toMatch(/^text\/calendar/);
    const cal = new ICAL.Component(ICAL.parse(feed.bytes.toString("utf8")));
    const events = cal.getAllSubcomponents("vevent");
    expect(events).toHaveLength(2);
    const first = new ICAL.Event(events[0]);
    expect(first.startDate.toJSDate().toISOString()).toBe("2026-12-07T14:00:00.000Z");
    // RFC 5545 §3.6.1: DTEND is exclusive, so it is the booking's end itself, not a minute before.
    expect(first.endDate.toJSDate().toISOString()).toBe("2026-12-07T16:30:00.000Z");
    expect(first.summary).toContain("Interface cell Ω");
    expect(first.description).toContain("scan rates 5–100 mV/s");
  });

  it("follows RFC 5545: CRLF line ends and folding at 75 octets (§3.1), even through multi-byte characters", async () => {
    const text = checkLines((await fetchFeed(feedUrl)).bytes);
    // Some line was long enough to need folding (continuation lines start with one space, §3.1).
    expect(text.split("\r\n").some((l) => l.startsWith(" "))).toBe(true);
    // Unfolding must not split a UTF-8 character: the parsed text has the characters intact.
    expect(text.includes("\uFFFD")).toBe(false);
  });

  it("gives each VEVENT exactly one UID and one DTSTAMP, in UTC (RFC 5545 §3.6.1, §3.8.4.7, §3.8.7.2)", async () => {
    const cal = new ICAL.Component(ICAL.parse((await fetchFeed(feedUrl)).bytes.toString("utf8")));
    const uids = new Set<string>();
    for (const ev of cal.getAllSubcomponents("vevent")) {
      expect(ev.getAllProperties("uid")).toHaveLength(1);
      expect(ev.getAllProperties("dtstamp")).toHaveLength(1);
      const stamp = ev.getFirstProperty("dtstamp")!.getFirstValue() as ICAL.Time;
      expect(stamp.zone?.tzid).toBe("UTC");
      uids.add(String(ev.getFirstPropertyValue("uid")));
    }
    expect(uids.size).toBe(bookingIds.length);
    // RFC 5545 §3.7.3 and §3.7.4: PRODID and VERSION:2.0 once per calendar.
    expect(cal.getFirstPropertyValue("version")).toBe("2.0");
    expect(cal.getAllProperties("prodid")).toHaveLength(1);
  });

  it("answers 404 for an unknown token, and the old URL stops working after rotation", async () => {
    expect((await fetchFeed(`${t.url}/api/calendar/not-a-real-token-at-all.ics`)).status).toBe(404);
    const rotated = await api.post("/api/calendar/me/rotate");
    expect(rotated.status).toBe(200);
    expect(rotated.body.url).not.toBe(feedUrl);
    expect((await fetchFeed(feedUrl)).status).toBe(404);
    expect((await fetchFeed(rotated.body.url)).status).toBe(200);
    feedUrl = rotated.body.url;
  });
});

describe("GET /api/bookings/:id.ics", () => {
  it("downloads one booking for its owner and hides it from others", async () => {
    const r = await api.get(`/api/bookings/${bookingIds[0]}.ics`);
    expect(r.status).toBe(200);
    checkLines(Buffer.from(r.text, "utf8"));
    const cal = new ICAL.Component(ICAL.parse(r.text));
    expect(cal.getAllSubcomponents("vevent")).toHaveLength(1);
    const stranger = await makeUser(t.ds, { roles: ["member"] });
    const s = new ApiClient(t.url);
    await s.login(stranger.email, TEST_PASSWORD);
    expect((await s.get(`/api/bookings/${bookingIds[0]}.ics`)).status).toBe(404);
  });
});

describe("feed times across the facility's daylight-saving change", () => {
  it("writes DTSTART and DTEND in UTC without TZID, so 10:00 Halifax time is 14:00Z before and 13:00Z after 14 March 2027 (RFC 5545 §3.3.5 form 2)", async () => {
    // America/Halifax moves from UTC−4 to UTC−3 on 14 March 2027 (IANA tz database, "northamerica").
    const who = await makeUser(t.ds, { roles: ["member"], name: "Dara Daylight" });
    const accountId = (await makeAccount(t.ds, [who.id])).id;
    const cell = await makeInstrument(t.ds);
    await train(t.ds, who.id, cell.id);
    const client = new ApiClient(t.url);
    await client.login(who.email, TEST_PASSWORD);
    const r = await client.post("/api/bookings", {
      instrumentIds: [cell.id],
      start: "2027-03-08T10:00:00-04:00",
      end: "2027-03-08T11:00:00-04:00",
      accountId,
      purpose: "",
      repeatWeeks: 2,
    });
    expect(r.status).toBe(201);

    const text = checkLines((await fetchFeed((await client.get("/api/calendar/me")).body.url)).bytes);
    const starts = text.split("\r\n").filter((l) => l.startsWith("DTSTART"));
    const ends = text.split("\r\n").filter((l) => l.startsWith("DTEND"));
    // The weekly session keeps its local hour, so its UTC time moves by the hour the clocks change.
    expect(starts).toEqual(["DTSTART:20270308T140000Z", "DTSTART:20270315T130000Z"]);
    expect(ends).toEqual(["DTEND:20270308T150000Z", "DTEND:20270315T140000Z"]);
    // UTC times need no time-zone definition (RFC 5545 §3.6.5 applies only to TZID references).
    expect(text).not.toContain("TZID");
    expect(text).not.toContain("BEGIN:VTIMEZONE");

    const cal = new ICAL.Component(ICAL.parse(text));
    const localHours = cal
      .getAllSubcomponents("vevent")
      .map((e) => new Date(new ICAL.Event(e).startDate.toJSDate()).toLocaleString("en-GB", { timeZone: "America/Halifax", hour: "2-digit", minute: "2-digit" }));
    expect(localHours).toEqual(["10:00", "10:00"]);
  });
});
