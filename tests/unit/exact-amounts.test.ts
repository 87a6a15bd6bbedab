/**
 * Container amounts kept exactly (issue 11: ten parallel quarter-usages of a 0.1 L container, in
 * mL and L, left 6.9 × 10⁻¹⁸ L and the container "in use"). SI prefixes are exact powers of ten
 * (SI Brochure, 9th ed.); 1,2-dichloroethane density 1.2569 g/mL at 20 °C (Merck Index);
 * M(C2H4Cl2) = 98.95 g/mol from IUPAC/CIAAW 2021 abridged atomic weights.
 */
import { describe, expect, it } from "vitest";
import {
  addAmounts,
  baseCount,
  compareAmounts,
  convertExactAmount,
  exactAmountInContainerUnit,
  exactAmountToNumber,
  exactAmountToString,
  fromBaseCount,
  isMoreThanLeft,
  subtractAmount,
  toExactAmount,
  withdrawExact,
} from "@shared/domain/exact-amounts";
import { amountInContainerUnit } from "@shared/domain/stock";
import { UnitError } from "@shared/domain/units";

const DCE = { densityGPerMl: 1.2569, molarMass: 98.95 };
const bottle = (unit: string) => ({ unit, kind: "bottle", concentrationMolPerL: null });

/** Applies usages one after another as the server does, exactly; returns what is left. */
function useUp(quantity: number, containerUnit: string, usages: [number, string][], chemical = DCE) {
  let left = quantity;
  let empty = false;
  for (const [amount, unit] of usages) {
    const w = withdrawExact(left, amount, unit, bottle(containerUnit), chemical);
    expect(w.enough).toBe(true);
    left = exactAmountToNumber(w.left);
    empty = w.empty;
  }
  return { left, empty };
}

describe("withdrawExact", () => {
  it("leaves exactly 0 after four quarter-usages of a 0.1 L container in mL, L and µL (floats leave 6.9e-18 L)", () => {
    const usages: [number, string][] = [[25, "mL"], [0.025, "L"], [25_000, "µL"], [0.025, "L"]];
    // The float path this replaces: 0.1 − 0.025 − 0.025 − 0.025 − 0.025 in IEEE 754 doubles.
    let float = 0.1;
    for (const [a, u] of usages) float -= amountInContainerUnit(a, u, bottle("L"), DCE);
    expect(float).not.toBe(0);
    expect(float).toBeCloseTo(6.9e-18, 19);

    const { left, empty } = useUp(0.1, "L", usages);
    expect(left).toBe(0);
    expect(Object.is(left, 0)).toBe(true);
    expect(empty).toBe(true);
  });

  it("leaves exactly 0 after ten usages in mixed units that add up to the container's 0.1 L", () => {
    // 25 + 25 + 10 + 10 + 10 + 5 + 5 + 4 + 3 + 3 = 100 mL
    const usages: [number, string][] = [
      [25, "mL"], [0.025, "L"], [10, "mL"], [0.01, "L"], [10_000, "µL"],
      [5, "mL"], [0.005, "L"], [4, "mL"], [0.003, "L"], [3000, "µL"],
    ];
    const { left, empty } = useUp(0.1, "L", usages);
    expect(left).toBe(0);
    expect(empty).toBe(true);
  });

  it("leaves exactly 0 from a 1 kg bottle after usages in g, kg and mg, and from 0.5 mol after mmol and mol", () => {
    expect(useUp(1, "kg", [[250, "g"], [0.25, "kg"], [250_000, "mg"], [0.1, "kg"], [150, "g"]]).left).toBe(0);
    expect(useUp(0.5, "mol", [[100, "mmol"], [0.1, "mol"], [300, "mmol"]]).left).toBe(0);
  });

  it("leaves exactly 0 when a container kept in mL is used up by mass through the density", () => {
    // 100 mL of 1,2-dichloroethane is 125.69 g (ρ = 1.2569 g/mL): nothing left, not 1e-14 mL.
    const w = withdrawExact(100, 125.69, "g", bottle("mL"), DCE);
    expect(w.enough).toBe(true);
    expect(exactAmountToNumber(w.left)).toBe(0);
    expect(w.empty).toBe(true);
  });

  it("refuses more than what is left, and allows exactly what is left", () => {
    expect(withdrawExact(0.1, 100.001, "mL", bottle("L"), DCE).enough).toBe(false);
    const refused = withdrawExact(0.1, 101, "mL", bottle("L"), DCE);
    expect(refused.enough).toBe(false);
    expect(exactAmountToNumber(refused.left)).toBe(0.1);
    expect(withdrawExact(0.1, 100, "mL", bottle("L"), DCE).enough).toBe(true);
  });

  it("cleans a float residue already stored: 6.938893903907228e-18 L reads as 0 nL (below the 1 nL resolution)", () => {
    expect(toExactAmount(6.938893903907228e-18, "L").base).toBe(0n);
    expect(withdrawExact(0.07500000000000001, 75, "mL", bottle("L"), DCE).empty).toBe(true);
  });
});

describe("conversions", () => {
  it("is exact within a dimension (SI prefixes): 25 mL is 0.025 L and 25 000 µL", () => {
    const a = toExactAmount(25, "mL");
    expect(exactAmountToString(a, "L")).toBe("0.025");
    expect(exactAmountToString(a, "µL")).toBe("25000");
    expect(exactAmountToNumber(convertExactAmount(a, "L"))).toBe(0.025);
  });

  it("rounds once to 1 nL through the density: 25 g of 1,2-dichloroethane is 25 ÷ 1.2569 = 19.890206… mL (Merck Index density)", () => {
    const v = convertExactAmount(toExactAmount(25, "g"), "mL", { densityGPerMl: 1.2569 });
    expect(exactAmountToString(v)).toBe("19.890206");
    expect(exactAmountToNumber(v)).toBeCloseTo(25 / 1.2569, 6);
  });

  it("goes from amount to volume through molar mass and density in one rounding: 10 mmol DCE is 0.98950 g ÷ 1.2569 = 0.787254… mL", () => {
    const v = exactAmountInContainerUnit(10, "mmol", bottle("mL"), DCE);
    expect(exactAmountToNumber(v)).toBeCloseTo((0.01 * 98.95) / 1.2569, 6);
    expect(exactAmountToString(v)).toBe("0.787254");
  });

  it("takes 2.5 mL of a 10 mM solution for 0.025 mmol of its solute (V = n ÷ c), exactly", () => {
    const solution = { unit: "mL", kind: "solution", concentrationMolPerL: 0.01 };
    expect(exactAmountToString(exactAmountInContainerUnit(0.025, "mmol", solution, { densityGPerMl: null, molarMass: 42.39 }))).toBe("2.5");
  });

  it("agrees with the float conversion of stock.ts to within 1 nL", () => {
    for (const [amount, unit, to] of [[3.3, "g", "mL"], [0.7, "mmol", "L"], [12.34, "mL", "g"]] as const) {
      const exactMl = exactAmountToNumber(exactAmountInContainerUnit(amount, unit, bottle(to), DCE));
      expect(Math.abs(exactMl - amountInContainerUnit(amount, unit, bottle(to), DCE))).toBeLessThanOrEqual(to === "L" ? 1e-9 : 1e-6);
    }
  });

  it("refuses what stock.ts refuses, with the same codes", () => {
    const code = (f: () => unknown) => {
      try {
        f();
      } catch (e) {
        return e instanceof UnitError ? e.code : "other";
      }
      return "none";
    };
    expect(code(() => exactAmountInContainerUnit(1, "mL", bottle("g"), { densityGPerMl: null, molarMass: 42.39 }))).toBe("needs_density");
    expect(code(() => exactAmountInContainerUnit(1, "mol", bottle("g"), { densityGPerMl: null, molarMass: null }))).toBe("needs_molar_mass");
    expect(code(() => exactAmountInContainerUnit(1, "g", { unit: "mL", kind: "solution", concentrationMolPerL: 0.01 }, DCE))).toBe("needs_density");
    expect(code(() => exactAmountInContainerUnit(1, "cups", bottle("mL"), DCE))).toBe("unknown_unit");
    for (const bad of [0, -1, Infinity, Number.NaN, 1e10, 0.0000001]) {
      expect(code(() => exactAmountInContainerUnit(bad, "mL", bottle("mL"), DCE)), String(bad)).toBe("invalid_amount");
    }
  });
});

describe("comparing and storing", () => {
  it("compares across units of one dimension and refuses to mix dimensions", () => {
    expect(compareAmounts(toExactAmount(1, "L"), toExactAmount(1000, "mL"))).toBe(0);
    expect(isMoreThanLeft(toExactAmount(1000.001, "mL"), toExactAmount(1, "L"))).toBe(true);
    expect(() => compareAmounts(toExactAmount(1, "g"), toExactAmount(1, "mL"))).toThrow(RangeError);
    expect(() => subtractAmount(toExactAmount(1, "mL"), toExactAmount(2, "mL"))).toThrow(RangeError);
  });

  it("adds waste exactly: 0.1 L + 0.2 L is 0.3 L (floats give 0.30000000000000004)", () => {
    expect(exactAmountToNumber(addAmounts(toExactAmount(0.1, "L"), toExactAmount(0.2, "L")))).toBe(0.3);
  });

  it("round-trips through a REAL column (15 significant digits) and an INTEGER column of base units", () => {
    for (const q of [0.075, 123.456789, 99999.999999, 1e-6]) {
      expect(exactAmountToNumber(toExactAmount(q, "mL"))).toBe(q);
    }
    const a = toExactAmount(0.1, "L");
    expect(baseCount(a)).toBe(100_000_000); // nL
    expect(exactAmountToNumber(fromBaseCount(baseCount(a), "L"))).toBe(0.1);
  });
});
