/**
 * The Safety review against the real app: review lists, the PDF report, safety data sheet
 * uploads (content checks, size limit, file names), CSV import (all or nothing) and export,
 * locations with limits, and the e-mail alerts job under a fixed clock.
 */
import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { readPdf } from "../support/pdf-text";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { Chemical, Container, OutboundMail } from "../../server/entities";
import { runStockAlerts } from "../../server/modules/safety/stock-alerts";

let t: TestApp;
let safety: ApiClient;
let member: ApiClient;
let safetyEmail: string;
let chemId: number;
let cabinetId: number;

const PDF = Buffer.from("%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n", "latin1");

function upload(client: ApiClient, chemicalId: number, file: Buffer, name: string, reviewedOn = "2025-06-01") {
  const form = new FormData();
  form.append("reviewedOn", reviewedOn);
  form.append("supplier", "Harbourline Scientific Supply");
  form.append("file", new Blob([new Uint8Array(file)], { type: "application/pdf" }), name);
  return client.request("POST", `/api/chemicals/${chemicalId}/sds`, { body: form });
}

function csv(client: ApiClient, route: string, text: string) {
  return client.request("POST", route, { body: text, headers: { "content-type": "text/csv" } });
}

beforeAll(async () => {
  t = await startTestApp({ deps: { rateLimits: { login: { windowMs: 60_000, limit: 1000 } } } });
  const s = await makeUser(t.ds, { roles: ["safety_officer"] });
  safetyEmail = s.email;
  safety = new ApiClient(t.url);
  await safety.login(s.email, TEST_PASSWORD);
  const m = await makeUser(t.ds, { roles: ["member"] });
  member = new ApiClient(t.url);
  await member.login(m.email, TEST_PASSWORD);
  const chem = await safety.post("/api/chemicals", {
    name: "1,2-Dichloroethane",
    casNumber: "107-06-2",
    formula: "C2H4Cl2",
    hazardStatements: ["H225", "H350"],
    flashPointC: 13,
    boilingPointC: 83.5,
    densityGPerMl: 1.2569,
    reorderPoint: 5000,
    reorderUnit: "mL",
  });
  chemId = chem.body.chemical.id;
  const room = await safety.post("/api/locations", { level: "room", name: "HCB 214" });
  await safety.post(`/api/locations/${room.body.location.id}/limits`, { classes: ["IA", "IB", "IC", "II"], maxVolume: 20, unit: "L", includesCabinets: true });
  const cab = await safety.post("/api/locations", { parentId: room.body.location.id, level: "cabinet", name: "UB-1", type: "flammable_cabinet", limitNote: "Example only" });
  cabinetId = cab.body.location.id;
  await safety.post(`/api/locations/${cabinetId}/limits`, { classes: ["IA", "IB", "IC", "II"], maxVolume: 10, unit: "L", includesCabinets: true, note: "Example only" });
});
afterAll(async () => {
  await t.close();
});

describe("safety data sheets", () => {
  it("stores a PDF under a random name in the data folder and returns it with its original name", async () => {
    const r = await upload(safety, chemId, PDF, "DCE sheet (2025).pdf");
    expect(r.status, r.text).toBe(201);
    const stored = fs.readdirSync(path.join(t.dir, "sds"));
    expect(stored).toHaveLength(1);
    expect(stored[0]).toMatch(/^[0-9a-f]{32}\.pdf$/);
    const d = await member.get(`/api/sds/${r.body.sheet.id}/file`);
    expect(d.status).toBe(200);
    expect(d.headers.get("content-type")).toContain("application/pdf");
    expect(d.headers.get("content-disposition")).toContain('filename="DCE sheet (2025).pdf"');
    expect(d.text.startsWith("%PDF-")).toBe(true);
  });

  it("refuses with 415 a file named .pdf whose content is not a PDF", async () => {
    const r = await upload(safety, chemId, Buffer.from("<html>not a pdf</html>"), "sheet.pdf");
    expect(r.status).toBe(415);
    expect(r.body.errors[0].path).toBe("file");
  });

  it("refuses with 413 a file over 10 MB", async () => {
    const big = Buffer.concat([PDF, Buffer.alloc(10 * 1024 * 1024 + 1)]);
    const r = await upload(safety, chemId, big, "big.pdf");
    expect(r.status).toBe(413);
  });

  it("refuses with 422 a file name with path parts, and stores nothing", async () => {
    const before = fs.readdirSync(path.join(t.dir, "sds")).length;
    const r = await upload(safety, chemId, PDF, "..\\..\\etc\\passwd.pdf");
    expect(r.status).toBe(422);
    expect(r.body.errors[0].path).toBe("file");
    expect(fs.readdirSync(path.join(t.dir, "sds"))).toHaveLength(before);
  });

  it("lists a sheet older than the 36-month review period as due", async () => {
    const other = await safety.post("/api/chemicals", { name: "Nitrobenzene", casNumber: "98-95-3", formula: "C6H5NO2" });
    await upload(safety, other.body.chemical.id, PDF, "nb.pdf", "2021-01-15");
    const r = await safety.get("/api/safety/sds-due");
    expect(r.body.items.map((s: { chemicalId: number }) => s.chemicalId)).toEqual([other.body.chemical.id]);
  });
});

describe("CSV import and export", () => {
  it("imports nothing when one row is bad, and lists each bad row with its line number and reason", async () => {
    const text = [
      "name,casNumber,formula,flashPointC",
      "Sodium chloride,7647-14-5,NaCl,",
      "Potassium chloride,7447-40-8,KCl,", // wrong check digit (7447-40-7)
      "Ferrocene,102-54-5,C10H10Fe,",
      "Gibberish,67-64-1,Qq2,",
    ].join("\n");
    const r = await csv(safety, "/api/chemicals/import", text);
    expect(r.status).toBe(422);
    expect(r.body.rows.map((b: { line: number; field: string }) => [b.line, b.field])).toEqual([
      [3, "casNumber"],
      [5, "formula"],
    ]);
    const names = (await t.ds.getRepository(Chemical).find()).map((c) => c.name);
    expect(names).not.toContain("Sodium chloride");
  });

  it("imports every row of a good file", async () => {
    const r = await csv(safety, "/api/chemicals/import", "name,casNumber,formula\nSodium chloride,7647-14-5,NaCl\nFerrocene,102-54-5,C10H10Fe\n");
    expect(r.status, r.text).toBe(201);
    expect(r.body.imported).toBe(2);
  });

  it("imports containers by CAS number and location path, refusing an unknown location by line", async () => {
    const bad = await csv(safety, "/api/containers/import", "casNumber,quantity,unit,location\n107-06-2,2500,mL,HCB 214 › UB-1\n107-06-2,2500,mL,Nowhere\n");
    expect(bad.status).toBe(422);
    expect(bad.body.rows).toEqual([{ line: 3, field: "location", reason: expect.stringContaining("Nowhere") }]);
    const good = await csv(safety, "/api/containers/import", "casNumber,quantity,unit,location,lot\n107-06-2,2500,mL,HCB 214 › UB-1,CSV-1\n");
    expect(good.status, good.text).toBe(201);
    const c = await t.ds.getRepository(Container).findOneByOrFail({ lot: "CSV-1" });
    expect(c.locationId).toBe(cabinetId);
  });

  it("exports the containers table as CSV with a formula-injection guard", async () => {
    await safety.post("/api/containers/receive", { chemicalId: chemId, count: 1, quantity: 100, unit: "mL", lot: "=HYPERLINK(\"x\")", locationId: cabinetId });
    const r = await member.get(`/api/containers/export.csv?chemicalId=${chemId}`);
    expect(r.status).toBe(200);
    expect(r.headers.get("content-type")).toContain("text/csv");
    expect(r.text.split("\n")[0]).toContain("chemicalName,casNumber");
    expect(r.text).toContain(`"'=HYPERLINK(""x"")"`);
  });
});

describe("the Safety review", () => {
  it("lists the carcinogen with where it is, and the expired container", async () => {
    const rec = await safety.post("/api/containers/receive", { chemicalId: chemId, count: 1, quantity: 500, unit: "mL", locationId: cabinetId, expiresAt: "2026-11-01" });
    const r = await safety.get("/api/safety/review");
    expect(r.status).toBe(200);
    const dce = r.body.hazardous.find((h: { chemicalId: number }) => h.chemicalId === chemId);
    expect(dce.carcinogen).toBe(true);
    expect(dce.containers.some((c: { locationPath: string }) => c.locationPath === "HCB 214 › UB-1")).toBe(true);
    expect(r.body.expired.map((c: { id: number }) => c.id)).toContain(rec.body.containers[0].id);
  });

  it("answers the printable report as a PDF of tables: each class's litres per location, each limit with its finding", async () => {
    const r = await safety.get("/api/safety/report.pdf");
    expect(r.status).toBe(200);
    expect(r.headers.get("content-type")).toContain("application/pdf");
    expect(r.text.startsWith("%PDF-")).toBe(true);
    const res = await fetch(`${t.url}/api/safety/report.pdf`, { headers: { cookie: safety.cookieHeader } });
    const pdf = await readPdf(new Uint8Array(await res.arrayBuffer()));
    const flat = pdf.text.replace(/\s+/g, " ");
    for (const header of ["Location", "IA", "IB", "IIIB", "Unknown volume", "Classes", "Limit", "Counted", "Finding"]) expect(flat).toContain(header);
    expect(flat).toContain("UB-1");
    expect(flat).toMatch(/Class IA \+ IB \+ IC \+ II/);
    expect(flat).toMatch(/Within limit|Over limit|Cannot confirm/);
  });

  it("refuses a limit with an unknown class, a negative volume or an unknown unit, naming each field (400)", async () => {
    const r = await safety.post(`/api/locations/${cabinetId}/limits`, { classes: ["IA", "IV"], maxVolume: -1, unit: "barrel", includesCabinets: true });
    expect(r.status).toBe(400);
    expect(r.body.errors.map((e: { path: string }) => e.path)).toEqual(expect.arrayContaining(["classes.1", "maxVolume", "unit"]));
    const before = (await safety.get("/api/locations")).body.items.find((l: { id: number }) => l.id === cabinetId).limits.length;
    expect(before).toBe(1);
  });

  it("refuses a location inside itself", async () => {
    const all = (await safety.get("/api/locations")).body.items as { id: number; parentId: number | null }[];
    const cab = all.find((l) => l.id === cabinetId)!;
    const r = await safety.patch(`/api/locations/${cab.parentId}`, { parentId: cabinetId, level: "room" });
    expect(r.status).toBe(422);
  });
});

describe("the stock-alerts job (fixed clock 2026-12-02)", () => {
  it("mails the safety officer once about the over-limit cabinet and the expiring container, and not again within the week", async () => {
    await safety.post("/api/containers/receive", { chemicalId: chemId, count: 5, quantity: 2500, unit: "mL", locationId: cabinetId, expiresAt: "2026-12-20" });
    const now = new Date("2026-12-02T15:00:00Z");
    const first = await runStockAlerts(t.ds, now, { tz: "America/Halifax", publicUrl: "http://phasebook.test" });
    expect(first.overLimit).toContain(cabinetId);
    expect(first.expiring.length).toBeGreaterThanOrEqual(5);
    const mails = await t.ds.getRepository(OutboundMail).findBy({ to: safetyEmail });
    expect(mails.some((m) => /over the storage limit/.test(m.subject) && m.text.includes("UB-1"))).toBe(true);
    expect(mails.some((m) => /expire within 30 days/.test(m.subject))).toBe(true);
    const again = await runStockAlerts(t.ds, new Date("2026-12-05T15:00:00Z"), { tz: "America/Halifax", publicUrl: "http://phasebook.test" });
    expect(again).toEqual({ reorder: [], expiring: [], overLimit: [] });
    const later = await runStockAlerts(t.ds, new Date("2026-12-10T15:00:00Z"), { tz: "America/Halifax", publicUrl: "http://phasebook.test" });
    expect(later.overLimit).toContain(cabinetId);
  });

  it("mails the managers when a chemical falls below its reorder point", async () => {
    const mgr = await makeUser(t.ds, { roles: ["manager"] });
    const low = await safety.post("/api/chemicals", { name: "Trifluorotoluene", casNumber: "98-08-8", formula: "C7H5F3", densityGPerMl: 1.19, reorderPoint: 2000, reorderUnit: "mL" });
    await safety.post("/api/containers/receive", { chemicalId: low.body.chemical.id, count: 1, quantity: 1000, unit: "mL" });
    const r = await runStockAlerts(t.ds, new Date("2026-12-03T15:00:00Z"), { tz: "America/Halifax", publicUrl: "http://phasebook.test" });
    expect(r.reorder).toContain(low.body.chemical.id);
    const mails = await t.ds.getRepository(OutboundMail).findBy({ to: mgr.email });
    expect(mails.some((m) => m.text.includes("Trifluorotoluene") && m.text.includes("1000 mL in stock"))).toBe(true);
  });
});
