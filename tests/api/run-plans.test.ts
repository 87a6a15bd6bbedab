/**
 * Run plans' contract routes through the API (issue 12): the ion table, POST /api/run-plans/preview
 * and /distribution with the issue's worked cases (custom ions, so every expected value follows from
 * the equations and the numbers written here), the table's electrolytes, and bad input.
 *
 * Sources of the equations checked: the Nernst equation for ion partition and the sign convention
 * Δ_o^w φ = φ(w) − φ(o) (IUPAC, Samec, Pure Appl. Chem. 76 (2004) 2147); Randles–Ševčík
 * i_p = 0.4463 zFAc (zFvD/RT)^½ (Bard & Faulkner, Electrochemical Methods, 2nd ed., eq. 6.2.19);
 * the steady-state current of an inlaid disc 4zFDcr (Saito 1968; Bard & Faulkner §5.3, from memory);
 * the distribution potential of a single salt, Δφ = (Δφ°₊ + Δφ°₋)/2 (the classic result of the
 * Nernst partition of both ions with electroneutrality; Girault, Electrochemistry at liquid–liquid
 * interfaces, from memory). Constants: the exact SI 2019 N_A, e, k (CODATA 2018).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";

const F = 6.02214076e23 * 1.602176634e-19;
const R = 6.02214076e23 * 1.380649e-23;
const k = (celsius: number) => (R * (celsius + 273.15)) / F;

let t: TestApp;
let member: ApiClient;
let manager: ApiClient;

beforeAll(async () => {
  t = await startTestApp();
  const m = await makeUser(t.ds, { roles: ["member"] });
  const boss = await makeUser(t.ds, { roles: ["manager", "member"] });
  member = new ApiClient(t.url);
  manager = new ApiClient(t.url);
  await member.login(m.email, TEST_PASSWORD);
  await manager.login(boss.email, TEST_PASSWORD);
});
afterAll(async () => {
  await t.close();
});

const salt = (cation: [string, number], anion: [string, number], molPerL: number) => [
  { ion: cation[0], charge: 1, standardPotentialV: cation[1], molPerL },
  { ion: anion[0], charge: -1, standardPotentialV: anion[1], molPerL },
];

describe("the ion table", () => {
  it("lists water | 1,2-dichloroethane and nitrobenzene, with the conventions", async () => {
    const r = await member.get("/api/ion-transfer/solvents");
    expect(r.status).toBe(200);
    expect(r.body.items.map((s: { id: string }) => s.id)).toEqual(expect.arrayContaining(["dce", "nitrobenzene"]));
    expect(r.body.items.find((s: { id: string }) => s.id === "dce").casNumber).toBe("107-06-2");
    expect(r.body.conventions.join(" ")).toContain("Pure Appl. Chem. 76 (2004) 2147");
  });

  it("gives each ion's charge and potential with its source, and keeps the 'from memory' marks", async () => {
    const r = await member.get("/api/ion-transfer/ions?solvent=DCE");
    expect(r.status).toBe(200);
    expect(r.body.solvent.id).toBe("dce");
    const li = r.body.items.find((i: { ion: string }) => i.ion === "Li+");
    expect(li.charge).toBe(1);
    expect(li.standardPotential.source).toMatch(/from memory/);
    expect(li.fromMemory).toBe(true);
    for (const ion of ["BTPPA+", "TB(C6F5)4-", "TBA+", "TPB-", "Cl-"]) expect(r.body.items.map((i: { ion: string }) => i.ion)).toContain(ion);
  });

  it("answers an unknown solvent with 422 naming it and the known ones", async () => {
    const r = await member.get("/api/ion-transfer/ions?solvent=octanol");
    expect(r.status).toBe(422);
    expect(r.body.code).toBe("unknown_solvent");
    expect(r.body.unknown).toEqual(["octanol"]);
    expect(r.body.known).toEqual(expect.arrayContaining(["dce", "nitrobenzene"]));
    expect(r.body.errors[0].path).toBe("solvent");
  });

  it("lets the manager add a solvent and an ion with their sources, and nobody else", async () => {
    const source = "Invented for this test: Example & Author, J. Test. Chem. 1 (2026) 1";
    expect((await member.post("/api/ion-transfer/solvents", { id: "tft", name: "α,α,α-trifluorotoluene", source })).status).toBe(403);
    const s = await manager.post("/api/ion-transfer/solvents", { id: "tft", name: "α,α,α-trifluorotoluene", aliases: ["TFT"], casNumber: "98-08-8", source });
    expect(s.status, s.text).toBe(201);
    expect(s.body.items.find((x: { id: string }) => x.id === "tft")).toEqual(expect.objectContaining({ origin: "added", source, casNumber: "98-08-8" }));
    const ion = await manager.post("/api/ion-transfer/ions", { solvent: "TFT", ion: "TMA+", charge: 1, standardPotentialV: 0.2, source });
    expect(ion.status, ion.text).toBe(201);
    expect(ion.body.items).toEqual([expect.objectContaining({ ion: "TMA+", origin: "added", fromMemory: false, standardPotential: { value: 0.2, source } })]);
    expect((await manager.post("/api/ion-transfer/ions", { solvent: "tft", ion: "TMA+", charge: 1, standardPotentialV: 0.2, source })).status).toBe(409);
    const wrongSign = await manager.post("/api/ion-transfer/ions", { solvent: "tft", ion: "Cl-", charge: 1, standardPotentialV: -0.5, source });
    expect(wrongSign.status).toBe(422);
    expect(wrongSign.body.errors[0].path).toBe("charge");
    const noSource = await manager.post("/api/ion-transfer/ions", { solvent: "tft", ion: "Na+", charge: 1, standardPotentialV: 0.5 });
    expect(noSource.status).toBe(400);
    expect(noSource.body.errors.map((e: { path: string }) => e.path)).toContain("source");
    const unknown = await manager.post("/api/ion-transfer/ions", { solvent: "hexane", ion: "Na+", charge: 1, standardPotentialV: 0.5, source });
    expect(unknown.status).toBe(422);
    expect(unknown.body.known).toContain("tft");
  });
});

describe("POST /api/run-plans/preview: the issue's worked cases with custom ions", () => {
  const preview = (body: object) => member.post("/api/run-plans/preview", body);

  it("a single 1:1 salt in water: the cation limits the positive end, the anion the negative, each at c_th by the Nernst equation", async () => {
    const r = await preview({ solvent: "dce", aqueous: salt(["M+", 0.55], ["A-", -0.5], 0.01), organic: [] });
    expect(r.status, r.text).toBe(200);
    expect(r.body.window.limitingPositive).toBe("M+");
    expect(r.body.window.limitingNegative).toBe("A-");
    expect(Math.abs(r.body.window.positiveLimitV - (0.55 + k(25) * Math.log(1e-4 / 0.01)))).toBeLessThan(1e-3);
    expect(Math.abs(r.body.window.negativeLimitV - (-0.5 - k(25) * Math.log(1e-4 / 0.01)))).toBeLessThan(1e-3);
  });

  it("the same salt at 50 °C: only RT/F changes", async () => {
    const r = await preview({ solvent: "dce", temperatureC: 50, aqueous: salt(["M+", 0.55], ["A-", -0.5], 0.01), organic: [] });
    expect(Math.abs(r.body.window.positiveLimitV - (0.55 + k(50) * Math.log(1e-4 / 0.01)))).toBeLessThan(1e-3);
    expect(r.body.notes.join(" ")).toMatch(/50 °C/);
  });

  it("a tenfold change of the organic supporting electrolyte moves its edges by (RT/F)·ln 10 = 59.2 mV at 25 °C", async () => {
    const organic = (c: number) => salt(["Q+", -0.7], ["B-", 0.75], c);
    const a = await preview({ solvent: "dce", aqueous: [], organic: organic(0.001) });
    const b = await preview({ solvent: "dce", aqueous: [], organic: organic(0.01) });
    expect(a.body.window.limitingNegative).toBe("Q+");
    // Q+ in oil: edge = Δφ° + (RT/F)·ln(c/c_th), so ten times the salt lowers it by 59.16 mV.
    expect(Math.abs(b.body.window.negativeLimitV - a.body.window.negativeLimitV - k(25) * Math.log(10))).toBeLessThan(1e-3);
    expect(Math.abs(a.body.window.positiveLimitV - b.body.window.positiveLimitV - k(25) * Math.log(10))).toBeLessThan(1e-3);
  });

  it("gives the Randles–Ševčík peak at a large interface and 4zFDcr at a micro-interface, to 1 %", async () => {
    const analyte = { ion: "X+", charge: 1, standardPotentialV: 0.05, molPerL: 0.001, phase: "aqueous", diffusionAqueousCm2PerS: 1e-5, diffusionOrganicCm2PerS: 1e-5 };
    const base = { solvent: "dce", aqueous: salt(["M+", 0.55], ["A-", -0.5], 0.01), organic: salt(["Q+", -0.7], ["B-", 0.75], 0.005), analytes: [analyte] };
    const big = await preview({ ...base, interfaceAreaCm2: 1.53, scanRateVPerS: 0.05 });
    const expected = 0.4463 * F * 1.53 * 1e-6 * Math.sqrt((F * 0.05 * 1e-5) / (R * 298.15));
    expect(Math.abs(big.body.analytes[0].peakCurrentA / expected - 1)).toBeLessThan(0.01);
    expect(big.body.analytes[0].insideWindow).toBe(true);
    expect(big.body.analytes[0].voltammogram.length).toBeGreaterThan(50);
    const micro = await preview({ ...base, interfaceRadiusCm: 1.25e-3 });
    expect(Math.abs(micro.body.analytes[0].steadyStateCurrentA / (4 * F * 1e-5 * 1e-6 * 1.25e-3) - 1)).toBeLessThan(0.01);
    expect(micro.body.analytes[0].peakCurrentA).toBeNull();
  });

  it("answers a side no ion can set as null, with a sentence", async () => {
    // Only an anion in water: it can set the negative end; nothing sets the positive one.
    const r = await preview({ solvent: "dce", aqueous: [{ ion: "A-", charge: -1, standardPotentialV: -0.5, molPerL: 0.01 }], organic: [] });
    expect(r.status).toBe(200);
    expect(r.body.window.positiveLimitV).toBeNull();
    expect(r.body.window.widthV).toBeNull();
    expect(r.body.window.notes.join(" ")).toMatch(/positive limit/);
  });
});

describe("POST /api/run-plans/distribution", () => {
  it("puts a single salt's distribution potential at the mean of its ions' standard potentials", async () => {
    const r = await member.post("/api/run-plans/distribution", {
      aqueousVolumeMl: 5,
      organicVolumeMl: 4,
      ions: [
        { ion: "C+", charge: 1, standardPotentialV: 0.1, aqueousMolPerL: 0.01, organicMolPerL: 0 },
        { ion: "D-", charge: -1, standardPotentialV: -0.05, aqueousMolPerL: 0.01, organicMolPerL: 0 },
      ],
    });
    expect(r.status, r.text).toBe(200);
    expect(Math.abs(r.body.galvaniPotentialV - (0.1 - 0.05) / 2)).toBeLessThan(1e-3);
  });

  it("a common ion in both phases at equal concentrations, with two ions that cannot cross, sits at that ion's standard potential", async () => {
    const r = await member.post("/api/run-plans/distribution", {
      solvent: "dce",
      aqueousVolumeMl: 5,
      organicVolumeMl: 5,
      ions: [
        { ion: "X+", charge: 1, standardPotentialV: 0.3, aqueousMolPerL: 0.01, organicMolPerL: 0.01 },
        { ion: "Y-", charge: -1, standardPotentialV: -1.2, aqueousMolPerL: 0.01, organicMolPerL: 0 },
        { ion: "Z-", charge: -1, standardPotentialV: 1.2, aqueousMolPerL: 0, organicMolPerL: 0.01 },
      ],
    });
    expect(r.status, r.text).toBe(200);
    expect(Math.abs(r.body.galvaniPotentialV - 0.3)).toBeLessThan(1e-3);
    const x = r.body.ions.find((i: { ion: string }) => i.ion === "X+");
    expect(Math.abs(x.aqueousMolPerL / 0.01 - 1)).toBeLessThan(0.01);
  });
});

describe("the table's electrolytes", () => {
  it("LiCl | BTPPA TB(C6F5)4 gives a clearly wider window than LiCl | TBA TPB, each edge set by the ion a practitioner expects", async () => {
    const plan = (organic: [string, string]) =>
      member.post("/api/run-plans/preview", {
        solvent: "dce",
        aqueous: [{ ion: "Li+", molPerL: 0.01 }, { ion: "Cl-", molPerL: 0.01 }],
        organic: [{ ion: organic[0], molPerL: 0.005 }, { ion: organic[1], molPerL: 0.005 }],
      });
    const wide = await plan(["BTPPA+", "TB(C6F5)4-"]);
    const narrow = await plan(["TBA+", "TPB-"]);
    expect(wide.status, wide.text).toBe(200);
    // With the hydrophobic organic salt, the aqueous ions limit: Li+ at the positive end, Cl− at the negative.
    expect([wide.body.window.limitingNegative, wide.body.window.limitingPositive]).toEqual(["Cl-", "Li+"]);
    // With TBA TPB, the organic ions transfer first: TBA+ at the negative end, TPB− at the positive.
    expect([narrow.body.window.limitingNegative, narrow.body.window.limitingPositive]).toEqual(["TBA+", "TPB-"]);
    expect(wide.body.window.widthV - narrow.body.window.widthV).toBeGreaterThan(0.3);
  });

  it("accepts the trade's aliases and mixes table and custom ions", async () => {
    const r = await member.post("/api/run-plans/preview", {
      solvent: "1,2-DCE",
      aqueous: [{ ion: "Li+", molPerL: 0.01 }, { ion: "Cl−", molPerL: 0.01 }],
      organic: [{ ion: "PNP+", molPerL: 0.005 }, { ion: "TPFB-", molPerL: 0.005 }],
      analytes: [{ ion: "TEA+", molPerL: 0.0005, phase: "aqueous" }],
    });
    expect(r.status, r.text).toBe(200);
    expect(r.body.analytes[0].ion).toBe("TEA+");
    expect(r.body.analytes[0].insideWindow).toBe(true);
  });
});

describe("bad input", () => {
  const ok = { solvent: "dce", aqueous: salt(["M+", 0.55], ["A-", -0.5], 0.01), organic: [] };
  it.each([
    [{ ...ok, temperatureC: 120 }, "temperatureC"],
    [{ ...ok, thresholdMolPerL: 0 }, "thresholdMolPerL"],
    [{ ...ok, aqueous: [{ ion: "M+", charge: 1, standardPotentialV: 0.55, molPerL: 0 }] }, "aqueous.0.molPerL"],
    [{ ...ok, aqueous: [{ ion: "M", charge: 0, standardPotentialV: 0.55, molPerL: 0.01 }] }, "aqueous.0.charge"],
    [{ ...ok, interfaceAreaCm2: -1 }, "interfaceAreaCm2"],
  ])("answers 400 naming the field (%#)", async (body, field) => {
    const r = await member.post("/api/run-plans/preview", body);
    expect(r.status).toBe(400);
    expect(r.body.errors.map((e: { path: string }) => e.path)).toContain(field);
  });

  it("answers 400 for a volume of zero in a distribution", async () => {
    const r = await member.post("/api/run-plans/distribution", { aqueousVolumeMl: 0, organicVolumeMl: 5, ions: salt(["C+", 0.1], ["D-", -0.1], 0.01).map(({ molPerL, ...i }) => ({ ...i, aqueousMolPerL: molPerL, organicMolPerL: 0 })) });
    expect(r.status).toBe(400);
    expect(r.body.errors.map((e: { path: string }) => e.path)).toContain("aqueousVolumeMl");
  });

  it("answers unknown ions with 422 naming every one and the known ones", async () => {
    const r = await member.post("/api/run-plans/preview", { solvent: "dce", aqueous: [{ ion: "Qx+", molPerL: 0.01 }, { ion: "Cl-", molPerL: 0.01 }], organic: [{ ion: "Zz-", molPerL: 0.01 }] });
    expect(r.status).toBe(422);
    expect(r.body.code).toBe("unknown_ion");
    expect(r.body.unknown).toEqual(["Qx+", "Zz-"]);
    expect(r.body.known).toContain("Li+");
    expect(r.body.errors.map((e: { path: string }) => e.path)).toEqual(["aqueous.0.ion", "organic.0.ion"]);
  });

  it("answers an unknown solvent with 422 naming it", async () => {
    const r = await member.post("/api/run-plans/preview", { ...ok, solvent: "octanol" });
    expect(r.status).toBe(422);
    expect(r.body.unknown).toEqual(["octanol"]);
  });

  it("is for people who are signed in", async () => {
    expect((await new ApiClient(t.url).post("/api/run-plans/preview", ok)).status).toBe(401);
  });
});
