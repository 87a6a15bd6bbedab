/** Chemicals, containers and locations → the DTOs of shared/schemas/stock. */
import { isHalogenated } from "@shared/domain/chemistry";
import { ghsFlammableCategory, isAcutelyToxic, isCarcinogen, nfpaClass } from "@shared/domain/hazards";
import type { ChemicalDto, ContainerDetailDto, ContainerDto, LocationDto, LocationLimitDto } from "@shared/schemas/stock";
import type { Chemical, Container, Location, LocationLimit } from "../../entities";
import { parseClasses } from "../../entities/location-limit.entity";
import type { AuthUser } from "../../middleware/auth";
import { containerPolicy } from "./container.policy";
import type { containerDetail } from "./container.queries";

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
    ions: c.ions ? (JSON.parse(c.ions) as ChemicalDto["ions"]) : null,
    createdAt: c.createdAt,
  };
}

/** A container row as the list query returns it: the container's columns plus names joined in. */
export type ContainerRow = Container & { chemicalName: string; casNumber: string; locationName: string | null; chemicalHoldReason: string | null; reservedQuantity: number };

export function presentContainer(c: ContainerRow, viewer: AuthUser): ContainerDto {
  return {
    id: c.id,
    chemicalId: c.chemicalId,
    chemicalName: c.chemicalName,
    casNumber: c.casNumber,
    kind: c.kind,
    quantity: c.quantity,
    initialQuantity: c.initialQuantity,
    unit: c.unit,
    reservedQuantity: c.reservedQuantity,
    freeQuantity: Math.max(0, c.quantity - c.reservedQuantity),
    locationId: c.locationId,
    locationName: c.locationName,
    status: c.status,
    openedAt: c.openedAt,
    expiresAt: c.expiresAt,
    retestAt: c.retestAt,
    groupId: c.groupId,
    organisation: c.organisation,
    labelToken: c.labelToken,
    supplier: c.supplier,
    lot: c.lot,
    priceCents: c.priceCents,
    concentrationMolPerL: c.concentrationMolPerL,
    holdReason: c.holdReason,
    chemicalHoldReason: c.chemicalHoldReason,
    createdAt: c.createdAt,
    abilities: containerPolicy.abilities(viewer, c),
  };
}

/**
 * The container page. Who used it, on which account and at what cost go only to those the
 * policy lets see the history; everyone else gets the chemical, hazards, quantity, place and
 * state, and their own usages in full.
 */
export function presentContainerDetail(d: Awaited<ReturnType<typeof containerDetail>>, viewer: AuthUser): ContainerDetailDto {
  const container = presentContainer(d.container, viewer);
  const shown = container.abilities.seeHistory;
  return {
    container,
    chemical: presentChemical(d.chemical),
    locationPath: d.locationPath,
    movements: d.movements.map((m) => ({
      id: m.id,
      kind: m.kind,
      fromLocationId: m.fromLocationId,
      fromLocationName: m.fromLocationName,
      toLocationId: m.toLocationId,
      toLocationName: m.toLocationName,
      userName: shown || m.userId === viewer.id ? m.userName : null,
      note: m.note,
      at: m.at,
    })),
    usages: d.usages.map((u) => {
      const mine = u.userId === viewer.id;
      const full = shown || mine;
      return {
        id: u.id,
        amount: u.amount,
        unit: u.unit,
        amountInContainerUnit: u.amountInContainerUnit,
        costCents: full ? u.costCents : null,
        bookingId: full ? u.bookingId : null,
        accountId: full ? u.accountId : null,
        userName: full ? u.userName : null,
        note: full ? u.note : "",
        at: u.at,
        mine,
      };
    }),
    parents: d.parents,
    children: d.children,
    reservations: d.reservations.map((r) => ({
      id: r.id,
      containerId: r.containerId,
      chemicalName: r.chemicalName,
      bookingId: r.bookingId,
      runPlanId: r.runPlanId,
      amount: r.amount,
      drawn: r.drawn,
      unit: r.unit,
      state: r.state,
      note: r.note,
      createdAt: r.createdAt,
    })),
    historyShown: shown,
  };
}

export function presentLocation(l: Location, path: string, limits: readonly LocationLimit[]): LocationDto {
  return {
    id: l.id,
    parentId: l.parentId,
    level: l.level,
    name: l.name,
    path,
    type: l.type,
    limits: limits.map(presentLimit),
    limitNote: l.limitNote,
  };
}

export function presentLimit(x: LocationLimit): LocationLimitDto {
  return {
    id: x.id,
    classes: parseClasses(x.classes),
    maxLitres: x.maxLitres,
    enteredVolume: x.enteredVolume,
    enteredUnit: x.enteredUnit,
    includesCabinets: Boolean(x.includesCabinets),
    note: x.note,
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
