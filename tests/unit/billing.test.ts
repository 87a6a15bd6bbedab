import { describe, expect, it } from "vitest";
import {
  type BillableBooking,
  type BillingPolicy,
  type RateEntry,
  NoRateError,
  applyMonthlyCap,
  billableMinutes,
  billableTime,
  consumableCharge,
  priceBooking,
  priceSession,
  rateFor,
  statementTotal,
  validateRateTable,
} from "@shared/domain/billing";
import {
  allocateProportionally,
  centsToDecimalString,
  formatMoney,
  multiplyRate,
  scaleCents,
  sumCents,
} from "@shared/domain/money";

// America/Halifax offsets (IANA tz database): ADT UTC−03:00 until 2026-11-01 02:00 local, AST UTC−04:00 after.
const TZ = "America/Halifax";
const d = (iso: string) => new Date(iso);

const policy: BillingPolicy = {
  roundingIncrementMinutes: 15,
  minimumMinutes: 30,
  noShowShare: 0.5,
  lateCancelShare: 0.25,
  cancellationWindowMinutes: 24 * 60,
};

function session(start: string, end: string, extra: Partial<BillableBooking> = {}): BillableBooking {
  return { start: d(start), end: d(end), status: "completed", ...extra };
}

describe("multiplyRate", () => {
  it("charges rate × minutes ÷ 60", () => {
    // $45.00/h for 75 min: 4500 × 75 / 60 = 5625 cents exactly.
    expect(multiplyRate(4500, 75)).toBe(5625);
  });

  it("rounds half a cent away from zero, not to even", () => {
    // 150 c/h × 1 min = 2.5 c → 3 (banker's rounding would give 2); 90 c/h × 1 min = 1.5 c → 2.
    expect(multiplyRate(150, 1)).toBe(3);
    expect(multiplyRate(90, 1)).toBe(2);
    // −30 c/h × 1 min = −0.5 c → −1 (away from zero, a credit rounds like a charge).
    expect(multiplyRate(-30, 1)).toBe(-1);
    // 4001 c/h × 1 min = 66.683 c → 67; 4000 c/h × 1 min = 66.667 c → 67; 3970 × 1 = 66.17 → 66.
    expect([multiplyRate(4001, 1), multiplyRate(4000, 1), multiplyRate(3970, 1)]).toEqual([67, 67, 66]);
  });

  it("refuses fractional cents or minutes", () => {
    expect(() => multiplyRate(4500.5, 60)).toThrow(RangeError);
    expect(() => multiplyRate(4500, 60.5)).toThrow(RangeError);
  });
});

describe("scaleCents", () => {
  it("applies a decimal factor exactly and rounds half away from zero", () => {
    // 4255 × 1.1 = 4680.5 → 4681 (floating point alone would give 4680.499…).
    expect(scaleCents(4255, 1.1)).toBe(4681);
    expect(scaleCents(4400, 1.5)).toBe(6600);
  });
});

describe("money helpers", () => {
  it("formats cents as Canadian dollars", () => {
    expect(formatMoney(123456)).toBe("$1,234.56");
    expect(formatMoney(-5)).toBe("-$0.05");
  });

  it("writes plain decimals for journal files", () => {
    expect([centsToDecimalString(123456), centsToDecimalString(-5), centsToDecimalString(0)]).toEqual(["1234.56", "-0.05", "0.00"]);
  });

  it("sums whole cents and refuses fractions", () => {
    expect(sumCents([1050, 2599, -100])).toBe(3549);
    expect(() => sumCents([10, 0.5])).toThrow(RangeError);
  });

  it("allocates an amount so the parts add up exactly", () => {
    // 100 over three equal weights: 33.33 each → floors 33, 33, 33 and the odd cent to the first.
    expect(allocateProportionally(100, [1, 1, 1])).toEqual([34, 33, 33]);
    // 1000 over 2:1 → 666.67 and 333.33 → 667 and 333.
    expect(allocateProportionally(1000, [2, 1])).toEqual([667, 333]);
    expect(allocateProportionally(-1000, [2, 1])).toEqual([-667, -333]);
  });
});

describe("billableMinutes", () => {
  it("rounds 61 minutes up to 75 with a 15-minute increment", () => {
    // Checked in 09:00, out 10:01: 61 min; ceil(61 / 15) = 5 increments × 15 = 75 min.
    const b = session("2026-05-04T09:00-03:00", "2026-05-04T11:00-03:00", {
      checkedInAt: d("2026-05-04T09:00-03:00"),
      checkedOutAt: d("2026-05-04T10:01-03:00"),
    });
    expect(billableMinutes({ booking: b, policy })).toBe(75);
  });

  it("leaves an exact multiple of the increment alone and drops stray seconds", () => {
    // 09:00:00 → 10:00:45 is 60 min 45 s; seconds are dropped: 60 min = 4 × 15.
    const b = session("2026-05-04T09:00-03:00", "2026-05-04T11:00-03:00", {
      checkedInAt: d("2026-05-04T09:00:00-03:00"),
      checkedOutAt: d("2026-05-04T10:00:45-03:00"),
    });
    expect(billableMinutes({ booking: b, policy })).toBe(60);
  });

  it("bills checked-in time rather than booked time when both check-in and check-out exist", () => {
    // Booked 09:00–12:00 (180 min) but used 09:20–10:35 = 75 min = 5 × 15.
    const b = session("2026-05-04T09:00-03:00", "2026-05-04T12:00-03:00", {
      checkedInAt: d("2026-05-04T09:20-03:00"),
      checkedOutAt: d("2026-05-04T10:35-03:00"),
    });
    expect(billableTime({ booking: b, policy })).toMatchObject({ basis: "checked_in", rawMinutes: 75, minutes: 75 });
  });

  it("bills booked time when there is no check-out, and never the cleaning buffer", () => {
    // Booked 09:00–11:00 = 120 min; the instrument's buffer after 11:00 is not part of the booking.
    const b = session("2026-05-04T09:00-03:00", "2026-05-04T11:00-03:00", { checkedInAt: d("2026-05-04T09:00-03:00") });
    expect(billableTime({ booking: b, policy })).toMatchObject({ basis: "booked", minutes: 120 });
  });

  it("raises a short session to the minimum charge", () => {
    // Used 10 min → rounded up to 15 → below the 30-min minimum → 30.
    const b = session("2026-05-04T09:00-03:00", "2026-05-04T10:00-03:00", {
      checkedInAt: d("2026-05-04T09:00-03:00"),
      checkedOutAt: d("2026-05-04T09:10-03:00"),
    });
    expect(billableTime({ booking: b, policy })).toMatchObject({ rawMinutes: 10, minutes: 30, minimumApplied: true });
  });

  it("bills a no-show half of the booked minutes", () => {
    // Booked 3 h = 180 min × 0.5 = 90 min (already a multiple of 15).
    const b = session("2026-05-04T09:00-03:00", "2026-05-04T12:00-03:00", { status: "no_show" });
    expect(billableTime({ booking: b, policy })).toMatchObject({ basis: "no_show", minutes: 90 });
  });

  it("rounds a no-show's share up to the increment but does not apply the minimum to it", () => {
    // Booked 20 min × 0.5 = 10 min → rounded up to 15; the 30-min minimum is for sessions that ran.
    const b = session("2026-05-04T09:00-03:00", "2026-05-04T09:20-03:00", { status: "no_show" });
    expect(billableTime({ booking: b, policy })).toMatchObject({ minutes: 15, minimumApplied: false });
  });

  it("bills a late cancellation a quarter of the booked minutes", () => {
    // Cancelled 2 h before the start, inside the 24 h window: 120 min × 0.25 = 30 min.
    const b = session("2026-05-04T09:00-03:00", "2026-05-04T11:00-03:00", {
      status: "cancelled",
      cancelledAt: d("2026-05-04T07:00-03:00"),
    });
    expect(billableTime({ booking: b, policy })).toMatchObject({ basis: "late_cancel", minutes: 30 });
  });

  it("bills nothing for a cancellation made in good time", () => {
    // Cancelled 2 days ahead, outside the 24 h window.
    const b = session("2026-05-04T09:00-03:00", "2026-05-04T11:00-03:00", {
      status: "cancelled",
      cancelledAt: d("2026-05-02T09:00-03:00"),
    });
    expect(billableTime({ booking: b, policy })).toMatchObject({ basis: "not_billed", minutes: 0 });
  });

  it("takes a share exactly (0.55 × 100 min is 55, not 56)", () => {
    // In binary floating point 100 × 0.55 = 55.00000000000001, whose ceiling would be 56.
    const exact = { ...policy, roundingIncrementMinutes: 1, noShowShare: 0.55 };
    const b = session("2026-05-04T09:00-03:00", "2026-05-04T10:40-03:00", { status: "no_show" });
    expect(billableMinutes({ booking: b, policy: exact })).toBe(55);
  });

  it("bills nothing for requested or declined bookings", () => {
    for (const status of ["requested", "declined"] as const) {
      expect(billableMinutes({ booking: session("2026-05-04T09:00-03:00", "2026-05-04T11:00-03:00", { status }), policy })).toBe(0);
    }
  });

  it("bills real elapsed minutes across the 2026-11-01 DST change", () => {
    // 00:00 ADT (03:00Z) to 04:00 AST (08:00Z): 5 real hours = 300 min, not the 240 the wall clock shows.
    const b = session("2026-11-01T00:00-03:00", "2026-11-01T04:00-04:00");
    expect(billableMinutes({ booking: b, policy })).toBe(300);
  });

  it("refuses a policy with a share above 1", () => {
    const b = session("2026-05-04T09:00-03:00", "2026-05-04T10:00-03:00");
    expect(() => billableMinutes({ booking: b, policy: { ...policy, noShowShare: 1.5 } })).toThrow(RangeError);
  });
});

// A small rate schedule. Kind-wide internal potentiostat rate $40.00/h until 2026-07-01, then
// $44.00/h; potentiostat 7 has its own $52.00/h in March and April; commercial $90.00/h.
const rates: RateEntry[] = [
  { id: "r1", instrumentKind: "potentiostat", customerClass: "internal", hourlyRateCents: 4000,
    effectiveFrom: d("2026-01-01T00:00-04:00"), effectiveTo: d("2026-07-01T00:00-03:00") },
  { id: "r2", instrumentKind: "potentiostat", customerClass: "internal", hourlyRateCents: 4400,
    effectiveFrom: d("2026-07-01T00:00-03:00"), effectiveTo: null },
  { id: "r3", instrumentId: 7, customerClass: "internal", hourlyRateCents: 5200,
    effectiveFrom: d("2026-03-01T00:00-04:00"), effectiveTo: d("2026-05-01T00:00-03:00") },
  { id: "r4", instrumentKind: "potentiostat", customerClass: "commercial", hourlyRateCents: 9000,
    effectiveFrom: d("2026-01-01T00:00-04:00"), effectiveTo: null },
];
const pot7 = { rates, instrumentId: 7, instrumentKind: "potentiostat" as const, customerClass: "internal" as const };

describe("rateFor", () => {
  const idAt = (iso: string, over: Partial<Parameters<typeof rateFor>[0]> = {}) => rateFor({ ...pot7, at: d(iso), ...over })?.id ?? null;

  it("uses the kind-wide rate when the instrument has none of its own", () => expect(idAt("2026-02-15T12:00Z")).toBe("r1"));
  it("prefers the instrument's own rate while it is in effect", () => expect(idAt("2026-04-01T12:00Z")).toBe("r3"));
  it("treats effectiveTo as exclusive", () => expect(idAt("2026-05-01T03:00Z")).toBe("r1"));
  it("treats effectiveFrom as inclusive", () => expect(idAt("2026-07-01T03:00Z")).toBe("r2"));
  it("does not give one instrument's rate to another", () => expect(idAt("2026-04-01T12:00Z", { instrumentId: 8 })).toBe("r1"));
  it("looks up the customer's class", () => expect(idAt("2026-04-01T12:00Z", { customerClass: "commercial" })).toBe("r4"));
  it("finds nothing before the schedule starts", () => expect(idAt("2025-12-31T12:00Z")).toBeNull());
  it("finds nothing for another kind", () => expect(idAt("2026-04-01T12:00Z", { instrumentId: 20, instrumentKind: "interface_cell" })).toBeNull());
});

describe("validateRateTable", () => {
  it("accepts the sample schedule, where one rate ends exactly when the next begins", () => {
    expect(validateRateTable(rates)).toEqual([]);
  });

  it("finds two rates for the same kind and class whose periods overlap", () => {
    const overlapping: RateEntry = { ...rates[1], id: "r5", effectiveFrom: d("2026-06-01T00:00-03:00") };
    const problems = validateRateTable([...rates, overlapping]);
    // r5 (June onwards) overlaps r1 (until July) and r2 (July onwards).
    expect(problems.map((p) => [p.code, p.path])).toEqual([
      ["overlap", "rates.4.effectiveFrom"],
      ["overlap", "rates.4.effectiveFrom"],
    ]);
  });

  it("does not mix classes, or instrument rates with kind rates", () => {
    const other: RateEntry = { ...rates[0], customerClass: "external_academic" };
    expect(validateRateTable([rates[0], other, rates[2]])).toEqual([]);
  });

  it("flags a rate with no target, a negative amount and dates in the wrong order", () => {
    const bad: RateEntry = { customerClass: "internal", hourlyRateCents: -1,
      effectiveFrom: d("2026-05-01T00:00Z"), effectiveTo: d("2026-04-01T00:00Z") };
    expect(validateRateTable([bad]).map((p) => p.code)).toEqual(["no_scope", "bad_rate", "bad_dates"]);
  });
});

describe("priceSession", () => {
  it("splits a session at a rate change inside it", () => {
    // 2026-06-30 22:00 to 2026-07-01 02:00 ADT on potentiostat 8: the kind rate goes from
    // $40.00 to $44.00 at midnight. 120 min × 4000 / 60 = 8000; 120 min × 4400 / 60 = 8800.
    const lines = priceSession({ ...pot7, instrumentId: 8, start: d("2026-06-30T22:00-03:00"), end: d("2026-07-01T02:00-03:00"), billableMinutes: 240 });
    expect(lines.map((l) => [l.rateId, l.minutes, l.hourlyRateCents, l.amountCents])).toEqual([
      ["r1", 120, 4000, 8000],
      ["r2", 120, 4400, 8800],
    ]);
    expect(statementTotal(lines)).toBe(16800);
  });

  it("spreads rounded-up minutes over the pieces in proportion to their length", () => {
    // Used 23:00–00:01 across the July rate change: 61 min → billed 75.
    // Pieces 60 and 1 real min: 75 × 60/61 = 73.77 and 75 × 1/61 = 1.23 → 73 + 1, and the
    // leftover minute goes to the larger remainder (0.77): 74 and 1.
    // 74 × 4000 / 60 = 4933.33 → 4933; 1 × 4400 / 60 = 73.33 → 73; total 5006.
    const { time, lines } = priceBooking({
      ...pot7,
      instrumentId: 8,
      policy,
      booking: session("2026-06-30T23:00-03:00", "2026-07-01T01:00-03:00", {
        checkedInAt: d("2026-06-30T23:00-03:00"),
        checkedOutAt: d("2026-07-01T00:01-03:00"),
      }),
    });
    expect(time.minutes).toBe(75);
    expect(lines.map((l) => [l.minutes, l.amountCents])).toEqual([[74, 4933], [1, 73]]);
    expect(statementTotal(lines)).toBe(5006);
  });

  it("bills a booking across the 2026-11-01 DST change by real elapsed minutes", () => {
    // 00:00 ADT to 04:00 AST is 300 real minutes; 300 × 4400 / 60 = 22000 cents ($220.00).
    const { lines } = priceBooking({ ...pot7, policy, booking: session("2026-11-01T00:00-03:00", "2026-11-01T04:00-04:00") });
    expect(lines.map((l) => [l.minutes, l.amountCents])).toEqual([[300, 22000]]);
  });

  it("applies an after-hours factor outside the local bookable hours", () => {
    // Monday 2026-11-02 16:00–20:00 AST with bookable hours 08:00–18:00 and a factor of 1.5:
    // 120 min × 4400 / 60 = 8800; 120 min × (4400 × 1.5 = 6600) / 60 = 13200; total 22000.
    const office = [{ from: "08:00", to: "18:00" }];
    const lines = priceSession({
      ...pot7,
      start: d("2026-11-02T16:00-04:00"),
      end: d("2026-11-02T20:00-04:00"),
      billableMinutes: 240,
      afterHours: { tz: TZ, bookableHours: { mon: office }, factor: 1.5 },
    });
    expect(lines.map((l) => [l.afterHours, l.minutes, l.hourlyRateCents, l.amountCents])).toEqual([
      [false, 120, 4400, 8800],
      [true, 120, 6600, 13200],
    ]);
    expect(statementTotal(lines)).toBe(22000);
  });

  it("prices a no-show's share at the rate of the booked time", () => {
    // Booked 09:00–12:00 on 2026-04-06 (potentiostat 7, own rate $52.00/h): 180 × 0.5 = 90 min;
    // 90 × 5200 / 60 = 7800.
    const { lines } = priceBooking({ ...pot7, policy, booking: session("2026-04-06T09:00-03:00", "2026-04-06T12:00-03:00", { status: "no_show" }) });
    expect(lines.map((l) => [l.rateId, l.minutes, l.amountCents])).toEqual([["r3", 90, 7800]]);
  });

  it("throws NoRateError when part of the session has no rate", () => {
    expect(() =>
      priceSession({ ...pot7, start: d("2025-12-31T23:00-04:00"), end: d("2026-01-01T01:00-04:00"), billableMinutes: 120 }),
    ).toThrow(NoRateError);
  });

  it("gives no lines for zero billable minutes", () => {
    expect(priceSession({ ...pot7, start: d("2026-05-04T09:00-03:00"), end: d("2026-05-04T10:00-03:00"), billableMinutes: 0 })).toEqual([]);
  });
});

describe("consumableCharge", () => {
  it("charges quantity × unit cost plus the mark-up", () => {
    // 12.5 mL of electrolyte at 84 c/mL = 1050 c; 10 % mark-up = 105 c; total 1155 c.
    expect(consumableCharge({ quantityUsed: 12.5, unitCostCents: 84, markupPercent: 10 })).toEqual({
      costCents: 1050,
      markupCents: 105,
      amountCents: 1155,
    });
  });

  it("rounds cost and total to the cent, half away from zero", () => {
    // 0.3 g at 1999 c/g = 599.7 c → 600; × 1.075 = 644.6775 c → 645; mark-up shown = 645 − 600 = 45.
    expect(consumableCharge({ quantityUsed: 0.3, unitCostCents: 1999, markupPercent: 7.5 })).toEqual({
      costCents: 600,
      markupCents: 45,
      amountCents: 645,
    });
  });

  it("charges at cost without a mark-up", () => {
    // 3 vials at 250 c = 750 c.
    expect(consumableCharge({ quantityUsed: 3, unitCostCents: 250 }).amountCents).toBe(750);
  });
});

describe("applyMonthlyCap", () => {
  const lines = [{ amountCents: 30000 }, { amountCents: 25000 }];

  it("adds one credit that brings the total down to the cap", () => {
    // 30000 + 25000 = 55000 > 50000: credit −5000, total 50000.
    const capped = applyMonthlyCap(lines, 50000);
    expect(capped[2]).toEqual({ kind: "cap_credit", description: "Monthly cap", amountCents: -5000 });
    expect(statementTotal(capped)).toBe(50000);
  });

  it("leaves lines under the cap, or with no cap, unchanged", () => {
    expect(applyMonthlyCap(lines, 60000)).toEqual(lines);
    expect(applyMonthlyCap(lines, null)).toEqual(lines);
  });
});

describe("statementTotal", () => {
  it("is the sum of the printed line amounts, so the statement reconciles to the cent", () => {
    // Three separate 1-minute sessions at $40.00/h: each 4000 / 60 = 66.67 → 67 c.
    // The statement shows three lines of 67 c, so its total is 201 c, not 3 × 66.67 = 200 c.
    const oneMinute = (hh: string) =>
      priceSession({ ...pot7, instrumentId: 8, start: d(`2026-02-02T${hh}:00-04:00`), end: d(`2026-02-02T${hh}:01-04:00`), billableMinutes: 1 });
    const lines = [...oneMinute("09"), ...oneMinute("10"), ...oneMinute("11")];
    expect(lines.map((l) => l.amountCents)).toEqual([67, 67, 67]);
    expect(statementTotal(lines)).toBe(201);
  });

  it("adds session, consumable and credit lines of a month", () => {
    // 16800 (rate-change session) + 22000 (DST night) + 1155 (electrolyte) − 5000 (credit) = 34955.
    const total = statementTotal([{ amountCents: 16800 }, { amountCents: 22000 }, { amountCents: 1155 }, { amountCents: -5000 }]);
    expect(total).toBe(34955);
    expect(formatMoney(total)).toBe("$349.55");
  });
});
