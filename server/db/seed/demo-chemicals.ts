/**
 * The demo's chemicals: the solvents, electrolyte salts and redox probe a liquid|liquid
 * electrochemistry core keeps. Identity and hazard data are PUBLISHED values, each with its
 * source beside it; "from memory" marks a value not re-read in that source (check the
 * supplier's safety data sheet before relying on it). Prices, reorder points and storage-group
 * wording are invented for the demo.
 *
 * Molar masses are not typed in: they come from the formula through molarMassFromFormula
 * (IUPAC/CIAAW 2021 abridged standard atomic weights), except for the etherate, whose bottle
 * form differs from the salt's formula (see there).
 */
import { molarMassFromFormula } from "@shared/domain/chemistry";

export type ChemicalKey =
  | "dce"
  | "licl"
  | "nacl"
  | "kcl"
  | "nitrobenzene"
  | "tft"
  | "tbacl"
  | "ppncl"
  | "litpfb"
  | "ferrocene"
  | "tmacl"
  | "acetone";

export interface DemoChemical {
  key: ChemicalKey;
  name: string;
  synonyms: string[];
  casNumber: string;
  formula: string;
  molarMass: number;
  molarMassOverridden: boolean;
  hazardStatements: string[];
  pictograms: string[];
  signalWord: "Danger" | "Warning" | null;
  precautions: string;
  /** Closed cup, °C. */
  flashPointC: number | null;
  boilingPointC: number | null;
  /** g/mL near 20 °C; liquids only. */
  densityGPerMl: number | null;
  carcinogen: boolean;
  acuteToxic: boolean;
  storageGroup: string;
  reorderPoint: number | null;
  reorderUnit: string | null;
  unitCostCents: number | null;
  costUnit: string | null;
  /** Electrolytes: the ions one formula unit gives, for run plans (charges as the formula says). */
  ions?: { ion: string; charge: number; count: number }[];
}

const ions = (cation: string, anion: string) => [
  { ion: cation, charge: 1, count: 1 },
  { ion: anion, charge: -1, count: 1 },
];

const fromFormula = (formula: string) => ({ formula, molarMass: molarMassFromFormula(formula), molarMassOverridden: false });

/**
 * Lithium tetrakis(pentafluorophenyl)borate is only isolated as a diethyl ether solvate, and a
 * bottle sold as the "ethyl etherate" holds LiB(C6F5)4 · x Et2O with x near 2.5 (the value
 * varies by lot; from memory). A solution made from the bottle must be weighed with the
 * bottle form's molar mass, not the bare salt's (685.97 g/mol), or the concentration comes
 * out about 27 % high. The demo's (invented) certificate of analysis says x = 2.5.
 */
/** Sodium and potassium chloride: not hazardous under GHS on suppliers' safety data sheets (from memory). */
const HARMLESS_SALT = {
  hazardStatements: [],
  pictograms: [],
  signalWord: null,
  precautions: "",
  flashPointC: null,
  boilingPointC: null,
  densityGPerMl: null,
  carcinogen: false,
  acuteToxic: false,
  storageGroup: "Inorganic salts",
} as const satisfies Partial<DemoChemical>;

const LITPFB_SALT = "LiB(C6F5)4";
const LITPFB_BOTTLE_FORM = "LiB(C6F5)4·2.5(C2H5)2O";

export const DEMO_CHEMICALS: readonly DemoChemical[] = [
  {
    key: "dce",
    name: "1,2-Dichloroethane",
    synonyms: ["DCE", "ethylene dichloride"],
    casNumber: "107-06-2",
    ...fromFormula("C2H4Cl2"),
    // Suppliers' safety data sheets for 1,2-dichloroethane, section 2 (hazards identification); some add H304 or H331.
    hazardStatements: ["H225", "H302", "H315", "H319", "H335", "H350"],
    pictograms: ["GHS02", "GHS07", "GHS08"],
    signalWord: "Danger",
    precautions:
      "Fume hood only; keep away from ignition sources. Carcinogen (H350): keep exposure as low as possible. Thin nitrile gloves give little protection; use the glove material the SDS names. Collect as halogenated waste.",
    flashPointC: 13, // Merck Index, closed cup
    boilingPointC: 83.5, // IARC Monographs vol. 71
    densityGPerMl: 1.2569, // Merck Index, 20 °C
    carcinogen: true,
    acuteToxic: false, // H302 is acute toxicity category 4 ("harmful"), not 1–3
    storageGroup: "Flammable liquids – halogenated",
    reorderPoint: 5000,
    reorderUnit: "mL",
    unitCostCents: 7,
    costUnit: "mL",
  },
  {
    key: "licl",
    ions: ions("Li+", "Cl-"),
    name: "Lithium chloride",
    synonyms: ["LiCl"],
    casNumber: "7447-41-8",
    ...fromFormula("LiCl"),
    // Suppliers' safety data sheets.
    hazardStatements: ["H302", "H315", "H319"],
    pictograms: ["GHS07"],
    signalWord: "Warning",
    precautions: "Hygroscopic: keep tightly closed and weigh quickly.",
    flashPointC: null,
    boilingPointC: null,
    densityGPerMl: null,
    carcinogen: false,
    acuteToxic: false,
    storageGroup: "Inorganic salts",
    reorderPoint: 50,
    reorderUnit: "g",
    unitCostCents: 70,
    costUnit: "g",
  },
  {
    key: "nacl",
    ions: ions("Na+", "Cl-"),
    name: "Sodium chloride",
    synonyms: ["NaCl"],
    casNumber: "7647-14-5",
    ...fromFormula("NaCl"),
    ...HARMLESS_SALT,
    reorderPoint: 100,
    reorderUnit: "g",
    unitCostCents: 8,
    costUnit: "g",
  },
  {
    key: "kcl",
    ions: ions("K+", "Cl-"),
    name: "Potassium chloride",
    synonyms: ["KCl"],
    casNumber: "7447-40-7",
    ...fromFormula("KCl"),
    ...HARMLESS_SALT,
    reorderPoint: 100,
    reorderUnit: "g",
    unitCostCents: 9,
    costUnit: "g",
  },
  {
    key: "nitrobenzene",
    name: "Nitrobenzene",
    synonyms: ["NB", "oil of mirbane"],
    casNumber: "98-95-3",
    ...fromFormula("C6H5NO2"),
    // EU CLP harmonised classification as printed on suppliers' sheets (Acute Tox. 3 by three
    // routes, Carc. 2, Repr. 1B, STOT RE 1, Aquatic Chronic 3); US sheets add H227 for a
    // category 4 combustible liquid. From memory, partly re-read on a supplier-sheet excerpt.
    hazardStatements: ["H227", "H301", "H311", "H331", "H351", "H360F", "H372", "H412"],
    pictograms: ["GHS06", "GHS08"],
    signalWord: "Danger",
    precautions:
      "Toxic through the skin: double gloves and a fume hood. Causes methaemoglobinaemia; know the first aid before use. Suspected carcinogen and reproductive toxicant.",
    flashPointC: 88, // Merck Index, closed cup 190 °F
    boilingPointC: 211, // Merck Index, 210–211 °C
    densityGPerMl: 1.2037, // 20 °C, CRC-style data table (secondary source)
    carcinogen: true, // H351 (IARC Group 2B)
    acuteToxic: true,
    storageGroup: "Combustible liquids – toxic",
    reorderPoint: 250,
    reorderUnit: "mL",
    unitCostCents: 9,
    costUnit: "mL",
  },
  {
    key: "tft",
    name: "α,α,α-Trifluorotoluene",
    synonyms: ["trifluorotoluene", "benzotrifluoride", "TFT"],
    casNumber: "98-08-8",
    ...fromFormula("C7H5F3"),
    // Suppliers' safety data sheets, from memory: H225; the long-term aquatic hazard (H411)
    // matches the older R51/53 on a supplier's MSDS.
    hazardStatements: ["H225", "H411"],
    pictograms: ["GHS02", "GHS09"],
    signalWord: "Danger",
    precautions: "Highly flammable; fume hood. A less toxic alternative to 1,2-dichloroethane for some interfaces.",
    flashPointC: 12, // suppliers' sheets, closed cup (from memory)
    boilingPointC: 102, // suppliers' sheets (from memory)
    densityGPerMl: 1.19, // suppliers' sheets, 20 °C (from memory)
    carcinogen: false,
    acuteToxic: false,
    storageGroup: "Flammable liquids – halogenated",
    reorderPoint: 500,
    reorderUnit: "mL",
    unitCostCents: 24,
    costUnit: "mL",
  },
  {
    key: "tbacl",
    ions: ions("TBA+", "Cl-"),
    name: "Tetrabutylammonium chloride",
    synonyms: ["TBACl", "TBA chloride"],
    casNumber: "1112-67-0",
    ...fromFormula("C16H36ClN"),
    // Suppliers' safety data sheets (from memory; some add H335 or H412).
    hazardStatements: ["H302", "H315", "H319"],
    pictograms: ["GHS07"],
    signalWord: "Warning",
    precautions: "Very hygroscopic: store dry, weigh quickly or in the glovebox.",
    flashPointC: null,
    boilingPointC: null,
    densityGPerMl: null,
    carcinogen: false,
    acuteToxic: false,
    storageGroup: "Organic salts – keep dry",
    reorderPoint: 10,
    reorderUnit: "g",
    unitCostCents: 60,
    costUnit: "g",
  },
  {
    key: "ppncl",
    ions: ions("BTPPA+", "Cl-"),
    name: "Bis(triphenylphosphoranylidene)ammonium chloride",
    synonyms: ["BTPPACl", "PPNCl", "bis(triphenylphosphine)iminium chloride"],
    // 21050-13-5 passes the CAS check digit; the "21050-13-9" in our brief does not.
    // Number as given in the Wikipedia chembox and a chemical supplier's listing.
    casNumber: "21050-13-5",
    ...fromFormula("C36H30ClNP2"),
    // Wikipedia chembox GHS labelling (H315, H319, H332, H335; Warning).
    hazardStatements: ["H315", "H319", "H332", "H335"],
    pictograms: ["GHS07"],
    signalWord: "Warning",
    precautions: "Cation source for the organic-phase electrolyte (metathesis with the borate).",
    flashPointC: null,
    boilingPointC: null,
    densityGPerMl: null,
    carcinogen: false,
    acuteToxic: false,
    storageGroup: "Organic salts – keep dry",
    reorderPoint: 5,
    reorderUnit: "g",
    unitCostCents: 600,
    costUnit: "g",
  },
  {
    key: "litpfb",
    ions: ions("Li+", "TB(C6F5)4-"),
    name: "Lithium tetrakis(pentafluorophenyl)borate ethyl etherate",
    synonyms: ["LiTPFB etherate", "LiB(C6F5)4 · x Et2O"],
    // The brief gave 155543-02-1, which fails the CAS check digit. 371162-53-7 is the etherate's
    // number in the Wikipedia chembox (marked unverified there; from a secondary source):
    // confirm it against the bottle's label.
    casNumber: "371162-53-7",
    formula: LITPFB_SALT,
    molarMass: molarMassFromFormula(LITPFB_BOTTLE_FORM),
    molarMassOverridden: true,
    // Suppliers' safety data sheets (from memory).
    hazardStatements: ["H315", "H319", "H335"],
    pictograms: ["GHS07"],
    signalWord: "Warning",
    precautions:
      `Store cold and dry; weigh in the glovebox. Use the bottle form's molar mass (${LITPFB_BOTTLE_FORM}) when making solutions. The dry salt can decompose violently when heated.`,
    flashPointC: null,
    boilingPointC: null,
    densityGPerMl: null,
    carcinogen: false,
    acuteToxic: false,
    storageGroup: "Moisture-sensitive salts – fridge",
    reorderPoint: 1,
    reorderUnit: "g",
    unitCostCents: 42_000,
    costUnit: "g",
  },
  {
    key: "ferrocene",
    name: "Ferrocene",
    synonyms: ["Fc", "bis(cyclopentadienyl)iron"],
    casNumber: "102-54-5",
    ...fromFormula("C10H10Fe"),
    // Suppliers' safety data sheets (from memory; recent sheets add H332, H361 and H372).
    hazardStatements: ["H228", "H302", "H411"],
    pictograms: ["GHS02", "GHS07", "GHS09"],
    signalWord: "Warning",
    precautions: "Flammable solid. Redox probe: reference for potential scales in the organic phase.",
    flashPointC: null,
    boilingPointC: null,
    densityGPerMl: null,
    carcinogen: false,
    acuteToxic: false,
    storageGroup: "Flammable solids",
    reorderPoint: 5,
    reorderUnit: "g",
    unitCostCents: 80,
    costUnit: "g",
  },
  {
    key: "tmacl",
    ions: ions("TMA+", "Cl-"),
    name: "Tetramethylammonium chloride",
    synonyms: ["TMACl", "TMA chloride"],
    casNumber: "75-57-0",
    ...fromFormula("C4H12ClN"),
    // Suppliers' safety data sheets (from memory): toxic if swallowed and in contact with skin.
    // No exclamation mark beside the skull and crossbones: UN GHS 1.4.10.5.3.1.
    hazardStatements: ["H301", "H311", "H315", "H319", "H335"],
    pictograms: ["GHS06"],
    signalWord: "Danger",
    precautions: "Toxic: gloves, weigh in a hood, wash hands after use. Aqueous-phase transferring ion for calibrating the potential scale.",
    flashPointC: null,
    boilingPointC: null,
    densityGPerMl: null,
    carcinogen: false,
    acuteToxic: true,
    storageGroup: "Toxic solids",
    reorderPoint: 20,
    reorderUnit: "g",
    unitCostCents: 50,
    costUnit: "g",
  },
  {
    key: "acetone",
    name: "Acetone",
    synonyms: ["propan-2-one", "dimethyl ketone"],
    casNumber: "67-64-1",
    ...fromFormula("C3H6O"),
    // EU CLP Annex VI harmonised classification (plus EUH066), as on suppliers' sheets (from memory).
    hazardStatements: ["H225", "H319", "H336"],
    pictograms: ["GHS02", "GHS07"],
    signalWord: "Danger",
    precautions: "For rinsing cells and glassware. Highly flammable: keep wash bottles small.",
    flashPointC: -20, // Merck Index, closed cup (from memory)
    boilingPointC: 56, // CRC Handbook 56.05 °C (from memory)
    densityGPerMl: 0.791, // 20 °C (from memory)
    carcinogen: false,
    acuteToxic: false,
    storageGroup: "Flammable liquids",
    reorderPoint: 4000,
    reorderUnit: "mL",
    unitCostCents: 2,
    costUnit: "mL",
  },
];
