import { describe, expect, it } from "vitest";
import { handlingCautions, needsFumeHood, PRECEDENCE_CAUTION, type CautionChemical } from "@shared/domain/cautions";

// 1,2-Dichloroethane: closed-cup flash point 13 °C (Merck Index), boiling point 83.5 °C (IARC
// Monographs vol. 71), H-codes as on suppliers' safety data sheets (some add H304 or H331);
// GHS category 2, NFPA class IB.
const DCE: CautionChemical = {
  hazardStatements: ["H225", "H302", "H315", "H319", "H335", "H350"],
  flashPointC: 13,
  boilingPointC: 83.5,
  ghsFlammableCategory: 2,
  nfpaClass: "IB",
  carcinogen: true,
  acuteToxic: false,
  halogenated: true,
};
const plain = (over: Partial<CautionChemical>): CautionChemical => ({ hazardStatements: [], flashPointC: null, boilingPointC: null, ...over });

describe("needsFumeHood", () => {
  it("asks for a fume hood for 1,2-dichloroethane", () => {
    expect(needsFumeHood(DCE)).toBe(true);
  });

  it("asks for one at a flash point of 60 °C, the top of GHS flammable category 3 (UN GHS ch. 2.6)", () => {
    expect(needsFumeHood(plain({ flashPointC: 60, boilingPointC: 200 }))).toBe(true);
  });

  it("does not ask for one at a flash point of 61 °C with a boiling point of 200 °C and no inhalation statement", () => {
    expect(needsFumeHood(plain({ flashPointC: 61, boilingPointC: 200 }))).toBe(false);
  });

  it("asks for one for chloroform, which does not burn but boils at 61 °C (CRC Handbook, from memory)", () => {
    expect(needsFumeHood(plain({ boilingPointC: 61.2, halogenated: true, hazardStatements: ["H302", "H315", "H351"] }))).toBe(true);
  });

  it("asks for one for nitrobenzene through its inhalation statement H331, though its flash point is 88 °C (from memory)", () => {
    expect(needsFumeHood(plain({ flashPointC: 88, boilingPointC: 211, hazardStatements: ["H301+H311+H331", "H351"] }))).toBe(true);
  });

  it("does not ask for one for lithium chloride, a salt without inhalation statements", () => {
    expect(needsFumeHood(plain({ hazardStatements: ["H302", "H315", "H319"] }))).toBe(false);
  });

  it("does not ask for one for a halogenated salt without a boiling point (tetrabutylammonium chloride)", () => {
    expect(needsFumeHood(plain({ halogenated: true, hazardStatements: ["H315", "H319"] }))).toBe(false);
  });
});

describe("handlingCautions", () => {
  it("tells someone handling 1,2-dichloroethane that it is flammable, a carcinogen, halogenated, and to use a fume hood", () => {
    const said = handlingCautions(DCE).join(" ");
    expect(said).toContain("Flammable liquid (GHS category 2, NFPA class IB)");
    expect(said).toContain("May cause cancer");
    expect(said).toContain("fume hood");
    expect(said).toContain("halogenated solvent waste");
  });

  it("says nothing for a chemical without hazard data", () => {
    expect(handlingCautions(plain({}))).toEqual([]);
  });

  it("keeps the sentence that the fire code, the safety office and the safety data sheet take precedence", () => {
    expect(PRECEDENCE_CAUTION).toMatch(/local fire code.*safety office.*safety data sheet.*take precedence/);
  });
});
