import { describe, expect, it } from "vitest";
import {
  FormulaError,
  STANDARD_ATOMIC_WEIGHTS,
  analyseFormula,
  atomicWeight,
  hillOrder,
  molarMassFromFormula,
  normaliseFormula,
} from "@shared/domain/chemistry";

/** A value published to `decimals` places covers everything that rounds to it. */
function expectRoundsTo(actual: number, published: number, decimals: number): void {
  expect(Math.abs(actual - published)).toBeLessThanOrEqual(0.5 * 10 ** -decimals + 1e-9);
}

describe("STANDARD_ATOMIC_WEIGHTS", () => {
  // IUPAC/CIAAW Standard Atomic Weights 2021, abridged values (Pure Appl. Chem. 94 (2022) 573–600; ciaaw.org).
  it.each([
    ["H", 1.008], ["Li", 6.94], ["B", 10.81], ["C", 12.011], ["N", 14.007], ["O", 15.999],
    ["F", 18.998], ["Na", 22.99], ["P", 30.974], ["S", 32.06], ["Cl", 35.45], ["K", 39.098],
    ["Fe", 55.845], ["Co", 58.933], ["Cu", 63.546], ["Br", 79.904], ["Pd", 106.42], ["I", 126.9],
  ])("holds the CIAAW 2021 abridged value for %s (%d)", (symbol, weight) => {
    expect(atomicWeight(symbol)).toBe(weight);
  });

  it("has no value for an element without a standard atomic weight (Tc, CIAAW 2021)", () => {
    expect(atomicWeight("Tc")).toBeUndefined();
  });

  it("covers every element a chemistry lab is likely to stock, from H to U less the radioactive gaps", () => {
    // 84 elements have a standard atomic weight in CIAAW 2021 (Tc, Pm, Po–Ac and Np onwards have none).
    expect(Object.keys(STANDARD_ATOMIC_WEIGHTS)).toHaveLength(84);
  });
});

describe("molarMassFromFormula", () => {
  // Molar masses summed by hand from the CIAAW 2021 abridged weights above.
  it.each([
    ["LiCl", 42.39],
    ["NaCl", 58.44],
    ["KCl", 74.55],
    ["C2H4Cl2", 98.95],
    ["C16H36ClN", 277.92],
    ["C10H10Fe", 186.04],
  ])("gives %s as %d g/mol (CIAAW 2021 abridged weights)", (formula, published) => {
    expectRoundsTo(molarMassFromFormula(formula), published, 2);
  });

  it("adds the abridged weights exactly: ferrocene is 10 × 12.011 + 10 × 1.008 + 55.845 = 186.035", () => {
    expect(molarMassFromFormula("C10H10Fe")).toBeCloseTo(186.035, 9);
  });

  it("uses the CIAAW abridged weights rather than isotopic means: 1,2-dichloroethane is 98.95, not the Merck Index's 98.96", () => {
    const mass = molarMassFromFormula("C2H4Cl2");
    expect(mass).toBeCloseTo(2 * 12.011 + 4 * 1.008 + 2 * 35.45, 9);
    expect(Math.abs(mass - 98.96)).toBeGreaterThan(0.005);
  });

  it("expands the groups chemists write: Bu4NCl is tetrabutylammonium chloride, C16H36ClN", () => {
    expect(molarMassFromFormula("Bu4NCl")).toBeCloseTo(molarMassFromFormula("C16H36ClN"), 9);
    expect(molarMassFromFormula("(C4H9)4NCl")).toBeCloseTo(molarMassFromFormula("C16H36ClN"), 9);
  });

  it("reads square brackets as grouping: K[B(C6H5)4] is C24H20BK, 358.33 g/mol (sum of CIAAW 2021 abridged weights)", () => {
    expect(molarMassFromFormula("K[B(C6H5)4]")).toBeCloseTo(molarMassFromFormula("C24H20BK"), 9);
    // 24 × 12.011 + 20 × 1.008 + 10.81 + 39.098 = 358.332
    expect(molarMassFromFormula("C24H20BK")).toBeCloseTo(358.332, 9);
  });

  describe("hydrates and solvates", () => {
    it("weighs copper(II) sulfate pentahydrate as 249.68 g/mol (handbook value, from memory; CIAAW sum 249.677)", () => {
      const mass = molarMassFromFormula("CuSO4·5H2O");
      expect(mass).toBeCloseTo(63.546 + 32.06 + 9 * 15.999 + 10 * 1.008, 9);
      expect(mass).toBeCloseTo(249.68, 2);
    });

    it.each(["CuSO4.5H2O", "CuSO4 . 5 H2O", "CuSO4*5H2O", "CuSO4•5H2O", "CuSO4(H2O)5"])(
      "reads %j as the same pentahydrate, never as CuSO4.5",
      (formula) => {
        expect(molarMassFromFormula(formula)).toBeCloseTo(molarMassFromFormula("CuSO4·5H2O"), 9);
      },
    );

    it("weighs lithium chloride monohydrate as 60.41 g/mol (suppliers' value, from memory)", () => {
      expect(molarMassFromFormula("LiCl.H2O")).toBeCloseTo(60.41, 1);
      expect(molarMassFromFormula("LiCl.H2O")).toBeCloseTo(molarMassFromFormula("LiCl") + molarMassFromFormula("H2O"), 9);
    });

    it("accepts a decimal number of solvent molecules after the dot, as etherates are sold", () => {
      // LiB(C6F5)4 685.974 + 2.5 × Et2O 74.123 = 871.2815 (CIAAW 2021 abridged weights)
      expect(molarMassFromFormula("LiB(C6F5)4·2.5(C2H5)2O")).toBeCloseTo(871.2815, 6);
      expect(molarMassFromFormula("LiB(C6F5)4·2.5Et2O")).toBeCloseTo(871.2815, 6);
    });
  });

  describe("decimal counts (Hill formulas as Phasebook prints them)", () => {
    // IUPAC/CIAAW 2021 abridged standard atomic weights: C 12.011, H 1.008, B 10.81, F 18.998,
    // Li 6.94, O 15.999. C34H25BF20LiO2.5 by hand:
    // 34 × 12.011 = 408.374; 25 × 1.008 = 25.2; 10.81; 20 × 18.998 = 379.96; 6.94; 2.5 × 15.999 = 39.9975
    const ETHERATE = 408.374 + 25.2 + 10.81 + 379.96 + 6.94 + 39.9975; // 871.2815

    it("accepts C34H25BF20LiO2.5, the Hill formula printed for the 2.5-etherate, and weighs it 871.2815 g/mol", () => {
      expect(ETHERATE).toBeCloseTo(871.2815, 9);
      expect(molarMassFromFormula("C34H25BF20LiO2.5")).toBeCloseTo(ETHERATE, 9);
      expect(normaliseFormula("C34H25BF20LiO2.5")).toBe("C34H25BF20LiO2.5");
    });

    it("reads back every Hill formula it prints for a solvate, with the same molar mass", () => {
      for (const formula of ["LiB(C6F5)4·2.5(C2H5)2O", "LiB(C6F5)4·0.5(C2H5)2O", "CaSO4·0.5H2O", "Fe(OH)2.5", "C6H12O6·0.25H2O", "CdCl2·2.5H2O"]) {
        const hill = analyseFormula(formula).hillFormula;
        expect(molarMassFromFormula(hill), `${formula} → ${hill}`).toBeCloseTo(molarMassFromFormula(formula), 9);
      }
      expect(analyseFormula("CaSO4·0.5H2O").hillFormula).toBe("CaHO4.5S");
      expect(analyseFormula("C6H12O6·0.25H2O").hillFormula).toBe("C6H12.5O6.25");
    });

    it("reads a count of 0.something as a decimal: wüstite Fe0.95O is 0.95 × 55.845 + 15.999 = 69.05175 g/mol", () => {
      expect(molarMassFromFormula("Fe0.95O")).toBeCloseTo(0.95 * 55.845 + 15.999, 9);
    });

    it.each([
      ["MgCl2.6H2O", "MgCl2·6H2O"],
      ["BaCl2.2H2O", "BaCl2·2H2O"],
      ["CdCl2.2.5H2O", "CdCl2·2.5H2O"],
      ["LiB(C6F5)4.2.5Et2O", "LiB(C6F5)4·2.5Et2O"],
    ])("still reads the traditional dot of %j as an adduct (%j)", (typed, adduct) => {
      expect(normaliseFormula(typed)).toBe(adduct);
      expect(molarMassFromFormula(typed)).toBeCloseTo(molarMassFromFormula(adduct), 9);
    });
  });

  it("weighs an isotope label with the nuclide mass: D2O is 20.03 g/mol (handbook value, from memory)", () => {
    expect(molarMassFromFormula("D2O")).toBeCloseTo(20.03, 1);
    expect(molarMassFromFormula("D2O")).toBeGreaterThan(molarMassFromFormula("H2O") + 1.9);
  });

  it("ignores a charge for the mass but reports it", () => {
    const sulfate = analyseFormula("SO4(2-)");
    expect(sulfate.charge).toBe(-2);
    expect(sulfate.molarMassGPerMol).toBeCloseTo(32.06 + 4 * 15.999, 9);
    expect(analyseFormula("Na+").charge).toBe(1);
    expect(analyseFormula("Fe(3+)").charge).toBe(3);
  });

  describe("refusals", () => {
    it.each([
      ["", "empty"],
      ["   ", "empty"],
      ["Xx2", "Xx"],
      ["nacl", "not a readable formula"],
      ["C6H5(", "not a readable formula"],
      ["K[B(C6H5)4", "never closed"],
      ["LiCl.", "empty part"],
      [".H2O", "empty part"],
      ["H2O'", "\"'\""],
      ["C{50,50}", "\"{\""],
      ["Tc2O7", "no standard atomic weight"],
      ["C1-3H4", "not a readable formula"],
    ])("refuses %j with a FormulaError mentioning %j", (formula, fragment) => {
      expect(() => molarMassFromFormula(formula)).toThrow(FormulaError);
      expect(() => molarMassFromFormula(formula)).toThrow(fragment);
    });

    it.each(["Fe2+", "NH4+", "PF6-"])("refuses the ambiguous charge in %j and shows how to write it", (formula) => {
      expect(() => molarMassFromFormula(formula)).toThrow(/in parentheses/);
    });

    it("keeps the formula on the error for the form to show", () => {
      try {
        molarMassFromFormula("Qq");
        expect.unreachable();
      } catch (error) {
        expect(error).toBeInstanceOf(FormulaError);
        expect((error as FormulaError).formula).toBe("Qq");
      }
    });
  });
});

describe("normaliseFormula", () => {
  it("removes spaces and writes every adduct dot as ·", () => {
    expect(normaliseFormula("CuSO4 . 5 H2O")).toBe("CuSO4·5H2O");
    expect(normaliseFormula("LiCl*H2O")).toBe("LiCl·H2O");
  });

  it("keeps the groups and brackets a chemist typed", () => {
    expect(normaliseFormula("Bu4NCl")).toBe("Bu4NCl");
    expect(normaliseFormula("K[B(C6H5)4]")).toBe("K[B(C6H5)4]");
  });

  it("writes the Hill formula on request: carbon, hydrogen, then alphabetical (Hill system)", () => {
    expect(normaliseFormula("ClCH2CH2Cl", { hill: true })).toBe("C2H4Cl2");
    expect(normaliseFormula("Fe(C5H5)2", { hill: true })).toBe("C10H10Fe");
    expect(normaliseFormula("Bu4NCl", { hill: true })).toBe("C16H36ClN");
  });

  it("orders a carbon-free formula wholly alphabetically, hydrogen included (Hill system)", () => {
    expect(normaliseFormula("CuSO4·5H2O", { hill: true })).toBe("CuH10O9S");
    expect(normaliseFormula("SO4(2-)", { hill: true })).toBe("O4S(2-)");
  });
});

describe("hillOrder", () => {
  it("puts an isotope label beside its element", () => {
    const order = hillOrder([
      { symbol: "O", count: 1 },
      { symbol: "H", massNumber: 2, count: 1 },
      { symbol: "H", count: 1 },
      { symbol: "C", count: 1 },
    ]);
    expect(order.map((a) => `${a.massNumber ?? ""}${a.symbol}`)).toEqual(["C", "H", "2H", "O"]);
  });
});
