/**
 * The Stockroom's container search, the chemicals list and the people list find text through
 * full-text indexes (FTS5, trigram). Here they are held to a plain scan: for tricky and random
 * texts, each list answers exactly the rows that SQLite's LIKE over the tables themselves gives
 * (ASCII letters in either case, every other character as written, the text's own % and _ taken
 * literally), in the same order, and no text is ever read as query syntax.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { DataSource } from "typeorm";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { makeCabinet } from "../support/label-factories";
import { connectionOf } from "../../server/db/prepared";
import { SEARCH_TUNING } from "../../server/modules/stockroom/container-search";

let t: TestApp;
let keeper: ApiClient;
let admin: ApiClient;
let cabinets: number[];

/** A small deterministic generator, so a failure can be replayed. */
function lcg(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}
const rnd = lcg(20261202);
const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rnd() * xs.length)];

const TRICKY_CHEMICALS: { name: string; synonyms: string[]; cas: string; formula: string | null }[] = [
  { name: "Lithium chloride", synonyms: ["LiCl", "Chlorure de lithium"], cas: "7447-41-8", formula: "ClLi" },
  { name: "Éthanol absolu", synonyms: ["ÉTHANOL", "alcool éthylique"], cas: "64-17-5", formula: "C2H6O" },
  { name: 'Tetrabutylammonium "TBA" perchlorate', synonyms: ['TBA "ClO4"'], cas: "1923-70-2", formula: "C16H36ClNO4" },
  { name: "AND NEAR OR NOT", synonyms: ["name:value", "col^umn", "star*"], cas: "0000-00-0", formula: null },
  { name: "50% w/w sodium hydroxide", synonyms: ["under_score", "back\\slash"], cas: "1310-73-2", formula: "HNaO" },
  { name: "Flask 🧪 solvent", synonyms: ["🧪🧪"], cas: "1111-11-1", formula: null },
  { name: "Naïve ester (ß-form)", synonyms: ["it's", "(paren)"], cas: "2222-22-2", formula: "C3H6O2" },
  { name: "1,2-Dichloroethane", synonyms: ["DCE", "ethylene dichloride"], cas: "107-06-2", formula: "C2H4Cl2" },
];
const SYLLABLES = ["chlor", "brom", "lith", "sod", "pot", "ium", "ide", "ate", "eth", "meth", "prop", "ol", "an", "ene", "nitro", "benz"];
const SUPPLIERS = ["Sigma-Aldrich", "Fisher Scientific", "Tidewater 🧪 Supply", "Àcme Chemicals", "", "50% Off Reagents"];

async function seed(ds: DataSource): Promise<void> {
  const stamp = "2026-11-01T12:00:00.000Z";
  const chemicals = [...TRICKY_CHEMICALS];
  for (let i = 0; i < 32; i++) {
    const name = Array.from({ length: 2 + Math.floor(rnd() * 3) }, () => pick(SYLLABLES)).join(rnd() < 0.3 ? " " : "");
    chemicals.push({ name: name[0].toUpperCase() + name.slice(1), synonyms: rnd() < 0.5 ? [pick(SYLLABLES) + "-" + i] : [], cas: `${100 + i}-${10 + i}-${i % 10}`, formula: rnd() < 0.7 ? `C${i}H${i * 2}` : null });
  }
  const ids: number[] = [];
  for (const c of chemicals) {
    const r = (await ds.query(`INSERT INTO chemicals (name, synonyms, casNumber, formula, createdAt) VALUES (?, ?, ?, ?, ?) RETURNING id`, [c.name, JSON.stringify(c.synonyms), c.cas, c.formula, stamp])) as { id: number }[];
    ids.push(r[0].id);
  }
  const lots = ['LOT "A"', "AND", "%", "_x_", "lot-ÉÀ", "🧪-7", "OR NEAR(a b)", ""];
  for (let i = 0; i < 420; i++) {
    const lot = rnd() < 0.2 ? pick(lots) : `L${Math.floor(rnd() * 100000)}-${pick(SYLLABLES)}`;
    await ds.query(
      `INSERT INTO containers (chemicalId, kind, quantity, initialQuantity, unit, locationId, status, labelToken, supplier, lot, expiresAt, createdAt) VALUES (?, 'bottle', ?, 500, 'mL', ?, ?, ?, ?, ?, ?, ?)`,
      [pick(ids), Math.floor(rnd() * 500), rnd() < 0.1 ? null : pick(cabinets), pick(["sealed", "in_use", "in_use", "empty", "on_hold", "disposed"]), `label-${i}-${Math.floor(rnd() * 1e9).toString(36)}`, pick(SUPPLIERS), lot, rnd() < 0.3 ? null : `2027-0${1 + Math.floor(rnd() * 9)}-1${Math.floor(rnd() * 9)}`, stamp],
    );
  }
}

/** The text as SQLite's LIKE pattern "contains", with the text's own \, % and _ literal (written here, not taken from the code under test). */
const contains = (text: string) => `%${text.replaceAll("\\", "\\\\").replaceAll("%", "\\%").replaceAll("_", "\\_")}%`;

/** The plain scan: containers whose chemical's or own text holds the text, or whose label code or number it is; in the chemical sort's order. */
/** Each sort's order as the Stockroom states it (ties by number; undated containers last either way). */
const ORDERS: Record<string, (d: string) => string> = {
  chemical: (d) => `ch.name ${d}, ch.id ${d}, c.id ${d}`,
  location: (d) => `l.name ${d}, l.id ${d}, c.id ${d}`,
  id: (d) => `c.id ${d}`,
  quantity: (d) => `c.quantity ${d}, c.id ${d}`,
  expiresAt: (d) => `c.expiresAt IS NULL, c.expiresAt ${d}, c.id ${d}`,
  lot: (d) => `c.lot ${d}, c.id ${d}`,
};

function scanContainers(text: string, extra = "1 = 1", order = ORDERS.chemical("ASC")): number[] {
  const rows = connectionOf(t.ds).prepare(
    `SELECT c.id FROM containers c JOIN chemicals ch ON ch.id = c.chemicalId LEFT JOIN locations l ON l.id = c.locationId
     WHERE (ch.name LIKE @pattern ESCAPE '\\' OR ch.casNumber LIKE @pattern ESCAPE '\\' OR COALESCE(ch.formula, '') LIKE @pattern ESCAPE '\\'
        OR EXISTS (SELECT 1 FROM json_each(ch.synonyms) s WHERE s.value LIKE @pattern ESCAPE '\\')
        OR c.lot LIKE @pattern ESCAPE '\\' OR c.supplier LIKE @pattern ESCAPE '\\' OR c.labelToken = @text OR ('#' || c.id) = @text OR CAST(c.id AS TEXT) = @text)
       AND ${extra}
     ORDER BY ${order}`,
  ).all({ pattern: contains(text), text }) as { id: number }[];
  return rows.map((r) => r.id);
}

function scanChemicals(text: string): number[] {
  const rows = connectionOf(t.ds).prepare(
    `SELECT ch.id FROM chemicals ch WHERE ch.name LIKE @pattern ESCAPE '\\' OR ch.casNumber LIKE @pattern ESCAPE '\\' OR COALESCE(ch.formula, '') LIKE @pattern ESCAPE '\\'
       OR EXISTS (SELECT 1 FROM json_each(ch.synonyms) s WHERE s.value LIKE @pattern ESCAPE '\\') ORDER BY ch.name, ch.id`,
  ).all({ pattern: contains(text) }) as { id: number }[];
  return rows.map((r) => r.id);
}

function scanUsers(text: string): number[] {
  const rows = connectionOf(t.ds).prepare(
    `SELECT u.id FROM users u WHERE u.name LIKE @pattern ESCAPE '\\' OR u.email LIKE @pattern ESCAPE '\\' OR COALESCE(u.organisation, '') LIKE @pattern ESCAPE '\\' ORDER BY u.name, u.id`,
  ).all({ pattern: contains(text) }) as { id: number }[];
  return rows.map((r) => r.id);
}

/** Every page of a list, following `limit`/`offset` until a short page. */
async function everything(client: ApiClient, path: string): Promise<{ ids: number[]; totals: { total: number; totalIsExact: boolean }[] }> {
  const ids: number[] = [];
  const totals: { total: number; totalIsExact: boolean }[] = [];
  for (let offset = 0; ; offset += 200) {
    const r = await client.get(`${path}${path.includes("?") ? "&" : "?"}limit=200&offset=${offset}`);
    expect(r.status, `${path}: ${r.text.slice(0, 300)}`).toBe(200);
    ids.push(...r.body.items.map((x: { id: number }) => x.id));
    totals.push({ total: r.body.total, totalIsExact: r.body.totalIsExact });
    if (r.body.items.length < 200) return { ids, totals };
  }
}

const TRICKY_TEXTS = [
  '"', '""', 'a"b', '"TBA"', "AND", "OR", "NOT", "NEAR", "NEAR(a b)", "and near", "*", "star*", "chl*", "^Lith", "col^umn", "name:value", "name:", ":",
  "(", ")", "(paren)", "-", "+", "%", "50%", "_", "under_score", "_x_", "\\", "back\\slash", "'", "it's", "🧪", "🧪🧪", "Flask 🧪", "🧪-7", "É", "é", "éthanol",
  "ÉTHANOL", "ß", "Naïve", "àcme", "Àcme", "LiCl", "licl", "LICL", "7447-41", "41-8", "107-06-2", 'LOT "A"', "lot", "chloride", "CHLORIDE", "Li", "l", "x", "zz",
  "Sigma", "sigma-ALDRICH", "Tidewater 🧪", "#1", "#99999", "1", "C2H", "OR NEAR(a b)",
];

function randomTexts(values: string[], n: number): string[] {
  const out: string[] = [];
  for (let i = 0; i < n; i++) {
    if (rnd() < 0.7) {
      const v = [...pick(values)];
      if (v.length === 0) continue;
      const start = Math.floor(rnd() * v.length);
      const piece = v.slice(start, start + 1 + Math.floor(rnd() * 8)).join("");
      out.push([...piece].map((ch) => (rnd() < 0.3 ? ch.toUpperCase() : rnd() < 0.3 ? ch.toLowerCase() : ch)).join("").trim() || "x");
    } else out.push(Array.from({ length: 1 + Math.floor(rnd() * 5) }, () => pick([..."aeiouclnrst-0123456789 %_\"*éÉ🧪"])).join("").trim() || "y");
  }
  return out;
}

beforeAll(async () => {
  t = await startTestApp();
  cabinets = [(await makeCabinet(t.ds, "Cabinet S1")).id, (await makeCabinet(t.ds, "Cabinet S2")).id];
  await seed(t.ds);
  for (const [name, organisation] of [["Zoë O'Brien", null], ['Ada "AND" Lovelace', "Tidewater Metals Recovery Ltd"], ["Ngozi 50%_Okafor", null], ["Émile Durand", "Àcme Labs"]] as const) {
    await makeUser(t.ds, { name, organisation, roles: ["member"] });
  }
  const k = await makeUser(t.ds, { roles: ["manager"] });
  keeper = new ApiClient(t.url);
  expect((await keeper.login(k.email, TEST_PASSWORD)).status).toBe(200);
  const a = await makeUser(t.ds, { roles: ["admin"] });
  admin = new ApiClient(t.url);
  expect((await admin.login(a.email, TEST_PASSWORD)).status).toBe(200);
});
afterAll(async () => {
  await t.close();
});

describe("GET /api/containers?q= against a plain scan", () => {
  it("finds exactly the containers a LIKE scan finds, in the chemical sort's order, for tricky and random texts", async () => {
    const values = ((await t.ds.query(`SELECT name AS v FROM chemicals UNION ALL SELECT lot FROM containers UNION ALL SELECT supplier FROM containers UNION ALL SELECT casNumber FROM chemicals`)) as { v: string }[]).map((r) => r.v);
    const label = ((await t.ds.query(`SELECT labelToken FROM containers LIMIT 1`)) as { labelToken: string }[])[0].labelToken;
    for (const text of [...TRICKY_TEXTS, label, ...randomTexts(values, 120)]) {
      const expected = scanContainers(text);
      const got = await everything(keeper, `/api/containers?q=${encodeURIComponent(text)}&sort=chemical`);
      expect(got.ids, `q=${JSON.stringify(text)}`).toEqual(expected);
      expect(got.totals[0], `q=${JSON.stringify(text)}`).toEqual({ total: expected.length, totalIsExact: true });
    }
  });

  it("agrees with the scan under every sort and with filters, page by page", async () => {
    const statuses = ["sealed", "in_use"];
    for (const text of ["chlor", "Li", "🧪", "Sigma", "%", "L1", "eth"]) {
      const filter = `c.status IN ('sealed', 'in_use') AND c.locationId = ${cabinets[0]}`;
      const filtered = scanContainers(text, filter);
      for (const sort of ["id", "chemical", "location", "quantity", "status", "expiresAt", "lot"]) {
        for (const dir of ["asc", "desc"]) {
          const got = await everything(keeper, `/api/containers?q=${encodeURIComponent(text)}&status=${statuses.join(",")}&locationId=${cabinets[0]}&sort=${sort}&dir=${dir}`);
          if (ORDERS[sort]) expect(got.ids, `${text} by ${sort} ${dir}`).toEqual(scanContainers(text, filter, ORDERS[sort](dir.toUpperCase())));
          else expect([...got.ids].sort((a, b) => a - b), `${text} by ${sort} ${dir}`).toEqual([...filtered].sort((a, b) => a - b));
          const paged: number[] = [];
          for (let offset = 0; offset < filtered.length; offset += 7) {
            const r = await keeper.get(`/api/containers?q=${encodeURIComponent(text)}&status=sealed,in_use&locationId=${cabinets[0]}&sort=${sort}&dir=${dir}&limit=7&offset=${offset}`);
            expect(r.body.total, `${text} by ${sort} ${dir} at ${offset}`).toBe(filtered.length);
            paged.push(...r.body.items.map((c: { id: number }) => c.id));
          }
          expect(paged, `${text} by ${sort} ${dir}, page by page`).toEqual(got.ids);
        }
      }
    }
  });

  it("treats an empty or blank search as no search, and a line break as a space", async () => {
    const all = await everything(keeper, `/api/containers?sort=chemical`);
    expect(all.ids.length).toBe(((await t.ds.query(`SELECT COUNT(*) AS n FROM containers`)) as { n: number }[])[0].n);
    for (const blank of ["", "   ", "%0A%09"]) expect((await everything(keeper, `/api/containers?sort=chemical&q=${blank}`)).ids).toEqual(all.ids);
    expect((await everything(keeper, `/api/containers?sort=chemical&q=${encodeURIComponent("Lithium\nchloride")}`)).ids).toEqual(scanContainers("Lithium chloride"));
  });

  it("answers 200 for 10,000 characters of anything, and 400 naming the field beyond", async () => {
    const long = "Lithium chloride ".repeat(600).slice(0, 10_000);
    const r = await keeper.get(`/api/containers?q=${encodeURIComponent(long)}`);
    expect(r.status).toBe(200);
    expect(r.body.items).toEqual([]);
    const operators = `"${'NEAR("a" "b", 3) AND x* OR ^y NOT col:z '.repeat(240)}`.slice(0, 10_000);
    expect((await keeper.get(`/api/containers?q=${encodeURIComponent(operators)}`)).status).toBe(200);
    const tooLong = await keeper.get(`/api/containers?q=${"a".repeat(10_001)}`);
    expect(tooLong.status).toBe(400);
    expect(tooLong.body.errors.map((e: { path: string }) => e.path)).toContain("query.q");
  });
});

describe("GET /api/containers?q= against a plain scan, every way of reading taken", () => {
  // With a few hundred containers the search always sorts its few matches in one read; with the
  // switch points lowered it lists few own-text matches only, walks the groups one by one, and
  // reads long segments in their sort's index, as it does in a large stockroom.
  const usual = { ...SEARCH_TUNING };
  beforeAll(() => Object.assign(SEARCH_TUNING, { ownTextListMax: 3, groupingPassMax: 5, denseAbove: 8 }));
  afterAll(() => Object.assign(SEARCH_TUNING, usual));

  it("still answers exactly the scan, in order, under every sort", async () => {
    const texts = ["chlor", "Li", "🧪", "Sigma", "%", "L1", "eth", "LOT \"A\"", "x", ""];
    for (const text of texts) {
      for (const [filter, extra] of [["", "1 = 1"], [`&status=sealed,in_use&locationId=${cabinets[0]}`, `c.status IN ('sealed', 'in_use') AND c.locationId = ${cabinets[0]}`]]) {
        for (const sort of Object.keys(ORDERS)) {
          for (const dir of ["asc", "desc"]) {
            const got = await everything(keeper, `/api/containers?q=${encodeURIComponent(text)}${filter}&sort=${sort}&dir=${dir}`);
            expect(got.ids, `q=${JSON.stringify(text)}${filter} by ${sort} ${dir}`).toEqual(scanContainers(text, extra, ORDERS[sort](dir.toUpperCase())));
          }
        }
      }
    }
  });
});

describe("GET /api/chemicals?q= and GET /api/users?q= against a plain scan", () => {
  it("finds exactly the chemicals a LIKE scan finds", async () => {
    const values = ((await t.ds.query(`SELECT name AS v FROM chemicals UNION ALL SELECT casNumber FROM chemicals`)) as { v: string }[]).map((r) => r.v);
    for (const text of [...TRICKY_TEXTS, ...randomTexts(values, 60)]) {
      const got = await everything(keeper, `/api/chemicals?q=${encodeURIComponent(text)}`);
      expect(got.ids, `q=${JSON.stringify(text)}`).toEqual(scanChemicals(text));
    }
  });

  it("finds exactly the people a LIKE scan finds, and follows a change of name", async () => {
    const values = ((await t.ds.query(`SELECT name AS v FROM users UNION ALL SELECT email FROM users`)) as { v: string }[]).map((r) => r.v);
    for (const text of [...TRICKY_TEXTS, "O'Brien", '"AND"', "50%_", "kestrelbay", ...randomTexts(values, 60)]) {
      const got = await everything(admin, `/api/users?q=${encodeURIComponent(text)}`);
      expect(got.ids, `q=${JSON.stringify(text)}`).toEqual(scanUsers(text));
    }
    const [who] = scanUsers("Zoë O'Brien");
    expect((await admin.patch(`/api/users/${who}`, { name: "Zoë Okonkwo" })).status).toBe(200);
    expect((await everything(admin, `/api/users?q=${encodeURIComponent("O'Brien")}`)).ids).toEqual([]);
    expect((await everything(admin, `/api/users?q=Okonkwo`)).ids).toEqual([who]);
  });

  it("follows a chemical's new name and synonyms", async () => {
    const [id] = scanChemicals("Naïve ester");
    expect((await keeper.patch(`/api/chemicals/${id}`, { name: "Ethyl formate", synonyms: ["Formic ether"] })).status).toBe(200);
    expect((await everything(keeper, `/api/chemicals?q=${encodeURIComponent("Naïve")}`)).ids).toEqual([]);
    expect((await everything(keeper, `/api/chemicals?q=${encodeURIComponent("formic ETHER")}`)).ids).toEqual([id]);
    expect((await everything(keeper, `/api/containers?q=${encodeURIComponent("formic ETHER")}&sort=chemical`)).ids).toEqual(scanContainers("Formic ether"));
  });
});

describe("totals of long lists", () => {
  it("count exactly up to 1,000 matches, then say 'more than', and still page to the end", async () => {
    const [{ id: chemicalId }] = (await t.ds.query(`INSERT INTO chemicals (name, casNumber, createdAt) VALUES ('Bulk acetonitrile', '75-05-8', '2026-11-01') RETURNING id`)) as { id: number }[];
    await t.ds.query(
      `WITH RECURSIVE n(i) AS (SELECT 1 UNION ALL SELECT i + 1 FROM n WHERE i < 1100)
       INSERT INTO containers (chemicalId, quantity, initialQuantity, unit, locationId, status, labelToken, lot, expiresAt, createdAt)
       SELECT ?, i, 4000, 'mL', ?, 'sealed', 'bulk-' || i, 'BULK-' || i, CASE WHEN i % 3 = 0 THEN NULL ELSE '2027-01-' || printf('%02d', 1 + i % 28) END, '2026-11-01' FROM n`,
      [chemicalId, cabinets[1]],
    );
    for (const sort of ["chemical", "location", "id", "expiresAt", "quantity"]) {
      const first = await keeper.get(`/api/containers?chemicalId=${chemicalId}&sort=${sort}&limit=50`);
      expect(first.body, sort).toMatchObject({ total: 1000, totalIsExact: false });
      const deep = await keeper.get(`/api/containers?chemicalId=${chemicalId}&sort=${sort}&limit=50&offset=1000`);
      expect(deep.body, sort).toMatchObject({ total: 1050, totalIsExact: false });
      const last = await keeper.get(`/api/containers?chemicalId=${chemicalId}&sort=${sort}&limit=200&offset=1000`);
      expect(last.body, sort).toMatchObject({ total: 1100, totalIsExact: true });
      expect(last.body.items).toHaveLength(100);
      const all = await everything(keeper, `/api/containers?chemicalId=${chemicalId}&sort=${sort}`);
      expect(new Set(all.ids).size, sort).toBe(1100);
    }
    // BULK-1, BULK-10…19, BULK-100…199, BULK-1000…1099 and BULK-1100.
    expect((await keeper.get(`/api/containers?q=BULK-1&limit=50`)).body).toMatchObject({ total: 212, totalIsExact: true });
  });
});
