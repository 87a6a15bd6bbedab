/**
 * The demo's places: the Halvorsen Chemistry Building › rooms › cabinets, hoods and shelves,
 * with storage limits. Every limit here is an EXAMPLE labelled as such in `limitNote`: the
 * local fire code, the institution's safety office and the safety data sheet set the real ones.
 * The small under-bench cabinet is deliberately over its example limit in the demo stock, so
 * the safety review has something to show.
 */
import type { LocationLevel, LocationType } from "../../entities/location.entity";

/** 1 US gallon = 3.785 411 784 L exactly (US customary units, NIST Handbook 44 Appendix C). */
export const LITRES_PER_US_GALLON = 3.785411784;

const gallons = (gal: number): number => Math.round(gal * LITRES_PER_US_GALLON * 100) / 100;

export type LocationKey =
  | "building"
  | "interfaceLab"
  | "underBench"
  | "hoodInterface"
  | "bench"
  | "prepLab"
  | "saltShelf"
  | "corrosives"
  | "fridge"
  | "hoodPrep"
  | "solventStore"
  | "flammableCabinet"
  | "wasteArea"
  | "halogenatedWaste";

export interface DemoLocation {
  key: LocationKey;
  parent: LocationKey | null;
  level: LocationLevel;
  name: string;
  type: LocationType;
  flammableLimitLitres: number | null;
  combustibleLimitLitres: number | null;
  limitNote: string;
}

/** Parents come before their children, so the list can be inserted in order. */
export const DEMO_LOCATIONS: readonly DemoLocation[] = [
  {
    key: "building",
    parent: null,
    level: "building",
    name: "Halvorsen Chemistry Building",
    type: "general",
    flammableLimitLitres: null,
    combustibleLimitLitres: null,
    limitNote: "",
  },
  {
    key: "interfaceLab",
    parent: "building",
    level: "room",
    name: "HCB 214 – Interface Laboratory",
    type: "general",
    // 20 US gal: NFPA 45 allows a class B laboratory unit 10 gal of Class I liquids per 100 ft²
    // (as quoted by secondary sources, /work/shared/reference/check-values.md); for a 200 ft² unit.
    flammableLimitLitres: gallons(20),
    combustibleLimitLitres: null,
    limitNote:
      "Example only: a laboratory-unit limit of the kind NFPA 45 sets by lab class and floor area (here 20 US gal); your local fire code and safety office set the real one.",
  },
  {
    key: "underBench",
    parent: "interfaceLab",
    level: "cabinet",
    name: "Under-bench solvent cabinet UB-1",
    type: "flammable_cabinet",
    flammableLimitLitres: 10,
    combustibleLimitLitres: null,
    limitNote: "Example only: institutional under-bench limit; your safety office sets the real one.",
  },
  {
    key: "hoodInterface",
    parent: "interfaceLab",
    level: "cabinet",
    name: "Fume hood FH-2",
    type: "fume_hood",
    flammableLimitLitres: null,
    combustibleLimitLitres: null,
    limitNote: "",
  },
  {
    key: "bench",
    parent: "interfaceLab",
    level: "shelf",
    name: "Bench B-3 (solutions in use)",
    type: "bench",
    flammableLimitLitres: null,
    combustibleLimitLitres: null,
    limitNote: "",
  },
  {
    key: "prepLab",
    parent: "building",
    level: "room",
    name: "HCB 216 – Preparation Laboratory",
    type: "general",
    flammableLimitLitres: null,
    combustibleLimitLitres: null,
    limitNote: "",
  },
  {
    key: "saltShelf",
    parent: "prepLab",
    level: "shelf",
    name: "Shelf S-2 (electrolyte salts)",
    type: "general",
    flammableLimitLitres: null,
    combustibleLimitLitres: null,
    limitNote: "",
  },
  {
    key: "corrosives",
    parent: "prepLab",
    level: "cabinet",
    name: "Corrosives and toxics cabinet CC-1",
    type: "corrosives_cabinet",
    flammableLimitLitres: null,
    combustibleLimitLitres: null,
    limitNote: "",
  },
  {
    key: "fridge",
    parent: "prepLab",
    level: "cabinet",
    name: "Chemical fridge F-1 (no food)",
    type: "fridge",
    flammableLimitLitres: null,
    combustibleLimitLitres: null,
    limitNote: "",
  },
  {
    key: "hoodPrep",
    parent: "prepLab",
    level: "cabinet",
    name: "Fume hood FH-4",
    type: "fume_hood",
    flammableLimitLitres: null,
    combustibleLimitLitres: null,
    limitNote: "",
  },
  {
    key: "solventStore",
    parent: "building",
    level: "room",
    name: "HCB 020 – Solvent Store",
    type: "general",
    flammableLimitLitres: null,
    combustibleLimitLitres: null,
    limitNote: "",
  },
  {
    key: "flammableCabinet",
    parent: "solventStore",
    level: "cabinet",
    name: "Flammable storage cabinet FC-1 (60 gal)",
    type: "flammable_cabinet",
    // OSHA 29 CFR 1910.106: at most 60 US gal of category 1–3 and 120 gal of category 4 liquids per cabinet.
    flammableLimitLitres: gallons(60),
    combustibleLimitLitres: gallons(120),
    limitNote:
      "Example only: OSHA 29 CFR 1910.106 cabinet limit for category 1–3 liquids (60 US gal) and category 4 (120 US gal); your local code and safety office set the real one.",
  },
  {
    key: "wasteArea",
    parent: "building",
    level: "room",
    name: "HCB 022 – Waste Area",
    type: "waste_area",
    flammableLimitLitres: null,
    combustibleLimitLitres: null,
    limitNote: "",
  },
  {
    key: "halogenatedWaste",
    parent: "wasteArea",
    level: "cabinet",
    name: "Halogenated solvent waste point W-1",
    type: "waste_area",
    flammableLimitLitres: null,
    combustibleLimitLitres: null,
    limitNote: "",
  },
];
