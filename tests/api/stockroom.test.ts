/**
 * The Stockroom's contract routes and their rules against the real app: chemicals with
 * computed fields, containers, usage in any compatible unit (atomic, never over-drawn),
 * solution planning and preparation with lineage, and the bad input the issue lists.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { Account, Booking, ContainerUsage, SolutionComponent } from "../../server/entities";

let t: TestApp;
let keeper: ApiClient;
let member: ApiClient;
let memberId: number;
let dce: { id: number };
let licl: { id: number };
let cabinetId: number;

async function signedIn(roles: ("member" | "manager" | "safety_officer")[]): Promise<{ c: ApiClient; id: number }> {
  const u = await makeUser(t.ds, { roles });
  const c = new ApiClient(t.url);
  expect((await c.login(u.email, TEST_PASSWORD)).status).toBe(200);
  return { c, id: u.id };
}

async function receive(chemicalId: number, quantity: number, unit: string, count = 1, locationId: number | null = cabinetId) {
  const r = await keeper.post("/api/containers/receive", { chemicalId, count, quantity, unit, locationId, supplier: "Harbourline Scientific Supply", lot: "T-1" });
  expect(r.status, r.text).toBe(201);
  return r.body.containers as { id: number; quantity: number; labelToken: string }[];
}

beforeAll(async () => {
  t = await startTestApp({ deps: { rateLimits: { login: { windowMs: 60_000, limit: 1000 } } } });
  keeper = (await signedIn(["manager"])).c;
  const m = await signedIn(["member"]);
  member = m.c;
  memberId = m.id;
  const room = await keeper.post("/api/locations", { level: "room", name: "HCB 214", type: "general" });
  expect((await keeper.post(`/api/locations/${room.body.location.id}/limits`, { classes: ["IA", "IB", "IC"], maxVolume: 20, unit: "US gal", includesCabinets: true })).status).toBe(201);
  const cab = await keeper.post("/api/locations", { parentId: room.body.location.id, level: "cabinet", name: "UB-1", type: "flammable_cabinet" });
  expect(cab.status, cab.text).toBe(201);
  cabinetId = cab.body.location.id;
  expect((await keeper.post(`/api/locations/${cabinetId}/limits`, { classes: ["IA", "IB", "IC", "II"], maxVolume: 10, unit: "L", includesCabinets: true })).status).toBe(201);
  const a = await keeper.post("/api/chemicals", {
    name: "1,2-Dichloroethane",
    casNumber: "107-06-2",
    formula: "C2H4Cl2",
    hazardStatements: ["H225", "H302", "H315", "H319", "H335", "H350"],
    flashPointC: 13,
    boilingPointC: 83.5,
    densityGPerMl: 1.2569,
    unitCostCents: 7,
    costUnit: "mL",
  });
  expect(a.status, a.text).toBe(201);
  dce = a.body.chemical;
  const b = await keeper.post("/api/chemicals", { name: "Lithium chloride", casNumber: "7447-41-8", formula: "LiCl", unitCostCents: 70, costUnit: "g" });
  expect(b.status, b.text).toBe(201);
  licl = b.body.chemical;
});
afterAll(async () => {
  await t.close();
});

describe("POST /api/chemicals", () => {
  it("computes the molar mass of C2H4Cl2 as 98.95 g/mol (IUPAC/CIAAW 2021 abridged atomic weights)", async () => {
    const r = await member.get(`/api/chemicals/${dce.id}`);
    expect(r.body.chemical.molarMass).toBeCloseTo(98.95, 2);
    expect(r.body.chemical.molarMassOverridden).toBe(false);
  });

  it("classifies 1,2-dichloroethane (flash 13 °C closed cup, Merck Index; bp 83.5 °C, IARC vol. 71) as GHS category 2 and NFPA 30 class IB", async () => {
    const r = await member.get(`/api/chemicals/${dce.id}`);
    expect(r.body.chemical.ghsFlammableCategory).toBe(2);
    expect(r.body.chemical.nfpaClass).toBe("IB");
    expect(r.body.chemical.carcinogen).toBe(true);
    expect(r.body.chemical.signalWord).toBe("Danger");
    expect(r.body.chemical.pictograms).toEqual(["GHS02", "GHS07", "GHS08"]);
  });

  it("keeps a given molar mass as an override for a solvate", async () => {
    const r = await keeper.post("/api/chemicals", { name: "Lithium tetrakis(pentafluorophenyl)borate ethyl etherate", casNumber: "371162-53-7", formula: "LiB(C6F5)4", molarMass: 871.3 });
    expect(r.status, r.text).toBe(201);
    expect(r.body.chemical.molarMass).toBe(871.3);
    expect(r.body.chemical.molarMassOverridden).toBe(true);
  });

  it("answers 422 naming casNumber for a number whose check digit is wrong (CAS check-digit rule: 107-06-2 is right, 107-06-3 is not)", async () => {
    const r = await keeper.post("/api/chemicals", { name: "Typo", casNumber: "107-06-3" });
    expect(r.status).toBe(422);
    expect(r.headers.get("content-type")).toContain("application/problem+json");
    expect(r.body.errors.map((e: { path: string }) => e.path)).toContain("casNumber");
  });

  it("answers 422 naming formula for a formula that cannot be weighed", async () => {
    const r = await keeper.post("/api/chemicals", { name: "Nonsense", casNumber: "7732-18-5", formula: "C2H4Xx2" });
    expect(r.status).toBe(422);
    expect(r.body.errors[0].path).toBe("formula");
  });

  it("answers 403 to a member", async () => {
    expect((await member.post("/api/chemicals", { name: "Water", casNumber: "7732-18-5" })).status).toBe(403);
  });

  it("lists chemicals with { items, total } and finds one by CAS number", async () => {
    const r = await member.get("/api/chemicals?q=107-06-2");
    expect(r.status).toBe(200);
    expect(r.body.total).toBe(1);
    expect(r.body.items[0]).toMatchObject({ name: "1,2-Dichloroethane", casNumber: "107-06-2", ghsFlammableCategory: 2, nfpaClass: "IB" });
  });
});

describe("POST /api/containers/receive and GET /api/containers", () => {
  it("receives n containers in one request, each with its own random label token", async () => {
    const made = await receive(licl.id, 100, "g", 3);
    expect(made).toHaveLength(3);
    const tokens = new Set(made.map((c) => c.labelToken));
    expect(tokens.size).toBe(3);
    // 18 random bytes as base64url: 24 characters, nothing derived from the id.
    for (const c of made) expect(c.labelToken).toMatch(/^[A-Za-z0-9_-]{24}$/);
  });

  it("filters by chemical, location and status, and searches by chemical name", async () => {
    const r = await member.get(`/api/containers?chemicalId=${licl.id}&locationId=${cabinetId}&status=sealed`);
    expect(r.status).toBe(200);
    expect(r.body.total).toBeGreaterThanOrEqual(3);
    expect(r.body.items.every((c: { chemicalId: number; status: string }) => c.chemicalId === licl.id && c.status === "sealed")).toBe(true);
    const s = await member.get("/api/containers?q=lithium&limit=2");
    expect(s.body.items).toHaveLength(2);
    expect(s.body.total).toBeGreaterThanOrEqual(3);
  });

  it("shows a container's movement history from its receipt", async () => {
    const [c] = await receive(licl.id, 25, "g");
    const r = await member.get(`/api/containers/${c.id}`);
    expect(r.status).toBe(200);
    expect(r.body.movements).toHaveLength(1);
    expect(r.body.movements[0]).toMatchObject({ kind: "received", toLocationId: cabinetId });
  });
});

describe("POST /api/containers/:id/usage", () => {
  it("takes 1 mL from a bottle kept in mL when 1.2569 g is logged (density 1.2569 g/mL at 20 °C, Merck Index)", async () => {
    const [c] = await receive(dce.id, 500, "mL");
    const r = await member.post(`/api/containers/${c.id}/usage`, { amount: 1.2569, unit: "g" });
    expect(r.status, r.text).toBe(200);
    expect(r.body.container.quantity).toBeCloseTo(499, 9);
    expect(r.body.container.status).toBe("in_use");
  });

  it("takes the volume of 10 mmol of 1,2-dichloroethane through its molar mass and density (98.95 g/mol ÷ 1.2569 g/mL → 0.7872 mL)", async () => {
    const [c] = await receive(dce.id, 500, "mL");
    const r = await member.post(`/api/containers/${c.id}/usage`, { amount: 10, unit: "mmol" });
    expect(r.status, r.text).toBe(200);
    expect(500 - r.body.container.quantity).toBeCloseTo(0.98952 / 1.2569, 3);
  });

  it("records the usage with its cost at the chemical's unit cost (10 mL at 7 ¢/mL = 70 ¢) and the booking's account", async () => {
    const [c] = await receive(dce.id, 500, "mL");
    const acc = await t.ds.getRepository(Account).insert({ code: "KB-CHEM-01", name: "Test grant", kind: "internal", customerClass: "internal", createdAt: "2026-01-01T00:00:00Z" });
    const accountId = acc.identifiers[0].id as number;
    const b = await t.ds.getRepository(Booking).insert({
      userId: memberId,
      accountId,
      status: "in_progress",
      startsAt: "2026-12-02T14:00:00.000Z",
      endsAt: "2026-12-02T16:00:00.000Z",
      startMs: Date.parse("2026-12-02T14:00:00Z"),
      endMs: Date.parse("2026-12-02T16:00:00Z"),
      createdAt: "2026-12-01T00:00:00Z",
      updatedAt: "2026-12-01T00:00:00Z",
    });
    const bookingId = b.identifiers[0].id as number;
    const r = await member.post(`/api/containers/${c.id}/usage`, { amount: 10, unit: "mL", bookingId });
    expect(r.status, r.text).toBe(200);
    const usage = await t.ds.getRepository(ContainerUsage).findOneByOrFail({ containerId: c.id });
    expect(usage).toMatchObject({ amount: 10, unit: "mL", amountInContainerUnit: 10, costCents: 70, bookingId, accountId, userId: memberId });
  });

  it("answers 422 when the amount exceeds what is left, and changes nothing", async () => {
    const [c] = await receive(dce.id, 5, "mL");
    const r = await member.post(`/api/containers/${c.id}/usage`, { amount: 5.01, unit: "mL" });
    expect(r.status).toBe(422);
    expect(r.body.errors[0].path).toBe("amount");
    expect((await member.get(`/api/containers/${c.id}`)).body.container.quantity).toBe(5);
  });

  it("answers 422 naming the unit for an unknown unit, a mass of a solid without density, and moles without a formula", async () => {
    const [c] = await receive(dce.id, 50, "mL");
    const unknown = await member.post(`/api/containers/${c.id}/usage`, { amount: 1, unit: "furlong" });
    expect(unknown.status).toBe(422);
    expect(unknown.body.errors[0].path).toBe("unit");
    const [salt] = await receive(licl.id, 10, "g");
    const noDensity = await member.post(`/api/containers/${salt.id}/usage`, { amount: 1, unit: "mL" });
    expect(noDensity.status).toBe(422);
    expect(noDensity.body.errors[0].path).toBe("unit");
    const plain = await keeper.post("/api/chemicals", { name: "Mystery salt", casNumber: "7647-14-5" });
    const [m] = await receive(plain.body.chemical.id, 10, "g");
    const noFormula = await member.post(`/api/containers/${m.id}/usage`, { amount: 1, unit: "mmol" });
    expect(noFormula.status).toBe(422);
    expect(noFormula.body.detail).toMatch(/molar mass/);
  });

  it("answers 422 for zero, negative and absurd amounts and 400 for a non-number", async () => {
    const [c] = await receive(dce.id, 50, "mL");
    for (const amount of [0, -5, 1e12]) {
      const r = await member.post(`/api/containers/${c.id}/usage`, { amount, unit: "mL" });
      expect(r.status, String(amount)).toBe(422);
      expect(r.body.errors[0].path).toBe("amount");
    }
    expect((await member.post(`/api/containers/${c.id}/usage`, { amount: "lots", unit: "mL" })).status).toBe(400);
    expect((await member.get(`/api/containers/${c.id}`)).body.container.quantity).toBe(50);
  });

  it("answers 409 while the container is on hold, and again after it was marked empty", async () => {
    const [c] = await receive(dce.id, 50, "mL");
    expect((await keeper.post(`/api/containers/${c.id}/hold`, { reason: "Cap cracked" })).status).toBe(200);
    expect((await member.post(`/api/containers/${c.id}/usage`, { amount: 1, unit: "mL" })).status).toBe(409);
    expect((await keeper.post(`/api/containers/${c.id}/release`)).body.container.status).toBe("sealed");
    expect((await member.post(`/api/containers/${c.id}/empty`)).status).toBe(200);
    expect((await member.post(`/api/containers/${c.id}/usage`, { amount: 1, unit: "mL" })).status).toBe(409);
  });

  it("answers 409 while the chemical is on hold", async () => {
    const other = await keeper.post("/api/chemicals", { name: "Acetone", casNumber: "67-64-1", formula: "C3H6O", flashPointC: -20, boilingPointC: 56, densityGPerMl: 0.791 });
    const [c] = await receive(other.body.chemical.id, 100, "mL");
    await keeper.post(`/api/chemicals/${other.body.chemical.id}/hold`, { reason: "Recall of the supplier's lot" });
    const r = await member.post(`/api/containers/${c.id}/usage`, { amount: 1, unit: "mL" });
    expect(r.status).toBe(409);
    expect(r.body.code).toBe("chemical_on_hold");
  });

  it("never over-draws under 20 parallel usages, and the sum of the decrements equals what was logged", async () => {
    const [c] = await receive(dce.id, 150, "mL");
    const answers = await Promise.all(Array.from({ length: 20 }, () => member.post(`/api/containers/${c.id}/usage`, { amount: 10, unit: "mL" })));
    expect(answers.filter((a) => a.status === 200)).toHaveLength(15);
    expect(answers.filter((a) => a.status === 422 || a.status === 409)).toHaveLength(5);
    const after = (await member.get(`/api/containers/${c.id}`)).body.container;
    expect(after.quantity).toBe(0);
    expect(after.status).toBe("empty");
    const usages = await t.ds.getRepository(ContainerUsage).findBy({ containerId: c.id });
    expect(usages.reduce((s, u) => s + u.amountInContainerUnit, 0)).toBe(150);
  });

  it("leaves exactly zero and 'empty' after ten parallel usages in mL and L that together take the whole 0.1 L", async () => {
    const [c] = await receive(dce.id, 0.1, "L");
    // 3 × 0.01 L + 7 × 10 mL = 0.1 L; in floating point 0.1 − 0.01 − … does not come to 0.
    const amounts = [...Array.from({ length: 3 }, () => ({ amount: 0.01, unit: "L" })), ...Array.from({ length: 7 }, () => ({ amount: 10, unit: "mL" }))];
    const answers = await Promise.all(amounts.map((a) => member.post(`/api/containers/${c.id}/usage`, a)));
    expect(answers.map((a) => a.status)).toEqual(amounts.map(() => 200));
    const after = (await member.get(`/api/containers/${c.id}`)).body.container;
    expect(after.quantity).toBe(0);
    expect(after.status).toBe("empty");
  });

  it("takes exactly four of ten parallel quarter-usages of a 0.1 L container, in mL and L, and leaves exactly zero", async () => {
    const [c] = await receive(dce.id, 0.1, "L");
    const answers = await Promise.all(Array.from({ length: 10 }, (_, i) => member.post(`/api/containers/${c.id}/usage`, i % 2 ? { amount: 25, unit: "mL" } : { amount: 0.025, unit: "L" })));
    expect(answers.filter((a) => a.status === 200)).toHaveLength(4);
    const after = (await member.get(`/api/containers/${c.id}`)).body.container;
    expect(after.quantity).toBe(0);
    expect(after.status).toBe("empty");
  });
});

describe("POST /api/solutions/plan", () => {
  it("asks for 42.39 mg of LiCl for 10 mmol/L in 100 mL (c × V × M; reference worked example)", async () => {
    const r = await member.post("/api/solutions/plan", { soluteChemicalId: licl.id, concentrationMolPerL: 0.01, volumeMl: 100 });
    expect(r.status, r.text).toBe(200);
    expect(r.body.soluteMassG * 1000).toBeCloseTo(42.39, 2);
  });

  it("divides by the purity (99 % → 42.82 mg)", async () => {
    const r = await member.post("/api/solutions/plan", { soluteChemicalId: licl.id, concentrationMolPerL: 0.01, volumeMl: 100, purityPercent: 99 });
    expect(r.body.soluteMassG * 1000).toBeCloseTo(42.39 / 0.99, 2);
  });

  it("answers 400 naming the field for a negative volume", async () => {
    const r = await member.post("/api/solutions/plan", { soluteChemicalId: licl.id, concentrationMolPerL: 0.01, volumeMl: -1 });
    expect(r.status).toBe(400);
    expect(r.body.errors[0].path).toBe("volumeMl");
  });
});

describe("POST /api/solutions", () => {
  it("creates the solution with its lineage and decrements both parents in one go", async () => {
    const [salt] = await receive(licl.id, 10, "g");
    const [solvent] = await receive(dce.id, 500, "mL");
    const r = await member.post("/api/solutions", { soluteContainerId: salt.id, solventContainerId: solvent.id, concentrationMolPerL: 0.01, volumeMl: 100, massWeighedG: 0.0430 });
    expect(r.status, r.text).toBe(201);
    expect(r.body.container).toMatchObject({ kind: "solution", quantity: 100, unit: "mL", chemicalId: licl.id });
    // 43.0 mg of LiCl (42.39 g/mol) in 100 mL is 10.14 mmol/L.
    expect(r.body.actualConcentrationMolPerL).toBeCloseTo(0.043 / 42.39 / 0.1, 6);
    const [s, v] = r.body.parents;
    expect(s.quantity).toBeCloseTo(10 - 0.043, 9);
    expect(v.quantity).toBeCloseTo(400, 9);
    const lineage = await t.ds.getRepository(SolutionComponent).findBy({ solutionContainerId: r.body.container.id });
    expect(lineage.map((l) => [l.parentContainerId, l.role])).toEqual([
      [salt.id, "solute"],
      [solvent.id, "solvent"],
    ]);
    const detail = await member.get(`/api/containers/${r.body.container.id}`);
    expect(detail.body.parents.map((p: { containerId: number }) => p.containerId)).toEqual([salt.id, solvent.id]);
  });

  it("changes nothing when the solvent bottle has too little left", async () => {
    const [salt] = await receive(licl.id, 10, "g");
    const [solvent] = await receive(dce.id, 50, "mL");
    const r = await member.post("/api/solutions", { soluteContainerId: salt.id, solventContainerId: solvent.id, concentrationMolPerL: 0.01, volumeMl: 100 });
    expect(r.status).toBe(422);
    expect(r.body.errors[0].path).toBe("volumeMl");
    expect((await member.get(`/api/containers/${salt.id}`)).body.container.quantity).toBe(10);
    expect((await member.get(`/api/containers/${solvent.id}`)).body.container.quantity).toBe(50);
  });
});

describe("GET /api/safety/locations", () => {
  it("totals liquid per cabinet by NFPA 30 class, rolls cabinets into their room, and finds each limit", async () => {
    const safety = (await signedIn(["safety_officer"])).c;
    const before = (await safety.get("/api/safety/locations")).body.items.find((l: { id: number }) => l.id === cabinetId);
    // 4 L more of 1,2-dichloroethane (flash 13 °C, boils 83.5 °C: NFPA 30 Class IB) in the 10 L cabinet.
    await receive(dce.id, 2000, "mL", 2);
    const r = await safety.get("/api/safety/locations");
    expect(r.status).toBe(200);
    const cab = r.body.items.find((l: { id: number }) => l.id === cabinetId);
    const room = r.body.items.find((l: { id: number }) => l.id === cab.parentId);
    expect(cab.litresByClass.IB).toBeCloseTo(before.litresByClass.IB + 4, 6);
    const [cabLimit] = cab.limits;
    expect(cabLimit).toMatchObject({ classes: ["IA", "IB", "IC", "II"], maxLitres: 10 });
    expect(cabLimit.finding).toBe(cabLimit.totalLitres > 10 ? "over" : "within");
    expect(room.litresByClass.IB).toBeGreaterThanOrEqual(cab.litresByClass.IB);
    // 20 US gal, typed in gallons, kept in litres: 20 × 3.785411784 L (exact by definition, NIST Handbook 44 Appendix C).
    expect(room.limits[0].maxLitres).toBeCloseTo(75.70823568, 8);
    expect(room.limits[0]).toMatchObject({ enteredVolume: 20, enteredUnit: "US gal" });
  });

  it("asks for a density (422 density_needed) when a flammable liquid arrives by mass without one, and counts it as unknown volume when forced", async () => {
    const hexane = await keeper.post("/api/chemicals", { name: "Hexane (no density on record)", casNumber: "110-54-3", formula: "C6H14", flashPointC: -22, boilingPointC: 69 });
    expect(hexane.status, hexane.text).toBe(201);
    const body = { chemicalId: hexane.body.chemical.id, count: 1, quantity: 2000, unit: "g", locationId: cabinetId };
    const refused = await keeper.post("/api/containers/receive", body);
    expect(refused.status).toBe(422);
    expect(refused.body.code).toBe("density_needed");
    expect(refused.body.errors[0].path).toBe("unit");
    expect(refused.body.detail).toMatch(/density/);
    const forced = await keeper.post("/api/containers/receive", { ...body, allowUnknownVolume: true });
    expect(forced.status).toBe(201);
    const cab = (await keeper.get("/api/safety/locations")).body.items.find((l: { id: number }) => l.id === cabinetId);
    expect(cab.unknownVolumeContainers).toBeGreaterThanOrEqual(1);
    expect(cab.unknownVolumeContainerIds).toContain(forced.body.containers[0].id);
    for (const limit of cab.limits) expect(limit.finding).not.toBe("within");
    await keeper.post(`/api/containers/${forced.body.containers[0].id}/dispose`, { reason: "test done" });
  });

  it("answers 403 to a member", async () => {
    expect((await member.get("/api/safety/locations")).status).toBe(403);
  });
});

describe("GET /api/containers sorted by chemical", () => {
  it("pages by chemical name, in either direction, without losing or repeating a container across chemicals", async () => {
    for (const dir of ["asc", "desc"]) {
      const all = (await member.get(`/api/containers?sort=chemical&dir=${dir}&limit=500`)).body;
      const names = all.items.map((c: { chemicalName: string }) => c.chemicalName);
      expect(names).toEqual([...names].sort((a: string, b: string) => (dir === "asc" ? a.localeCompare(b) : b.localeCompare(a))));
      const paged: number[] = [];
      for (let offset = 0; offset < all.total; offset += 3) {
        const page = await member.get(`/api/containers?sort=chemical&dir=${dir}&limit=3&offset=${offset}`);
        expect(page.body.total).toBe(all.total);
        paged.push(...page.body.items.map((c: { id: number }) => c.id));
      }
      expect(paged).toEqual(all.items.map((c: { id: number }) => c.id));
    }
  });
});

describe("GET /api/containers with text and filters together", () => {
  it("returns exactly the containers that pass every filter, whatever the sort, and pages them", async () => {
    const roomId = (await keeper.get(`/api/locations`)).body.items.find((l: { id: number }) => l.id === cabinetId).parentId as number;
    await receive(licl.id, 500, "g", 2, roomId);
    await receive(dce.id, 1, "L", 1, roomId);
    const opened = (await receive(licl.id, 100, "g", 1))[0];
    expect((await member.post(`/api/containers/${opened.id}/usage`, { amount: 1, unit: "g" })).status).toBe(200);
    type Row = { id: number; chemicalName: string; status: string; locationId: number | null };
    const everything = (await member.get(`/api/containers?limit=500`)).body.items as Row[];
    const expected = (locations: number[]) =>
      everything
        .filter((c) => /lithium/i.test(c.chemicalName) && ["sealed", "in_use"].includes(c.status) && c.locationId !== null && locations.includes(c.locationId))
        .map((c) => c.id)
        .sort((a, b) => a - b);
    const cases = [
      { query: `locationId=${cabinetId}`, ids: expected([cabinetId]) },
      { query: `locationId=${roomId}&within=true`, ids: expected([roomId, cabinetId]) },
    ];
    expect(cases[1].ids.length).toBeGreaterThan(cases[0].ids.length);
    for (const { query, ids } of cases) {
      for (const sort of ["id", "chemical", "location", "quantity"]) {
        const r = await member.get(`/api/containers?q=LITHIUM&status=sealed,in_use&${query}&sort=${sort}&limit=500`);
        expect(r.status).toBe(200);
        expect(r.body.total, `${query} by ${sort}`).toBe(ids.length);
        expect(r.body.items.map((c: Row) => c.id).sort((a: number, b: number) => a - b), `${query} by ${sort}`).toEqual(ids);
        const paged: number[] = [];
        for (let offset = 0; offset < ids.length; offset += 2) {
          paged.push(...(await member.get(`/api/containers?q=LITHIUM&status=sealed,in_use&${query}&sort=${sort}&limit=2&offset=${offset}`)).body.items.map((c: Row) => c.id));
        }
        expect(paged, `${query} by ${sort}, page by page`).toEqual(r.body.items.map((c: Row) => c.id));
      }
    }
  });
});

describe("GET /api/containers sorted by expiry", () => {
  it("lists the soonest expiry first and containers without a date last, in either direction", async () => {
    const dated = await keeper.post("/api/containers/receive", { chemicalId: licl.id, count: 1, quantity: 5, unit: "g", locationId: cabinetId, expiresAt: "2027-01-15" });
    expect(dated.status, dated.text).toBe(201);
    await receive(licl.id, 5, "g");
    for (const dir of ["asc", "desc"]) {
      const items = (await member.get(`/api/containers?sort=expiresAt&dir=${dir}&limit=500`)).body.items as { expiresAt: string | null }[];
      const dates = items.map((c) => c.expiresAt);
      const firstNull = dates.indexOf(null);
      expect(firstNull, "some containers have no date").toBeGreaterThan(0);
      expect(dates.slice(firstNull).every((d) => d === null), `${dir}: no dated container after an undated one`).toBe(true);
      const known = dates.slice(0, firstNull) as string[];
      expect(known).toEqual([...known].sort((a, b) => (dir === "asc" ? a.localeCompare(b) : b.localeCompare(a))));
    }
  });
});

describe("POST /api/containers/:id/waste", () => {
  async function carboy(capacityL = 5) {
    const r = await keeper.post("/api/containers/receive", { chemicalId: dce.id, count: 1, quantity: capacityL, unit: "L", kind: "waste", locationId: cabinetId });
    expect(r.status, r.text).toBe(201);
    return r.body.containers[0] as { id: number; quantity: number; initialQuantity: number; status: string };
  }

  it("receives a waste container empty and in use, its size being the capacity", async () => {
    const w = await carboy();
    expect(w).toMatchObject({ quantity: 0, initialQuantity: 5, status: "in_use" });
  });

  it("adds 250 mL to a 5 L carboy as 0.25 L", async () => {
    const w = await carboy();
    const r = await member.post(`/api/containers/${w.id}/waste`, { amount: 250, unit: "mL" });
    expect(r.status, r.text).toBe(200);
    expect(r.body.container.quantity).toBeCloseTo(0.25, 12);
  });

  it("converts a mass through the density: 125.69 g of 1,2-dichloroethane is 100 mL (1.2569 g/mL at 20 °C, Merck Index)", async () => {
    const w = await carboy();
    const r = await member.post(`/api/containers/${w.id}/waste`, { amount: 125.69, unit: "g" });
    expect(r.status, r.text).toBe(200);
    expect(r.body.container.quantity).toBeCloseTo(0.1, 9);
  });

  it("answers 422 naming the amount when the carboy would overflow, and changes nothing", async () => {
    const w = await carboy(1);
    expect((await member.post(`/api/containers/${w.id}/waste`, { amount: 900, unit: "mL" })).status).toBe(200);
    const r = await member.post(`/api/containers/${w.id}/waste`, { amount: 200, unit: "mL" });
    expect(r.status).toBe(422);
    expect(r.body.code).toBe("waste_container_full");
    expect(r.body.errors[0].path).toBe("amount");
    expect((await member.get(`/api/containers/${w.id}`)).body.container.quantity).toBeCloseTo(0.9, 12);
  });

  it("answers 409 for a container that is not waste", async () => {
    const [bottle] = await receive(dce.id, 500, "mL");
    const r = await member.post(`/api/containers/${bottle.id}/waste`, { amount: 10, unit: "mL" });
    expect(r.status).toBe(409);
    expect(r.body.code).toBe("not_waste_container");
  });

  it("answers 422 for a unit of no known kind", async () => {
    const w = await carboy();
    const r = await member.post(`/api/containers/${w.id}/waste`, { amount: 10, unit: "cups" });
    expect(r.status).toBe(422);
    expect(r.body.errors[0].path).toBe("unit");
  });
});
