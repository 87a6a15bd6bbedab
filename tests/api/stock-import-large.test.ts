/**
 * A large stockroom arrives by CSV, a file of up to 20,000 containers at a time: every row or none
 * is written, each container with its "received" movement, and the search finds them at once
 * (the full-text index follows by trigger).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { makeCabinet, makeDichloroethane } from "../support/label-factories";

let t: TestApp;
let keeper: ApiClient;
let cabinet: { id: number; name: string };

const csv = (text: string) => keeper.request("POST", "/api/containers/import", { body: text, headers: { "content-type": "text/csv" } });

function file(rows: number, lotPrefix: string, bad?: number): string {
  const lines = ["casNumber,chemicalName,quantity,unit,location,status,supplier,lot,expiresAt"];
  for (let i = 1; i <= rows; i++) {
    const quantity = i === bad ? "a lot" : String(100 + (i % 900));
    lines.push(`107-06-2,1;2-Dichloroethane,${quantity},mL,${cabinet.id},${i % 3 ? "sealed" : "in_use"},Kestrel Chemicals Supply,${lotPrefix}-${i},2028-0${1 + (i % 9)}-15`);
  }
  return lines.join("\n").replace(/1;2-Dichloroethane/g, '"1,2-Dichloroethane"') + "\n";
}

beforeAll(async () => {
  t = await startTestApp();
  await makeDichloroethane(t.ds);
  cabinet = await makeCabinet(t.ds, "Flammables cabinet F9");
  const k = await makeUser(t.ds, { roles: ["manager"] });
  keeper = new ApiClient(t.url);
  expect((await keeper.login(k.email, TEST_PASSWORD)).status).toBe(200);
});
afterAll(async () => {
  await t.close();
});

describe("POST /api/containers/import with a file of 20,000 rows", () => {
  it("imports every container with its received movement, and the search finds them by lot", async () => {
    const r = await csv(file(20_000, "KB26"));
    expect(r.status, r.text.slice(0, 300)).toBe(201);
    expect(r.body.imported).toBe(20_000);
    const [{ n: moved }] = (await t.ds.query(`SELECT COUNT(*) AS n FROM container_movements WHERE kind = 'received' AND note = 'CSV import' AND toLocationId = ?`, [cabinet.id])) as { n: number }[];
    expect(moved).toBe(20_000);
    const one = await keeper.get(`/api/containers?q=KB26-19999&sort=id`);
    expect(one.body.items.map((c: { lot: string }) => c.lot)).toEqual(["KB26-19999"]);
    const many = await keeper.get(`/api/containers?q=kb26-1999&sort=lot`);
    // KB26-1999 and KB26-19990 … KB26-19999.
    expect(many.body).toMatchObject({ total: 11, totalIsExact: true });
    const all = await keeper.get(`/api/containers?q=${encodeURIComponent("Kestrel Chemicals")}`);
    expect(all.body).toMatchObject({ total: 1000, totalIsExact: false });
  });

  it("imports nothing from a file with one bad row, and names the row", async () => {
    const before = ((await t.ds.query(`SELECT COUNT(*) AS n FROM containers`)) as { n: number }[])[0].n;
    const r = await csv(file(20_000, "KB27", 17_345));
    expect(r.status).toBe(422);
    expect(r.body.code).toBe("import_refused");
    expect(r.body.errors).toEqual([{ path: "line 17346: quantity", message: expect.stringContaining("a lot") }]);
    expect(((await t.ds.query(`SELECT COUNT(*) AS n FROM containers`)) as { n: number }[])[0].n).toBe(before);
    expect((await keeper.get(`/api/containers?q=KB27-1`)).body.total).toBe(0);
  });

  it("refuses a file of more than 20,000 rows", async () => {
    const r = await csv(file(20_001, "KB28"));
    expect(r.status).toBe(422);
    expect(r.body.errors.map((e: { message: string }) => e.message)).toContain("A file may hold at most 20000 rows.");
  });
});
