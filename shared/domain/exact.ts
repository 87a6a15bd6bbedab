/**
 * Exact numbers for the figures people check by hand: amounts left in a container, quantities
 * and unit prices on charge lines. A value is a fraction of two BigInts, always reduced, with a
 * positive denominator, so 0.1 + 0.2 is 3/10 and 25 mL − 0.025 L is 0.
 *
 * Decimal text and JavaScript numbers are read by their decimal digits: the number 0.1 is read
 * as one tenth (its shortest decimal form, which is what the person typed), not as the binary
 * float nearest to it. Rounding is explicit and happens only where a function says so.
 */

export interface Exact {
  /** Numerator; carries the sign. */
  readonly n: bigint;
  /** Denominator; always above zero. */
  readonly d: bigint;
}

function gcd(a: bigint, b: bigint): bigint {
  let x = a < 0n ? -a : a;
  let y = b < 0n ? -b : b;
  while (y !== 0n) [x, y] = [y, x % y];
  return x;
}

/** n ÷ d, reduced. Throws RangeError for a zero denominator. */
export function fraction(n: bigint | number, d: bigint | number = 1n): Exact {
  let num = BigInt(n);
  let den = BigInt(d);
  if (den === 0n) throw new RangeError("Division by zero");
  if (den < 0n) {
    num = -num;
    den = -den;
  }
  const g = gcd(num, den);
  return g > 1n ? { n: num / g, d: den / g } : { n: num, d: den };
}

export const ZERO: Exact = fraction(0n);
export const ONE: Exact = fraction(1n);

export function pow10(exponent: number): bigint {
  if (!Number.isSafeInteger(exponent) || exponent < 0) throw new RangeError(`pow10 needs a whole exponent ≥ 0, got ${exponent}`);
  return 10n ** BigInt(exponent);
}

/** The fraction for value × 10^exponent (exponent may be negative). */
export function scaleByPowerOfTen(value: Exact, exponent: number): Exact {
  return exponent >= 0 ? fraction(value.n * pow10(exponent), value.d) : fraction(value.n, value.d * pow10(-exponent));
}

const DECIMAL = /^([+-])?(\d+)?(?:\.(\d*))?(?:[eE]([+-]?\d+))?$/;
const RATIO = /^([+-]?\d+)\/(\d+)$/;

/**
 * Reads "12.5", "-0.025", "2.5e-7", "1/6" or a finite number (by its shortest decimal text,
 * so 0.1 is exactly one tenth). Throws RangeError for anything else.
 */
export function exact(value: string | number | bigint | Exact): Exact {
  if (typeof value === "object") return fraction(value.n, value.d);
  if (typeof value === "bigint") return fraction(value);
  if (typeof value === "number") {
    if (!Number.isFinite(value)) throw new RangeError(`${value} is not a finite number`);
    return exact(String(value));
  }
  const text = value.trim();
  const ratio = RATIO.exec(text);
  if (ratio) return fraction(BigInt(ratio[1]), BigInt(ratio[2]));
  const m = DECIMAL.exec(text);
  if (!m || (m[2] === undefined && (m[3] === undefined || m[3] === ""))) throw new RangeError(`"${value}" is not a number`);
  const whole = m[2] ?? "0";
  const frac = m[3] ?? "";
  const digits = BigInt(whole + frac) * (m[1] === "-" ? -1n : 1n);
  const exponent = Number(m[4] ?? "0") - frac.length;
  if (!Number.isSafeInteger(exponent) || Math.abs(exponent) > 400) throw new RangeError(`"${value}" is out of range`);
  return scaleByPowerOfTen(fraction(digits), exponent);
}

export const add = (a: Exact, b: Exact): Exact => fraction(a.n * b.d + b.n * a.d, a.d * b.d);
export const subtract = (a: Exact, b: Exact): Exact => fraction(a.n * b.d - b.n * a.d, a.d * b.d);
export const multiply = (a: Exact, b: Exact): Exact => fraction(a.n * b.n, a.d * b.d);
export function divide(a: Exact, b: Exact): Exact {
  if (b.n === 0n) throw new RangeError("Division by zero");
  return fraction(a.n * b.d, a.d * b.n);
}
export const negate = (a: Exact): Exact => fraction(-a.n, a.d);
export const isZero = (a: Exact): boolean => a.n === 0n;

/** −1, 0 or 1 as a is below, equal to or above b. */
export function compare(a: Exact, b: Exact): -1 | 0 | 1 {
  const left = a.n * b.d;
  const right = b.n * a.d;
  return left < right ? -1 : left > right ? 1 : 0;
}

export function sum(values: readonly Exact[]): Exact {
  return values.reduce(add, ZERO);
}

export type RoundingRule = "half_away_from_zero" | "half_even" | "down" | "up";

/**
 * The whole number nearest to the value under the rule: "half_away_from_zero" (2.5 → 3,
 * −2.5 → −3), "half_even" (2.5 → 2, 3.5 → 4), "down" (towards zero) or "up" (away from zero).
 */
export function roundToInteger(value: Exact, rule: RoundingRule = "half_away_from_zero"): bigint {
  const negative = value.n < 0n;
  const n = negative ? -value.n : value.n;
  const q = n / value.d;
  const r = n % value.d;
  let out = q;
  if (r !== 0n) {
    if (rule === "up") out = q + 1n;
    else if (rule === "half_away_from_zero") out = 2n * r >= value.d ? q + 1n : q;
    else if (rule === "half_even") out = 2n * r > value.d || (2n * r === value.d && q % 2n === 1n) ? q + 1n : q;
  }
  return negative ? -out : out;
}

/** The value rounded to `places` decimals, as an exact fraction. */
export function roundToPlaces(value: Exact, places: number, rule: RoundingRule = "half_away_from_zero"): Exact {
  return scaleByPowerOfTen(fraction(roundToInteger(scaleByPowerOfTen(value, places), rule)), -places);
}

/** Decimals needed to write the value exactly, or null when its decimal expansion never ends (1/3). */
export function terminatingPlaces(value: Exact): number | null {
  let d = value.d;
  let twos = 0;
  let fives = 0;
  while (d % 2n === 0n) {
    d /= 2n;
    twos++;
  }
  while (d % 5n === 0n) {
    d /= 5n;
    fives++;
  }
  return d === 1n ? Math.max(twos, fives) : null;
}

function fixed(value: Exact, places: number): string {
  const scaled = roundToInteger(scaleByPowerOfTen(value, places));
  const negative = scaled < 0n;
  const digits = (negative ? -scaled : scaled).toString().padStart(places + 1, "0");
  const body = places === 0 ? digits : `${digits.slice(0, -places)}.${digits.slice(-places)}`;
  return negative ? `-${body}` : body;
}

/**
 * Decimal text: with `places`, rounded half away from zero to that many decimals ("0.17");
 * without, the exact value ("0.025", "-3") — or, for a value with no finite decimal form,
 * the reduced fraction ("1/6"), so the text always reads back as the same number.
 */
export function toDecimalString(value: Exact, places?: number): string {
  if (places !== undefined) return fixed(value, places);
  const exactPlaces = terminatingPlaces(value);
  return exactPlaces === null ? `${value.n}/${value.d}` : fixed(value, exactPlaces);
}

/** The nearest JavaScript number (for storage in a REAL column or for display). */
export function toNumber(value: Exact): number {
  const places = terminatingPlaces(value);
  // A terminating decimal parses to the float nearest to it, which is the best a float can do.
  if (places !== null && places <= 400) return Number(fixed(value, places));
  // Otherwise 17 significant digits are more than a float holds.
  const magnitude = value.n === 0n ? 0 : (value.n < 0n ? -value.n : value.n).toString().length - value.d.toString().length;
  return Number(fixed(value, Math.max(0, 17 - magnitude)));
}
