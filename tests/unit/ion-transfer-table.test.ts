import { describe, expect, it } from "vitest";
import {
  FARADAY_C_PER_MOL,
  GAS_CONSTANT_J_PER_MOL_K,
  IonTransferError,
  STANDARD_ION_TRANSFER_TABLE,
  findIon,
  resolveIons,
  resolveSolvent,
  saltIonConcentrations,
  saltIons,
  thermalVoltageV,
} from "@shared/domain/ion-transfer";

const DCE = resolveSolvent(STANDARD_ION_TRANSFER_TABLE, "dce");

function errorOf(run: () => unknown): IonTransferError {
  try {
    run();
  } catch (error) {
    if (error instanceof IonTransferError) return error;
    throw error;
  }
  throw new Error("expected an IonTransferError");
}

describe("constants", () => {
  it("takes F = N_A·e = 96 485.332 12 C/mol (CODATA 2018, from the exact SI 2019 constants)", () => {
    expect(FARADAY_C_PER_MOL).toBeCloseTo(96485.33212, 4);
  });

  it("takes R = N_A·k = 8.314 462 618 J/(mol·K) (CODATA 2018)", () => {
    expect(GAS_CONSTANT_J_PER_MOL_K).toBeCloseTo(8.314462618, 8);
  });

  it("gives a Nernst slope (RT/F)·ln 10 of 59.159 mV per decade at 25 °C (reference check values)", () => {
    expect(thermalVoltageV(25) * Math.log(10) * 1000).toBeCloseTo(59.159, 3);
  });
});

describe("the ion table", () => {
  const everyIon = STANDARD_ION_TRANSFER_TABLE.flatMap((s) => s.ions.map((ion) => ({ solvent: s.id, ion })));

  it("names a source beside every value", () => {
    for (const { ion } of everyIon) {
      expect(ion.standardPotential.source.length, ion.ion).toBeGreaterThan(20);
      if (ion.diffusionAqueous) expect(ion.diffusionAqueous.source.length, ion.ion).toBeGreaterThan(20);
      if (ion.diffusionOrganic) expect(ion.diffusionOrganic.source.length, ion.ion).toBeGreaterThan(20);
    }
  });

  it("writes the charge's sign in the name the trade uses", () => {
    for (const { ion } of everyIon) expect(ion.ion.endsWith(ion.charge > 0 ? "+" : "-"), ion.ion).toBe(true);
  });

  // Δ_o^w φ° = ΔG°tr(w→o)/(zF): hydrophilic cations and hydrophobic anions positive, hydrophilic
  // anions and hydrophobic cations negative (IUPAC sign convention, Pure Appl. Chem. 76 (2004) 2147).
  it.each([
    ["Li+", 0.5, 0.65],
    ["Na+", 0.5, 0.65],
    ["Cl-", -0.6, -0.45],
    ["TMA+", 0.1, 0.2],
    ["TEA+", -0.03, 0.07],
    ["TBA+", -0.3, -0.15],
    ["TPAs+", -0.4, -0.3],
    ["TPB-", 0.3, 0.4],
    ["BTPPA+", -1.2, -0.6],
    ["TB(C6F5)4-", 0.65, 1.2],
  ])("puts %s in water | DCE between %d V and %d V", (name, low, high) => {
    const value = findIon(DCE, name)?.standardPotential.value as number;
    expect(value).toBeGreaterThanOrEqual(low);
    expect(value).toBeLessThanOrEqual(high);
  });

  it("puts TPAs+ and TPB- symmetrically about zero, as the TATB assumption requires, in both solvents", () => {
    for (const solvent of STANDARD_ION_TRANSFER_TABLE) {
      const cation = findIon(solvent, "TPAs+")?.standardPotential.value as number;
      const anion = findIon(solvent, "TPB-")?.standardPotential.value as number;
      expect(cation + anion).toBeCloseTo(0, 12);
    }
  });

  it("orders the tetraalkylammonium ions by hydrophobicity: TMA+ > TEA+ > TPrA+ > TBA+ in DCE", () => {
    const v = (n: string) => findIon(DCE, n)?.standardPotential.value as number;
    expect(v("TMA+")).toBeGreaterThan(v("TEA+"));
    expect(v("TEA+")).toBeGreaterThan(v("TPrA+"));
    expect(v("TPrA+")).toBeGreaterThan(v("TBA+"));
  });
});

describe("resolveSolvent", () => {
  it.each(["dce", "DCE", "1,2-dichloroethane", " Nitrobenzene ", "NB"])("finds %j", (name) => {
    expect(() => resolveSolvent(STANDARD_ION_TRANSFER_TABLE, name)).not.toThrow();
  });

  it("takes 1,2-dichloroethane when no solvent is named", () => {
    expect(resolveSolvent(STANDARD_ION_TRANSFER_TABLE, undefined).id).toBe("dce");
  });

  it("refuses an unknown solvent, naming it and the known ones", () => {
    const error = errorOf(() => resolveSolvent(STANDARD_ION_TRANSFER_TABLE, "toluene"));
    expect(error.code).toBe("unknown_solvent");
    expect(error.field).toBe("solvent");
    expect(error.unknown).toEqual(["toluene"]);
    expect(error.known).toEqual(["dce", "nitrobenzene"]);
    expect(error.message).toContain("toluene");
    expect(error.message).toContain("dce");
  });
});

describe("resolveIons", () => {
  it("reads table ions, aliases and Unicode minus signs", () => {
    const ions = resolveIons(DCE, [
      { ref: { ion: "Li+" }, path: "a" },
      { ref: { ion: "TPFB-" }, path: "b" },
      { ref: { ion: "Cl\u2212" }, path: "c" },
    ]);
    expect(ions.map((i) => i.ion)).toEqual(["Li+", "TB(C6F5)4-", "Cl-"]);
    expect(ions[0].diffusionAqueousCm2PerS).toBeCloseTo(1.029e-5, 12);
    expect(ions[0].custom).toBe(false);
  });

  it("takes a custom ion's charge and potential from the request", () => {
    const [ion] = resolveIons(DCE, [{ ref: { ion: "X+", charge: 1, standardPotentialV: -0.3 }, path: "a" }]);
    expect(ion).toMatchObject({ ion: "X+", charge: 1, standardPotentialV: -0.3, custom: true, source: "given in the request" });
  });

  it("lets a measured diffusion coefficient override the table's", () => {
    const [ion] = resolveIons(DCE, [{ ref: { ion: "TEA+", diffusionAqueousCm2PerS: 9e-6 }, path: "a" }]);
    expect(ion.diffusionAqueousCm2PerS).toBe(9e-6);
    expect(ion.diffusionAqueousSource).toBe("given in the request");
  });

  it("reports every unknown ion at once, with the paths and the known ions", () => {
    const error = errorOf(() =>
      resolveIons(DCE, [
        { ref: { ion: "Li+" }, path: "aqueous[0]" },
        { ref: { ion: "Xx+" }, path: "aqueous[1]" },
        { ref: { ion: "Yy-" }, path: "organic[0]" },
      ]),
    );
    expect(error.code).toBe("unknown_ion");
    expect(error.unknown).toEqual(["Xx+", "Yy-"]);
    expect(error.fields).toEqual(["aqueous[1].ion", "organic[0].ion"]);
    expect(error.known).toContain("BTPPA+");
    expect(error.message).toContain("Xx+");
  });

  it("refuses a custom ion of charge 0 or without its potential", () => {
    expect(errorOf(() => resolveIons(DCE, [{ ref: { ion: "X", charge: 0, standardPotentialV: 0.1 }, path: "a" }])).code).toBe("invalid_ion");
    expect(errorOf(() => resolveIons(DCE, [{ ref: { ion: "X+", charge: 1 }, path: "a" }])).code).toBe("invalid_ion");
  });
});

describe("saltIons", () => {
  it.each([
    ["LiCl", ["Li+", "Cl-"]],
    ["BTPPA TB(C6F5)4", ["BTPPA+", "TB(C6F5)4-"]],
    ["BTPPATPFB", ["BTPPA+", "TB(C6F5)4-"]],
    ["TBA TPB", ["TBA+", "TPB-"]],
    ["TBATPB", ["TBA+", "TPB-"]],
    ["TPAsTPB", ["TPAs+", "TPB-"]],
    ["KTPBCl", ["K+", "TPBCl-"]],
    ["TBACl", ["TBA+", "Cl-"]],
    ["NaClO4", ["Na+", "ClO4-"]],
  ])("splits %s into %j, one of each per formula unit", (salt, ions) => {
    const parts = saltIons(DCE, salt);
    expect(parts.map((p) => p.ion)).toEqual(ions);
    expect(parts.map((p) => p.stoichiometry)).toEqual([1, 1]);
  });

  it("gives 10 mmol/L of each ion from 10 mmol/L of LiCl", () => {
    expect(saltIonConcentrations(DCE, "LiCl", 0.01)).toEqual([
      { ion: "Li+", molPerL: 0.01 },
      { ion: "Cl-", molPerL: 0.01 },
    ]);
  });

  it("refuses a salt it cannot split, naming it", () => {
    const error = errorOf(() => saltIons(DCE, "CsI"));
    expect(error.code).toBe("unknown_salt");
    expect(error.unknown).toEqual(["CsI"]);
  });
});
