import { describe, expect, it } from "vitest";
import { UNITS, UnitError, convertAmount, isUnit, parseUnit, unitDimension } from "@shared/domain/units";

// 1,2-Dichloroethane: density 1.2569 g/mL at 20 °C (Merck Index); molar mass 98.954 g/mol from
// CIAAW 2021 abridged atomic weights (2 × 12.011 + 4 × 1.008 + 2 × 35.45).
const DCE = { densityGPerMl: 1.2569, molarMassGPerMol: 98.954 };
// Lithium chloride: 6.94 + 35.45 = 42.39 g/mol (CIAAW 2021 abridged).
const LICL_MOLAR_MASS = 42.39;

function unitErrorOf(run: () => unknown): UnitError {
  try {
    run();
  } catch (error) {
    if (error instanceof UnitError) return error;
    throw error;
  }
  throw new Error("expected a UnitError");
}

describe("UNITS", () => {
  it("offers mass, volume and amount units for the UI, each with its dimension", () => {
    expect(UNITS.map((u) => u.unit)).toEqual(["mg", "g", "kg", "µL", "mL", "L", "mmol", "mol"]);
    expect(new Set(UNITS.map((u) => u.dimension))).toEqual(new Set(["mass", "volume", "amount"]));
  });
});

describe("unitDimension", () => {
  it.each([
    ["mg", "mass"], ["kg", "mass"], ["µL", "volume"], ["uL", "volume"], ["L", "volume"], ["mmol", "amount"],
  ])("puts %s in %s", (unit, dimension) => {
    expect(unitDimension(unit)).toBe(dimension);
  });

  it("refuses a unit it does not know, with the code unknown_unit", () => {
    expect(unitErrorOf(() => unitDimension("lb")).code).toBe("unknown_unit");
  });
});

describe("parseUnit", () => {
  it("accepts uL, the Greek mu and a lower-case l for the microlitre, and answers with the micro sign", () => {
    expect(parseUnit("uL")).toBe("µL");
    expect(parseUnit("μL")).toBe("µL");
    expect(parseUnit("ul")).toBe("µL");
    expect(parseUnit(" ml ")).toBe("mL");
  });

  it("does not read MG as milligrams", () => {
    expect(isUnit("MG")).toBe(false);
  });
});

describe("convertAmount", () => {
  describe("within a dimension", () => {
    it("turns 2.5 g into 2500 mg and 0.0025 kg", () => {
      expect(convertAmount({ amount: 2.5, from: "g", to: "mg" })).toBe(2500);
      expect(convertAmount({ amount: 2.5, from: "g", to: "kg" })).toBe(0.0025);
    });

    it("turns 250 µL into 0.25 mL, and accepts uL for it", () => {
      expect(convertAmount({ amount: 250, from: "uL", to: "mL" })).toBe(0.25);
    });

    it("turns 1 mg into exactly 0.001 g, dividing by the power of ten", () => {
      expect(convertAmount({ amount: 1, from: "mg", to: "g" })).toBe(0.001);
    });

    it("turns 1 L into 1 000 000 µL", () => {
      expect(convertAmount({ amount: 1, from: "L", to: "µL" })).toBe(1_000_000);
    });

    it("needs neither density nor molar mass", () => {
      expect(convertAmount({ amount: 3, from: "mol", to: "mmol" })).toBe(3000);
    });
  });

  describe("mass and volume through the density", () => {
    it("weighs 100 mL of 1,2-dichloroethane at 125.69 g (density 1.2569 g/mL at 20 °C, Merck Index)", () => {
      expect(convertAmount({ amount: 100, from: "mL", to: "g", ...DCE })).toBeCloseTo(125.69, 9);
    });

    it("measures 125.69 g of 1,2-dichloroethane as 0.1 L", () => {
      expect(convertAmount({ amount: 125.69, from: "g", to: "L", ...DCE })).toBeCloseTo(0.1, 12);
    });

    it("refuses without a density, with the code needs_density", () => {
      const error = unitErrorOf(() => convertAmount({ amount: 100, from: "mL", to: "g" }));
      expect(error.code).toBe("needs_density");
      expect(error.field).toBe("densityGPerMl");
      expect(error.message).toMatch(/density in g\/mL/);
    });
  });

  describe("mass and amount through the molar mass", () => {
    it("counts 42.39 mg of LiCl as 1 mmol (M = 42.39 g/mol, CIAAW 2021)", () => {
      expect(convertAmount({ amount: 42.39, from: "mg", to: "mmol", molarMassGPerMol: LICL_MOLAR_MASS })).toBeCloseTo(1, 12);
    });

    it("counts 1 g of LiCl as 23.59 mmol", () => {
      // 1 / 42.39 mol = 0.023590 mol
      expect(convertAmount({ amount: 1, from: "g", to: "mmol", molarMassGPerMol: LICL_MOLAR_MASS })).toBeCloseTo(23.59, 2);
    });

    it("weighs 0.5 mol of LiCl at 21.195 g", () => {
      expect(convertAmount({ amount: 0.5, from: "mol", to: "g", molarMassGPerMol: LICL_MOLAR_MASS })).toBeCloseTo(21.195, 9);
    });

    it("refuses without a molar mass, with the code needs_molar_mass", () => {
      const error = unitErrorOf(() => convertAmount({ amount: 1, from: "g", to: "mol" }));
      expect(error.code).toBe("needs_molar_mass");
      expect(error.message).toMatch(/molar mass in g\/mol/);
    });
  });

  describe("volume and amount through density and molar mass", () => {
    it("counts 1 mL of 1,2-dichloroethane as 12.70 mmol (1.2569 g ÷ 98.954 g/mol)", () => {
      expect(convertAmount({ amount: 1, from: "mL", to: "mmol", ...DCE })).toBeCloseTo(12.702, 3);
    });

    it("measures 1 mol of 1,2-dichloroethane as 78.729 mL (98.954 g ÷ 1.2569 g/mL)", () => {
      expect(convertAmount({ amount: 1, from: "mol", to: "mL", ...DCE })).toBeCloseTo(78.7286, 4);
    });

    it("asks for the density first when both are missing", () => {
      expect(unitErrorOf(() => convertAmount({ amount: 1, from: "mL", to: "mol" })).code).toBe("needs_density");
    });

    it("asks for the molar mass when only the density is known", () => {
      expect(unitErrorOf(() => convertAmount({ amount: 1, from: "mL", to: "mol", densityGPerMl: 1.2569 })).code).toBe("needs_molar_mass");
    });
  });

  describe("invalid quantities", () => {
    it.each([
      [-1, "cannot be negative"],
      [Number.NaN, "must be a number"],
      [Number.POSITIVE_INFINITY, "finite"],
      [2e9, "larger than Phasebook accepts"],
    ])("refuses %d with invalid_amount (%s)", (amount, fragment) => {
      const error = unitErrorOf(() => convertAmount({ amount, from: "g", to: "mg" }));
      expect(error.code).toBe("invalid_amount");
      expect(error.field).toBe("amount");
      expect(error.message).toContain(fragment);
    });

    it("accepts zero, an empty bottle", () => {
      expect(convertAmount({ amount: 0, from: "mL", to: "g", densityGPerMl: 1.2569 })).toBe(0);
    });

    it("refuses a density of zero or below", () => {
      const error = unitErrorOf(() => convertAmount({ amount: 1, from: "mL", to: "g", densityGPerMl: 0 }));
      expect(error).toMatchObject({ code: "invalid_amount", field: "densityGPerMl" });
    });

    it("refuses a density typed in kg/m³ (1256.9 for 1,2-dichloroethane)", () => {
      const error = unitErrorOf(() => convertAmount({ amount: 1, from: "mL", to: "g", densityGPerMl: 1256.9 }));
      expect(error).toMatchObject({ code: "invalid_amount", field: "densityGPerMl" });
    });

    it("refuses a negative molar mass", () => {
      const error = unitErrorOf(() => convertAmount({ amount: 1, from: "g", to: "mol", molarMassGPerMol: -42.39 }));
      expect(error).toMatchObject({ code: "invalid_amount", field: "molarMassGPerMol" });
    });

    it("names the side with the unknown unit", () => {
      const error = unitErrorOf(() => convertAmount({ amount: 1, from: "g", to: "oz" }));
      expect(error).toMatchObject({ code: "unknown_unit", field: "to" });
    });
  });
});
