/**
 * The double-entry journal a finalised billing run hands to the finance office: internal accounts
 * settle by transfer, so each internal statement becomes a debit to the customer's account and
 * an equal credit to the facility's recovery account. Every run's journal balances to the cent
 * in each currency, and a voided run gets a reversal: the same lines with the sides swapped.
 *
 * Granularity: one debit and one credit PER STATEMENT (not one credit per rate class). Each pair
 * balances by itself, so a department asking about its charge, a statement corrected later, or a
 * reversal is traced to exactly two lines, and the recovery account's ledger shows whom each
 * credit came from. (A journal holds internal statements only, so "per rate class" would be a
 * single credit line anyway.)
 *
 * Amounts are written in the currency's units with two decimals ("1234.50"), never negative:
 * a statement with a negative total (a credit) swaps the sides instead. Zero statements are left
 * out. Writing the CSV is for the caller; JOURNAL_COLUMNS gives the header order.
 */
import { type Cents, centsToDecimalString, sumCents } from "./money";

export interface JournalStatement {
  accountCode: string;
  accountName: string;
  totalCents: Cents;
  currency: string;
  /** The billing month, YYYY-MM. */
  period: string;
  department?: string | null;
  /** Number of charge lines, for the description. */
  lineCount?: number;
}

export const JOURNAL_COLUMNS = ["period", "account", "department", "debit", "credit", "currency", "description"] as const;
export type JournalColumn = (typeof JOURNAL_COLUMNS)[number];
export type JournalLine = Record<JournalColumn, string>;

export interface JournalOptions {
  /** The facility's recovery (income) account, e.g. from RECOVERY_ACCOUNT. */
  recoveryAccount: string;
  /** Named in every description, e.g. "Liquid Interfaces Core". */
  facilityName: string;
}

const AMOUNT = /^(\d+)\.(\d{2})$/;

/** "1234.56" → 123456 (two decimals, not negative); throws RangeError otherwise. */
export function decimalStringToCents(text: string): Cents {
  if (text === "") return 0;
  const m = AMOUNT.exec(text);
  if (!m) throw new RangeError(`"${text}" is not an amount with two decimals`);
  const cents = Number(m[1]) * 100 + Number(m[2]);
  if (!Number.isSafeInteger(cents)) throw new RangeError(`"${text}" is too large`);
  return cents;
}

function checkStatement(s: JournalStatement, i: number): void {
  if (!Number.isSafeInteger(s.totalCents)) throw new RangeError(`statements[${i}].totalCents must be whole cents`);
  if (!/^[A-Z]{3}$/.test(s.currency)) throw new RangeError(`statements[${i}].currency must be an ISO 4217 code such as CAD`);
  if (s.accountCode.trim() === "") throw new RangeError(`statements[${i}].accountCode is empty`);
}

/** Journal lines for a run's finalised internal statements: per statement, a debit and a credit. */
export function buildJournal(statements: readonly JournalStatement[], options: JournalOptions): JournalLine[] {
  if (options.recoveryAccount.trim() === "") throw new RangeError("The recovery account is empty");
  const lines: JournalLine[] = [];
  statements.forEach((s, i) => {
    checkStatement(s, i);
    if (s.totalCents === 0) return;
    const amount = centsToDecimalString(Math.abs(s.totalCents));
    const count = s.lineCount === undefined ? "" : ` (${s.lineCount} line${s.lineCount === 1 ? "" : "s"})`;
    const charge = s.totalCents > 0;
    const customer: JournalLine = {
      period: s.period,
      account: s.accountCode,
      department: s.department ?? "",
      debit: charge ? amount : "",
      credit: charge ? "" : amount,
      currency: s.currency,
      description: `${options.facilityName} recharge ${s.period}: ${s.accountName}${count}${charge ? "" : ", credit"}`,
    };
    const recovery: JournalLine = {
      period: s.period,
      account: options.recoveryAccount,
      department: "",
      debit: charge ? "" : amount,
      credit: charge ? amount : "",
      currency: s.currency,
      description: `${options.facilityName} recharge ${s.period}: recovered from ${s.accountCode} ${s.accountName}${charge ? "" : ", credit"}`,
    };
    lines.push(customer, recovery);
  });
  return lines;
}

/** The same lines with debit and credit swapped, for a voided run. */
export function reverseJournal(lines: readonly JournalLine[], note = "Reversal"): JournalLine[] {
  return lines.map((l) => ({ ...l, debit: l.credit, credit: l.debit, description: `${note}: ${l.description}` }));
}

export interface CurrencyBalance {
  currency: string;
  debitCents: Cents;
  creditCents: Cents;
}

export interface JournalCheck {
  /** Debits equal credits in every currency, and every line has exactly one side filled. */
  balanced: boolean;
  byCurrency: CurrencyBalance[];
  /** Lines with both sides or neither side filled (by index). */
  malformedLines: number[];
}

/** Sums debits and credits per currency (exactly, in cents) and says whether they balance. */
export function checkJournal(lines: readonly JournalLine[]): JournalCheck {
  const sums = new Map<string, { debit: Cents[]; credit: Cents[] }>();
  const malformedLines: number[] = [];
  lines.forEach((l, i) => {
    const debit = decimalStringToCents(l.debit);
    const credit = decimalStringToCents(l.credit);
    if ((l.debit === "") === (l.credit === "")) malformedLines.push(i);
    const slot = sums.get(l.currency) ?? { debit: [], credit: [] };
    slot.debit.push(debit);
    slot.credit.push(credit);
    sums.set(l.currency, slot);
  });
  const byCurrency = [...sums.entries()]
    .sort(([a], [b]) => a.localeCompare(b))
    .map(([currency, s]) => ({ currency, debitCents: sumCents(s.debit), creditCents: sumCents(s.credit) }));
  return {
    balanced: malformedLines.length === 0 && byCurrency.every((c) => c.debitCents === c.creditCents),
    byCurrency,
    malformedLines,
  };
}

/**
 * Net charge to customer accounts (their debits minus their credits) per currency; for a run's
 * journal it equals the sum of the internal statements' totals in that currency.
 */
export function netChargedToCustomers(lines: readonly JournalLine[], recoveryAccount: string): Map<string, Cents> {
  const out = new Map<string, Cents>();
  for (const l of lines) {
    if (l.account === recoveryAccount) continue;
    out.set(l.currency, (out.get(l.currency) ?? 0) + decimalStringToCents(l.debit) - decimalStringToCents(l.credit));
  }
  return out;
}

/** Rows in JOURNAL_COLUMNS order, without the header, for a CSV writer. */
export function journalRows(lines: readonly JournalLine[]): string[][] {
  return lines.map((l) => JOURNAL_COLUMNS.map((c) => l[c]));
}

/** File name of a run's journal; a voided run's original says VOID, its reversal says so too. */
export function journalFileName(period: string, kind: "journal" | "reversal", voided = false): string {
  return kind === "reversal" ? `journal-${period}-reversal.csv` : `journal-${period}${voided ? "-VOID" : ""}.csv`;
}
