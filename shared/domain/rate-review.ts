/**
 * Phasebook's yearly rate review: the break-even hourly rate of a recharge (specialised service)
 * facility. 2 CFR 200.468(b) asks that charges follow actual usage from a rate schedule that
 * does not treat federally funded work differently from other work, including internal use,
 * that rates recover only the aggregate cost (direct plus an allocable share of indirect cost),
 * and that rates are adjusted at least every two years taking in the over- or under-applied
 * costs of earlier periods. Hence:
 *
 *   rate = (total cost − subsidy − carried balance) ÷ projected billable hours
 *
 * where a positive carried balance is a surplus (lowers the rate) and a negative one a deficit
 * (raises it). The rate is rounded half away from zero to the cent, like every amount in
 * money.ts; the at most half a cent per hour it over- or under-recovers shows up in the next
 * review's carried balance.
 *
 * External classes priced at internal × factor are common practice (an institution's policy);
 * the regulation binds only the rate charged to internal and federally funded users.
 */
import type { RuleViolation } from "./booking-rules";
import type { CustomerClass } from "./billing";
import { type Cents, divideRounded, scaleCents } from "./money";

export type CostCategory = "salaries" | "service_contracts" | "depreciation" | "supplies" | "indirect" | "other";

export interface CostLine {
  label: string;
  category: CostCategory;
  amountCents: Cents;
}

export interface BreakEvenInput {
  costLines: readonly CostLine[];
  subsidyCents: Cents;
  /** Positive: surplus carried forward (lowers the rate). Negative: deficit (raises it). */
  carriedBalanceCents: Cents;
  projectedBillableHours: number;
}

export interface BreakEven {
  totalCostCents: Cents;
  costByCategory: Partial<Record<CostCategory, Cents>>;
  subsidyCents: Cents;
  carriedBalanceCents: Cents;
  /** What the rates must bring in: total cost − subsidy − carried balance. */
  recoverableCents: Cents;
  projectedBillableHours: number;
  hourlyRateCents: Cents;
}

export type BreakEvenResult = { ok: true; value: BreakEven } | { ok: false; errors: RuleViolation[] };

function inputErrors(input: BreakEvenInput): RuleViolation[] {
  const errors: RuleViolation[] = [];
  input.costLines.forEach((line, i) => {
    if (!Number.isSafeInteger(line.amountCents) || line.amountCents < 0) {
      errors.push({ code: "bad_amount", path: `costLines.${i}.amountCents`, message: "Give the cost as whole cents, zero or more" });
    }
  });
  if (!Number.isSafeInteger(input.subsidyCents) || input.subsidyCents < 0) {
    errors.push({ code: "bad_amount", path: "subsidyCents", message: "Give the subsidy as whole cents, zero or more" });
  }
  if (!Number.isSafeInteger(input.carriedBalanceCents)) {
    errors.push({ code: "bad_amount", path: "carriedBalanceCents", message: "Give the carried balance as whole cents" });
  }
  // Hours are kept to the hundredth; anything less than that cannot carry a rate.
  if (!Number.isFinite(input.projectedBillableHours) || Math.round(input.projectedBillableHours * 100) <= 0) {
    errors.push({ code: "no_hours", path: "projectedBillableHours", message: "Projected billable hours must be more than zero" });
  }
  return errors;
}

function byCategory(lines: readonly CostLine[]): Partial<Record<CostCategory, Cents>> {
  const totals: Partial<Record<CostCategory, Cents>> = {};
  for (const l of lines) totals[l.category] = (totals[l.category] ?? 0) + l.amountCents;
  return totals;
}

export function breakEvenRate(input: BreakEvenInput): BreakEvenResult {
  const errors = inputErrors(input);
  if (errors.length > 0) return { ok: false, errors };
  const totalCostCents = input.costLines.reduce((sum, l) => sum + l.amountCents, 0);
  const recoverableCents = totalCostCents - input.subsidyCents - input.carriedBalanceCents;
  if (recoverableCents < 0) {
    return {
      ok: false,
      errors: [{ code: "negative_rate", path: "subsidyCents", message: "Subsidy and carried surplus exceed the costs; the rate would be below zero" }],
    };
  }
  const hundredthsOfHours = BigInt(Math.round(input.projectedBillableHours * 100));
  const hourlyRateCents = Number(divideRounded(BigInt(recoverableCents) * 100n, hundredthsOfHours));
  return {
    ok: true,
    value: {
      totalCostCents,
      costByCategory: byCategory(input.costLines),
      subsidyCents: input.subsidyCents,
      carriedBalanceCents: input.carriedBalanceCents,
      recoverableCents,
      projectedBillableHours: input.projectedBillableHours,
      hourlyRateCents,
    },
  };
}

/** Factors over the internal rate for the other classes (common practice, institution's choice). */
export interface ClassFactors {
  external_academic: number;
  commercial: number;
}

/**
 * One hourly rate per customer class; internal is the break-even rate itself, never scaled.
 * A factor below 1 is refused: it would charge outside users less than the internal and
 * federally funded users whose rate the regulation fixes.
 */
export function classRates(internalRateCents: Cents, factors: ClassFactors): Record<CustomerClass, Cents> {
  for (const [name, f] of Object.entries(factors)) {
    if (!Number.isFinite(f) || f < 1) throw new RangeError(`The ${name} factor must be 1 or more, got ${f}`);
  }
  return {
    internal: scaleCents(internalRateCents, 1),
    external_academic: scaleCents(internalRateCents, factors.external_academic),
    commercial: scaleCents(internalRateCents, factors.commercial),
  };
}

/**
 * The balance to carry into the next review: what was carried in, plus what the rates and the
 * subsidy brought in, minus what the service cost. Positive is a surplus.
 */
export function nextCarriedBalance(p: { carriedInCents: Cents; recoveredCents: Cents; subsidyCents: Cents; costCents: Cents }): Cents {
  return p.carriedInCents + p.recoveredCents + p.subsidyCents - p.costCents;
}
