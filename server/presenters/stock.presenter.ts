/** Chemicals, containers and locations → the DTOs of shared/schemas/stock. */
import { isHalogenated } from "@shared/domain/chemistry";
import { ghsFlammableCategory, isAcutelyToxic, isCarcinogen, nfpaClass } from "@shared/domain/hazards";
import type { ChemicalDto, ContainerDto, LocationDto } from "@shared/schemas/stock";
import type { Chemical, Container, Location } from "../entities";

function safeHalogenated(formula: string | null): boolean {
  if (!formula) return false;
  try {
    return isHalogenated(formula);
  } catch {
    return false;
  }
}

export function presentChemical(c: Chemical): ChemicalDto {
  const hazardStatements = JSON.parse(c.hazardStatements) as string[];
  return {
    id: c.id,
    name: c.name,
    synonyms: JSON.parse(c.synonyms) as string[],
    casNumber: c.casNumber,
    formula: c.formula,
    molarMass: c.molarMass,
    molarMassOverridden: Boolean(c.molarMassOverridden),
    hazardStatements,
    pictograms: JSON.parse(c.pictograms) as string[],
    signalWord: c.signalWord,
    precautions: c.precautions,
    flashPointC: c.flashPointC,
    boilingPointC: c.boilingPointC,
    densityGPerMl: c.densityGPerMl,
    ghsFlammableCategory: ghsFlammableCategory(c.flashPointC, c.boilingPointC),
    nfpaClass: nfpaClass(c.flashPointC, c.boilingPointC),
    // The stored flag is what the safety office set; the codes can only add to it.
    carcinogen: Boolean(c.carcinogen) || isCarcinogen(hazardStatements),
    acuteToxic: Boolean(c.acuteToxic) || isAcutelyToxic(hazardStatements),
    halogenated: safeHalogenated(c.formula),
    storageGroup: c.storageGroup,
    reorderPoint: c.reorderPoint,
    reorderUnit: c.reorderUnit,
    unitCostCents: c.unitCostCents,
    costUnit: c.costUnit,
    onHoldReason: c.onHoldReason,
    createdAt: c.createdAt,
  };
}

/** A container row as the list query returns it: the container's columns plus names joined in. */
export type ContainerRow = Container & { chemicalName: string; casNumber: string; locationName: string | null; chemicalHoldReason: string | null };

export function presentContainer(c: ContainerRow): ContainerDto {
  return {
    id: c.id,
    chemicalId: c.chemicalId,
    chemicalName: c.chemicalName,
    casNumber: c.casNumber,
    kind: c.kind,
    quantity: c.quantity,
    initialQuantity: c.initialQuantity,
    unit: c.unit,
    locationId: c.locationId,
    locationName: c.locationName,
    status: c.status,
    openedAt: c.openedAt,
    expiresAt: c.expiresAt,
    retestAt: c.retestAt,
    groupId: c.groupId,
    labelToken: c.labelToken,
    supplier: c.supplier,
    lot: c.lot,
    priceCents: c.priceCents,
    concentrationMolPerL: c.concentrationMolPerL,
    holdReason: c.holdReason,
    chemicalHoldReason: c.chemicalHoldReason,
    createdAt: c.createdAt,
  };
}

export function presentLocation(l: Location, path: string): LocationDto {
  return {
    id: l.id,
    parentId: l.parentId,
    level: l.level,
    name: l.name,
    path,
    type: l.type,
    flammableLimitLitres: l.flammableLimitLitres,
    combustibleLimitLitres: l.combustibleLimitLitres,
    limitNote: l.limitNote,
  };
}

/** "Building › Room › Cabinet" for every location, from one read of the (small) table. */
export function locationPaths(all: readonly Location[]): Map<number, string> {
  const byId = new Map(all.map((l) => [l.id, l]));
  const out = new Map<number, string>();
  const pathOf = (l: Location, depth = 0): string => {
    const known = out.get(l.id);
    if (known) return known;
    const parent = l.parentId === null ? undefined : byId.get(l.parentId);
    const p = parent && depth < 20 ? `${pathOf(parent, depth + 1)} › ${l.name}` : l.name;
    out.set(l.id, p);
    return p;
  };
  for (const l of all) pathOf(l);
  return out;
}
