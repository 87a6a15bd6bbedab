import { describe, expect, it } from "vitest";
import {
  type BookableHours,
  type BookingRules,
  type TrainingRecord,
  bookableWindows,
  checkBookingRules,
  parseClock,
  trainingState,
  validateBookableHours,
} from "@shared/domain/booking-rules";

// Offsets for America/Halifax from the IANA tz database: AST is UTC−04:00, ADT is UTC−03:00;
// in 2026 ADT runs from 2026-03-08 02:00 local to 2026-11-01 02:00 local.
const TZ = "America/Halifax";
const d = (iso: string) => new Date(iso);
const office = [{ from: "08:00", to: "18:00" }];
const weekdays: BookableHours = { mon: office, tue: office, wed: office, thu: office, fri: office };
const trained: TrainingRecord = { expiresAt: null };
const base: BookingRules = { minLeadMinutes: 60, maxLengthMinutes: 480, bookableHours: weekdays, trainingRequired: true };
// Monday 2026-05-04 in ADT; "now" is the Friday before.
const now = d("2026-05-01T12:00:00-03:00");

function check(start: string, end: string, over: Partial<Parameters<typeof checkBookingRules>[0]> = {}) {
  return checkBookingRules({ start: d(start), end: d(end), now, tz: TZ, rules: base, training: trained, ...over });
}
const codes = (v: { code: string }[]) => v.map((x) => x.code);

describe("checkBookingRules", () => {
  it("accepts a weekday booking inside the bookable hours by a trained person", () => {
    expect(check("2026-05-04T09:00:00-03:00", "2026-05-04T12:00:00-03:00")).toEqual([]);
  });

  it("reports an end before the start and nothing else", () => {
    expect(codes(check("2026-05-04T12:00:00-03:00", "2026-05-04T09:00:00-03:00"))).toEqual(["end_before_start"]);
  });

  it("reports a booking of no length", () => {
    expect(codes(check("2026-05-04T12:00:00-03:00", "2026-05-04T12:00:00-03:00"))).toEqual(["zero_length"]);
  });

  it("reports a start in the past", () => {
    const v = check("2026-05-04T09:00:00-03:00", "2026-05-04T10:00:00-03:00", { now: d("2026-05-04T09:30:00-03:00") });
    expect(codes(v)).toEqual(["in_past"]);
    expect(v[0].path).toBe("start");
  });

  it("enforces the minimum lead time to the minute", () => {
    const later = { now: d("2026-05-04T08:00:00-03:00") };
    expect(codes(check("2026-05-04T08:59:00-03:00", "2026-05-04T10:00:00-03:00", later))).toEqual(["lead_time"]);
    expect(check("2026-05-04T09:00:00-03:00", "2026-05-04T10:00:00-03:00", later)).toEqual([]);
  });

  it("allows exactly the maximum length and refuses one minute more", () => {
    expect(check("2026-05-04T08:00:00-03:00", "2026-05-04T16:00:00-03:00")).toEqual([]);
    expect(codes(check("2026-05-04T08:00:00-03:00", "2026-05-04T16:01:00-03:00"))).toEqual(["too_long"]);
  });

  it("refuses a booking that runs past the end of the bookable window", () => {
    const v = check("2026-05-04T17:00:00-03:00", "2026-05-04T18:30:00-03:00");
    expect(codes(v)).toEqual(["outside_bookable_hours"]);
    expect(v[0].message).toContain("08:00–18:00");
  });

  it("says a day without windows is not bookable", () => {
    const v = check("2026-05-09T09:00:00-03:00", "2026-05-09T10:00:00-03:00"); // a Saturday
    expect(v).toEqual([{ code: "outside_bookable_hours", path: "start", message: "Saturdays are not bookable on this instrument" }]);
  });

  it("requires the booking to lie within one window, not across a lunch break", () => {
    const split: BookableHours = { mon: [{ from: "08:00", to: "12:00" }, { from: "13:00", to: "18:00" }] };
    const rules = { ...base, bookableHours: split };
    expect(codes(check("2026-05-04T11:00:00-03:00", "2026-05-04T14:00:00-03:00", { rules }))).toEqual(["outside_bookable_hours"]);
    expect(check("2026-05-04T13:00:00-03:00", "2026-05-04T18:00:00-03:00", { rules })).toEqual([]);
  });

  it("refuses a booking across midnight even on an instrument open at all hours", () => {
    const rules = { ...base, bookableHours: undefined, afterHoursAllowed: true };
    expect(codes(check("2026-05-04T22:00:00-03:00", "2026-05-05T02:00:00-03:00", { rules }))).toEqual(["spans_midnight"]);
  });

  it("lets a booking end exactly at midnight", () => {
    const rules = { ...base, bookableHours: undefined };
    expect(check("2026-05-04T20:00:00-03:00", "2026-05-05T00:00:00-03:00", { rules })).toEqual([]);
  });

  describe("after-hours work", () => {
    const night = ["2026-05-04T20:00:00-03:00", "2026-05-05T02:00:00-03:00"] as const;
    const endorsed: TrainingRecord = { expiresAt: null, afterHours: true };

    it("is allowed, across midnight, for an endorsed person on an instrument that allows it", () => {
      expect(check(...night, { rules: { ...base, afterHoursAllowed: true }, training: endorsed })).toEqual([]);
    });

    it("is refused when the instrument does not allow it", () => {
      expect(codes(check(...night, { rules: { ...base, afterHoursAllowed: false }, training: endorsed }))).toEqual(["spans_midnight"]);
    });

    it("is refused to a person without the endorsement", () => {
      expect(codes(check(...night, { rules: { ...base, afterHoursAllowed: true } }))).toEqual(["spans_midnight"]);
    });

    it("is refused when the endorsed record has been revoked", () => {
      const revoked = { ...endorsed, revoked: true };
      expect(codes(check(...night, { rules: { ...base, afterHoursAllowed: true }, training: revoked }))).toEqual([
        "spans_midnight",
        "training_missing",
      ]);
    });
  });

  describe("training", () => {
    const slot = ["2026-05-04T09:00:00-03:00", "2026-05-04T12:00:00-03:00"] as const;

    it("is missing when the person has no record", () => {
      const v = check(...slot, { training: null });
      expect(v).toEqual([{ code: "training_missing", path: "training", message: "You need current training on this instrument" }]);
    });

    it("must still be valid at the booked end, not only at the start", () => {
      const lapsesMidSession = { expiresAt: d("2026-05-04T11:00:00-03:00") };
      expect(codes(check(...slot, { training: lapsesMidSession }))).toEqual(["training_expired"]);
    });

    it("covers a booking that ends before it expires", () => {
      expect(check(...slot, { training: { expiresAt: d("2026-05-04T12:01:00-03:00") } })).toEqual([]);
    });

    it("is not checked on an instrument that does not require it", () => {
      expect(check(...slot, { training: null, rules: { ...base, trainingRequired: false } })).toEqual([]);
    });
  });

  it("lists every broken rule at once", () => {
    const v = check("2026-04-30T07:00:00-03:00", "2026-04-30T19:00:00-03:00", { training: null });
    expect(codes(v)).toEqual(["in_past", "too_long", "outside_bookable_hours", "training_missing"]);
  });

  it("reports an unknown time zone instead of throwing", () => {
    expect(codes(check("2026-05-04T09:00:00-03:00", "2026-05-04T10:00:00-03:00", { tz: "Atlantic/Nowhere" }))).toEqual([
      "invalid_time_zone",
    ]);
  });

  it("reports an unreadable time instead of throwing", () => {
    expect(codes(check("not a date", "2026-05-04T10:00:00-03:00"))).toEqual(["invalid_time"]);
  });
});

describe("checkBookingRules across the DST changes in America/Halifax", () => {
  const open = { ...base, bookableHours: undefined, minLeadMinutes: 0 };
  const early = { now: d("2026-01-01T00:00:00Z") };

  it("counts 00:00–04:00 local on 2026-03-08 as 3 real hours (clocks skip 02:00→03:00)", () => {
    // 00:00 AST = 04:00Z; 04:00 ADT = 07:00Z; 07:00 − 04:00 = 3 h = 180 min.
    const [start, end] = ["2026-03-08T00:00:00-04:00", "2026-03-08T04:00:00-03:00"];
    expect(check(start, end, { ...early, rules: { ...open, maxLengthMinutes: 180 } })).toEqual([]);
    expect(codes(check(start, end, { ...early, rules: { ...open, maxLengthMinutes: 179 } }))).toEqual(["too_long"]);
  });

  it("counts 00:00–04:00 local on 2026-11-01 as 5 real hours (clocks repeat 01:00–02:00)", () => {
    // 00:00 ADT = 03:00Z; 04:00 AST = 08:00Z; 08:00 − 03:00 = 5 h = 300 min.
    const [start, end] = ["2026-11-01T00:00:00-03:00", "2026-11-01T04:00:00-04:00"];
    expect(check(start, end, { ...early, rules: { ...open, maxLengthMinutes: 300 } })).toEqual([]);
    expect(codes(check(start, end, { ...early, rules: { ...open, maxLengthMinutes: 299 } }))).toEqual(["too_long"]);
  });

  it("keeps bookable hours at 08:00 local before and after the spring change", () => {
    const rules = { ...base, minLeadMinutes: 0 };
    // Friday 2026-03-06 (AST): 08:00 local is 12:00Z, so 11:00Z is 07:00 local.
    expect(check("2026-03-06T12:00:00Z", "2026-03-06T13:00:00Z", { ...early, rules })).toEqual([]);
    expect(codes(check("2026-03-06T11:00:00Z", "2026-03-06T12:00:00Z", { ...early, rules }))).toEqual(["outside_bookable_hours"]);
    // Monday 2026-03-09 (ADT): 08:00 local is 11:00Z, so the same UTC hour is now inside.
    expect(check("2026-03-09T11:00:00Z", "2026-03-09T12:00:00Z", { ...early, rules })).toEqual([]);
    // ...and 18:00 local is 21:00Z, so 21:00Z–22:00Z is after closing.
    expect(codes(check("2026-03-09T21:00:00Z", "2026-03-09T22:00:00Z", { ...early, rules }))).toEqual(["outside_bookable_hours"]);
  });

  it("keeps bookable hours at 08:00 local before and after the fall change", () => {
    const rules = { ...base, minLeadMinutes: 0 };
    // Friday 2026-10-30 (ADT): 08:00 local is 11:00Z.
    expect(check("2026-10-30T11:00:00Z", "2026-10-30T12:00:00Z", { ...early, rules })).toEqual([]);
    // Monday 2026-11-02 (AST): 11:00Z is 07:00 local; 08:00 local is 12:00Z.
    expect(codes(check("2026-11-02T11:00:00Z", "2026-11-02T12:00:00Z", { ...early, rules }))).toEqual(["outside_bookable_hours"]);
    expect(check("2026-11-02T12:00:00Z", "2026-11-02T13:00:00Z", { ...early, rules })).toEqual([]);
  });
});

describe("trainingState", () => {
  const at = d("2026-05-04T12:00:00Z");
  const inDays = (n: number) => new Date(at.getTime() + n * 86_400_000);

  it("is none without a record", () => expect(trainingState(null, at)).toBe("none"));
  it("is none for a revoked record", () => expect(trainingState({ expiresAt: null, revoked: true }, at)).toBe("none"));
  it("is current when the record never expires", () => expect(trainingState({ expiresAt: null }, at)).toBe("current"));
  it("is current 31 days before expiry", () => expect(trainingState({ expiresAt: inDays(31) }, at)).toBe("current"));
  it("is expiring exactly 30 days before expiry", () => expect(trainingState({ expiresAt: inDays(30) }, at)).toBe("expiring"));
  it("is expiring one day before expiry", () => expect(trainingState({ expiresAt: inDays(1) }, at)).toBe("expiring"));
  it("is expired at the moment of expiry", () => expect(trainingState({ expiresAt: at }, at)).toBe("expired"));
  it("is expired after expiry", () => expect(trainingState({ expiresAt: inDays(-3) }, at)).toBe("expired"));
});

describe("parseClock", () => {
  it("reads HH:MM and 24:00 as minutes after midnight and rejects the rest", () => {
    expect([parseClock("00:00"), parseClock("08:30"), parseClock("24:00")]).toEqual([0, 510, 1440]);
    expect([parseClock("8:30"), parseClock("24:01"), parseClock("12:60")]).toEqual([null, null, null]);
  });
});

describe("validateBookableHours", () => {
  it("flags malformed, empty and overlapping windows by path", () => {
    const problems = validateBookableHours({
      mon: [{ from: "8:00", to: "12:00" }],
      tue: [{ from: "12:00", to: "09:00" }],
      wed: [{ from: "08:00", to: "12:00" }, { from: "11:00", to: "15:00" }],
      thu: office,
    });
    expect(problems.map((p) => [p.code, p.path])).toEqual([
      ["bad_clock", "bookableHours.mon.0"],
      ["empty_window", "bookableHours.tue.0"],
      ["overlapping_windows", "bookableHours.wed.1"],
    ]);
  });
});

describe("bookableWindows", () => {
  it("gives a 00:00–24:00 window on 2026-03-08 a real length of 23 hours", () => {
    const windows = bookableWindows(
      { start: d("2026-03-08T00:00:00-04:00"), end: d("2026-03-09T00:00:00-03:00") },
      TZ,
      { sun: [{ from: "00:00", to: "24:00" }] },
    );
    expect(windows.reduce((s, w) => s + (w.end - w.start), 0)).toBe(23 * 3_600_000);
  });
});
