import { describe, expect, it } from "vitest";
import {
  IonTransferError,
  STANDARD_ION_TRANSFER_TABLE,
  distribution,
  previewRunPlan,
  saltIonConcentrations,
  resolveSolvent,
  type PreviewRunPlanInput,
} from "@shared/domain/ion-transfer";
import { distributionDto, distributionInput, runPlanPreviewDto, runPlanPreviewInput } from "@shared/schemas/run-plans";

// Independent constants for the expected values: SI 2019 exact N_A, e, k (SI Brochure, 9th ed.).
const F = 6.02214076e23 * 1.602176634e-19;
const R = 6.02214076e23 * 1.380649e-23;
const rtOverF = (celsius: number) => (R * (celsius + 273.15)) / F;
const TABLE = STANDARD_ION_TRANSFER_TABLE;

function errorOf(run: () => unknown): IonTransferError {
  try {
    run();
  } catch (error) {
    if (error instanceof IonTransferError) return error;
    throw error;
  }
  throw new Error("expected an IonTransferError");
}

/** Custom ions only, so every expected value follows from the equations and the numbers here. */
const customPlan: PreviewRunPlanInput = {
  solvent: "dce",
  aqueous: [
    { ion: "M+", charge: 1, standardPotentialV: 0.55, molPerL: 0.01 },
    { ion: "A-", charge: -1, standardPotentialV: -0.5, molPerL: 0.01 },
  ],
  organic: [
    { ion: "Q+", charge: 1, standardPotentialV: -0.7, molPerL: 0.005 },
    { ion: "B-", charge: -1, standardPotentialV: 0.75, molPerL: 0.005 },
  ],
  analytes: [
    { ion: "X+", charge: 1, standardPotentialV: 0.05, molPerL: 0.001, phase: "aqueous", diffusionAqueousCm2PerS: 1e-5, diffusionOrganicCm2PerS: 5e-6 },
    { ion: "Y-", charge: -1, standardPotentialV: 0.6, molPerL: 0.0005, phase: "organic" },
  ],
  interfaceAreaCm2: 1.13,
  scanRateVPerS: 0.02,
};

describe("previewRunPlan with custom ions", () => {
  const plan = previewRunPlan(customPlan, TABLE);

  it("answers in the shape of the contract", () => {
    expect(runPlanPreviewDto.safeParse(plan).success).toBe(true);
  });

  // Window edges: Nernst equation for ion partition at c_th = 1e-4 mol/L (see window tests).
  it("limits the window by M+ (positive) and A- (negative), to 1 mV of the equation", () => {
    const k = rtOverF(25);
    expect(plan.window.limitingPositive).toBe("M+");
    expect(plan.window.limitingNegative).toBe("A-");
    expect(Math.abs((plan.window.positiveLimitV as number) - (0.55 + k * Math.log(1e-4 / 0.01)))).toBeLessThan(1e-3);
    expect(Math.abs((plan.window.negativeLimitV as number) - (-0.5 - k * Math.log(1e-4 / 0.01)))).toBeLessThan(1e-3);
    expect(plan.window.negativeLimitAppliedV).toBeNull();
  });

  // Δφ½ = Δφ° + (RT/2zF)·ln(D_w/D_o); Randles–Ševčík (Bard & Faulkner eq. 6.2.19) with D of the start phase.
  it("puts X+ at Δφ° + (RT/2F)·ln 2 and gives its Randles–Ševčík peak to 1 %", () => {
    const x = plan.analytes[0];
    expect(Math.abs(x.halfWavePotentialV - (0.05 + (rtOverF(25) / 2) * Math.log(2)))).toBeLessThan(1e-3);
    const expected = 0.4463 * F * 1.13 * 1e-6 * Math.sqrt((F * 0.02 * 1e-5) / (R * 298.15));
    expect(Math.abs((x.peakCurrentA as number) / expected - 1)).toBeLessThan(0.01);
    expect(x.insideWindow).toBe(true);
    expect(x.transfersTowards).toBe("positive");
    expect(x.steadyStateCurrentA).toBeNull();
    // 136 µA: twice that (the headroom rule) fits the 1 mA range.
    expect(expected * 1e6).toBeCloseTo(136, 0);
    expect(x.suggestedCurrentRangeA).toBe(1e-3);
    expect(x.voltammogram?.length).toBeGreaterThan(100);
  });

  it("says when diffusion coefficients are unknown, takes them equal, and flags a transfer outside the window", () => {
    const y = plan.analytes[1];
    expect(y.halfWavePotentialV).toBe(0.6);
    expect(y.diffusionAqueousSource).toMatch(/assumed/);
    expect(y.notes.join(" ")).toMatch(/taken as equal/);
    expect(y.insideWindow).toBe(false);
    expect(y.notes.join(" ")).toMatch(/above the positive limit/);
    expect(y.transfersTowards).toBe("positive");
  });

  it("states the conventions and the cautions for dichloroethane", () => {
    expect(plan.conventions.join(" ")).toMatch(/φ\(water\) − φ\(organic\)/);
    expect(plan.cautions.join(" ")).toMatch(/fume hood/);
    expect(plan.cautions.join(" ")).toMatch(/safety data sheet/);
  });
});

describe("previewRunPlan on a micro-interface and with a reference ion", () => {
  it("gives the steady-state current 4|z|FDcr and puts every potential on the applied scale", () => {
    const plan = previewRunPlan(
      {
        solvent: "dce",
        aqueous: [{ ion: "Li+", molPerL: 0.01 }, { ion: "Cl-", molPerL: 0.01 }],
        organic: [{ ion: "BTPPA+", molPerL: 0.005 }, { ion: "TB(C6F5)4-", molPerL: 0.005 }],
        analytes: [{ ion: "TEA+", molPerL: 0.0005, phase: "aqueous", diffusionOrganicCm2PerS: 8.68e-6 }],
        interfaceRadiusCm: 12.5e-4,
        reference: { ion: "TMA+", measuredHalfWaveV: 0.41 },
      },
      TABLE,
    );
    const tma = resolveSolvent(TABLE, "dce").ions.find((i) => i.ion === "TMA+")?.standardPotential.value as number;
    // TMA+ has no organic diffusion coefficient in the table: taken equal, so its Δφ½ = Δφ°.
    expect(plan.scale?.offsetV).toBeCloseTo(0.41 - tma, 12);
    const tea = plan.analytes[0];
    // Saito / Bard & Faulkner §5.3 (from memory): i_ss = 4|z|FDcr, D of the aqueous phase (table: 0.868e-5).
    expect(Math.abs((tea.steadyStateCurrentA as number) / (4 * F * 0.868e-5 * 0.5e-6 * 12.5e-4) - 1)).toBeLessThan(0.01);
    expect(tea.peakCurrentA).toBeNull();
    expect(tea.voltammogram).toBeNull();
    expect(tea.appliedHalfWaveV).toBeCloseTo(tea.halfWavePotentialV + (0.41 - tma), 12);
    expect(plan.window.positiveLimitAppliedV).toBeCloseTo((plan.window.positiveLimitV as number) + (0.41 - tma), 12);
    expect(plan.suggestedCurrentRangeA).toBe(1e-8);
    expect(runPlanPreviewDto.safeParse(plan).success).toBe(true);
  });

  it("plans LiCl | BTPPA TB(C6F5)4 from the salts' names: edges by Li+ and Cl-, wider than LiCl | TBA TPB", () => {
    const dce = resolveSolvent(TABLE, "dce");
    const phase = (salt: string, c: number) => saltIonConcentrations(dce, salt, c);
    const wide = previewRunPlan({ solvent: "DCE", aqueous: phase("LiCl", 0.01), organic: phase("BTPPA TB(C6F5)4", 0.005) }, TABLE);
    const narrow = previewRunPlan({ solvent: "DCE", aqueous: phase("LiCl", 0.01), organic: phase("TBA TPB", 0.005) }, TABLE);
    expect([wide.window.limitingNegative, wide.window.limitingPositive]).toEqual(["Cl-", "Li+"]);
    expect([narrow.window.limitingNegative, narrow.window.limitingPositive]).toEqual(["TBA+", "TPB-"]);
    expect((wide.window.widthV as number) - (narrow.window.widthV as number)).toBeGreaterThan(0.3);
  });
});

describe("previewRunPlan: bad names", () => {
  it("refuses an unknown solvent, naming it and the known ones", () => {
    const error = errorOf(() => previewRunPlan({ ...customPlan, solvent: "octanol" }, TABLE));
    expect(error).toMatchObject({ code: "unknown_solvent", field: "solvent", unknown: ["octanol"] });
    expect(error.known).toContain("dce");
  });

  it("refuses unknown ions all at once, naming them, their fields and the known ones", () => {
    const error = errorOf(() =>
      previewRunPlan(
        { solvent: "dce", aqueous: [{ ion: "Li+", molPerL: 0.01 }, { ion: "Qq+", molPerL: 0.01 }], organic: [], analytes: [{ ion: "Zz-", molPerL: 1e-3, phase: "aqueous" }] },
        TABLE,
      ),
    );
    expect(error.code).toBe("unknown_ion");
    expect(error.unknown).toEqual(["Qq+", "Zz-"]);
    expect(error.fields).toEqual(["aqueous[1].ion", "analytes[0].ion"]);
    expect(error.known).toContain("TB(C6F5)4-");
  });

  it("answers an open side with null and a sentence when no ion can set it", () => {
    const plan = previewRunPlan({ solvent: "dce", aqueous: [{ ion: "Li+", molPerL: 0.01 }], organic: [] }, TABLE);
    expect(plan.window.negativeLimitV).toBeNull();
    expect(plan.window.notes.join(" ")).toMatch(/negative limit/);
  });
});

describe("distribution", () => {
  it("answers the contract's shape for a single 1:1 salt of table ions: Δφ = (Δφ°₊ + Δφ°₋)/2", () => {
    const answer = distribution(
      { solvent: "dce", aqueousVolumeMl: 5, organicVolumeMl: 5, ions: [{ ion: "TEA+", aqueousMolPerL: 0.001, organicMolPerL: 0 }, { ion: "ClO4-", aqueousMolPerL: 0.001, organicMolPerL: 0 }] },
      TABLE,
    );
    const dce = resolveSolvent(TABLE, "dce");
    const value = (name: string) => dce.ions.find((i) => i.ion === name)?.standardPotential.value as number;
    expect(answer.galvaniPotentialV).toBeCloseTo((value("TEA+") + value("ClO4-")) / 2, 9);
    expect(distributionDto.safeParse(answer).success).toBe(true);
  });

  it("says which solvent it took when none was named", () => {
    const answer = distribution({ aqueousVolumeMl: 5, organicVolumeMl: 5, ions: [{ ion: "TEA+", aqueousMolPerL: 0.001, organicMolPerL: 0 }, { ion: "Cl-", aqueousMolPerL: 0.001, organicMolPerL: 0 }] }, TABLE);
    expect(answer.notes[0]).toMatch(/1,2-dichloroethane/);
  });

  it("reports an unknown ion with the known ones", () => {
    const error = errorOf(() => distribution({ aqueousVolumeMl: 5, organicVolumeMl: 5, ions: [{ ion: "Xx+", aqueousMolPerL: 1e-3, organicMolPerL: 0 }, { ion: "Cl-", aqueousMolPerL: 1e-3, organicMolPerL: 0 }] }, TABLE));
    expect(error).toMatchObject({ code: "unknown_ion", fields: ["ions[0].ion"], unknown: ["Xx+"] });
  });
});

describe("the run-plan schemas", () => {
  const valid = {
    solvent: "dce",
    aqueous: [{ ion: "Li+", molPerL: 0.01 }],
    organic: [{ ion: "X+", charge: 1, standardPotentialV: -0.3, molPerL: 0.005 }],
  };
  const pathsOf = (result: { success: boolean; error?: { issues: { path: PropertyKey[] }[] } }) =>
    (result.error?.issues ?? []).map((issue) => issue.path.join("."));

  it("accepts a plan with a custom ion given inline", () => {
    expect(runPlanPreviewInput.safeParse(valid).success).toBe(true);
  });

  it.each([
    [{ aqueous: [{ ion: "Li+", molPerL: 0 }] }, "aqueous.0.molPerL"],
    [{ organic: [{ ion: "TBA+", molPerL: -0.01 }] }, "organic.0.molPerL"],
    [{ thresholdMolPerL: 0 }, "thresholdMolPerL"],
    [{ temperatureC: 101 }, "temperatureC"],
    [{ temperatureC: -1 }, "temperatureC"],
    [{ organic: [{ ion: "X", charge: 0, standardPotentialV: -0.3, molPerL: 0.005 }] }, "organic.0.charge"],
    [{ organic: [{ ion: "X+", charge: 1, molPerL: 0.005 }] }, "organic.0.standardPotentialV"],
    [{ analytes: [{ ion: "TEA+", molPerL: 1e-3, phase: "water" }] }, "analytes.0.phase"],
    [{ interfaceAreaCm2: 0 }, "interfaceAreaCm2"],
    [{ scanRateVPerS: -0.1 }, "scanRateVPerS"],
  ])("refuses %j, naming %s", (override, path) => {
    expect(pathsOf(runPlanPreviewInput.safeParse({ ...valid, ...override }))).toContain(path);
  });

  it.each([
    [{ aqueousVolumeMl: 0 }, "aqueousVolumeMl"],
    [{ organicVolumeMl: -5 }, "organicVolumeMl"],
    [{ ions: [{ ion: "Li+", aqueousMolPerL: -1, organicMolPerL: 0 }, { ion: "Cl-", aqueousMolPerL: 0.01, organicMolPerL: 0 }] }, "ions.0.aqueousMolPerL"],
    [{ ions: [{ ion: "Li+", aqueousMolPerL: 0, organicMolPerL: 0 }, { ion: "Cl-", aqueousMolPerL: 0.01, organicMolPerL: 0 }] }, "ions.0.aqueousMolPerL"],
    [{ temperatureC: 150 }, "temperatureC"],
  ])("refuses a distribution with %j, naming %s", (override, path) => {
    const request = { aqueousVolumeMl: 5, organicVolumeMl: 5, ions: [{ ion: "Li+", aqueousMolPerL: 0.01, organicMolPerL: 0 }, { ion: "Cl-", aqueousMolPerL: 0.01, organicMolPerL: 0 }] };
    expect(pathsOf(distributionInput.safeParse({ ...request, ...override }))).toContain(path);
  });

  it("accepts an ion present in one phase only", () => {
    expect(
      distributionInput.safeParse({ aqueousVolumeMl: 5, organicVolumeMl: 5, ions: [{ ion: "Li+", aqueousMolPerL: 0.01, organicMolPerL: 0 }, { ion: "Cl-", aqueousMolPerL: 0.01, organicMolPerL: 0 }] }).success,
    ).toBe(true);
  });
});
