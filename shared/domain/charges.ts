/**
 * Charge lines whose figures a finance office can check with a calculator: every line carries
 * its quantity, its unit (h, mL, g, each…) and the price of one unit, and the amount is
 * quantity × unit price rounded ONCE, at the line, to the cent. The mark-up is part of the unit
 * price, so nothing is rounded before it is applied (a usage costing 1.4 ¢ at a 10 % mark-up is
 * 1.54 ¢ → 2 ¢, not 1.4 → 1 → 1.1 → 1 ¢ as when the cost was rounded at the time of use).
 *
 * Quantities and unit prices are exact (exact.ts) and travel as text: a decimal when one
 * exists ("0.25", "13.2"), otherwise a reduced fraction ("1/6" h for ten minutes), so
 * quantity × unit price always reproduces the amount.
 *
 * Rounding rule: halves away from zero, the rule of money.ts (a spreadsheet's ROUND, what a
 * person checking a statement gets; the bias is at most half a cent per line and the break-even
 * review folds any over-recovery into the next period). Statements print CHARGE_ROUNDING_NOTE.
 */
import { type Exact, type RoundingRule, ONE, add, divide, exact, fraction, multiply, roundToInteger, toDecimalString } from "./exact";
import { convertExactAmount, exactValue, toExactAmount } from "./exact-amounts";
import type { Cents } from "./money";
import { UnitError, parseUnit } from "./units";

export const CHARGE_ROUNDING_RULE: RoundingRule = "half_away_from_zero";

/** The sentence statements print under their lines. */
export const CHARGE_ROUNDING_NOTE =
  "Each line's amount is its quantity times its unit price (any mark-up included in the unit price), rounded once to the cent, halves away from zero; the total is the sum of the lines' amounts.";

export type ExactInput = number | string | Exact;

export interface ChargeLineFigures {
  /** Exact decimal text, or a fraction "n/d" where no decimal is exact. */
  quantity: string;
  /** "h", "min", "mL", "g", "each"… */
  unit: string;
  /** Price of one unit in cents, mark-up included; exact decimal text or fraction; may have fractions of a cent. */
  unitPriceCents: string;
  /** quantity × unitPriceCents rounded once to the cent. */
  amountCents: Cents;
}

function readExact(value: ExactInput, what: string): Exact {
  try {
    return exact(value);
  } catch {
    throw new RangeError(`${what} must be a number, got ${String(value)}`);
  }
}

function toCents(value: bigint): Cents {
  const n = Number(value);
  if (!Number.isSafeInteger(n)) throw new RangeError("The amount is too large to represent exactly");
  return n;
}

/** 1 + markupPercent ÷ 100, exactly. */
export function markupFactor(markupPercent: ExactInput = 0): Exact {
  const m = readExact(markupPercent, "markupPercent");
  if (m.n < 0n) throw new RangeError("markupPercent must be zero or more");
  return add(ONE, divide(m, fraction(100n)));
}

/** quantity × unit price rounded once to the cent (halves away from zero). */
export function lineAmountCents(quantity: ExactInput, unitPriceCents: ExactInput): Cents {
  return toCents(roundToInteger(multiply(readExact(quantity, "quantity"), readExact(unitPriceCents, "unitPriceCents")), CHARGE_ROUNDING_RULE));
}

/**
 * A charge line from a quantity, its unit and the price of one unit before any mark-up; the
 * mark-up (percent) is folded into the unit price, and the amount is rounded once.
 */
export function chargeLine(input: { quantity: ExactInput; unit: string; unitPriceCents: ExactInput; markupPercent?: ExactInput }): ChargeLineFigures {
  const quantity = readExact(input.quantity, "quantity");
  const price = multiply(readExact(input.unitPriceCents, "unitPriceCents"), markupFactor(input.markupPercent ?? 0));
  return {
    quantity: toDecimalString(quantity),
    unit: input.unit,
    unitPriceCents: toDecimalString(price),
    amountCents: toCents(roundToInteger(multiply(quantity, price), CHARGE_ROUNDING_RULE)),
  };
}

/** True when the line's quantity × unit price rounds to its amount (a check for statements and tests). */
export function lineReconciles(line: ChargeLineFigures): boolean {
  return lineAmountCents(line.quantity, line.unitPriceCents) === line.amountCents;
}

/**
 * Instrument time: `minutes` billed at an hourly rate, as hours ("0.25" h, or "1/6" h for ten
 * minutes). The amount equals money.ts multiplyRate(hourlyRateCents, minutes).
 */
export function timeChargeLine(minutes: number, hourlyRateCents: ExactInput): ChargeLineFigures {
  if (!Number.isSafeInteger(minutes)) throw new RangeError(`minutes must be a whole number, got ${minutes}`);
  return chargeLine({ quantity: fraction(BigInt(minutes), 60n), unit: "h", unitPriceCents: hourlyRateCents });
}

/** A single-amount line (an adjustment, a correction, a cap credit): 1 each at the amount. */
export function eachChargeLine(amountCents: Cents): ChargeLineFigures {
  if (!Number.isSafeInteger(amountCents)) throw new RangeError(`amountCents must be whole cents, got ${amountCents}`);
  return chargeLine({ quantity: 1, unit: "each", unitPriceCents: amountCents });
}

export interface PricedChemical {
  densityGPerMl: number | null;
  molarMass: number | null;
  /** Price of one costUnit in cents; may be fractional. */
  unitCostCents: number | string | null;
  costUnit: string | null;
}

export interface UsageCost {
  /** The amount used, in the chemical's cost unit (exact; through density or molar mass to 1 nL, 1 µg or 1 nmol). */
  quantity: string;
  unit: string;
  /** Price of one cost unit at the time of use, in cents. */
  unitCostCents: string;
  /** quantity × unit cost, NOT rounded: keep it with the usage and round once on the charge line. */
  costCents: string;
}

/**
 * What a usage costs, unrounded, at the chemical's unit cost: the figures to keep with the usage
 * at the time of use (the price may change before billing). Null when the chemical has no unit
 * cost or the amount cannot be put in its cost unit (a solid priced per g, logged in mL).
 */
export function usageCost(amount: number | string, unit: string, chemical: PricedChemical): UsageCost | null {
  if (chemical.unitCostCents === null || chemical.costUnit === null) return null;
  try {
    const costUnit = parseUnit(chemical.costUnit, "to");
    const used = convertExactAmount(toExactAmount(amount, unit), costUnit, {
      densityGPerMl: chemical.densityGPerMl,
      molarMassGPerMol: chemical.molarMass,
    });
    const quantity = exactValue(used);
    const price = readExact(chemical.unitCostCents, "unitCostCents");
    return {
      quantity: toDecimalString(quantity),
      unit: costUnit,
      unitCostCents: toDecimalString(price),
      costCents: toDecimalString(multiply(quantity, price)),
    };
  } catch (e) {
    if (e instanceof UnitError) return null;
    throw e;
  }
}

/**
 * The charge line for a usage: the quantity in the cost unit at the unit cost × (1 + mark-up),
 * rounded once. Pass the figures kept at the time of use (usageCost).
 */
export function consumableChargeLine(cost: Pick<UsageCost, "quantity" | "unit" | "unitCostCents">, markupPercent: ExactInput = 0): ChargeLineFigures {
  return chargeLine({ quantity: cost.quantity, unit: cost.unit, unitPriceCents: cost.unitCostCents, markupPercent });
}
