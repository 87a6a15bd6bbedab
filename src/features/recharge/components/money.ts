/** Money on Recharge screens: integer cents in, the facility's currency out; dollars typed in, cents sent. */
import { formatMoney } from "@shared/domain/money";

export const money = (cents: number, currency = "CAD") => formatMoney(cents, currency);

/** "45.5" or "45.50" → 4550; null when the text is not an amount with at most two decimals. */
export function parseDollars(text: string): number | null {
  const t = text.trim().replace(/,/g, "");
  if (!/^-?\d+(\.\d{1,2})?$/.test(t)) return null;
  const [whole, frac = ""] = t.replace("-", "").split(".");
  const cents = Number(whole) * 100 + Number(frac.padEnd(2, "0"));
  return t.startsWith("-") ? -cents : cents;
}

/** The last month that has ended, as YYYY-MM in the browser's calendar. */
export function lastMonth(now = new Date()): string {
  const d = new Date(now.getFullYear(), now.getMonth() - 1, 1);
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, "0")}`;
}
