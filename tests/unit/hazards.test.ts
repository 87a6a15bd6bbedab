import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import path from "node:path";
import {
  assessFlammability,
  celsiusToFahrenheit,
  fahrenheitToCelsius,
  ghsFlammableCategory,
  hazardLabel,
  isAcutelyToxic,
  isCarcinogen,
  nfpaClass,
  nfpaClassFahrenheit,
  pictogramsFor,
  signalWordFor,
  type GhsFlammableCategory,
} from "@shared/domain/hazards";
import { H_CODES, hazardStatementText, isHCode, normaliseHCode, splitHCode } from "@shared/domain/ghs-statements";
import { FormulaError, isHalogenated } from "@shared/domain/chemistry";

// 1,2-Dichloroethane: closed-cup flash point 13 °C (Merck Index), boiling point 83.5 °C (IARC vol. 71);
// GHS codes as on suppliers' safety data sheets: Danger; H225, H302, H315, H319, H335, H350.
const DCE_FLASH_C = 13;
const DCE_BOIL_C = 83.5;
const DCE_CODES = ["H225", "H302", "H315", "H319", "H335", "H350"];

describe("ghsFlammableCategory (UN GHS ch. 2.6, table 2.6.1)", () => {
  it("puts 1,2-dichloroethane (FP 13 °C, IBP 83.5 °C) in category 2", () => {
    expect(ghsFlammableCategory(DCE_FLASH_C, DCE_BOIL_C)).toBe(2);
  });

  it.each<[number, number, GhsFlammableCategory | null, string]>([
    [22.9, 80, 2, "FP < 23 °C and IBP > 35 °C → category 2"],
    [23, 80, 3, "23 °C ≤ FP ≤ 60 °C → category 3 (23 is not below 23)"],
    [23.1, 80, 3, "23 °C ≤ FP ≤ 60 °C → category 3"],
    [10, 35, 1, "FP < 23 °C and IBP ≤ 35 °C → category 1 (35 is included)"],
    [10, 35.1, 2, "FP < 23 °C and IBP > 35 °C → category 2"],
    [60, 150, 3, "FP ≤ 60 °C → category 3 (60 is included)"],
    [60.1, 150, 4, "60 °C < FP ≤ 93 °C → category 4"],
    [93, 200, 4, "FP ≤ 93 °C → category 4 (93 is included)"],
    [93.1, 200, null, "FP > 93 °C → not a flammable liquid"],
  ])("classifies FP %d °C, IBP %d °C as %s (%s)", (flash, boil, category) => {
    expect(ghsFlammableCategory(flash, boil)).toBe(category);
  });

  it("takes the stricter category 1 when the boiling point is missing below 23 °C", () => {
    expect(ghsFlammableCategory(10, null)).toBe(1);
    expect(ghsFlammableCategory(10)).toBe(1);
  });

  it("does not need the boiling point from 23 °C up", () => {
    expect(ghsFlammableCategory(40, null)).toBe(3);
  });

  it("cannot classify without a flash point", () => {
    expect(ghsFlammableCategory(null, 80)).toBeNull();
    expect(ghsFlammableCategory(Number.NaN, 80)).toBeNull();
  });
});

describe("nfpaClassFahrenheit (NFPA 30 classes, limits in °F)", () => {
  it.each([
    [72.9, 99.9, "IA", "FP < 73 °F and BP < 100 °F"],
    [72.9, 100, "IB", "FP < 73 °F and BP ≥ 100 °F"],
    [73, 150, "IC", "73 °F ≤ FP < 100 °F"],
    [99.9, 150, "IC", "FP < 100 °F"],
    [100, 300, "II", "100 °F ≤ FP < 140 °F"],
    [139.9, 300, "II", "FP < 140 °F"],
    [140, 300, "IIIA", "140 °F ≤ FP < 200 °F"],
    [199.9, 400, "IIIA", "FP < 200 °F"],
    [200, 400, "IIIB", "FP ≥ 200 °F"],
  ])("classifies FP %d °F, BP %d °F as %s (%s)", (flash, boil, cls) => {
    expect(nfpaClassFahrenheit(flash, boil)).toBe(cls);
  });

  it("takes the stricter class IA when the boiling point is missing below 73 °F", () => {
    expect(nfpaClassFahrenheit(50, null)).toBe("IA");
  });
});

describe("nfpaClass (°C converted exactly to NFPA 30's °F limits)", () => {
  it("puts 1,2-dichloroethane (FP 13 °C = 55.4 °F, BP 83.5 °C = 182.3 °F) in class IB", () => {
    expect(nfpaClass(DCE_FLASH_C, DCE_BOIL_C)).toBe("IB");
  });

  it.each([
    [22.7, 83.5, "IB", "22.7 °C = 72.86 °F, below 73 °F"],
    [22.8, 83.5, "IC", "22.8 °C = 73.04 °F"],
    [10, 37.7, "IA", "BP 37.7 °C = 99.86 °F, below 100 °F"],
    [10, 37.8, "IB", "BP 37.8 °C = 100.04 °F"],
    [37.7, 150, "IC", "FP 99.86 °F"],
    [37.8, 150, "II", "FP 100.04 °F"],
    [59.9, 150, "II", "FP 139.82 °F"],
    [60, 150, "IIIA", "FP 60 °C = 140 °F exactly"],
    [93.3, 250, "IIIA", "FP 199.94 °F"],
    [93.4, 250, "IIIB", "FP 200.12 °F"],
  ])("classifies FP %d °C, BP %d °C as %s (%s)", (flash, boil, cls) => {
    expect(nfpaClass(flash, boil)).toBe(cls);
  });

  it.each([
    [73, "IC"],
    [100, "II"],
    [140, "IIIA"],
    [200, "IIIB"],
  ])("puts a flash point of exactly %d °F given in °C on the upper side of the limit (%s)", (fahrenheit, cls) => {
    expect(nfpaClass(fahrenheitToCelsius(fahrenheit), 250)).toBe(cls);
  });

  it("converts °C to °F with the exact 9/5 factor", () => {
    expect(celsiusToFahrenheit(100)).toBe(212);
    expect(celsiusToFahrenheit(-40)).toBe(-40);
    expect(celsiusToFahrenheit(fahrenheitToCelsius(73))).toBe(73);
  });
});

describe("assessFlammability", () => {
  it("reports GHS category 2 with H225 and NFPA class IB for 1,2-dichloroethane", () => {
    expect(assessFlammability(DCE_FLASH_C, DCE_BOIL_C)).toEqual({
      ghsCategory: 2,
      ghsHazardStatement: "H225",
      nfpaClass: "IB",
      assumedLowBoilingPoint: false,
    });
  });

  it("says when a missing boiling point made it choose the stricter class", () => {
    expect(assessFlammability(13, null)).toMatchObject({ ghsCategory: 1, nfpaClass: "IA", assumedLowBoilingPoint: true });
  });

  it("reports category 4 as H227, combustible liquid (UN GHS table 2.6.2), and 70 °C = 158 °F as NFPA IIIA", () => {
    expect(assessFlammability(70, 200)).toMatchObject({ ghsCategory: 4, ghsHazardStatement: "H227", nfpaClass: "IIIA" });
  });
});

describe("isCarcinogen", () => {
  it("counts 1,2-dichloroethane, which carries H350", () => {
    expect(isCarcinogen(DCE_CODES)).toBe(true);
  });

  it.each([["H350i"], ["H351"], ["h350"]])("counts %s (carcinogenicity cat. 1A/1B/2, UN GHS ch. 3.6)", (code) => {
    expect(isCarcinogen([code])).toBe(true);
  });

  it("does not count a mutagen (H340) or a reproductive toxicant (H360)", () => {
    expect(isCarcinogen(["H340", "H360"])).toBe(false);
  });
});

describe("isAcutelyToxic", () => {
  it.each([["H300"], ["H301"], ["H310"], ["H311"], ["H330"], ["H331"], ["H301+H311+H331"]])(
    "counts %s (acute toxicity cat. 1–3, UN GHS ch. 3.1)",
    (code) => {
      expect(isAcutelyToxic([code])).toBe(true);
    },
  );

  it("does not count category 4, 'harmful' (H302 of 1,2-dichloroethane)", () => {
    expect(isAcutelyToxic(DCE_CODES)).toBe(false);
  });

  it("counts 1,2-dichloroethane from a supplier who adds H331", () => {
    expect(isAcutelyToxic([...DCE_CODES, "H331"])).toBe(true);
  });
});

describe("isHalogenated", () => {
  it.each(["C2H4Cl2", "ClCH2CH2Cl", "CHCl3", "C6H5Br", "C6F6"])("counts %s as a halogenated organic", (formula) => {
    expect(isHalogenated(formula)).toBe(true);
  });

  it.each(["LiCl", "NaCl", "C10H10Fe", "C6H5NO2", "H2O"])("does not count %s", (formula) => {
    expect(isHalogenated(formula)).toBe(false);
  });

  it("counts an organic salt with a halide ion, erring towards the halogenated waste stream", () => {
    expect(isHalogenated("Bu4NCl")).toBe(true);
  });

  it("throws a FormulaError for a formula it cannot read", () => {
    expect(() => isHalogenated("Xy")).toThrow(FormulaError);
  });
});

describe("pictogramsFor and signalWordFor", () => {
  it("gives 1,2-dichloroethane the flame, exclamation mark and health hazard with Danger", () => {
    expect(pictogramsFor(DCE_CODES)).toEqual(["GHS02", "GHS07", "GHS08"]);
    expect(signalWordFor(DCE_CODES)).toBe("Danger");
  });

  it("drops the exclamation mark once the skull applies (UN GHS 1.4.10.5.3.1(a), from memory)", () => {
    expect(pictogramsFor([...DCE_CODES, "H331"])).toEqual(["GHS02", "GHS06", "GHS08"]);
  });

  it("drops the exclamation mark for skin or eye irritation when the corrosion pictogram applies (1.4.10.5.3.1(b))", () => {
    expect(pictogramsFor(["H314", "H315", "H319"])).toEqual(["GHS05"]);
  });

  it("keeps the exclamation mark next to corrosion when it also stands for harmful-if-swallowed", () => {
    expect(pictogramsFor(["H314", "H302"])).toEqual(["GHS05", "GHS07"]);
  });

  it("drops the exclamation mark for skin sensitisation beside respiratory sensitisation (1.4.10.5.3.1(c))", () => {
    expect(pictogramsFor(["H334", "H317"])).toEqual(["GHS08"]);
    expect(pictogramsFor(["H334", "H317", "H336"])).toEqual(["GHS07", "GHS08"]);
  });

  it("gives flammable liquid category 4 (H227) no pictogram and the signal word Warning (UN GHS table 2.6.2)", () => {
    expect(pictogramsFor(["H227"])).toEqual([]);
    expect(signalWordFor(["H227"])).toBe("Warning");
  });

  it.each([
    ["H224", ["GHS02"], "Danger"],
    ["H225", ["GHS02"], "Danger"],
    ["H226", ["GHS02"], "Warning"],
    ["H290", ["GHS05"], "Warning"],
    ["H318", ["GHS05"], "Danger"],
    ["H270", ["GHS03"], "Danger"],
    ["H280", ["GHS04"], "Warning"],
    ["H200", ["GHS01"], "Danger"],
    ["H241", ["GHS01", "GHS02"], "Danger"],
    ["H304", ["GHS08"], "Danger"],
    ["H373", ["GHS08"], "Warning"],
    ["H400", ["GHS09"], "Warning"],
    ["H411", ["GHS09"], "none"],
    ["H420", ["GHS07"], "Warning"],
    ["H362", [], "none"],
    ["H412", [], "none"],
  ])("labels %s with %j and %s (UN GHS category tables, from memory)", (code, pictograms, word) => {
    expect(pictogramsFor([code])).toEqual(pictograms);
    expect(signalWordFor([code])).toBe(word);
  });

  it("cannot tell Danger from Warning for a flammable solid alone (H228 covers categories 1 and 2)", () => {
    expect(signalWordFor(["H228"])).toBe("undetermined");
    expect(hazardLabel(["H228"]).undeterminedCodes).toEqual(["H228"]);
  });

  it("settles on Danger when another code carries it", () => {
    expect(signalWordFor(["H228", "H225"])).toBe("Danger");
  });

  it("stays undetermined when the only other signal word is Warning", () => {
    expect(signalWordFor(["H272", "H315"])).toBe("undetermined");
  });

  it("splits combined codes into their members", () => {
    expect(pictogramsFor(["H300+H310+H330"])).toEqual(["GHS06"]);
  });

  it("lists codes it does not know and lets them add nothing", () => {
    const label = hazardLabel(["H225", "H299", "banana"]);
    expect(label.pictograms).toEqual(["GHS02"]);
    expect(label.unknownCodes).toEqual(["banana", "H299"]);
  });

  it("has a label entry for every single code in the statement table", () => {
    for (const code of H_CODES) expect(hazardLabel([code]).unknownCodes).toEqual([]);
  });
});

describe("hazardStatementText (UN GHS rev. 9 Annex 3, texts from memory)", () => {
  it.each([
    ["H224", "Extremely flammable liquid and vapour"],
    ["H225", "Highly flammable liquid and vapour"],
    ["H226", "Flammable liquid and vapour"],
    ["H227", "Combustible liquid"],
    ["H302", "Harmful if swallowed"],
    ["H315", "Causes skin irritation"],
    ["H319", "Causes serious eye irritation"],
    ["H335", "May cause respiratory irritation"],
    ["H350", "May cause cancer"],
    ["H410", "Very toxic to aquatic life with long lasting effects"],
  ])("reads %s as %j", (code, text) => {
    expect(hazardStatementText(code)).toBe(text);
  });

  it("tidies the code as typed", () => {
    expect(hazardStatementText(" h350i ")).toBe("May cause cancer by inhalation");
  });

  it("gives the official text of a combination listed in Annex 3", () => {
    expect(hazardStatementText("H300+H310+H330")).toBe("Fatal if swallowed, in contact with skin or if inhaled");
  });

  it("joins the members' texts for a combination Annex 3 does not list", () => {
    expect(hazardStatementText("H315+H319")).toBe("Causes skin irritation; Causes serious eye irritation");
  });

  it("has no text for an unknown code", () => {
    expect(hazardStatementText("H299")).toBeUndefined();
  });
});

describe("isHCode", () => {
  it.each(["H225", "H350i", "H360Fd", "H300+H310", "h319"])("accepts %s", (code) => {
    expect(isHCode(code)).toBe(true);
  });

  it.each(["H999", "H299", "EUH066", "P210", "225", "H35", "H360X", ""])("rejects %j", (code) => {
    expect(isHCode(code)).toBe(false);
  });

  it("keeps the case of the suffix, which carries meaning (H360Fd is not H360FD)", () => {
    expect(normaliseHCode("h360Fd")).toBe("H360Fd");
    expect(hazardStatementText("H360Fd")).not.toBe(hazardStatementText("H360FD"));
  });

  it("splits a combined code into its members", () => {
    expect(splitHCode("H301 + H311")).toEqual(["H301", "H311"]);
  });

  it("covers every statement of the physical, health and environmental ranges the brief asks for", () => {
    const required = [
      ...range(200, 208), ...range(220, 232), ...range(240, 242), ...range(250, 252), 260, 261,
      ...range(270, 272), ...range(280, 284), 290,
      ...range(300, 305), ...range(310, 320), ...range(330, 336), 340, 341, 350, 351, 360, 361, 362,
      ...range(370, 373), ...range(400, 402), ...range(410, 413), 420,
    ].map((n) => `H${n}`);
    expect(required.filter((code) => !isHCode(code))).toEqual([]);
  });
});

function range(from: number, to: number): number[] {
  return Array.from({ length: to - from + 1 }, (_, i) => from + i);
}

describe("the hazard modules the browser imports", () => {
  // The hazard panel imports hazards.ts and ghs-statements.ts; the formula parser (mf-parser)
  // would add about 200 kB to that page, so neither may reach it through a relative import.
  function importsOf(file: string, seen = new Set<string>()): Set<string> {
    if (seen.has(file)) return seen;
    seen.add(file);
    const text = readFileSync(file, "utf8");
    for (const m of text.matchAll(/^import\s[^;]*?from\s+"([^"]+)"/gms)) {
      const spec = m[1];
      if (spec.startsWith("./")) importsOf(path.join(path.dirname(file), `${spec.slice(2)}.ts`), seen);
      else seen.add(spec);
    }
    return seen;
  }

  it.each([
    "shared/domain/hazards.ts",
    "shared/domain/ghs-statements.ts",
    "shared/domain/cautions.ts",
    // The Safety review, the stock forms and Recharge use these in the browser too.
    "shared/domain/storage.ts",
    "shared/domain/exact-amounts.ts",
    "shared/domain/charges.ts",
    "shared/domain/journal.ts",
  ])("keeps %s free of the formula parser", (file) => {
    const reached = [...importsOf(path.resolve(file))];
    expect(reached.filter((r) => r === "mf-parser" || r.endsWith("chemistry.ts"))).toEqual([]);
  });

  it("would notice chemistry.ts pulling in the parser", () => {
    expect([...importsOf(path.resolve("shared/domain/chemistry.ts"))]).toContain("mf-parser");
  });
});
