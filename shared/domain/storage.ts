/**
 * Storage of flammable and combustible liquids by fire-code liquid class, for the Safety review.
 *
 * Fire codes set their limits by liquid class and by groups of classes (NFPA 30 and NFPA 45,
 * the International Fire Code, the National Fire Code of Canada): Class IA alone, Class I
 * (IA + IB + IC) together, Classes I + II + IIIA together, with or without the liquids kept in
 * approved flammable-liquid cabinets. The class comes from the closed-cup flash point and the
 * boiling point (NFPA 30; hazards.ts nfpaClass). Which limits apply where, and their values,
 * are for the local fire code and the safety office; Phasebook only adds up and compares.
 *
 * A liquid whose volume cannot be computed (kept by mass or amount without a density, or an
 * amount without a molar mass) is never dropped: it is counted as a container of unknown
 * volume, and a limit its class falls under can then only be "over" (the known litres already
 * pass it) or "cannot_confirm", never "within".
 *
 * Litres are added exactly in nanolitres (exact-amounts.ts), so a total exactly at a limit is
 * at it, and only more than the limit is over.
 */
import { type Exact, compare, divide, exact, fraction, multiply, toNumber } from "./exact";
import { convertExactAmount, exactAmountToNumber, toExactAmount } from "./exact-amounts";
import { type NfpaClass, nfpaClass } from "./hazards";
import { UnitError, unitDimension } from "./units";

/** NFPA 30 liquid classes, most to least flammable. */
export const NFPA_CLASSES: readonly NfpaClass[] = Object.freeze(["IA", "IB", "IC", "II", "IIIA", "IIIB"] as const);

/** Flammable liquids (Class I) and combustible liquids (Classes II and III), NFPA 30. */
export const NFPA_CLASS_NAMES: Readonly<Record<NfpaClass, string>> = Object.freeze({
  IA: "Class IA flammable liquid",
  IB: "Class IB flammable liquid",
  IC: "Class IC flammable liquid",
  II: "Class II combustible liquid",
  IIIA: "Class IIIA combustible liquid",
  IIIB: "Class IIIB combustible liquid",
});

/**
 * Litres in one US liquid gallon, exact: the gallon is 231 cubic inches and the inch 2.54 cm
 * exactly (international yard and pound agreement, 1959), 231 × 2.54³ cm³ = 3785.411784 cm³.
 * NIST Handbook 44, Appendix C.
 */
export const LITRES_PER_US_GALLON = "3.785411784";
const GALLON: Exact = exact(LITRES_PER_US_GALLON);

export const LIMIT_VOLUME_UNITS = ["L", "US gal"] as const;
export type LimitVolumeUnit = (typeof LIMIT_VOLUME_UNITS)[number];

export function usGallonsToLitres(gallons: number): number {
  return toNumber(multiply(exact(gallons), GALLON));
}

export function litresToUsGallons(litres: number): number {
  return toNumber(divide(exact(litres), GALLON));
}

/** A limit typed in L or US gal, in litres (how limits are stored). */
export function limitVolumeToLitres(volume: number, unit: LimitVolumeUnit): number {
  return unit === "US gal" ? usGallonsToLitres(volume) : volume;
}

// ---------------------------------------------------------------- inputs

export type PhysicalState = "solid" | "liquid" | "gas";

export interface StorageChemical {
  id: number;
  flashPointC: number | null;
  boilingPointC: number | null;
  densityGPerMl: number | null;
  molarMass: number | null;
  /** When known. A chemical with a flash point and no state is treated as a liquid (the safe side). */
  state?: PhysicalState | null;
}

export interface StorageContainer {
  id: number;
  locationId: number | null;
  quantity: number;
  unit: string;
  chemicalId: number;
  /** Empty and disposed containers hold nothing and are skipped. */
  status?: string;
}

export interface StorageLimit {
  id: number;
  /** The classes whose litres this limit adds up; at least one. */
  classes: readonly NfpaClass[];
  maxLitres: number;
  /** False: containers inside approved cabinets below the limit's location do not count toward it. */
  includesCabinets: boolean;
}

export interface StorageLocation {
  id: number;
  parentId: number | null;
  name?: string;
  /** An approved (listed) flammable-liquid storage cabinet; when absent, type "flammable_cabinet" is taken as one. */
  isApprovedCabinet?: boolean;
  type?: string;
  limits?: readonly StorageLimit[];
}

// ---------------------------------------------------------------- outputs

export type LimitFinding = "within" | "over" | "cannot_confirm";

export type LitresByClass = Record<NfpaClass, number>;

export interface LimitResult extends StorageLimit {
  /** Known litres of the limit's classes that count toward it. */
  totalLitres: number;
  /** Containers of the limit's classes that count toward it but whose volume is unknown. */
  unknownVolumeContainers: number;
  finding: LimitFinding;
}

export interface LocationStorage {
  id: number;
  /** Known litres by class: this location's containers and those of every place inside it. */
  litresByClass: LitresByClass;
  /** Flammable or combustible liquids here (or inside) whose volume cannot be computed. */
  unknownVolumeContainers: number;
  unknownVolumeByClass: Record<NfpaClass, number>;
  /** Their container ids, so the review can list them. */
  unknownVolumeContainerIds: number[];
  /** Every container here or inside, liquid or not. */
  containerCount: number;
  limits: LimitResult[];
}

function isApprovedCabinet(location: StorageLocation): boolean {
  return location.isApprovedCabinet ?? location.type === "flammable_cabinet";
}

/** The NFPA 30 class of a chemical as stored, or null when it is not a flammable or combustible liquid. */
export function storageClass(chemical: Pick<StorageChemical, "flashPointC" | "boilingPointC" | "state">): NfpaClass | null {
  if (chemical.state === "solid" || chemical.state === "gas") return null;
  return nfpaClass(chemical.flashPointC, chemical.boilingPointC);
}

/** Nanolitres of liquid in a container, or null when its volume cannot be computed. */
export function containerNanolitres(container: Pick<StorageContainer, "quantity" | "unit">, chemical: Pick<StorageChemical, "densityGPerMl" | "molarMass">): bigint | null {
  try {
    const held = toExactAmount(Math.max(0, container.quantity), container.unit);
    return convertExactAmount(held, "L", { densityGPerMl: chemical.densityGPerMl, molarMassGPerMol: chemical.molarMass }).base;
  } catch (e) {
    if (e instanceof UnitError) return null;
    throw e;
  }
}

const NL_PER_L = 1_000_000_000n;
const nlToLitres = (nl: bigint) => exactAmountToNumber({ unit: "L", dimension: "volume", base: nl });
const zeroByClass = <T>(zero: () => T) => Object.fromEntries(NFPA_CLASSES.map((c) => [c, zero()])) as Record<NfpaClass, T>;

interface Item {
  id: number;
  cls: NfpaClass | null;
  nl: bigint | null;
  /** The container's location and its ancestors, innermost first. */
  path: number[];
}

export interface StorageInput {
  locations: readonly StorageLocation[];
  containers: readonly StorageContainer[];
  chemicals: readonly StorageChemical[];
}

/**
 * Per location: known litres by NFPA class of everything in it and inside it, the containers of
 * unknown volume, and each of its limits with the litres that count toward it and the finding.
 * A container with no location, or in a location not listed, counts nowhere.
 */
export function storageByLiquidClass({ locations, containers, chemicals }: StorageInput): Map<number, LocationStorage> {
  const byId = new Map(locations.map((l) => [l.id, l]));
  const chemById = new Map(chemicals.map((c) => [c.id, c]));

  const pathOf = (start: number): number[] => {
    const path: number[] = [];
    const seen = new Set<number>(); // guards against a cycle in bad data
    let at: number | null = start;
    while (at !== null && byId.has(at) && !seen.has(at)) {
      seen.add(at);
      path.push(at);
      at = byId.get(at)!.parentId;
    }
    return path;
  };

  const items: Item[] = [];
  for (const c of containers) {
    if (c.locationId === null || !byId.has(c.locationId)) continue;
    if (c.status === "empty" || c.status === "disposed") continue;
    const chem = chemById.get(c.chemicalId);
    const cls = chem ? storageClass(chem) : null;
    items.push({ id: c.id, cls, nl: cls === null || !chem ? null : containerNanolitres(c, chem), path: pathOf(c.locationId) });
  }

  const out = new Map<number, LocationStorage>();
  const rolled = new Map<number, { nl: Record<NfpaClass, bigint>; unknown: Record<NfpaClass, number>; unknownIds: number[]; count: number }>();
  for (const l of locations) rolled.set(l.id, { nl: zeroByClass(() => 0n), unknown: zeroByClass(() => 0), unknownIds: [], count: 0 });
  for (const item of items) {
    for (const at of item.path) {
      const r = rolled.get(at)!;
      r.count += 1;
      if (item.cls === null) continue;
      if (item.nl === null) {
        r.unknown[item.cls] += 1;
        r.unknownIds.push(item.id);
      } else r.nl[item.cls] += item.nl;
    }
  }

  for (const l of locations) {
    const r = rolled.get(l.id)!;
    const limits = (l.limits ?? []).map((limit) => evaluateLimit(l.id, limit, items, byId));
    out.set(l.id, {
      id: l.id,
      litresByClass: Object.fromEntries(NFPA_CLASSES.map((c) => [c, nlToLitres(r.nl[c])])) as LitresByClass,
      unknownVolumeContainers: r.unknownIds.length,
      unknownVolumeByClass: r.unknown,
      unknownVolumeContainerIds: r.unknownIds,
      containerCount: r.count,
      limits,
    });
  }
  return out;
}

function evaluateLimit(locationId: number, limit: StorageLimit, items: readonly Item[], byId: Map<number, StorageLocation>): LimitResult {
  const classes = new Set(limit.classes);
  let nl = 0n;
  let unknown = 0;
  for (const item of items) {
    if (item.cls === null || !classes.has(item.cls)) continue;
    const depth = item.path.indexOf(locationId);
    if (depth === -1) continue;
    // Cabinets strictly inside the limit's location; a limit set on a cabinet counts its own contents.
    if (!limit.includesCabinets && item.path.slice(0, depth).some((at) => isApprovedCabinet(byId.get(at)!))) continue;
    if (item.nl === null) unknown += 1;
    else nl += item.nl;
  }
  const max: Exact = multiply(exact(limit.maxLitres), fraction(NL_PER_L));
  const over = compare(fraction(nl), max) > 0;
  const finding: LimitFinding = over ? "over" : unknown > 0 ? "cannot_confirm" : "within";
  return {
    id: limit.id,
    classes: [...limit.classes],
    maxLitres: limit.maxLitres,
    includesCabinets: limit.includesCabinets,
    totalLitres: nlToLitres(nl),
    unknownVolumeContainers: unknown,
    finding,
  };
}

// ---------------------------------------------------------------- receiving

export interface ReceiptVolumeCheck {
  /** True when the container's volume could not be computed: the server answers 422 density_needed. */
  volumeUnknown: boolean;
  nfpaClass: NfpaClass | null;
  /** What the chemical's record lacks for a volume: the density, and for an amount also the molar mass. */
  missing: ("densityGPerMl" | "molarMassGPerMol")[];
  /** A sentence for the person receiving it; null when nothing is missing. */
  message: string | null;
}

/**
 * Whether receiving `unit` of a chemical leaves its volume unknown for the storage totals: a
 * flammable or combustible liquid (it has an NFPA 30 class) received by mass without a density,
 * or by amount of substance without a density or a molar mass. Volumes are always known.
 * An unknown unit is left to the unit check (volumeUnknown false).
 */
export function receiptVolumeCheck(
  unit: string,
  chemical: Pick<StorageChemical, "flashPointC" | "boilingPointC" | "densityGPerMl" | "molarMass" | "state"> & { name?: string },
): ReceiptVolumeCheck {
  const cls = storageClass(chemical);
  let dimension: string;
  try {
    dimension = unitDimension(unit);
  } catch (e) {
    if (e instanceof UnitError) return { volumeUnknown: false, nfpaClass: cls, missing: [], message: null };
    throw e;
  }
  const missing: ReceiptVolumeCheck["missing"] = [];
  if (cls !== null && dimension !== "volume") {
    if (chemical.densityGPerMl == null) missing.push("densityGPerMl");
    if (dimension === "amount" && chemical.molarMass == null) missing.push("molarMassGPerMol");
  }
  if (missing.length === 0) return { volumeUnknown: false, nfpaClass: cls, missing, message: null };
  const what = chemical.name ? `${chemical.name} is a ${NFPA_CLASS_NAMES[cls!]}` : `This chemical is a ${NFPA_CLASS_NAMES[cls!]}`;
  const need = missing.length === 2 ? "its density (g/mL) and molar mass" : missing[0] === "densityGPerMl" ? "its density (g/mL)" : "its molar mass";
  return {
    volumeUnknown: true,
    nfpaClass: cls,
    missing,
    message:
      `${what} (NFPA 30), and the storage limits count such liquids in litres. ` +
      `Received in ${unit}, its volume cannot be computed without ${need}: enter it on the chemical's record, or receive the container by volume.`,
  };
}
