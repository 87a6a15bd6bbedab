/**
 * The demo's bottles, vials, one prepared solution and one waste container, in every state a
 * container can be in. The stock is arranged so the safety review has findings: the small
 * under-bench cabinet UB-1 holds more flammable liquid than its 10 L example limit, one
 * nitrobenzene bottle and one ferrocene bottle are past their expiry date, one label is
 * unreadable. Suppliers, lots and prices are invented.
 */
import type { ContainerKind, ContainerStatus } from "../../entities/container.entity";
import type { ChemicalKey } from "./demo-chemicals";
import type { LocationKey } from "./demo-locations";
import type { GroupKey } from "./demo-people";

export interface DemoContainer {
  chemical: ChemicalKey;
  kind: ContainerKind;
  quantity: number;
  initialQuantity: number;
  unit: "mL" | "g";
  location: LocationKey;
  status: ContainerStatus;
  /** Days from the seeding moment; null for never opened. */
  openedDays: number | null;
  expiresDays: number | null;
  /** null: facility stock, shared by everyone. */
  group: GroupKey | null;
  supplier: string;
  lot: string;
  priceCents: number | null;
  concentrationMolPerL?: number;
  holdReason?: string;
}

const HARBOURLINE = "Harbourline Scientific Supply";
const NORTHWIND = "Northwind Reagents";

const sealed = (
  chemical: ChemicalKey,
  amount: number,
  unit: "mL" | "g",
  location: LocationKey,
  expiresDays: number,
  supplier: string,
  lot: string,
  priceCents: number,
  group: GroupKey | null = null,
): DemoContainer => ({
  chemical,
  kind: "bottle",
  quantity: amount,
  initialQuantity: amount,
  unit,
  location,
  status: "sealed",
  openedDays: null,
  expiresDays,
  group,
  supplier,
  lot,
  priceCents,
});

const opened = (
  chemical: ChemicalKey,
  left: number,
  of: number,
  unit: "mL" | "g",
  location: LocationKey,
  openedDays: number,
  expiresDays: number,
  supplier: string,
  lot: string,
  priceCents: number | null,
  group: GroupKey | null = null,
): DemoContainer => ({
  chemical,
  kind: "bottle",
  quantity: left,
  initialQuantity: of,
  unit,
  location,
  status: "in_use",
  openedDays,
  expiresDays,
  group,
  supplier,
  lot,
  priceCents,
});

export const DEMO_CONTAINERS: readonly DemoContainer[] = [
  // 1,2-Dichloroethane: three sealed 2.5 L bottles and an opened one under the bench, which with
  // the trifluorotoluene and acetone there puts UB-1 at 11.75 L against its 10 L example limit.
  sealed("dce", 2500, "mL", "underBench", 700, HARBOURLINE, "HS-DCE-24117", 18_000),
  sealed("dce", 2500, "mL", "underBench", 700, HARBOURLINE, "HS-DCE-24117", 18_000),
  sealed("dce", 2500, "mL", "underBench", 650, HARBOURLINE, "HS-DCE-24088", 18_000),
  opened("dce", 1850, 2500, "mL", "underBench", -21, 600, HARBOURLINE, "HS-DCE-24088", 18_000, "soft"),
  opened("dce", 420, 500, "mL", "hoodInterface", -6, 400, NORTHWIND, "NR-7716-DCE", 5_200, "soft"),
  sealed("dce", 2500, "mL", "flammableCabinet", 720, HARBOURLINE, "HS-DCE-25002", 18_000),
  {
    ...sealed("dce", 2500, "mL", "flammableCabinet", 720, HARBOURLINE, "HS-DCE-25002", 18_000),
    status: "on_hold",
    holdReason: "Cap liner cracked on delivery; the supplier is sending a replacement. Do not open.",
  },
  { ...opened("dce", 0, 2500, "mL", "flammableCabinet", -120, 500, HARBOURLINE, "HS-DCE-23951", 18_000), status: "empty" },
  {
    // Halogenated waste: the quantity is what has been collected; initialQuantity is the
    // carboy's capacity, since a waste container fills rather than empties.
    chemical: "dce",
    kind: "waste",
    quantity: 2100,
    initialQuantity: 4000,
    unit: "mL",
    location: "halogenatedWaste",
    status: "in_use",
    openedDays: -35,
    expiresDays: 55,
    group: null,
    supplier: "Waste carboy",
    lot: "HALO-W1-07",
    priceCents: null,
  },

  // Lithium chloride and the prepared 10 mM aqueous solution made from it.
  opened("licl", 78.4, 100, "g", "saltShelf", -45, 500, NORTHWIND, "NR-1029-LICL", 7_000, "soft"),
  sealed("licl", 100, "g", "saltShelf", 900, NORTHWIND, "NR-1102-LICL", 7_000),
  {
    chemical: "licl",
    kind: "solution",
    quantity: 180,
    initialQuantity: 250,
    unit: "mL",
    location: "bench",
    status: "in_use",
    openedDays: -3,
    expiresDays: 27,
    group: "soft",
    supplier: "Prepared in the facility",
    lot: "10 mM LiCl in water (prepared by P. Nandakumar)",
    priceCents: null,
    concentrationMolPerL: 0.01,
  },

  opened("nacl", 412, 500, "g", "saltShelf", -160, 1200, NORTHWIND, "NR-0440-NACL", 4_000),
  opened("kcl", 230, 500, "g", "saltShelf", -210, 1100, NORTHWIND, "NR-0518-KCL", 4_500),
  sealed("kcl", 500, "g", "saltShelf", 1400, NORTHWIND, "NR-0612-KCL", 4_500),

  sealed("nitrobenzene", 1000, "mL", "flammableCabinet", 800, HARBOURLINE, "HS-NB-5521", 9_000),
  // Past its expiry date and still in the hood: a safety-review finding.
  opened("nitrobenzene", 180, 250, "mL", "hoodInterface", -400, -40, HARBOURLINE, "HS-NB-4870", 2_600, "separations"),

  opened("tft", 800, 1000, "mL", "underBench", -30, 500, HARBOURLINE, "HS-TFT-3307", 24_000, "separations"),
  sealed("tft", 1000, "mL", "flammableCabinet", 700, HARBOURLINE, "HS-TFT-3390", 24_000),

  // Expires within 30 days of seeding.
  opened("tbacl", 18.5, 25, "g", "saltShelf", -70, 20, NORTHWIND, "NR-2201-TBA", 1_500, "soft"),
  opened("ppncl", 7.2, 10, "g", "saltShelf", -90, 600, NORTHWIND, "NR-3318-PPN", 6_000, "soft"),

  opened("litpfb", 0.62, 1, "g", "fridge", -14, 170, NORTHWIND, "NR-9042-LTB (CoA: 2.5 Et2O)", 42_000, "soft"),
  sealed("litpfb", 1, "g", "fridge", 365, NORTHWIND, "NR-9077-LTB (CoA: 2.5 Et2O)", 42_000, "soft"),

  // Past its expiry date: a safety-review finding.
  opened("ferrocene", 21, 25, "g", "saltShelf", -500, -15, HARBOURLINE, "HS-FC-1180", 2_000),
  sealed("ferrocene", 25, "g", "saltShelf", 1000, HARBOURLINE, "HS-FC-1305", 2_000),

  {
    ...opened("tmacl", 40, 100, "g", "corrosives", -130, 700, NORTHWIND, "NR-2750-TMA", 5_000, "geochem"),
    status: "on_hold",
    holdReason: "Label unreadable after a spill; the safety office will relabel it before use.",
  },

  opened("acetone", 1600, 2500, "mL", "underBench", -10, 900, HARBOURLINE, "HS-AC-8812", 4_000),
  sealed("acetone", 4000, "mL", "flammableCabinet", 1000, HARBOURLINE, "HS-AC-8850", 6_000),
  sealed("acetone", 4000, "mL", "flammableCabinet", 1000, HARBOURLINE, "HS-AC-8850", 6_000),
  opened("acetone", 350, 500, "mL", "hoodPrep", -4, 900, HARBOURLINE, "HS-AC-8812 (wash bottle)", null),
];
