/**
 * Hazard classes Phasebook derives for the stockroom and the safety review: flammable-liquid
 * category and class from flash and boiling points, and labels (pictograms, signal word)
 * from a chemical's H-codes. A chemical may hold any set of H-codes; nothing here is
 * hard-coded per substance.
 *
 * Sources (named beside each rule):
 * - UN GHS rev. 9, chapter 2.6 (flammable liquids), as adopted by OSHA in 29 CFR 1910.1200
 *   Appendix B.6 and used for storage in 29 CFR 1910.106(a)(19).
 * - NFPA 30, Flammable and Combustible Liquids Code, classes IA–IIIB (closed-cup flash point),
 *   whose limits are in °F; we classify in °F so the limits stay exact.
 * - Pictograms and signal words per hazard class and category: UN GHS Annex 1 and the
 *   chapter tables; precedence of pictograms: UN GHS 1.4.10.5.3.1 (same rule in EU CLP
 *   Art. 26). Those tables were applied FROM MEMORY, not re-read in the documents.
 *
 * Nothing here parses formulas: the browser imports this module for pictogram names, and the
 * formula parser is a large package. isHalogenated lives in chemistry.ts for that reason.
 */
import { splitHCode } from "./ghs-statements";

export type GhsFlammableCategory = 1 | 2 | 3 | 4;
export type NfpaClass = "IA" | "IB" | "IC" | "II" | "IIIA" | "IIIB";
export type GhsPictogram = "GHS01" | "GHS02" | "GHS03" | "GHS04" | "GHS05" | "GHS06" | "GHS07" | "GHS08" | "GHS09";
export type SignalWord = "Danger" | "Warning";

function isNumber(value: number | null | undefined): value is number {
  return typeof value === "number" && Number.isFinite(value);
}

/**
 * UN GHS ch. 2.6 flammable-liquid category from the closed-cup flash point and initial boiling
 * point (°C): 1 = FP < 23 and IBP ≤ 35; 2 = FP < 23 and IBP > 35; 3 = 23 ≤ FP ≤ 60;
 * 4 = 60 < FP ≤ 93; null above 93 °C or without a flash point.
 *
 * A missing boiling point only matters below 23 °C; there we return category 1, the stricter
 * one (smaller containers, tighter limits), and the UI should say the boiling point is missing.
 */
export function ghsFlammableCategory(
  flashPointC: number | null | undefined,
  boilingPointC?: number | null,
): GhsFlammableCategory | null {
  if (!isNumber(flashPointC)) return null;
  if (flashPointC < 23) {
    if (!isNumber(boilingPointC)) return 1;
    return boilingPointC <= 35 ? 1 : 2;
  }
  if (flashPointC <= 60) return 3;
  if (flashPointC <= 93) return 4;
  return null;
}

/** °C → °F, rounded to 1e-9 °F so that a limit converted back and forth lands on itself. */
export function celsiusToFahrenheit(celsius: number): number {
  return Math.round((celsius * 9 / 5 + 32) * 1e9) / 1e9;
}

export function fahrenheitToCelsius(fahrenheit: number): number {
  return ((fahrenheit - 32) * 5) / 9;
}

/**
 * NFPA 30 class from closed-cup flash point and boiling point in °F:
 * IA FP < 73 and BP < 100; IB FP < 73 and BP ≥ 100; IC 73 ≤ FP < 100; II 100 ≤ FP < 140;
 * IIIA 140 ≤ FP < 200; IIIB FP ≥ 200. A missing boiling point below 73 °F gives IA,
 * the stricter class.
 */
export function nfpaClassFahrenheit(
  flashPointF: number | null | undefined,
  boilingPointF?: number | null,
): NfpaClass | null {
  if (!isNumber(flashPointF)) return null;
  if (flashPointF < 73) {
    if (!isNumber(boilingPointF)) return "IA";
    return boilingPointF < 100 ? "IA" : "IB";
  }
  if (flashPointF < 100) return "IC";
  if (flashPointF < 140) return "II";
  if (flashPointF < 200) return "IIIA";
  return "IIIB";
}

/** NFPA 30 class from °C values (converted exactly to °F; see nfpaClassFahrenheit). */
export function nfpaClass(flashPointC: number | null | undefined, boilingPointC?: number | null): NfpaClass | null {
  if (!isNumber(flashPointC)) return null;
  return nfpaClassFahrenheit(
    celsiusToFahrenheit(flashPointC),
    isNumber(boilingPointC) ? celsiusToFahrenheit(boilingPointC) : null,
  );
}

export interface FlammabilityAssessment {
  ghsCategory: GhsFlammableCategory | null;
  /** H224–H227 for categories 1–4 (UN GHS ch. 2.6, table 2.6.2). */
  ghsHazardStatement: "H224" | "H225" | "H226" | "H227" | null;
  nfpaClass: NfpaClass | null;
  /** True when a class was chosen as the stricter one because the boiling point is missing. */
  assumedLowBoilingPoint: boolean;
}

const FLAMMABLE_STATEMENT = { 1: "H224", 2: "H225", 3: "H226", 4: "H227" } as const;

/** Both classifications at once, with a flag the UI shows when a boiling point would decide. */
export function assessFlammability(
  flashPointC: number | null | undefined,
  boilingPointC?: number | null,
): FlammabilityAssessment {
  const ghsCategory = ghsFlammableCategory(flashPointC, boilingPointC);
  const nfpa = nfpaClass(flashPointC, boilingPointC);
  // Below 23 °C (GHS) the boiling point decides; the NFPA limit of 73 °F (22.8 °C) lies inside that range.
  const boilingPointDecides = isNumber(flashPointC) && flashPointC < 23;
  return {
    ghsCategory,
    ghsHazardStatement: ghsCategory === null ? null : FLAMMABLE_STATEMENT[ghsCategory],
    nfpaClass: nfpa,
    assumedLowBoilingPoint: boilingPointDecides && !isNumber(boilingPointC),
  };
}

/** Single H-codes of a list, combined codes ("H300+H330") split into their members. */
function singleCodes(hCodes: readonly string[]): Set<string> {
  return new Set(hCodes.flatMap((code) => splitHCode(code)));
}

const CARCINOGEN_CODES = ["H350", "H350i", "H351"];

/** Carcinogenicity category 1A, 1B (H350, H350i) or 2 (H351) — UN GHS ch. 3.6; H350i is EU CLP. */
export function isCarcinogen(hCodes: readonly string[]): boolean {
  const codes = singleCodes(hCodes);
  return CARCINOGEN_CODES.some((c) => codes.has(c));
}

/**
 * Acute toxicity categories 1–3 by any route: H300, H310, H330 (cat. 1–2) and H301, H311,
 * H331 (cat. 3), UN GHS ch. 3.1. These are the categories that carry the skull and crossbones
 * and that lab safety plans usually treat as "highly toxic"; category 4 (H302, H312, H332,
 * "harmful") and 5 are left out on purpose.
 */
export const ACUTELY_TOXIC_CODES: readonly string[] = ["H300", "H301", "H310", "H311", "H330", "H331"];

export function isAcutelyToxic(hCodes: readonly string[]): boolean {
  const codes = singleCodes(hCodes);
  return ACUTELY_TOXIC_CODES.some((c) => codes.has(c));
}

type SignalVerdict = SignalWord | "none" | "either";

interface CodeLabel {
  pictograms: readonly GhsPictogram[];
  /** "either" where the code spans categories with different signal words. */
  signal: SignalVerdict;
  /** True where the code spans categories with and without a pictogram. */
  pictogramsUncertain?: boolean;
}

const L = (pictograms: GhsPictogram[], signal: SignalVerdict, pictogramsUncertain = false): CodeLabel => ({
  pictograms,
  signal,
  pictogramsUncertain,
});

/**
 * Label elements per single H-code, from the category tables of the UN GHS chapters (from
 * memory). Notes on codes that a brief reading gets wrong:
 * - H205 (explosive division 1.5) has no pictogram; H241 carries both bomb and flame.
 * - H221 covers flammable gas 1B (flame, Danger) and 2 (no pictogram, Warning): undecidable.
 * - H227 (flammable liquid cat. 4), H229 alone (aerosol cat. 3), H303/H313/H333 (acute cat. 5),
 *   H316, H320 have no pictogram but the signal word Warning.
 * - H362 (effects via lactation) has neither pictogram nor signal word; so have H401, H402,
 *   H412, H413. H411 has the environment pictogram without a signal word.
 * - H228, H242, H261, H272 and H207 span categories with Danger and Warning: "either".
 */
const CODE_LABELS: Readonly<Record<string, CodeLabel>> = {
  H200: L(["GHS01"], "Danger"),
  H201: L(["GHS01"], "Danger"),
  H202: L(["GHS01"], "Danger"),
  H203: L(["GHS01"], "Danger"),
  H204: L(["GHS01"], "Warning"),
  H205: L([], "Danger"),
  H206: L(["GHS02"], "Danger"),
  H207: L(["GHS02"], "either"),
  H208: L(["GHS02"], "Warning"),
  H220: L(["GHS02"], "Danger"),
  H221: L([], "either", true),
  H222: L(["GHS02"], "Danger"),
  H223: L(["GHS02"], "Warning"),
  H224: L(["GHS02"], "Danger"),
  H225: L(["GHS02"], "Danger"),
  H226: L(["GHS02"], "Warning"),
  H227: L([], "Warning"),
  H228: L(["GHS02"], "either"),
  H229: L([], "Warning"),
  H230: L([], "none"),
  H231: L([], "none"),
  H232: L(["GHS02"], "Danger"),
  H240: L(["GHS01"], "Danger"),
  H241: L(["GHS01", "GHS02"], "Danger"),
  H242: L(["GHS02"], "either"),
  H250: L(["GHS02"], "Danger"),
  H251: L(["GHS02"], "Danger"),
  H252: L(["GHS02"], "Warning"),
  H260: L(["GHS02"], "Danger"),
  H261: L(["GHS02"], "either"),
  H270: L(["GHS03"], "Danger"),
  H271: L(["GHS03"], "Danger"),
  H272: L(["GHS03"], "either"),
  H280: L(["GHS04"], "Warning"),
  H281: L(["GHS04"], "Warning"),
  H282: L(["GHS02", "GHS04"], "Danger"),
  H283: L(["GHS02", "GHS04"], "Warning"),
  H284: L(["GHS04"], "Warning"),
  H290: L(["GHS05"], "Warning"),
  H300: L(["GHS06"], "Danger"),
  H301: L(["GHS06"], "Danger"),
  H302: L(["GHS07"], "Warning"),
  H303: L([], "Warning"),
  H304: L(["GHS08"], "Danger"),
  H305: L(["GHS08"], "Warning"),
  H310: L(["GHS06"], "Danger"),
  H311: L(["GHS06"], "Danger"),
  H312: L(["GHS07"], "Warning"),
  H313: L([], "Warning"),
  H314: L(["GHS05"], "Danger"),
  H315: L(["GHS07"], "Warning"),
  H316: L([], "Warning"),
  H317: L(["GHS07"], "Warning"),
  H318: L(["GHS05"], "Danger"),
  H319: L(["GHS07"], "Warning"),
  H320: L([], "Warning"),
  H330: L(["GHS06"], "Danger"),
  H331: L(["GHS06"], "Danger"),
  H332: L(["GHS07"], "Warning"),
  H333: L([], "Warning"),
  H334: L(["GHS08"], "Danger"),
  H335: L(["GHS07"], "Warning"),
  H336: L(["GHS07"], "Warning"),
  H340: L(["GHS08"], "Danger"),
  H341: L(["GHS08"], "Warning"),
  H350: L(["GHS08"], "Danger"),
  H350i: L(["GHS08"], "Danger"),
  H351: L(["GHS08"], "Warning"),
  H360: L(["GHS08"], "Danger"),
  H360F: L(["GHS08"], "Danger"),
  H360D: L(["GHS08"], "Danger"),
  H360FD: L(["GHS08"], "Danger"),
  H360Fd: L(["GHS08"], "Danger"),
  H360Df: L(["GHS08"], "Danger"),
  H361: L(["GHS08"], "Warning"),
  H361f: L(["GHS08"], "Warning"),
  H361d: L(["GHS08"], "Warning"),
  H361fd: L(["GHS08"], "Warning"),
  H362: L([], "none"),
  H370: L(["GHS08"], "Danger"),
  H371: L(["GHS08"], "Warning"),
  H372: L(["GHS08"], "Danger"),
  H373: L(["GHS08"], "Warning"),
  H400: L(["GHS09"], "Warning"),
  H401: L([], "none"),
  H402: L([], "none"),
  H410: L(["GHS09"], "Warning"),
  H411: L(["GHS09"], "none"),
  H412: L([], "none"),
  H413: L([], "none"),
  H420: L(["GHS07"], "Warning"),
};

/** Codes for which the exclamation mark stands for skin or eye irritation only. */
const IRRITATION_CODES = new Set(["H315", "H319"]);
const SKIN_SENSITISATION_CODES = new Set(["H317"]);

export interface HazardLabel {
  pictograms: GhsPictogram[];
  /**
   * "none" when no code carries a signal word; "undetermined" when the codes alone cannot
   * decide between Danger and Warning (e.g. only H228): read the supplier's label.
   */
  signalWord: SignalWord | "none" | "undetermined";
  /** Codes whose pictograms or signal word depend on a category the code does not reveal. */
  undeterminedCodes: string[];
  /** Codes Phasebook does not know; they add nothing to the label. */
  unknownCodes: string[];
}

/**
 * Pictograms and signal word for a set of H-codes.
 *
 * Pictogram precedence, UN GHS 1.4.10.5.3.1 / EU CLP Art. 26 (from memory, applied only as
 * far as we are sure of it):
 * (a) with the skull and crossbones (GHS06) the exclamation mark (GHS07) does not appear;
 * (b) with the corrosion pictogram (GHS05) the exclamation mark does not appear where it would
 *     stand only for skin or eye irritation;
 * (c) with the health hazard pictogram (GHS08) for respiratory sensitisation (H334) the
 *     exclamation mark does not appear where it would stand only for skin sensitisation or skin
 *     or eye irritation.
 * The optional omissions for explosives (GHS01 making GHS02/GHS03 optional) are not applied:
 * showing one pictogram too many is the safe error.
 *
 * Signal word, UN GHS 1.4.10.5.2(a): Danger outranks Warning, and only one appears.
 */
export function hazardLabel(hCodes: readonly string[]): HazardLabel {
  const codes = [...singleCodes(hCodes)];
  const unknownCodes = [
    ...hCodes.filter((c) => splitHCode(c).length === 0),
    ...codes.filter((c) => !Object.hasOwn(CODE_LABELS, c)),
  ];
  const known = codes.filter((c) => Object.hasOwn(CODE_LABELS, c));
  const undeterminedCodes = known.filter((c) => CODE_LABELS[c].signal === "either" || CODE_LABELS[c].pictogramsUncertain);

  const pictograms = new Set<GhsPictogram>();
  const exclamationReasons = new Set<string>();
  for (const code of known) {
    for (const p of CODE_LABELS[code].pictograms) {
      pictograms.add(p);
      if (p === "GHS07") exclamationReasons.add(code);
    }
  }
  if (pictograms.has("GHS06")) exclamationReasons.clear();
  if (pictograms.has("GHS05")) for (const c of IRRITATION_CODES) exclamationReasons.delete(c);
  if (known.includes("H334")) {
    for (const c of [...IRRITATION_CODES, ...SKIN_SENSITISATION_CODES]) exclamationReasons.delete(c);
  }
  if (exclamationReasons.size === 0) pictograms.delete("GHS07");

  const signals = known.map((c) => CODE_LABELS[c].signal);
  const signalWord: HazardLabel["signalWord"] = signals.includes("Danger")
    ? "Danger"
    : signals.includes("either")
      ? "undetermined"
      : signals.includes("Warning")
        ? "Warning"
        : "none";

  return {
    pictograms: [...pictograms].sort(),
    signalWord,
    undeterminedCodes,
    unknownCodes,
  };
}

/** Pictogram codes GHS01…GHS09 for a set of H-codes, after the precedence rules. */
export function pictogramsFor(hCodes: readonly string[]): GhsPictogram[] {
  return hazardLabel(hCodes).pictograms;
}

/** Signal word derivable from H-codes alone; see HazardLabel.signalWord. */
export function signalWordFor(hCodes: readonly string[]): HazardLabel["signalWord"] {
  return hazardLabel(hCodes).signalWord;
}

/** Plain names of the pictograms, for alt text and for people who do not know the codes. */
export const PICTOGRAM_NAMES: Readonly<Record<GhsPictogram, string>> = {
  GHS01: "Exploding bomb",
  GHS02: "Flame",
  GHS03: "Flame over circle",
  GHS04: "Gas cylinder",
  GHS05: "Corrosion",
  GHS06: "Skull and crossbones",
  GHS07: "Exclamation mark",
  GHS08: "Health hazard",
  GHS09: "Environment",
};
