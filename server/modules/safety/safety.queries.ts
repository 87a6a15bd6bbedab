/**
 * The Safety review's findings: liquid totals per location by fire-code class against the limits
 * the safety office set (a room counts its cabinets), carcinogens and acutely toxic substances and
 * where they are, expired or past-retest stock, stock without a place, holds, halogenated waste
 * and how full it is, and safety data sheets due for review. "Today" is the facility's date.
 *
 * A prepared solution is counted as its solvent: 100 mL of 10 mM salt in 1,2-dichloroethane
 * burns like 1,2-dichloroethane.
 */
import type { DataSource, EntityManager } from "typeorm";
import { DateTime } from "luxon";
import { storageByLiquidClass } from "@shared/domain/storage";
import type { LocationTotalsDto } from "@shared/schemas/stock";
import { Chemical, Location, LocationLimit, Setting } from "../../entities";
import { parseClasses } from "../../entities/location-limit.entity";
import { locationPaths, presentChemical } from "../stockroom";

/** Months after which a safety data sheet is due for review, unless the facility sets its own. */
export const DEFAULT_SDS_REVIEW_MONTHS = 36; // common practice (many institutions review every 3 years); a facility setting
export const SDS_REVIEW_SETTING = "sds_review_months";

export function facilityToday(now: Date, tz: string): string {
  return DateTime.fromJSDate(now).setZone(tz).toISODate() ?? now.toISOString().slice(0, 10);
}

interface StockRow {
  id: number;
  locationId: number | null;
  quantity: number;
  unit: string;
  flashPointC: number | null;
  boilingPointC: number | null;
  densityGPerMl: number | null;
  molarMass: number | null;
}

export async function sdsReviewMonths(em: EntityManager | DataSource): Promise<number> {
  const s = await em.getRepository(Setting).findOneBy({ key: SDS_REVIEW_SETTING });
  const n = s ? Number(JSON.parse(s.value)) : NaN;
  return Number.isFinite(n) && n > 0 ? n : DEFAULT_SDS_REVIEW_MONTHS;
}

/**
 * Per location: litres by NFPA 30 liquid class (its own containers and those of the places inside
 * it), the flammable or combustible liquids whose volume cannot be computed, and each limit the
 * safety office set with its finding (within, over, or cannot confirm because of unknown volumes).
 * A prepared solution counts as its solvent.
 */
export async function safetyLocationTotals(em: EntityManager | DataSource): Promise<LocationTotalsDto[]> {
  const locations = await em.getRepository(Location).find({ order: { id: "ASC" } });
  const limits = await em.getRepository(LocationLimit).find({ order: { id: "ASC" } });
  const rows = (await em.query(
    `SELECT c.id, c.locationId, c.quantity, c.unit,
            COALESCE(sv.flashPointC, ch.flashPointC) AS flashPointC,
            CASE WHEN sv.id IS NULL THEN ch.boilingPointC ELSE sv.boilingPointC END AS boilingPointC,
            CASE WHEN sv.id IS NULL THEN ch.densityGPerMl ELSE sv.densityGPerMl END AS densityGPerMl,
            CASE WHEN sv.id IS NULL THEN ch.molarMass ELSE sv.molarMass END AS molarMass
     FROM containers c
     JOIN chemicals ch ON ch.id = c.chemicalId
     LEFT JOIN solution_components comp ON comp.solutionContainerId = c.id AND comp.role = 'solvent'
     LEFT JOIN containers pc ON pc.id = comp.parentContainerId
     LEFT JOIN chemicals sv ON sv.id = pc.chemicalId
     WHERE c.status NOT IN ('empty', 'disposed') AND c.locationId IS NOT NULL`,
  )) as StockRow[];
  const limitsOf = new Map<number, LocationLimit[]>();
  for (const l of limits) limitsOf.set(l.locationId, [...(limitsOf.get(l.locationId) ?? []), l]);
  // Each container carries its own burning properties (a solution its solvent's), so it is its own "chemical" here.
  const storage = storageByLiquidClass({
    locations: locations.map((l) => ({
      id: l.id,
      parentId: l.parentId,
      type: l.type,
      limits: (limitsOf.get(l.id) ?? []).map((x) => ({ id: x.id, classes: parseClasses(x.classes), maxLitres: x.maxLitres, includesCabinets: Boolean(x.includesCabinets) })),
    })),
    containers: rows.map((r) => ({ id: r.id, locationId: r.locationId, quantity: r.quantity, unit: r.unit, chemicalId: r.id })),
    chemicals: rows.map((r) => ({ id: r.id, flashPointC: r.flashPointC, boilingPointC: r.boilingPointC, densityGPerMl: r.densityGPerMl, molarMass: r.molarMass })),
  });
  const paths = locationPaths(locations);
  return locations.map((l) => {
    const s = storage.get(l.id)!;
    const entered = new Map((limitsOf.get(l.id) ?? []).map((x) => [x.id, x]));
    const limitResults = s.limits.map((r) => {
      const row = entered.get(r.id)!;
      return { ...r, classes: [...r.classes], note: row.note, enteredVolume: row.enteredVolume, enteredUnit: row.enteredUnit };
    });
    return {
      id: l.id,
      parentId: l.parentId,
      name: l.name,
      path: paths.get(l.id) ?? l.name,
      level: l.level,
      type: l.type,
      litresByClass: s.litresByClass,
      unknownVolumeContainers: s.unknownVolumeContainers,
      unknownVolumeContainerIds: s.unknownVolumeContainerIds,
      limits: limitResults,
      limitNote: l.limitNote,
      overLimit: limitResults.some((r) => r.finding === "over"),
      cannotConfirm: !limitResults.some((r) => r.finding === "over") && limitResults.some((r) => r.finding === "cannot_confirm"),
      containerCount: s.containerCount,
    };
  });
}

export interface ReviewContainer {
  id: number;
  chemicalId: number;
  chemicalName: string;
  quantity: number;
  initialQuantity: number;
  unit: string;
  status: string;
  kind: string;
  locationId: number | null;
  locationPath: string | null;
  expiresAt: string | null;
  retestAt: string | null;
  holdReason: string | null;
  lot: string;
}

/** Everything the Safety review page lists, in one read. */
export async function safetyReview(ds: DataSource, now: Date, tz: string) {
  const today = facilityToday(now, tz);
  const locations = await ds.getRepository(Location).find();
  const paths = locationPaths(locations);
  const chemicals = (await ds.getRepository(Chemical).find({ order: { name: "ASC" } })).map(presentChemical);
  const active = (await ds.query(
    `SELECT c.id, c.chemicalId, ch.name AS chemicalName, c.quantity, c.initialQuantity, c.unit, c.status, c.kind, c.locationId,
            c.expiresAt, c.retestAt, c.holdReason, c.lot
     FROM containers c JOIN chemicals ch ON ch.id = c.chemicalId
     WHERE c.status NOT IN ('empty', 'disposed') ORDER BY ch.name, c.id`,
  )) as Omit<ReviewContainer, "locationPath">[];
  const withPath: ReviewContainer[] = active.map((c) => ({ ...c, locationPath: c.locationId === null ? null : (paths.get(c.locationId) ?? null) }));
  const byChemical = new Map<number, ReviewContainer[]>();
  for (const c of withPath) byChemical.set(c.chemicalId, [...(byChemical.get(c.chemicalId) ?? []), c]);

  const hazardous = chemicals
    .filter((ch) => ch.carcinogen || ch.acuteToxic)
    .map((ch) => ({
      chemicalId: ch.id,
      name: ch.name,
      casNumber: ch.casNumber,
      carcinogen: ch.carcinogen,
      acuteToxic: ch.acuteToxic,
      hazardStatements: ch.hazardStatements,
      containers: byChemical.get(ch.id) ?? [],
    }));
  const expired = withPath.filter((c) => (c.expiresAt !== null && c.expiresAt < today) || (c.retestAt !== null && c.retestAt < today));
  const noLocation = withPath.filter((c) => c.locationId === null);
  const unknownIds = new Set((await safetyLocationTotals(ds)).flatMap((t) => t.unknownVolumeContainerIds));
  const unknownVolume = withPath.filter((c) => unknownIds.has(c.id));
  const onHoldContainers = withPath.filter((c) => c.status === "on_hold");
  const onHoldChemicals = chemicals.filter((ch) => ch.onHoldReason !== null).map((ch) => ({ chemicalId: ch.id, name: ch.name, reason: ch.onHoldReason }));
  const halogenated = new Set(chemicals.filter((ch) => ch.halogenated).map((ch) => ch.id));
  const halogenatedWaste = withPath
    .filter((c) => c.kind === "waste" && halogenated.has(c.chemicalId))
    .map((c) => ({ ...c, fillPercent: c.initialQuantity > 0 ? Math.round((c.quantity / c.initialQuantity) * 1000) / 10 : null }));

  const months = await sdsReviewMonths(ds);
  const dueBefore = DateTime.fromISO(today).minus({ months }).toISODate()!;
  const latest = (await ds.query(
    `SELECT s.chemicalId, MAX(s.reviewedOn) AS reviewedOn FROM safety_data_sheets s GROUP BY s.chemicalId`,
  )) as { chemicalId: number; reviewedOn: string }[];
  const latestBy = new Map(latest.map((r) => [r.chemicalId, r.reviewedOn]));
  const sdsDue = chemicals
    .filter((ch) => (latestBy.get(ch.id) ?? "") < dueBefore)
    .map((ch) => ({ chemicalId: ch.id, name: ch.name, reviewedOn: latestBy.get(ch.id) ?? null }));

  return { today, sdsReviewMonths: months, hazardous, expired, noLocation, unknownVolume, onHold: { containers: onHoldContainers, chemicals: onHoldChemicals }, halogenatedWaste, sdsDue };
}

export type SafetyReview = Awaited<ReturnType<typeof safetyReview>>;
