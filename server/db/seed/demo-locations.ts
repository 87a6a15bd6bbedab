/**
 * The demo's places: the Halvorsen Chemistry Building › rooms › cabinets, hoods and shelves,
 * with storage limits by fire-code liquid class. Every limit here is an EXAMPLE labelled as such
 * in its note: the local fire code, the institution's safety office and the safety data sheet
 * set the real ones. The small under-bench cabinet is deliberately over its example limit in the
 * demo stock, so the safety review has something to show.
 */
import type { NfpaClass } from "@shared/domain/hazards";
import type { LocationLevel, LocationType } from "../../entities/location.entity";

export interface DemoLimit {
  classes: NfpaClass[];
  volume: number;
  unit: "L" | "US gal";
  includesCabinets: boolean;
  note: string;
}

const CLASS_I: NfpaClass[] = ["IA", "IB", "IC"];

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
  limits: DemoLimit[];
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
    limits: [],
    limitNote: "",
  },
  {
    key: "interfaceLab",
    parent: "building",
    level: "room",
    name: "HCB 214 – Interface Laboratory",
    type: "general",
    // NFPA 45, Standard on Fire Protection for Laboratories Using Chemicals, maximum quantities per
    // laboratory unit (as quoted by secondary sources, not re-read in the standard): a class B unit
    // 10 US gal of Class I liquids per 100 ft² outside cabinets, twice that with cabinets; for 200 ft².
    limits: [
      { classes: CLASS_I, volume: 20, unit: "US gal", includesCabinets: false, note: "Example only: NFPA 45-style Class I limit outside approved cabinets for a 200 ft² class B unit." },
      { classes: [...CLASS_I, "II", "IIIA"], volume: 40, unit: "US gal", includesCabinets: true, note: "Example only: Classes I, II and IIIA together, cabinets included." },
    ],
    limitNote:
      "Example limits of the kind NFPA 45 sets by laboratory class and floor area; your local fire code and safety office set the real ones.",
  },
  {
    key: "underBench",
    parent: "interfaceLab",
    level: "cabinet",
    name: "Under-bench solvent cabinet UB-1",
    type: "flammable_cabinet",
    limits: [
      { classes: [...CLASS_I, "II"], volume: 10, unit: "L", includesCabinets: true, note: "Example only: institutional under-bench limit for Class I and II liquids." },
      { classes: ["IA"], volume: 4, unit: "L", includesCabinets: true, note: "Example only: Class IA alone (the most volatile liquids)." },
    ],
    limitNote: "Example limits of an institution's own; your safety office sets the real ones.",
  },
  {
    key: "hoodInterface",
    parent: "interfaceLab",
    level: "cabinet",
    name: "Fume hood FH-2",
    type: "fume_hood",
    limits: [],
    limitNote: "",
  },
  {
    key: "bench",
    parent: "interfaceLab",
    level: "shelf",
    name: "Bench B-3 (solutions in use)",
    type: "bench",
    limits: [],
    limitNote: "",
  },
  {
    key: "prepLab",
    parent: "building",
    level: "room",
    name: "HCB 216 – Preparation Laboratory",
    type: "general",
    limits: [],
    limitNote: "",
  },
  {
    key: "saltShelf",
    parent: "prepLab",
    level: "shelf",
    name: "Shelf S-2 (electrolyte salts)",
    type: "general",
    limits: [],
    limitNote: "",
  },
  {
    key: "corrosives",
    parent: "prepLab",
    level: "cabinet",
    name: "Corrosives and toxics cabinet CC-1",
    type: "corrosives_cabinet",
    limits: [],
    limitNote: "",
  },
  {
    key: "fridge",
    parent: "prepLab",
    level: "cabinet",
    name: "Chemical fridge F-1 (no food)",
    type: "fridge",
    limits: [],
    limitNote: "",
  },
  {
    key: "hoodPrep",
    parent: "prepLab",
    level: "cabinet",
    name: "Fume hood FH-4",
    type: "fume_hood",
    limits: [],
    limitNote: "",
  },
  {
    key: "solventStore",
    parent: "building",
    level: "room",
    name: "HCB 020 – Solvent Store",
    type: "general",
    // International Fire Code, maximum allowable quantity per control area for Class IB liquids:
    // 120 US gal before increases for sprinklers and cabinets (as quoted by secondary sources).
    limits: [{ classes: ["IB"], volume: 120, unit: "US gal", includesCabinets: true, note: "Example only: IFC-style maximum allowable quantity of Class IB liquid per control area, before increases." }],
    limitNote: "",
  },
  {
    key: "flammableCabinet",
    parent: "solventStore",
    level: "cabinet",
    name: "Flammable storage cabinet FC-1 (60 gal)",
    type: "flammable_cabinet",
    // OSHA 29 CFR 1910.106(d)(3)(i): not more than 60 US gal of Class I or Class II liquids, nor more
    // than 120 gal of Class III liquids, in a storage cabinet (OSHA's classes, which match NFPA 30's
    // thresholds for I and II; its Class III covers IIIA and IIIB).
    limits: [
      { classes: [...CLASS_I, "II"], volume: 60, unit: "US gal", includesCabinets: true, note: "Example only: OSHA 29 CFR 1910.106(d)(3) cabinet limit, Class I and II liquids." },
      { classes: ["IIIA", "IIIB"], volume: 120, unit: "US gal", includesCabinets: true, note: "Example only: OSHA 29 CFR 1910.106(d)(3) cabinet limit, Class III liquids." },
    ],
    limitNote: "Example limits from OSHA's cabinet quantities; your local code and safety office set the real ones.",
  },
  {
    key: "wasteArea",
    parent: "building",
    level: "room",
    name: "HCB 022 – Waste Area",
    type: "waste_area",
    limits: [],
    limitNote: "",
  },
  {
    key: "halogenatedWaste",
    parent: "wasteArea",
    level: "cabinet",
    name: "Halogenated solvent waste point W-1",
    type: "waste_area",
    limits: [],
    limitNote: "",
  },
];
