import { describe, expect, it } from "vitest";
import type { BookableHours } from "@shared/domain/booking-rules";
import { monthRange, utilisation } from "@shared/domain/utilisation";

// America/Halifax offsets from the IANA tz database: ADT UTC−03:00, AST UTC−04:00; the
// November 2026 change is on Sunday 2026-11-01 at 02:00 local, the March one on 2026-03-08.
const TZ = "America/Halifax";
const d = (iso: string) => new Date(iso);
const day = [{ from: "09:00", to: "17:00" }];
const weekdays: BookableHours = { mon: day, tue: day, wed: day, thu: day, fri: day };
const early = [{ from: "00:00", to: "04:00" }];

describe("monthRange", () => {
  it("runs from local midnight on the 1st to local midnight on the next 1st", () => {
    const { monthStart, monthEnd } = monthRange("2026-11", TZ);
    expect(monthStart.toISOString()).toBe("2026-11-01T03:00:00.000Z"); // 00:00 ADT
    expect(monthEnd.toISOString()).toBe("2026-12-01T04:00:00.000Z"); // 00:00 AST
  });

  it("refuses a malformed period", () => {
    expect(() => monthRange("2026-13", TZ)).toThrow(RangeError);
  });
});

describe("utilisation", () => {
  const november = monthRange("2026-11", TZ);

  it("sums weekday windows over the month's local days", () => {
    // November 2026 starts on a Sunday: Mondays 2, 9, 16, 23, 30 (5); Tue–Fri 4 each (16).
    // 21 weekdays × 8 h = 168 h.
    expect(utilisation({ ...november, tz: TZ, bookableHours: weekdays, bookings: [] }).bookableHours).toBe(168);
  });

  it("gives the fall-back Sunday's 00:00–04:00 window five real hours", () => {
    // Sundays 1, 8, 15, 22, 29. On the 1st, 00:00 ADT (03:00Z) to 04:00 AST (08:00Z) is 5 h;
    // the other four are 4 h each: 5 + 4 × 4 = 21 h.
    expect(utilisation({ ...november, tz: TZ, bookableHours: { sun: early }, bookings: [] }).bookableHours).toBe(21);
  });

  it("gives the spring-forward Sunday's 00:00–04:00 window three real hours", () => {
    // March 2026 Sundays: 1, 8, 15, 22, 29. On the 8th, 00:00 AST (04:00Z) to 04:00 ADT (07:00Z)
    // is 3 h; the other four are 4 h each: 3 + 4 × 4 = 19 h.
    const march = monthRange("2026-03", TZ);
    expect(utilisation({ ...march, tz: TZ, bookableHours: { sun: early }, bookings: [] }).bookableHours).toBe(19);
  });

  it("counts booked and used time by status, clipped to the month", () => {
    const result = utilisation({
      ...november,
      tz: TZ,
      bookableHours: weekdays,
      bookings: [
        // 4 h booked; used 09:10–12:40 = 3.5 h.
        { start: d("2026-11-02T09:00-04:00"), end: d("2026-11-02T13:00-04:00"), status: "confirmed",
          checkedInAt: d("2026-11-02T09:10-04:00"), checkedOutAt: d("2026-11-02T12:40-04:00") },
        // 8 h booked, 8 h used.
        { start: d("2026-11-03T09:00-04:00"), end: d("2026-11-03T17:00-04:00"), status: "completed",
          checkedInAt: d("2026-11-03T09:00-04:00"), checkedOutAt: d("2026-11-03T17:00-04:00") },
        // A no-show: 2 h booked, nothing used.
        { start: d("2026-11-04T10:00-04:00"), end: d("2026-11-04T12:00-04:00"), status: "no_show" },
        // Cancelled, requested and declined time is not booked.
        { start: d("2026-11-05T09:00-04:00"), end: d("2026-11-05T17:00-04:00"), status: "cancelled" },
        { start: d("2026-11-06T09:00-04:00"), end: d("2026-11-06T10:00-04:00"), status: "requested" },
        { start: d("2026-11-06T10:00-04:00"), end: d("2026-11-06T11:00-04:00"), status: "declined" },
        // Still running: 2 h booked, no check-out yet so nothing used.
        { start: d("2026-11-30T09:00-04:00"), end: d("2026-11-30T11:00-04:00"), status: "in_progress",
          checkedInAt: d("2026-11-30T09:00-04:00") },
        // After-hours into December: only 20:00–24:00 on the 30th (4 h) is in November.
        { start: d("2026-11-30T20:00-04:00"), end: d("2026-12-01T02:00-04:00"), status: "confirmed" },
      ],
    });
    // booked = 4 + 8 + 2 + 2 + 4 = 20 h; used = 3.5 + 8 = 11.5 h; bookable = 168 h.
    expect(result.bookableHours).toBe(168);
    expect(result.bookedHours).toBe(20);
    expect(result.usedHours).toBe(11.5);
    expect(result.bookedPct).toBeCloseTo((20 / 168) * 100, 10); // 11.90 %
    expect(result.usedPct).toBeCloseTo((11.5 / 168) * 100, 10); // 6.85 %
  });

  it("counts overlapping used time once", () => {
    // A late check-out (until 11:15) overlaps the next person's 11:00 check-in:
    // 09:00–12:00 is 3 h, not 3.25 h.
    const result = utilisation({
      ...november,
      tz: TZ,
      bookableHours: weekdays,
      bookings: [
        { start: d("2026-11-02T09:00-04:00"), end: d("2026-11-02T11:00-04:00"), status: "completed",
          checkedInAt: d("2026-11-02T09:00-04:00"), checkedOutAt: d("2026-11-02T11:15-04:00") },
        { start: d("2026-11-02T11:00-04:00"), end: d("2026-11-02T12:00-04:00"), status: "completed",
          checkedInAt: d("2026-11-02T11:00-04:00"), checkedOutAt: d("2026-11-02T12:00-04:00") },
      ],
    });
    expect(result.usedHours).toBe(3);
  });

  it("gives no percentage when nothing was bookable", () => {
    const result = utilisation({ ...november, tz: TZ, bookableHours: {}, bookings: [] });
    expect(result).toEqual({ bookableHours: 0, bookedHours: 0, usedHours: 0, bookedPct: null, usedPct: null });
  });
});
