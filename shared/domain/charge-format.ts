/**
 * Charge-line figures as people read them, on statements and screens, without losing exactness:
 * a quantity as its exact text (a decimal, or "1/6" where no decimal is exact), and a unit price
 * held in cents (possibly with fractions of a cent, e.g. 2.16 ¢/g) in the currency's units with
 * as many decimals as it needs, never rounded ("$0.0216"). Amounts stay whole cents (money.ts).
 */
import { divide, exact, fraction, terminatingPlaces, toNumber } from "./exact";
import { currencyFormat } from "./money";

/** Most decimals a unit price is printed with; a longer one is printed in cents as its exact text. */
const MAX_PLACES = 8;

/** "1.5", "31.4225", "1/6": the quantity as stored (exact text), with a leading zero where needed. */
export function formatQuantity(quantity: string): string {
  return quantity.startsWith(".") ? `0${quantity}` : quantity;
}

/**
 * The price of one unit in the currency's units: "$35.00", "$0.0216". A price with no finite
 * decimal form, or more than eight decimals, is shown in cents as its exact text ("1/3 ¢").
 */
export function formatUnitPrice(unitPriceCents: string, currency = "CAD", locale = "en-CA"): string {
  const units = divide(exact(unitPriceCents), fraction(100n));
  const places = terminatingPlaces(units);
  if (places === null || places > MAX_PLACES) return `${unitPriceCents} ¢`;
  const digits = Math.max(2, places);
  return currencyFormat(locale, currency, digits).format(toNumber(units));
}

/** "$35.00/h", "$0.0216/g", "$12.34" for one item. */
export function formatUnitPricePer(unitPriceCents: string, unit: string, currency = "CAD", locale = "en-CA"): string {
  const price = formatUnitPrice(unitPriceCents, currency, locale);
  return unit === "each" ? price : `${price}/${unit}`;
}
