import { describe, expect, it } from "vitest";
import { SolutionError, actualConcentration, dilution, planSolution } from "@shared/domain/solutions";
import { molarMassFromFormula } from "@shared/domain/chemistry";

// LiCl: 6.94 + 35.45 = 42.39 g/mol (IUPAC/CIAAW 2021 abridged atomic weights).
const LICL = 42.39;

function solutionErrorOf(run: () => unknown): SolutionError {
  try {
    run();
  } catch (error) {
    if (error instanceof SolutionError) return error;
    throw error;
  }
  throw new Error("expected a SolutionError");
}

describe("planSolution", () => {
  it("needs 42.39 mg of LiCl for 100 mL at 10 mmol/L (reference worked example, m = c × V × M)", () => {
    const plan = planSolution({ concentrationMolPerL: 0.01, volumeMl: 100, molarMassGPerMol: LICL });
    expect(plan.soluteMassG * 1000).toBeCloseTo(42.39, 9);
    expect(plan.soluteAmountMol).toBeCloseTo(0.001, 12);
  });

  it("needs 42.82 mg of 99 % LiCl for the same solution (42.39 mg ÷ 0.99)", () => {
    const plan = planSolution({ concentrationMolPerL: 0.01, volumeMl: 100, molarMassGPerMol: LICL, purityPercent: 99 });
    expect(plan.soluteMassG * 1000).toBeCloseTo(42.82, 2);
    expect(plan.pureSoluteMassG * 1000).toBeCloseTo(42.39, 9);
  });

  it("gives the same answer from the molar mass computed from the formula", () => {
    const plan = planSolution({ concentrationMolPerL: 0.01, volumeMl: 100, molarMassGPerMol: molarMassFromFormula("LiCl") });
    expect(plan.soluteMassG * 1000).toBeCloseTo(42.39, 9);
  });

  it("weighs more of a hydrate than of the bare salt for the same concentration", () => {
    const bare = planSolution({ concentrationMolPerL: 0.1, volumeMl: 50, molarMassGPerMol: molarMassFromFormula("LiCl") });
    const hydrate = planSolution({ concentrationMolPerL: 0.1, volumeMl: 50, molarMassGPerMol: molarMassFromFormula("LiCl·H2O") });
    // the difference is 5 mmol of water: 0.005 mol × 18.015 g/mol
    expect(hydrate.soluteMassG - bare.soluteMassG).toBeCloseTo(0.005 * 18.015, 9);
  });

  it("takes the solvent volume as the final volume and calls it exact for a dilute electrolyte", () => {
    const plan = planSolution({ concentrationMolPerL: 0.01, volumeMl: 100, molarMassGPerMol: LICL });
    expect(plan.solventVolumeMl).toBe(100);
    expect(plan.finalVolumeMl).toBe(100);
    expect(plan.solventVolumeApproximate).toBe(false);
  });

  it("flags the solvent volume as approximate for a concentrated solution (1 mol/L LiCl is 42 g/L)", () => {
    const plan = planSolution({ concentrationMolPerL: 1, volumeMl: 100, molarMassGPerMol: LICL });
    expect(plan.solventVolumeApproximate).toBe(true);
  });

  it.each([
    [{ concentrationMolPerL: 0 }, "concentrationMolPerL"],
    [{ concentrationMolPerL: -0.01 }, "concentrationMolPerL"],
    [{ volumeMl: Number.NaN }, "volumeMl"],
    [{ molarMassGPerMol: Number.POSITIVE_INFINITY }, "molarMassGPerMol"],
  ])("refuses %j with invalid_number on %s", (override, field) => {
    const error = solutionErrorOf(() =>
      planSolution({ concentrationMolPerL: 0.01, volumeMl: 100, molarMassGPerMol: LICL, ...override }),
    );
    expect(error).toMatchObject({ code: "invalid_number", field });
  });

  it.each([0, -5, 100.5, Number.NaN])("refuses a purity of %d %%", (purityPercent) => {
    const error = solutionErrorOf(() =>
      planSolution({ concentrationMolPerL: 0.01, volumeMl: 100, molarMassGPerMol: LICL, purityPercent }),
    );
    expect(error.code).toBe("purity_out_of_range");
  });

  it("accepts a purity of exactly 100 %", () => {
    const plan = planSolution({ concentrationMolPerL: 0.01, volumeMl: 100, molarMassGPerMol: LICL, purityPercent: 100 });
    expect(plan.soluteMassG).toBe(plan.pureSoluteMassG);
  });
});

describe("actualConcentration", () => {
  it("turns 42.39 mg of LiCl in 100 mL back into 10 mmol/L", () => {
    expect(actualConcentration({ massWeighedG: 0.04239, volumeMl: 100, molarMassGPerMol: LICL })).toBeCloseTo(0.01, 12);
  });

  it("turns a slightly heavy weighing of 45.0 mg into 10.62 mmol/L", () => {
    // 0.0450 g ÷ 42.39 g/mol ÷ 0.100 L = 0.010616 mol/L
    expect(actualConcentration({ massWeighedG: 0.045, volumeMl: 100, molarMassGPerMol: LICL })).toBeCloseTo(0.010616, 6);
  });

  it("counts only the pure part of a 99 % solid", () => {
    const c = actualConcentration({ massWeighedG: 0.04282, volumeMl: 100, molarMassGPerMol: LICL, purityPercent: 99 });
    expect(c).toBeCloseTo(0.01, 5);
  });

  it("refuses a zero volume", () => {
    const error = solutionErrorOf(() => actualConcentration({ massWeighedG: 0.04, volumeMl: 0, molarMassGPerMol: LICL }));
    expect(error).toMatchObject({ code: "invalid_number", field: "volumeMl" });
  });
});

describe("dilution", () => {
  it("takes 10 mL of a 100 mmol/L stock for 100 mL at 10 mmol/L and adds 90 mL (C1V1 = C2V2)", () => {
    expect(dilution({ c1: 100, c2: 10, v2: 100 })).toEqual({ v1: 10, diluentVolume: 90 });
  });

  it("takes 2.5 mL of a 1 mol/L stock for 50 mL at 0.05 mol/L", () => {
    const plan = dilution({ c1: 1, c2: 0.05, v2: 50 });
    expect(plan.v1).toBeCloseTo(2.5, 12);
    expect(plan.diluentVolume).toBeCloseTo(47.5, 12);
  });

  it("takes the whole volume from the stock when the concentrations are equal", () => {
    expect(dilution({ c1: 0.1, c2: 0.1, v2: 25 })).toEqual({ v1: 25, diluentVolume: 0 });
  });

  it("refuses to raise the concentration", () => {
    expect(solutionErrorOf(() => dilution({ c1: 10, c2: 20, v2: 100 })).code).toBe("concentration_increase");
  });

  it("refuses a zero stock concentration", () => {
    expect(solutionErrorOf(() => dilution({ c1: 0, c2: 0, v2: 100 })).code).toBe("invalid_number");
  });
});
