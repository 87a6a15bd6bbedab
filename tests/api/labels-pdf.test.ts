import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { PDFArray, PDFDict, PDFDocument, PDFHexString, PDFName, PDFString } from "pdf-lib";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { makeCabinet, makeContainer, makeDichloroethane, makeInstrument } from "../support/label-factories";
import type { Container } from "../../server/entities";

let t: TestApp;
let manager: ApiClient;
let safety: ApiClient;
let member: ApiClient;
let bottles: Container[];
let vial: Container;

async function signedIn(roles: ("member" | "manager" | "safety_officer")[]): Promise<ApiClient> {
  const u = await makeUser(t.ds, { roles });
  const c = new ApiClient(t.url);
  await c.login(u.email, TEST_PASSWORD);
  return c;
}

async function pdfOf(client: ApiClient, path: string): Promise<Uint8Array> {
  const res = await fetch(t.url + path, { headers: { cookie: client.cookieHeader } });
  expect(res.status, await res.clone().text().then((s) => s.slice(0, 300))).toBe(200);
  expect(res.headers.get("content-type")).toBe("application/pdf");
  return new Uint8Array(await res.arrayBuffer());
}

/** Every link annotation's URI, page by page: each label carries exactly one, over its QR code. */
function labelLinks(doc: PDFDocument): string[][] {
  return doc.getPages().map((page) => {
    const annots = page.node.lookup(PDFName.of("Annots"), PDFArray) as PDFArray | undefined;
    if (!annots) return [];
    const out: string[] = [];
    for (let i = 0; i < annots.size(); i++) {
      const a = annots.lookup(i, PDFDict);
      const action = a.lookup(PDFName.of("A"), PDFDict);
      const uri = action.lookup(PDFName.of("URI")) as PDFString | PDFHexString;
      out.push(uri.decodeText());
    }
    return out;
  });
}

const MM = 72 / 25.4; // PDF points per mm (1 pt = 1/72 in; 1 in = 25.4 mm)
const url = (c: { labelToken: string }) => `http://phasebook.test/s/${c.labelToken}`;

beforeAll(async () => {
  t = await startTestApp();
  manager = await signedIn(["manager"]);
  safety = await signedIn(["safety_officer"]);
  member = await signedIn(["member"]);
  const chem = await makeDichloroethane(t.ds);
  const cabinet = await makeCabinet(t.ds);
  bottles = [];
  for (let i = 0; i < 26; i++) bottles.push(await makeContainer(t.ds, { chemicalId: chem.id, locationId: cabinet.id }));
  vial = await makeContainer(t.ds, { chemicalId: chem.id, kind: "vial", quantity: 2, unit: "g" });
});
afterAll(async () => {
  await t.close();
});

describe("GET /api/labels.pdf", () => {
  it("prints one bottle label per page for three containers, each with its own label URL, and says so in the Subject", async () => {
    const ids = bottles.slice(0, 3);
    const doc = await PDFDocument.load(await pdfOf(manager, `/api/labels.pdf?containerIds=${ids.map((c) => c.id).join(",")}`));
    expect(doc.getPageCount()).toBe(3);
    expect(labelLinks(doc)).toEqual(ids.map((c) => [url(c)]));
    expect(doc.getSubject()).toBe("3 labels");
    const { width, height } = doc.getPage(0).getSize();
    expect(width).toBeCloseTo(100 * MM, 3);
    expect(height).toBeCloseTo(50 * MM, 3);
  });

  it("gives a vial the small 40 × 20 mm label", async () => {
    const doc = await PDFDocument.load(await pdfOf(safety, `/api/labels.pdf?containerIds=${vial.id}`));
    expect(doc.getPage(0).getSize().width).toBeCloseTo(40 * MM, 3);
    expect(doc.getPage(0).getSize().height).toBeCloseTo(20 * MM, 3);
    expect(labelLinks(doc)).toEqual([[url(vial)]]);
  });

  it("lays 26 labels on A4 sheets of 3 × 8: 24 on the first page, 2 on the second", async () => {
    const stocks = await manager.get("/api/labels/stocks");
    const a4 = stocks.body.items.find((s: { name: string }) => /A4 sheet, 3 × 8/.test(s.name));
    const doc = await PDFDocument.load(await pdfOf(manager, `/api/labels.pdf?stockId=${a4.id}&containerIds=${bottles.map((c) => c.id).join(",")}`));
    expect(doc.getPageCount()).toBe(2);
    // ISO 216: A4 is 210 × 297 mm.
    expect(doc.getPage(0).getSize().width).toBeCloseTo(210 * MM, 3);
    expect(doc.getPage(0).getSize().height).toBeCloseTo(297 * MM, 3);
    const links = labelLinks(doc);
    expect(links.map((p) => p.length)).toEqual([24, 2]);
    expect(links.flat()).toEqual(bottles.map(url));
    expect(doc.getSubject()).toBe("26 labels");
  });

  it("skips positions already used on the first sheet", async () => {
    const stocks = await manager.get("/api/labels/stocks");
    const a4 = stocks.body.items.find((s: { name: string }) => /A4 sheet, 3 × 8/.test(s.name));
    const doc = await PDFDocument.load(await pdfOf(manager, `/api/labels.pdf?stockId=${a4.id}&skip=23&containerIds=${bottles[0].id},${bottles[1].id}`));
    expect(labelLinks(doc).map((p) => p.length)).toEqual([1, 1]);
  });

  it("prints instrument labels", async () => {
    const cell = await makeInstrument(t.ds, "interface_cell");
    const pot = await makeInstrument(t.ds, "potentiostat");
    const doc = await PDFDocument.load(await pdfOf(manager, `/api/labels.pdf?instrumentIds=${cell.id},${pot.id}`));
    expect(labelLinks(doc).flat()).toEqual([url(cell), url(pot)]);
  });

  it("answers 422 for more than 500 labels, before looking anything up", async () => {
    const ids = Array.from({ length: 501 }, (_, i) => i + 1).join(",");
    const r = await manager.get(`/api/labels.pdf?containerIds=${ids}`);
    expect(r.status).toBe(422);
    expect(r.body.code).toBe("too_many_labels");
  });

  it("answers 404 naming the records that do not exist", async () => {
    const r = await manager.get(`/api/labels.pdf?containerIds=${bottles[0].id},999999&instrumentIds=888888`);
    expect(r.status).toBe(404);
    expect(r.body.detail).toMatch(/container 999999, instrument 888888/);
  });

  it("answers 400 when no record is named or the list is malformed", async () => {
    expect((await manager.get(`/api/labels.pdf`)).status).toBe(400);
    expect((await manager.get(`/api/labels.pdf?containerIds=1;2`)).status).toBe(400);
  });

  it("is refused to a member with 403", async () => {
    expect((await member.get(`/api/labels.pdf?containerIds=${bottles[0].id}`)).status).toBe(403);
  });
});

describe("POST /api/labels/stocks", () => {
  it("adds a stock described by its dimensions", async () => {
    const r = await manager.post("/api/labels/stocks", {
      name: "A4 sheet, 2 × 7 labels of 99.1 × 38.1 mm", size: "bottle",
      pageWidthMm: 210, pageHeightMm: 297, labelWidthMm: 99.1, labelHeightMm: 38.1, columns: 2, rows: 7,
      marginTopMm: 15.15, marginLeftMm: 4.65, gapXMm: 2.5, gapYMm: 0,
    });
    expect(r.status).toBe(201);
    expect(r.body.stock).toMatchObject({ columns: 2, rows: 7 });
  });

  it("answers 422 when the labels would run off the page", async () => {
    const r = await manager.post("/api/labels/stocks", {
      name: "Too wide", size: "vial", pageWidthMm: 100, pageHeightMm: 100, labelWidthMm: 40, labelHeightMm: 20, columns: 3, rows: 2,
    });
    expect(r.status).toBe(422);
  });
});
