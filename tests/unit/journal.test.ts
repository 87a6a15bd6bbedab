/**
 * The finance journal: double entry (every debit has an equal credit; debits = credits), amounts
 * in the currency's units with two decimals. Principle of double-entry bookkeeping (common
 * practice); totals worked by hand beside each check.
 */
import { describe, expect, it } from "vitest";
import { JOURNAL_COLUMNS, buildJournal, checkJournal, decimalStringToCents, journalFileName, journalRows, netChargedToCustomers, reverseJournal, type JournalStatement } from "@shared/domain/journal";

const OPTIONS = { recoveryAccount: "4510-LIC-RECOVERY", facilityName: "Liquid Interfaces Core" };
const st = (accountCode: string, totalCents: number, extra: Partial<JournalStatement> = {}): JournalStatement => ({
  accountCode,
  accountName: `Account ${accountCode}`,
  totalCents,
  currency: "CAD",
  period: "2026-05",
  ...extra,
});

describe("buildJournal", () => {
  const statements = [st("CHEM-101", 123_450, { department: "CHEM", lineCount: 12 }), st("CPE-202", 9_999), st("EES-303", 0), st("CHEM-404", 5)];
  const lines = buildJournal(statements, OPTIONS);

  it("debits each customer account and credits the recovery account, per statement; zero statements are left out", () => {
    expect(lines).toHaveLength(6);
    expect(lines[0]).toEqual({
      period: "2026-05",
      account: "CHEM-101",
      department: "CHEM",
      debit: "1234.50",
      credit: "",
      currency: "CAD",
      description: "Liquid Interfaces Core recharge 2026-05: Account CHEM-101 (12 lines)",
    });
    expect(lines[1]).toMatchObject({ account: "4510-LIC-RECOVERY", debit: "", credit: "1234.50" });
    expect(lines[5]).toMatchObject({ account: "4510-LIC-RECOVERY", credit: "0.05" });
    expect(lines.some((l) => l.account === "EES-303")).toBe(false);
  });

  it("balances to the cent: debits 1234.50 + 99.99 + 0.05 = 1334.54 = credits = the statements' total", () => {
    const check = checkJournal(lines);
    expect(check.balanced).toBe(true);
    expect(check.byCurrency).toEqual([{ currency: "CAD", debitCents: 133_454, creditCents: 133_454 }]);
    expect(netChargedToCustomers(lines, OPTIONS.recoveryAccount).get("CAD")).toBe(statements.reduce((a, s) => a + s.totalCents, 0));
  });

  it("swaps the sides for a statement with a negative total (a credit), never writing a negative amount", () => {
    const credit = buildJournal([st("CPE-202", -2_500)], OPTIONS);
    expect(credit.map((l) => [l.account, l.debit, l.credit])).toEqual([
      ["CPE-202", "", "25.00"],
      ["4510-LIC-RECOVERY", "25.00", ""],
    ]);
    expect(checkJournal(credit).balanced).toBe(true);
    expect(netChargedToCustomers(credit, OPTIONS.recoveryAccount).get("CAD")).toBe(-2_500);
  });

  it("balances each currency by itself", () => {
    const mixed = buildJournal([st("A", 100), st("B", 250, { currency: "USD" })], OPTIONS);
    expect(checkJournal(mixed).byCurrency).toEqual([
      { currency: "CAD", debitCents: 100, creditCents: 100 },
      { currency: "USD", debitCents: 250, creditCents: 250 },
    ]);
  });

  it("refuses an empty recovery account, fractional cents and a currency that is not an ISO 4217 code", () => {
    expect(() => buildJournal([st("A", 1)], { ...OPTIONS, recoveryAccount: " " })).toThrow(RangeError);
    expect(() => buildJournal([st("A", 1.5)], OPTIONS)).toThrow(RangeError);
    expect(() => buildJournal([st("A", 1, { currency: "dollars" })], OPTIONS)).toThrow(RangeError);
  });
});

describe("checkJournal", () => {
  it("notices a line changed by a cent, and a line with both sides or neither filled", () => {
    const lines = buildJournal([st("A", 1000), st("B", 2000)], OPTIONS);
    const tampered = lines.map((l, i) => (i === 0 ? { ...l, debit: "10.01" } : l));
    expect(checkJournal(tampered).balanced).toBe(false);
    const both = lines.map((l, i) => (i === 0 ? { ...l, credit: "10.00" } : l));
    expect(checkJournal(both).malformedLines).toEqual([0]);
    expect(checkJournal(both).balanced).toBe(false);
  });

  it("reads amounts with exactly two decimals only", () => {
    expect(decimalStringToCents("1234.56")).toBe(123_456);
    expect(decimalStringToCents("0.05")).toBe(5);
    for (const bad of ["1.5", "-1.00", "1,000.00", "1e3"]) expect(() => decimalStringToCents(bad), bad).toThrow(RangeError);
  });
});

describe("reverseJournal", () => {
  it("writes the same lines with the sides swapped, balancing too, and cancels the original", () => {
    const lines = buildJournal([st("A", 1000), st("B", -300)], OPTIONS);
    const reversal = reverseJournal(lines);
    expect(reversal.map((l) => [l.account, l.debit, l.credit])).toEqual(lines.map((l) => [l.account, l.credit, l.debit]));
    expect(reversal[0].description).toBe(`Reversal: ${lines[0].description}`);
    expect(checkJournal(reversal).balanced).toBe(true);
    // Original + reversal: every account nets to zero.
    const net = netChargedToCustomers([...lines, ...reversal], OPTIONS.recoveryAccount);
    expect(net.get("CAD")).toBe(0);
  });
});

describe("rows for the CSV writer", () => {
  it("gives the columns in header order, with at least account, debit, credit, currency and description", () => {
    expect(JOURNAL_COLUMNS).toEqual(["period", "account", "department", "debit", "credit", "currency", "description"]);
    const [row] = journalRows(buildJournal([st("A", 5)], OPTIONS));
    expect(row).toEqual(["2026-05", "A", "", "0.05", "", "CAD", "Liquid Interfaces Core recharge 2026-05: Account A"]);
  });

  it("names a voided run's journal and its reversal", () => {
    expect(journalFileName("2026-05", "journal")).toBe("journal-2026-05.csv");
    expect(journalFileName("2026-05", "journal", true)).toBe("journal-2026-05-VOID.csv");
    expect(journalFileName("2026-05", "reversal")).toBe("journal-2026-05-reversal.csv");
  });
});
