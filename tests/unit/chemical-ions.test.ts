/**
 * The ions a chemical gives, as people write them ("Li+, Cl-"; "2 Na+, SO4 2-"): charges read from
 * the trade's way of writing ions, and the electroneutrality of a formula unit (Σ count·z = 0).
 */
import { describe, expect, it } from "vitest";
import { ChemicalIonsError, chargeFromName, checkChemicalIons, formatChemicalIons, parseChemicalIons } from "@shared/domain/ion-transfer/chemical-ions";

describe("parseChemicalIons", () => {
  it("reads LiCl's ions and BTPPA TB(C6F5)4's", () => {
    expect(parseChemicalIons("Li+, Cl-")).toEqual([
      { ion: "Li+", charge: 1, count: 1 },
      { ion: "Cl-", charge: -1, count: 1 },
    ]);
    expect(parseChemicalIons("BTPPA+, TB(C6F5)4-")).toEqual([
      { ion: "BTPPA+", charge: 1, count: 1 },
      { ion: "TB(C6F5)4-", charge: -1, count: 1 },
    ]);
  });

  it("reads counts and double charges: Na2SO4 gives 2 Na+ and one SO4 2-", () => {
    expect(parseChemicalIons("2 Na+, SO4 2-")).toEqual([
      { ion: "Na+", charge: 1, count: 2 },
      { ion: "SO4 2-", charge: -2, count: 1 },
    ]);
    expect(chargeFromName("SO4^2-")).toBe(-2);
    expect(chargeFromName("Li⁺")).toBe(1);
    expect(chargeFromName("Cl−")).toBe(-1);
  });

  it("answers an empty text as 'not an electrolyte'", () => {
    expect(parseChemicalIons("  ")).toBeNull();
  });

  it.each([
    ["Li, Cl-", "ions.0"],
    ["Li+, Cl-, Cl-", "ions.2.ion"],
    ["2 Li+, Cl-", "ions"],
    ["Na+, K+", "ions"],
  ])("refuses %j naming %s", (text, field) => {
    try {
      parseChemicalIons(text);
      throw new Error("expected a refusal");
    } catch (e) {
      expect(e).toBeInstanceOf(ChemicalIonsError);
      expect((e as ChemicalIonsError).field).toBe(field);
    }
  });

  it("refuses a charge whose sign disagrees with the name", () => {
    expect(() => checkChemicalIons([{ ion: "Li+", charge: -1, count: 1 }, { ion: "Cl-", charge: 1, count: 1 }])).toThrow(/written as a cation/);
  });

  it("writes them back as a page shows them", () => {
    expect(formatChemicalIons([{ ion: "Na+", charge: 1, count: 2 }, { ion: "SO4 2-", charge: -2, count: 1 }])).toBe("2 Na+ + SO4 2-");
  });
});
