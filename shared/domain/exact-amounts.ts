/**
 * Container amounts kept exactly, so that a usage that takes the rest leaves 0 and not
 * 6.9 × 10⁻¹⁸ L. An amount is a whole number of the smallest unit Phasebook keeps for its
 * dimension (its "base unit"), held as a BigInt:
 *
 *   volume: 1 nL (10⁻⁶ mL)   mass: 1 µg (10⁻⁶ g)   amount of substance: 1 nmol (10⁻⁹ mol)
 *
 * Every unit a person may use (units.ts) is a whole power of ten of its base unit, so converting
 * within a dimension (mL ↔ L, g ↔ kg, mmol ↔ mol) is exact both ways, and sums and differences
 * of amounts are exact. Two places round, each once, to the base unit (halves away from zero):
 * - reading a quantity finer than the base unit (0.0004 µL is 0 nL; nobody dispenses it);
 * - crossing dimensions through the density or the molar mass (25 g of 1,2-dichloroethane is
 *   25 ÷ 1.2569 mL = 19 890.206… µL, kept as 19 890 206 nL). The conversion is computed as one
 *   exact fraction from the decimal digits of the density and molar mass, then rounded.
 *
 * A number read from a REAL column is read by its shortest decimal text (0.1 is one tenth), and
 * an amount written back with exactAmountToNumber is the float nearest to its decimal value, so
 * a quantity of up to 15 significant digits goes through a REAL column and back unchanged. An
 * INTEGER column holding `base` (see baseCount) needs no such care.
 */
import {
  type Exact,
  compare as compareExact,
  divide,
  exact,
  fraction,
  multiply,
  roundToInteger,
  scaleByPowerOfTen,
  toDecimalString,
  toNumber,
} from "./exact";
import { type Dimension, type Unit, MAX_DENSITY_G_PER_ML, MAX_QUANTITY, UNITS, UnitError, type UnitErrorField, parseUnit } from "./units";

/** Power of ten of each dimension's base unit relative to g, mL and mol (see units.ts). */
export const BASE_UNITS: Readonly<Record<Dimension, { symbol: string; exponent: number }>> = Object.freeze({
  mass: { symbol: "µg", exponent: -6 },
  volume: { symbol: "nL", exponent: -6 },
  amount: { symbol: "nmol", exponent: -9 },
});

export interface ExactAmount {
  /** The unit the amount is shown in. */
  unit: Unit;
  dimension: Dimension;
  /** Whole number of base units (nL, µg or nmol). */
  base: bigint;
}

function info(unit: Unit) {
  return UNITS.find((u) => u.unit === unit)!;
}

/** Base units in one `unit` (1 L = 10⁹ nL, 1 mg = 10³ µg, 1 mmol = 10⁶ nmol). */
function basePerUnit(unit: Unit): bigint {
  const i = info(unit);
  return 10n ** BigInt(i.exponent - BASE_UNITS[i.dimension].exponent);
}

function readQuantity(value: unknown, field: UnitErrorField, what: string): Exact {
  if (typeof value === "number") {
    if (Number.isNaN(value)) throw new UnitError("invalid_amount", field, `The ${what} must be a number.`);
    if (!Number.isFinite(value)) throw new UnitError("invalid_amount", field, `The ${what} must be a finite number.`);
  }
  if (typeof value !== "number" && typeof value !== "string") throw new UnitError("invalid_amount", field, `The ${what} must be a number.`);
  let q: Exact;
  try {
    q = exact(value);
  } catch {
    throw new UnitError("invalid_amount", field, `The ${what} must be a number (got "${String(value)}").`);
  }
  return q;
}

/** An exact amount from what a person typed or a column held; rounds finer digits to the base unit. */
export function toExactAmount(quantity: number | string, unit: string, field: UnitErrorField = "amount"): ExactAmount {
  const u = parseUnit(unit, field === "amount" ? "from" : field);
  const q = readQuantity(quantity, field, "quantity");
  if (q.n < 0n) throw new UnitError("invalid_amount", field, `The quantity cannot be negative (got ${String(quantity)}).`);
  if (compareExact(q, fraction(MAX_QUANTITY)) > 0) {
    throw new UnitError("invalid_amount", field, `The quantity of ${String(quantity)} is larger than Phasebook accepts (${MAX_QUANTITY}).`);
  }
  return { unit: u, dimension: info(u).dimension, base: roundToInteger(multiply(q, fraction(basePerUnit(u)))) };
}

/** An amount of `base` base units shown in `unit` (an INTEGER column read back). */
export function fromBaseCount(base: bigint | number, unit: string): ExactAmount {
  const u = parseUnit(unit, "to");
  const b = BigInt(base);
  return { unit: u, dimension: info(u).dimension, base: b };
}

/** The whole number of base units as a JavaScript number, for an INTEGER column; throws past 2⁵³. */
export function baseCount(amount: ExactAmount): number {
  const n = Number(amount.base);
  if (!Number.isSafeInteger(n)) throw new RangeError(`${amount.base} base units is too large for a safe integer`);
  return n;
}

/** The amount in its unit (or another unit of the same dimension) as an exact fraction. */
export function exactValue(amount: ExactAmount, unit: string = amount.unit): Exact {
  const u = parseUnit(unit, "to");
  if (info(u).dimension !== amount.dimension) {
    throw new UnitError("unknown_unit", "to", `An amount in ${amount.unit} cannot be shown in ${u} without a conversion.`);
  }
  return fraction(amount.base, basePerUnit(u));
}

/** The amount as a number in its unit (or another unit of its dimension): 0 is exactly 0. */
export function exactAmountToNumber(amount: ExactAmount, unit: string = amount.unit): number {
  return toNumber(exactValue(amount, unit));
}

/** The amount as exact decimal text in its unit ("0.025"), never in exponent form. */
export function exactAmountToString(amount: ExactAmount, unit: string = amount.unit): string {
  return toDecimalString(exactValue(amount, unit));
}

export interface ConversionData {
  densityGPerMl?: number | string | null;
  molarMassGPerMol?: number | string | null;
}

function densityOf(data: ConversionData, from: Unit, to: Unit): Exact {
  if (data.densityGPerMl === undefined || data.densityGPerMl === null) {
    throw new UnitError("needs_density", "densityGPerMl", `Converting ${from} to ${to} needs the density in g/mL. Enter it on the chemical's record.`);
  }
  const d = readQuantity(data.densityGPerMl, "densityGPerMl", "density");
  if (d.n <= 0n) throw new UnitError("invalid_amount", "densityGPerMl", `The density must be above zero (got ${String(data.densityGPerMl)} g/mL).`);
  if (compareExact(d, fraction(MAX_DENSITY_G_PER_ML)) > 0) {
    throw new UnitError("invalid_amount", "densityGPerMl", `The density of ${String(data.densityGPerMl)} is larger than Phasebook accepts (${MAX_DENSITY_G_PER_ML}).`);
  }
  return d;
}

function molarMassOf(data: ConversionData, from: Unit, to: Unit): Exact {
  if (data.molarMassGPerMol === undefined || data.molarMassGPerMol === null) {
    throw new UnitError(
      "needs_molar_mass",
      "molarMassGPerMol",
      `Converting ${from} to ${to} needs the molar mass in g/mol. Enter the formula or the molar mass on the chemical's record.`,
    );
  }
  const m = readQuantity(data.molarMassGPerMol, "molarMassGPerMol", "molar mass");
  if (m.n <= 0n) throw new UnitError("invalid_amount", "molarMassGPerMol", `The molar mass must be above zero (got ${String(data.molarMassGPerMol)} g/mol).`);
  if (compareExact(m, fraction(MAX_QUANTITY)) > 0) {
    throw new UnitError("invalid_amount", "molarMassGPerMol", `The molar mass of ${String(data.molarMassGPerMol)} is larger than Phasebook accepts (${MAX_QUANTITY}).`);
  }
  return m;
}

/**
 * The amount in another unit. Within a dimension this is exact; across dimensions it goes
 * through grams (volume × density, amount × molar mass) as one exact fraction and is rounded
 * once to the target's base unit. Throws UnitError naming what is missing.
 */
export function convertExactAmount(amount: ExactAmount, to: string, data: ConversionData = {}): ExactAmount {
  const target = parseUnit(to, "to");
  const targetDim = info(target).dimension;
  if (targetDim === amount.dimension) return { unit: target, dimension: targetDim, base: amount.base };
  // In the dimension's SI-ish unit: g, mL or mol.
  const inUnit = scaleByPowerOfTen(fraction(amount.base), BASE_UNITS[amount.dimension].exponent);
  let grams: Exact;
  if (amount.dimension === "mass") grams = inUnit;
  else if (amount.dimension === "volume") grams = multiply(inUnit, densityOf(data, amount.unit, target));
  else grams = multiply(inUnit, molarMassOf(data, amount.unit, target));
  let out: Exact;
  if (targetDim === "mass") out = grams;
  else if (targetDim === "volume") out = divide(grams, densityOf(data, amount.unit, target));
  else out = divide(grams, molarMassOf(data, amount.unit, target));
  const base = roundToInteger(scaleByPowerOfTen(out, -BASE_UNITS[targetDim].exponent));
  return { unit: target, dimension: targetDim, base };
}

export interface StockChemicalData {
  densityGPerMl: number | null;
  molarMass: number | null;
}

export interface StockContainerData {
  unit: string;
  kind: string;
  /** mol/L, for prepared solutions. */
  concentrationMolPerL: number | null;
}

/**
 * What a logged amount takes from a container, exactly, in the container's unit: the exact
 * counterpart of stock.ts amountInContainerUnit, with the same rules and refusals (a bottle
 * through density and molar mass; a prepared solution by volume, or by its solute through the
 * concentration, V = n ÷ c, rounded once to 1 nL; never by mass). Throws UnitError.
 */
export function exactAmountInContainerUnit(amount: number | string, unit: string, container: StockContainerData, chemical: StockChemicalData): ExactAmount {
  const typed = readQuantity(amount, "amount", "amount");
  if (typed.n <= 0n) throw new UnitError("invalid_amount", "amount", `The amount must be above zero (got ${String(amount)}).`);
  const taken = toExactAmount(amount, unit);
  if (taken.base === 0n) {
    throw new UnitError("invalid_amount", "amount", `${String(amount)} ${unit} is below the smallest amount Phasebook keeps (1 ${BASE_UNITS[taken.dimension].symbol}).`);
  }
  const target = parseUnit(container.unit, "to");
  if (container.kind === "solution" && container.concentrationMolPerL) {
    if (taken.dimension === "mass") {
      throw new UnitError(
        "needs_density",
        "from",
        "A prepared solution is measured by volume or by the amount of its solute; a mass of solution needs its density, which Phasebook does not keep. Log mL or mmol.",
      );
    }
    if (taken.dimension === "amount") {
      const c = readQuantity(container.concentrationMolPerL, "amount", "concentration");
      if (c.n <= 0n) throw new UnitError("invalid_amount", "amount", "The solution's concentration must be above zero.");
      // V[nL] = n[nmol] ÷ c[mol/L]: 10⁻⁹ mol ÷ (mol/L) = 10⁻⁹ L = 1 nL.
      const nL = roundToInteger(divide(fraction(taken.base), c));
      return convertExactAmount({ unit: "µL", dimension: "volume", base: nL }, target);
    }
    return convertExactAmount(taken, target);
  }
  return convertExactAmount(taken, target, { densityGPerMl: chemical.densityGPerMl, molarMassGPerMol: chemical.molarMass });
}

function sameDimension(a: ExactAmount, b: ExactAmount): void {
  if (a.dimension !== b.dimension) throw new RangeError(`Cannot combine an amount in ${a.unit} with one in ${b.unit}; convert it first.`);
}

/** −1, 0 or 1 as a is less than, equal to or more than b (same dimension). */
export function compareAmounts(a: ExactAmount, b: ExactAmount): -1 | 0 | 1 {
  sameDimension(a, b);
  return a.base < b.base ? -1 : a.base > b.base ? 1 : 0;
}

/** True when `take` is more than what is `left`: the usage must be refused. Equal is allowed. */
export function isMoreThanLeft(take: ExactAmount, left: ExactAmount): boolean {
  return compareAmounts(take, left) > 0;
}

/** left − take in left's unit; exactly zero when take is all that is left. Throws when take is more. */
export function subtractAmount(left: ExactAmount, take: ExactAmount): ExactAmount {
  sameDimension(left, take);
  if (take.base > left.base) throw new RangeError(`Cannot take ${exactAmountToString(take)} ${take.unit} from ${exactAmountToString(left)} ${left.unit}.`);
  return { unit: left.unit, dimension: left.dimension, base: left.base - take.base };
}

/** a + b in a's unit (waste poured into a carboy). */
export function addAmounts(a: ExactAmount, b: ExactAmount): ExactAmount {
  sameDimension(a, b);
  return { unit: a.unit, dimension: a.dimension, base: a.base + b.base };
}

export interface Withdrawal {
  /** What the usage takes, in the container's unit. */
  take: ExactAmount;
  /** False when the usage asks for more than is left; nothing is taken then. */
  enough: boolean;
  /** What is left afterwards (unchanged when not enough). */
  left: ExactAmount;
  /** True when exactly nothing is left: the container becomes "empty". */
  empty: boolean;
}

/**
 * One usage against a container, for the server's check-and-decrement: `quantity` is what the
 * container holds now (in container.unit, as stored), `amount` and `unit` what the person logged.
 * Write exactAmountToNumber(result.left) (or baseCount) back, and set the state from `empty`.
 */
export function withdrawExact(
  quantity: number | string,
  amount: number | string,
  unit: string,
  container: StockContainerData,
  chemical: StockChemicalData,
): Withdrawal {
  const now = toExactAmount(quantity, container.unit);
  const take = exactAmountInContainerUnit(amount, unit, container, chemical);
  if (isMoreThanLeft(take, now)) return { take, enough: false, left: now, empty: now.base === 0n };
  const left = subtractAmount(now, take);
  return { take, enough: true, left, empty: left.base === 0n };
}
