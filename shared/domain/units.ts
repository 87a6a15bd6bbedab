/**
 * Stock quantities and their units. A bottle's contents are kept in one unit (mass, volume or
 * amount of substance); people withdraw in whatever unit suits them, and the two meet here.
 * Crossing dimensions needs the substance's density (mass ↔ volume) or molar mass
 * (mass ↔ amount), or both (volume ↔ amount); without them we refuse rather than guess.
 *
 * Within a dimension the factors are exact powers of ten (SI prefixes), applied by
 * multiplying or dividing by 10ⁿ so that 1 mg is 0.001 g to the last bit.
 */
import { InputRuleError } from "./input-rule-error";

export type Dimension = "mass" | "volume" | "amount";
export type Unit = "mg" | "g" | "kg" | "µL" | "mL" | "L" | "mmol" | "mol";

export interface UnitInfo {
  unit: Unit;
  dimension: Dimension;
  /** Power of ten relative to the dimension's base unit: g, mL or mol. */
  exponent: number;
  /** Name for screens and screen readers. */
  name: string;
}

/** Units offered in the UI, grouped by dimension, smallest first. */
export const UNITS: readonly UnitInfo[] = Object.freeze([
  { unit: "mg", dimension: "mass", exponent: -3, name: "milligram" },
  { unit: "g", dimension: "mass", exponent: 0, name: "gram" },
  { unit: "kg", dimension: "mass", exponent: 3, name: "kilogram" },
  { unit: "µL", dimension: "volume", exponent: -3, name: "microlitre" },
  { unit: "mL", dimension: "volume", exponent: 0, name: "millilitre" },
  { unit: "L", dimension: "volume", exponent: 3, name: "litre" },
  { unit: "mmol", dimension: "amount", exponent: -3, name: "millimole" },
  { unit: "mol", dimension: "amount", exponent: 0, name: "mole" },
] satisfies UnitInfo[]);

/** The largest quantity, density or molar mass Phasebook accepts: anything above is a typo. */
export const MAX_QUANTITY = 1e9;

/**
 * No liquid or solid at lab conditions is denser than about 22.6 g/mL (osmium, from memory);
 * a larger number is almost always kg/m³ typed as g/mL.
 */
export const MAX_DENSITY_G_PER_ML = 25;

export type UnitErrorCode = "unknown_unit" | "needs_density" | "needs_molar_mass" | "invalid_amount";
export type UnitErrorField = "amount" | "from" | "to" | "densityGPerMl" | "molarMassGPerMol";

export class UnitError extends InputRuleError<UnitErrorCode, UnitErrorField> {}

// People type "uL" (no µ key), the Greek mu instead of the micro sign, or a lower-case l.
const ALIASES: Readonly<Record<string, Unit>> = {
  mg: "mg",
  g: "g",
  kg: "kg",
  "µL": "µL",
  "µl": "µL",
  "μL": "µL",
  "μl": "µL",
  uL: "µL",
  ul: "µL",
  mL: "mL",
  ml: "mL",
  L: "L",
  l: "L",
  mmol: "mmol",
  mol: "mol",
};

/** The canonical unit for what a person typed; throws UnitError "unknown_unit". */
export function parseUnit(input: string, field: UnitErrorField = "from"): Unit {
  const key = typeof input === "string" ? input.trim() : "";
  if (Object.hasOwn(ALIASES, key)) return ALIASES[key];
  const offered = UNITS.map((u) => u.unit).join(", ");
  throw new UnitError("unknown_unit", field, `"${String(input)}" is not a unit Phasebook knows. Use one of ${offered}.`);
}

export function isUnit(input: string): boolean {
  return typeof input === "string" && Object.hasOwn(ALIASES, input.trim());
}

function infoOf(unit: Unit): UnitInfo {
  return UNITS.find((u) => u.unit === unit) as UnitInfo;
}

/** Mass, volume or amount; throws UnitError "unknown_unit" for an unknown unit. */
export function unitDimension(unit: string): Dimension {
  return infoOf(parseUnit(unit)).dimension;
}

function scaleByPowerOfTen(value: number, exponent: number): number {
  if (exponent === 0) return value;
  return exponent > 0 ? value * 10 ** exponent : value / 10 ** -exponent;
}

function checkQuantity(value: unknown, field: UnitErrorField, what: string, max = MAX_QUANTITY): number {
  if (typeof value !== "number" || Number.isNaN(value)) {
    throw new UnitError("invalid_amount", field, `The ${what} must be a number.`);
  }
  if (!Number.isFinite(value)) throw new UnitError("invalid_amount", field, `The ${what} must be a finite number.`);
  if (value > max) throw new UnitError("invalid_amount", field, `The ${what} of ${value} is larger than Phasebook accepts (${max}).`);
  return value;
}

function checkAmount(amount: unknown): number {
  const value = checkQuantity(amount, "amount", "quantity");
  if (value < 0) throw new UnitError("invalid_amount", "amount", `The quantity cannot be negative (got ${value}).`);
  return value;
}

function checkDensity(density: number | null | undefined, from: Unit, to: Unit): number {
  if (density === undefined || density === null) {
    throw new UnitError(
      "needs_density",
      "densityGPerMl",
      `Converting ${from} to ${to} needs the density in g/mL. Enter it on the chemical's record.`,
    );
  }
  const value = checkQuantity(density, "densityGPerMl", "density", MAX_DENSITY_G_PER_ML);
  if (value <= 0) throw new UnitError("invalid_amount", "densityGPerMl", `The density must be above zero (got ${value} g/mL).`);
  return value;
}

function checkMolarMass(molarMass: number | null | undefined, from: Unit, to: Unit): number {
  if (molarMass === undefined || molarMass === null) {
    throw new UnitError(
      "needs_molar_mass",
      "molarMassGPerMol",
      `Converting ${from} to ${to} needs the molar mass in g/mol. Enter the formula or the molar mass on the chemical's record.`,
    );
  }
  const value = checkQuantity(molarMass, "molarMassGPerMol", "molar mass");
  if (value <= 0) throw new UnitError("invalid_amount", "molarMassGPerMol", `The molar mass must be above zero (got ${value} g/mol).`);
  return value;
}

export interface ConvertAmountInput {
  amount: number;
  from: string;
  to: string;
  /** Needed when exactly one side is a volume, or volume ↔ amount. */
  densityGPerMl?: number | null;
  /** Needed when one side is an amount of substance and the other is not. */
  molarMassGPerMol?: number | null;
}

/**
 * Converts a quantity between units: within a dimension by SI prefix, mass ↔ volume through
 * the density, mass ↔ amount through the molar mass, volume ↔ amount through both. The result
 * is not rounded; rounding is for display. Throws UnitError.
 */
export function convertAmount(input: ConvertAmountInput): number {
  const amount = checkAmount(input.amount);
  const from = infoOf(parseUnit(input.from, "from"));
  const to = infoOf(parseUnit(input.to, "to"));
  const inBase = scaleByPowerOfTen(amount, from.exponent);
  if (from.dimension === to.dimension) return scaleByPowerOfTen(inBase, -to.exponent);

  // Every cross-dimension route goes through grams, the one unit both others meet.
  let grams: number;
  if (from.dimension === "mass") grams = inBase;
  else if (from.dimension === "volume") grams = inBase * checkDensity(input.densityGPerMl, from.unit, to.unit);
  else grams = inBase * checkMolarMass(input.molarMassGPerMol, from.unit, to.unit);

  let outBase: number;
  if (to.dimension === "mass") outBase = grams;
  else if (to.dimension === "volume") outBase = grams / checkDensity(input.densityGPerMl, from.unit, to.unit);
  else outBase = grams / checkMolarMass(input.molarMassGPerMol, from.unit, to.unit);
  return scaleByPowerOfTen(outBase, -to.exponent);
}
