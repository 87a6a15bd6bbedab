import { describe, expect, it } from "vitest";
import { weeklyOccurrences } from "@shared/domain/recurrence";

// America/Halifax offsets from the IANA tz database: ADT UTC−03:00 until 2026-11-01 02:00
// local, AST UTC−04:00 after; ADT again from 2026-03-08 02:00 local (→ 03:00).
const TZ = "America/Halifax";
const iso = (occ: { start: Date; end: Date }) => [occ.start.toISOString(), occ.end.toISOString()];

describe("weeklyOccurrences", () => {
  it("repeats at 10:00 local across the November change, so UTC moves from 13:00 to 14:00", () => {
    const occ = weeklyOccurrences({
      start: new Date("2026-10-22T10:00:00-03:00"),
      end: new Date("2026-10-22T13:00:00-03:00"),
      weeks: 3,
      tz: TZ,
    });
    expect(occ.map(iso)).toEqual([
      ["2026-10-22T13:00:00.000Z", "2026-10-22T16:00:00.000Z"], // Thu 10:00–13:00 ADT
      ["2026-10-29T13:00:00.000Z", "2026-10-29T16:00:00.000Z"], // Thu 10:00–13:00 ADT
      ["2026-11-05T14:00:00.000Z", "2026-11-05T17:00:00.000Z"], // Thu 10:00–13:00 AST
    ]);
    expect(occ.map((o) => o.index)).toEqual([0, 1, 2]);
  });

  it("repeats at 10:00 local across the March change, so UTC moves from 14:00 to 13:00", () => {
    const occ = weeklyOccurrences({
      start: new Date("2026-03-05T10:00:00-04:00"),
      end: new Date("2026-03-05T11:30:00-04:00"),
      weeks: 2,
      tz: TZ,
    });
    expect(occ.map(iso)).toEqual([
      ["2026-03-05T14:00:00.000Z", "2026-03-05T15:30:00.000Z"],
      ["2026-03-12T13:00:00.000Z", "2026-03-12T14:30:00.000Z"],
    ]);
  });

  it("keeps a night session's real length when the change falls inside it (RFC 5545 exact duration, from memory)", () => {
    // Saturday 2026-10-24 23:00 ADT to Sunday 04:00 ADT is 5 real hours (02:00Z to 07:00Z).
    // A week later 23:00 ADT is 2026-11-01T02:00Z; five real hours on is 07:00Z = 03:00 AST.
    const occ = weeklyOccurrences({
      start: new Date("2026-10-24T23:00:00-03:00"),
      end: new Date("2026-10-25T04:00:00-03:00"),
      weeks: 2,
      tz: TZ,
    });
    expect(occ.map(iso)[1]).toEqual(["2026-11-01T02:00:00.000Z", "2026-11-01T07:00:00.000Z"]);
  });

  it("moves a start that falls in the spring-forward gap one hour on (RFC 5545 §3.3.5, from memory)", () => {
    // 02:30 on 2026-03-08 does not exist in Halifax; read with the offset before the gap
    // (−04:00) it is 06:30Z, which the clocks show as 03:30 ADT.
    const occ = weeklyOccurrences({
      start: new Date("2026-03-01T02:30:00-04:00"),
      end: new Date("2026-03-01T03:30:00-04:00"),
      weeks: 2,
      tz: TZ,
    });
    expect(occ[1].start.toISOString()).toBe("2026-03-08T06:30:00.000Z");
  });

  it("gives a single occurrence for one week", () => {
    const start = new Date("2026-05-04T09:00:00-03:00");
    const end = new Date("2026-05-04T10:00:00-03:00");
    expect(weeklyOccurrences({ start, end, weeks: 1, tz: TZ })).toEqual([{ index: 0, start, end }]);
  });

  it("refuses zero weeks, fractional weeks, an empty session and an unknown zone", () => {
    const start = new Date("2026-05-04T09:00:00-03:00");
    const end = new Date("2026-05-04T10:00:00-03:00");
    expect(() => weeklyOccurrences({ start, end, weeks: 0, tz: TZ })).toThrow(RangeError);
    expect(() => weeklyOccurrences({ start, end, weeks: 2.5, tz: TZ })).toThrow(RangeError);
    expect(() => weeklyOccurrences({ start, end: start, weeks: 2, tz: TZ })).toThrow(RangeError);
    expect(() => weeklyOccurrences({ start, end, weeks: 2, tz: "Atlantic/Nowhere" })).toThrow(RangeError);
  });
});
