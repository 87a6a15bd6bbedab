/**
 * The cautions Phasebook shows where a person handles a chemical (container page, logging usage
 * on the Scan page, solution preparation, receiving a delivery): flammability, toxicity,
 * carcinogenicity, halogenated waste, and whether to work in a fume hood. Pure and free of the
 * formula parser, so the browser imports it; the chemical's flags come computed from the server.
 *
 * Sources: UN GHS rev. 9 ch. 2.6 (flammable liquids: categories 1–3 have a flash point at or
 * below 60 °C, so "volatile" here means a flash point of 60 °C or less), UN GHS Annex 3 (H-statements for inhalation). The fume-hood rule for a boiling
 * point below 150 °C is common practice (a solvent that evaporates readily at room temperature),
 * not a published threshold. The local fire code, the safety office and the safety data sheet
 * take precedence over all of this.
 */
import { isCarcinogen } from "./hazards";

export const PRECEDENCE_CAUTION =
  "Storage limits and handling rules are those set by the local fire code, the institution's safety office and the safety data sheet, which take precedence over anything Phasebook computes.";

/** What the cautions need to know of a chemical (a subset of the chemical DTO). */
export interface CautionChemical {
  hazardStatements: readonly string[];
  flashPointC: number | null;
  boilingPointC: number | null;
  ghsFlammableCategory?: 1 | 2 | 3 | 4 | null;
  nfpaClass?: string | null;
  carcinogen?: boolean;
  acuteToxic?: boolean;
  halogenated?: boolean;
}

/** UN GHS ch. 2.6: flammable-liquid categories 1–3 end at a flash point of 60 °C. */
export const VOLATILE_FLASH_POINT_C = 60;
/** Common practice: below this boiling point a solvent gives off vapour readily at the bench. */
export const VOLATILE_BOILING_POINT_C = 150;

/** H-statements about harm by breathing (UN GHS Annex 3), plus the CMR and organ-toxicity codes whose usual route is vapour. */
export const INHALATION_CODES: readonly string[] = ["H330", "H331", "H332", "H335", "H336", "H340", "H341", "H350", "H351", "H370", "H372"];

/**
 * A fume hood is needed for a volatile solvent (flash point of 60 °C or less, or a boiling point
 * below 150 °C, which takes in the chlorinated solvents that do not burn, such as chloroform),
 * for a halogenated liquid, and for anything with an inhalation hazard statement.
 */
export function needsFumeHood(c: CautionChemical): boolean {
  if (c.flashPointC !== null && c.flashPointC <= VOLATILE_FLASH_POINT_C) return true;
  if (c.boilingPointC !== null && c.boilingPointC < VOLATILE_BOILING_POINT_C) return true;
  // A boiling point on record means a liquid; a halogenated salt (Bu4NCl) has none.
  if (c.halogenated && c.boilingPointC !== null) return true;
  return c.hazardStatements.some((h) => INHALATION_CODES.some((code) => h.startsWith(code)));
}

/** The cautions for a chemical, as sentences, most urgent first. */
export function handlingCautions(c: CautionChemical): string[] {
  const out: string[] = [];
  const codes = c.hazardStatements;
  const category = c.ghsFlammableCategory ?? null;
  if (category !== null && category <= 3) {
    out.push(`Flammable liquid (GHS category ${category}${c.nfpaClass ? `, NFPA class ${c.nfpaClass}` : ""}): keep away from ignition sources and store it in a flammable-liquids cabinet.`);
  } else if (category === 4) out.push("Combustible liquid (GHS category 4): keep away from heat.");
  if (c.acuteToxic) out.push("Toxic: avoid skin contact and inhalation; wear the gloves the safety data sheet names.");
  else if (codes.some((h) => ["H302", "H312", "H332"].includes(h))) out.push("Harmful if swallowed, in contact with skin or inhaled, as its statements say.");
  if (c.carcinogen || isCarcinogen(codes)) {
    out.push(codes.some((h) => h.startsWith("H350")) ? "May cause cancer (known or presumed carcinogen): keep exposure as low as possible." : "Suspected of causing cancer: keep exposure as low as possible.");
  }
  if (needsFumeHood(c)) out.push("Work in a fume hood: its vapour is hazardous to breathe.");
  if (c.halogenated) out.push("Halogenated: collect its waste in the halogenated solvent waste.");
  return out;
}
