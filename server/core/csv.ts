/**
 * The one CSV writer of every export (stock, and the journal, utilisation and people exports as
 * their areas move to it). papaparse does the format (RFC 4180 quoting, CRLF); this adds OWASP's
 * CSV-injection rule: a text cell that starts with `=`, `+`, `-`, `@`, a tab or a carriage
 * return is prefixed with `'` and quoted, so a spreadsheet shows it as text instead of running
 * it as a formula (`=HYPERLINK(…)` in a chemical's name stays a name).
 *
 * Numbers are not text: a JS number is written as the number it is (a negative quantity or
 * amount stays a number a spreadsheet can add up), and a `money` column writes integer cents
 * as a decimal amount with two places (`-1234` → `-12.34`). Only values the code computed can be
 * numbers, so no person's text escapes the rule through them.
 */
import Papa from "papaparse";

export type CsvCell = string | number | boolean | Date | null | undefined;

export interface CsvColumn<T> {
  header: string;
  value: (row: T) => CsvCell;
  /** text (default): guarded; number: a JS number as is; money: integer cents as a decimal amount. */
  kind?: "text" | "number" | "money";
  /** number columns: always this many decimal places (hours as 40.00), still a number to a spreadsheet. */
  decimals?: number;
}

/** OWASP "CSV Injection": the first characters a spreadsheet takes as the start of a formula. */
const FORMULA_START = /^[=+\-@\t\r]/;

/** A text cell as OWASP asks: prefixed with ' when a spreadsheet would read it as a formula. */
export function guardCell(text: string): string {
  return FORMULA_START.test(text) ? `'${text}` : text;
}

function cell(v: CsvCell, { kind, decimals, header }: CsvColumn<never>): string | number {
  if (v === null || v === undefined) return "";
  if (kind === "money") {
    if (typeof v !== "number" || !Number.isInteger(v)) throw new TypeError(`CSV column ${header} holds money as integer cents, not ${JSON.stringify(v)}`);
    const sign = v < 0 ? "-" : "";
    const abs = Math.abs(v);
    return `${sign}${Math.floor(abs / 100)}.${String(abs % 100).padStart(2, "0")}`;
  }
  if (typeof v === "number") return !Number.isFinite(v) ? "" : decimals === undefined ? v : v.toFixed(decimals);
  if (kind === "number") throw new TypeError(`CSV column ${header} holds numbers, not ${JSON.stringify(v)}`);
  if (typeof v === "boolean") return v ? "yes" : "no";
  if (v instanceof Date) return v.toISOString();
  return guardCell(v);
}

const UNPARSE = {
  // A guarded cell is also quoted, as OWASP recommends; papaparse quotes the rest as needed.
  quotes: (value: unknown) => typeof value === "string" && value.startsWith("'"),
  newline: "\r\n",
};

export interface CsvOptions {
  /**
   * Lines of one text cell each, written before the header (guarded like any text cell): a
   * warning a reader must see first, such as the VOID line of a voided run's journal.
   */
  preamble?: readonly string[];
}

/** Rows to CSV text: any preamble lines, a header line of the columns' headers, then one line per row. */
export function toCsv<T>(rows: readonly T[], columns: readonly CsvColumn<T>[], options: CsvOptions = {}): string {
  const data = rows.map((row) => columns.map((c) => cell(c.value(row), c as CsvColumn<never>)));
  const table = Papa.unparse({ fields: columns.map((c) => guardCell(c.header)), data }, UNPARSE);
  if (!options.preamble?.length) return table;
  return `${Papa.unparse(options.preamble.map((line) => [guardCell(line)]), UNPARSE)}\r\n${table}`;
}
