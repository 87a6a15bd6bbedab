import { describe, expect, it } from "vitest";
import { type CostLine, breakEvenRate, classRates, nextCarriedBalance } from "@shared/domain/rate-review";

// The break-even method of 2 CFR 200.468(b)(2): rates recover only the aggregate cost (direct
// plus allocable indirect), are adjusted at least every two years, and take in the over- or
// under-applied costs of earlier periods:
//   rate = (total cost − subsidy − carried surplus, or + carried deficit) ÷ projected billable hours.

// An invented year of the Liquid Interfaces Core, in cents.
const costLines: CostLine[] = [
  { label: "Technician salary and benefits", category: "salaries", amountCents: 6_800_000 }, // $68,000
  { label: "Potentiostat service contracts", category: "service_contracts", amountCents: 1_250_000 }, // $12,500
  { label: "Depreciation of the potentiostats", category: "depreciation", amountCents: 1_500_000 }, // $15,000
  { label: "Glassware, reference electrodes, gases", category: "supplies", amountCents: 450_000 }, // $4,500
  { label: "Allocable indirect costs", category: "indirect", amountCents: 1_000_000 }, // $10,000
]; // total 11,000,000 c = $110,000

function rateOf(result: ReturnType<typeof breakEvenRate>): number {
  if (!result.ok) throw new Error(`expected a rate, got ${JSON.stringify(result.errors)}`);
  return result.value.hourlyRateCents;
}

describe("breakEvenRate (2 CFR 200.468)", () => {
  it("lowers the rate by a carried surplus", () => {
    // 11,000,000 − 3,000,000 subsidy − 500,000 surplus = 7,500,000 c to recover;
    // 7,500,000 ÷ 1,800 h = 4,166.67 c/h → 4,167 c/h ($41.67).
    const result = breakEvenRate({ costLines, subsidyCents: 3_000_000, carriedBalanceCents: 500_000, projectedBillableHours: 1800 });
    expect(result).toEqual({
      ok: true,
      value: {
        totalCostCents: 11_000_000,
        costByCategory: { salaries: 6_800_000, service_contracts: 1_250_000, depreciation: 1_500_000, supplies: 450_000, indirect: 1_000_000 },
        subsidyCents: 3_000_000,
        carriedBalanceCents: 500_000,
        recoverableCents: 7_500_000,
        projectedBillableHours: 1800,
        hourlyRateCents: 4167,
      },
    });
  });

  it("raises the rate by a carried deficit", () => {
    // 11,000,000 − 3,000,000 + 500,000 deficit = 8,500,000 c; ÷ 1,800 h = 4,722.22 → 4,722 c/h.
    expect(rateOf(breakEvenRate({ costLines, subsidyCents: 3_000_000, carriedBalanceCents: -500_000, projectedBillableHours: 1800 }))).toBe(4722);
  });

  it("accepts fractional hours", () => {
    // 11,000,000 − 10,000,000 = 1,000,000 c; ÷ 1,234.5 h = 810.04 c/h → 810.
    expect(rateOf(breakEvenRate({ costLines, subsidyCents: 10_000_000, carriedBalanceCents: 0, projectedBillableHours: 1234.5 }))).toBe(810);
  });

  it("rounds half a cent away from zero", () => {
    // 1,000 c ÷ 400 h = 2.5 c/h → 3.
    const one = [{ label: "Supplies", category: "supplies" as const, amountCents: 1000 }];
    expect(rateOf(breakEvenRate({ costLines: one, subsidyCents: 0, carriedBalanceCents: 0, projectedBillableHours: 400 }))).toBe(3);
  });

  it("answers errors, not a rate, for zero or negative hours", () => {
    for (const hours of [0, -10, Number.NaN]) {
      const result = breakEvenRate({ costLines, subsidyCents: 0, carriedBalanceCents: 0, projectedBillableHours: hours });
      expect(result).toEqual({
        ok: false,
        errors: [{ code: "no_hours", path: "projectedBillableHours", message: "Projected billable hours must be more than zero" }],
      });
    }
  });

  it("answers an error when subsidy and surplus exceed the costs", () => {
    const result = breakEvenRate({ costLines, subsidyCents: 10_000_000, carriedBalanceCents: 1_500_000, projectedBillableHours: 1800 });
    expect(result.ok ? [] : result.errors.map((e) => e.code)).toEqual(["negative_rate"]);
  });

  it("points at a negative cost line", () => {
    const bad = [...costLines, { label: "Refund", category: "other" as const, amountCents: -100 }];
    const result = breakEvenRate({ costLines: bad, subsidyCents: 0, carriedBalanceCents: 0, projectedBillableHours: 1800 });
    expect(result.ok ? [] : result.errors.map((e) => e.path)).toEqual(["costLines.5.amountCents"]);
  });
});

describe("classRates", () => {
  it("keeps internal at break-even and scales the external classes (common practice)", () => {
    // 4,167 × 1.3 = 5,417.1 → 5,417; 4,167 × 1.8 = 7,500.6 → 7,501.
    expect(classRates(4167, { external_academic: 1.3, commercial: 1.8 })).toEqual({
      internal: 4167,
      external_academic: 5417,
      commercial: 7501,
    });
  });

  it("refuses a factor below 1, which would charge outside users less than internal ones", () => {
    expect(() => classRates(4167, { external_academic: 0.9, commercial: 1.8 })).toThrow(RangeError);
  });
});

describe("nextCarriedBalance", () => {
  it("carries forward what came in minus what the service cost", () => {
    // 500,000 carried in + 7,400,000 recovered + 3,000,000 subsidy − 11,200,000 cost = −300,000 (a deficit).
    expect(nextCarriedBalance({ carriedInCents: 500_000, recoveredCents: 7_400_000, subsidyCents: 3_000_000, costCents: 11_200_000 })).toBe(-300_000);
  });
});
