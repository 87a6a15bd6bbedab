import { describe, expect, it } from "vitest";
import { amountInContainerUnit, containerLitres, usageCostCents } from "@shared/domain/stock";
import { UnitError } from "@shared/domain/units";

// 1,2-Dichloroethane: density 1.2569 g/mL at 20 °C (Merck Index); M = 98.95 g/mol from
// IUPAC/CIAAW 2021 abridged atomic weights (C 12.011, H 1.008, Cl 35.45).
const DCE = { densityGPerMl: 1.2569, molarMass: 98.95 };
const bottle = (unit: string) => ({ unit, kind: "bottle", concentrationMolPerL: null });

describe("amountInContainerUnit", () => {
  it("takes 1 mL of 1,2-dichloroethane for 1.2569 g (Merck Index density)", () => {
    expect(amountInContainerUnit(1.2569, "g", bottle("mL"), DCE)).toBeCloseTo(1, 12);
  });

  it("takes 0.7873 mL for 10 mmol of 1,2-dichloroethane (n × M ÷ ρ)", () => {
    expect(amountInContainerUnit(10, "mmol", bottle("mL"), DCE)).toBeCloseTo((0.01 * 98.95) / 1.2569, 12);
  });

  it("takes 2.5 mL of a 10 mM prepared solution for 25 µmol (0.025 mmol) of its solute (V = n ÷ c)", () => {
    const solution = { unit: "mL", kind: "solution", concentrationMolPerL: 0.01 };
    expect(amountInContainerUnit(0.025, "mmol", solution, { densityGPerMl: null, molarMass: 42.39 })).toBeCloseTo(2.5, 12);
  });

  it("refuses a mass of a prepared solution, whose density Phasebook does not keep", () => {
    const solution = { unit: "mL", kind: "solution", concentrationMolPerL: 0.01 };
    expect(() => amountInContainerUnit(1, "g", solution, DCE)).toThrow(UnitError);
  });

  it("refuses a volume of a solid without a density, naming the density", () => {
    try {
      amountInContainerUnit(1, "mL", bottle("g"), { densityGPerMl: null, molarMass: 42.39 });
      expect.unreachable();
    } catch (e) {
      expect((e as UnitError).code).toBe("needs_density");
    }
  });

  it("refuses zero, negative, infinite and absurd amounts", () => {
    for (const amount of [0, -1, Infinity, Number.NaN, 1e10]) {
      expect(() => amountInContainerUnit(amount, "mL", bottle("mL"), DCE), String(amount)).toThrow(UnitError);
    }
  });
});

describe("usageCostCents", () => {
  const licl = { densityGPerMl: null, molarMass: 42.39, unitCostCents: 70, costUnit: "g" };

  it("charges 250 mg of a salt at 70 ¢/g as 18 ¢ (17.5 rounded half up)", () => {
    expect(usageCostCents(250, "mg", licl)).toBe(18);
  });

  it("charges 1 mmol of LiCl (42.39 mg) at 70 ¢/g as 3 ¢", () => {
    expect(usageCostCents(1, "mmol", licl)).toBe(3);
  });

  it("is null when the chemical has no unit cost, or the amount cannot be priced", () => {
    expect(usageCostCents(1, "g", { ...licl, unitCostCents: null })).toBeNull();
    expect(usageCostCents(1, "mL", licl)).toBeNull();
  });
});

describe("containerLitres", () => {
  it("reads 2500 mL as 2.5 L and 1256.9 g of 1,2-dichloroethane as 1 L", () => {
    expect(containerLitres(2500, "mL", null)).toBe(2.5);
    expect(containerLitres(1256.9, "g", 1.2569)).toBeCloseTo(1, 12);
  });

  it("is null for a solid without a density", () => {
    expect(containerLitres(100, "g", null)).toBeNull();
  });
});

