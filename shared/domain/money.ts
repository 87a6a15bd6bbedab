/**
 * Money in Phasebook: every amount is an integer number of minor units (cents), so statement
 * totals reconcile to the cent. Rounding happens in one place, `divideRounded`, with one rule:
 * round half away from zero ("commercial" rounding). We prefer it to banker's rounding because
 * it is what a person checking a statement with a calculator or a spreadsheet's ROUND gets;
 * its upward bias is at most half a cent per line, and the break-even review folds any
 * over- or under-recovery into the next period's carried balance anyway.
 */

/** Integer amount in minor units (cents for CAD and USD). */
export type Cents = number;

function assertCents(value: number, name: string): void {
  if (!Number.isSafeInteger(value)) throw new RangeError(`${name} must be a whole number of cents, got ${value}`);
}

/**
 * numerator ÷ denominator rounded half away from zero, in exact integer arithmetic
 * (BigInt, so products of rates, minutes and factors never lose precision).
 */
export function divideRounded(numerator: bigint, denominator: bigint): bigint {
  if (denominator === 0n) throw new RangeError("Division by zero");
  const negative = numerator < 0n !== denominator < 0n;
  const n = numerator < 0n ? -numerator : numerator;
  const d = denominator < 0n ? -denominator : denominator;
  const quotient = n / d;
  const rounded = 2n * (n % d) >= d ? quotient + 1n : quotient;
  return negative ? -rounded : rounded;
}

function toSafeNumber(value: bigint, what: string): number {
  const n = Number(value);
  if (!Number.isSafeInteger(n)) throw new RangeError(`${what} is too large to represent exactly`);
  return n;
}

/**
 * A decimal factor (1.5, 0.25, 12.5 %) as an exact fraction over 10 000. Factors in rate sheets
 * never carry more than four decimals; anything finer is rounded to that.
 */
export function factorToBasisPoints(factor: number): bigint {
  if (!Number.isFinite(factor)) throw new RangeError(`Factor must be a finite number, got ${factor}`);
  return BigInt(Math.round(factor * 10_000));
}

/** Charge for `minutes` at an hourly rate: rate × minutes ÷ 60, rounded half away from zero. */
export function multiplyRate(hourlyRateCents: Cents, minutes: number): Cents {
  assertCents(hourlyRateCents, "hourlyRateCents");
  if (!Number.isSafeInteger(minutes)) throw new RangeError(`minutes must be a whole number, got ${minutes}`);
  return toSafeNumber(divideRounded(BigInt(hourlyRateCents) * BigInt(minutes), 60n), "Charge");
}

/** An amount scaled by a decimal factor (an after-hours factor, a class factor), rounded to the cent. */
export function scaleCents(amountCents: Cents, factor: number): Cents {
  assertCents(amountCents, "amountCents");
  return toSafeNumber(divideRounded(BigInt(amountCents) * factorToBasisPoints(factor), 10_000n), "Amount");
}

export function sumCents(values: readonly Cents[]): Cents {
  let total = 0;
  for (const [i, v] of values.entries()) {
    assertCents(v, `values[${i}]`);
    total += v;
  }
  assertCents(total, "total");
  return total;
}

/**
 * Splits `totalCents` over non-negative integer weights so the parts sum exactly to the total
 * (largest-remainder method; ties go to the earlier entry, so the result is reproducible).
 */
export function allocateProportionally(totalCents: Cents, weights: readonly number[]): Cents[] {
  assertCents(totalCents, "totalCents");
  weights.forEach((w, i) => {
    if (!Number.isSafeInteger(w) || w < 0) throw new RangeError(`weights[${i}] must be a non-negative whole number`);
  });
  const weightSum = weights.reduce((a, b) => a + b, 0);
  if (weights.length === 0 || weightSum === 0) {
    if (totalCents === 0) return weights.map(() => 0);
    throw new RangeError("Cannot allocate a non-zero amount over zero weights");
  }
  const sign = totalCents < 0 ? -1n : 1n;
  const total = BigInt(Math.abs(totalCents));
  const W = BigInt(weightSum);
  const floors = weights.map((w) => (total * BigInt(w)) / W);
  const remainders = weights.map((w, i) => ({ i, r: (total * BigInt(w)) % W }));
  let left = total - floors.reduce((a, b) => a + b, 0n);
  remainders.sort((a, b) => (a.r === b.r ? a.i - b.i : a.r > b.r ? -1 : 1));
  for (const { i } of remainders) {
    if (left === 0n) break;
    floors[i] += 1n;
    left -= 1n;
  }
  return floors.map((f) => Number(f * sign));
}

/** "$1,234.56" style text for screens and statements (en-CA conventions unless told). */
export function formatMoney(cents: Cents, currency = "CAD", locale = "en-CA"): string {
  assertCents(cents, "cents");
  return currencyFormat(locale, currency, null).format(cents / 100);
}

const formats = new Map<string, Intl.NumberFormat>();

/**
 * One Intl.NumberFormat per locale, currency and number of decimals (null: the currency's own),
 * kept: making one costs far more than formatting with it, and a statement formats thousands.
 */
export function currencyFormat(locale: string, currency: string, digits: number | null): Intl.NumberFormat {
  const key = `${locale}|${currency}|${digits ?? ""}`;
  let f = formats.get(key);
  if (!f) {
    f = new Intl.NumberFormat(locale, digits === null ? { style: "currency", currency } : { style: "currency", currency, minimumFractionDigits: digits, maximumFractionDigits: digits });
    formats.set(key, f);
  }
  return f;
}

/** "1234.56" / "-0.05": plain decimal text for journal files, with no symbol or grouping. */
export function centsToDecimalString(cents: Cents): string {
  assertCents(cents, "cents");
  const abs = Math.abs(cents);
  const whole = Math.floor(abs / 100);
  const frac = String(abs % 100).padStart(2, "0");
  return `${cents < 0 ? "-" : ""}${whole}.${frac}`;
}
