/**
 * Scan: resolves a scanned label token to its record (or says the label was replaced) and
 * describes the record as the Scan page shows it, with what the signed-in person may do there
 * (from the container and instrument policies, nothing decided here).
 */
import type { DataSource } from "typeorm";
import { handlingCautions } from "@shared/domain/cautions";
import { isLabelTokenShape } from "@shared/domain/labels";
import { pictogramsFor, signalWordFor, type GhsPictogram } from "@shared/domain/hazards";
import type { BookingStatus } from "@shared/schemas/bookings";
import { recordPath, type LabelledTypeName } from "@shared/schemas/labels";
import { type ScanBookingDto, type ScanContainerRecord, type ScanInstrumentRecord, type ScanResultDto } from "@shared/schemas/scan";
import { AuditEntry, Chemical, Container, Instrument, LabelHistory } from "../../entities";
import { AppError, NotFound } from "../../errors";
import type { AuthUser } from "../../middleware/auth";
import type { Deps } from "../../core/deps";
import { allLocations, containerPolicy, locationPaths, presentChemical } from "../stockroom";
import { bookingPolicy, instrumentPolicy, openFaults, readBookingSettings, seesInFull } from "../schedule";
import { factsOf, plansOfBookings, runPlanPolicy } from "../runplans";

/**
 * A retired token opens nothing: 404 as the contract has it for a token that leads nowhere, with
 * its own code "label_replaced" (and when) so a client can tell "replaced" from "never existed".
 */
export class LabelReplaced extends AppError {
  constructor(replacedAt: string, type: LabelledTypeName) {
    super(
      404,
      "label_replaced",
      `This label was replaced on ${replacedAt.slice(0, 10)}; the ${type} has a newer label. Scan the new label or look the record up.`,
      undefined,
      { replacedAt, labelledType: type },
    );
  }
}

const ACTIVE_BOOKING = ["requested", "confirmed", "in_progress"];

/** Building › room › cabinet for a location id, from one read of the (small) locations table. */
export async function pathFinder(ds: DataSource): Promise<(id: number | null) => string | null> {
  const paths = locationPaths(await allLocations(ds));
  return (id) => (id === null ? null : (paths.get(id) ?? null));
}

export function jsonList(s: string): string[] {
  try {
    const v = JSON.parse(s) as unknown;
    return Array.isArray(v) ? v.map(String) : [];
  } catch {
    return [];
  }
}

async function containerRecord(ds: DataSource, user: AuthUser, c: Container): Promise<ScanContainerRecord> {
  const chem = await ds.getRepository(Chemical).findOneByOrFail({ id: c.chemicalId });
  const where = await pathFinder(ds);
  const hCodes = jsonList(chem.hazardStatements);
  const stored = jsonList(chem.pictograms) as GhsPictogram[];
  const signal = chem.signalWord ?? signalWordFor(hCodes);
  return {
    chemicalId: chem.id,
    name: chem.name,
    casNumber: chem.casNumber,
    kind: c.kind,
    quantity: c.quantity,
    unit: c.unit,
    status: c.status,
    holdReason: c.holdReason,
    locationId: c.locationId,
    location: where(c.locationId),
    expiresAt: c.expiresAt,
    hazardStatements: hCodes,
    pictograms: stored.length ? stored : pictogramsFor(hCodes),
    signalWord: signal === "none" || signal === "undetermined" ? null : signal,
    cautions: handlingCautions(presentChemical(chem)),
    abilities: containerPolicy.abilities(user, { ...c, chemicalHoldReason: chem.onHoldReason }),
  };
}

async function bookingsOf(deps: Deps, user: AuthUser, instrumentId: number): Promise<{ current: ScanBookingDto | null; next: ScanBookingDto | null }> {
  const t = deps.now().getTime();
  const rows: { id: number; userId: number; status: BookingStatus; startsAt: string; endsAt: string; startMs: number; endMs: number; checkedInAt: string | null; checkedOutAt: string | null; userName: string }[] =
    await deps.ds.query(
      `SELECT b.id, b.userId, b.status, b.startsAt, b.endsAt, b.startMs, b.endMs, b.checkedInAt, b.checkedOutAt, u.name AS userName
         FROM bookings b JOIN booking_instruments bi ON bi.bookingId = b.id JOIN users u ON u.id = b.userId
        WHERE bi.instrumentId = ? AND b.endMs > ? AND b.status IN (${ACTIVE_BOOKING.map(() => "?").join(",")})
        ORDER BY b.startMs LIMIT 5`,
      [instrumentId, t, ...ACTIVE_BOOKING],
    );
  const { checkInEarlyMinutes } = readBookingSettings(deps.ds);
  const dto = (b: (typeof rows)[number]): ScanBookingDto => {
    const mine = b.userId === user.id;
    // Who booked it, and when they checked in, as the Schedule shows it: the booking policy's rule.
    const full = seesInFull(user, b);
    return {
      id: full ? b.id : null,
      start: b.startsAt,
      end: b.endsAt,
      status: b.status,
      mine,
      who: full ? b.userName : null,
      checkedInAt: full ? b.checkedInAt : null,
      checkedOutAt: full ? b.checkedOutAt : null,
      // The Schedule's booking policy says what the scanner may do (check in, check out…).
      abilities: bookingPolicy.abilities(user, { booking: b, nowMs: t, checkInEarlyMinutes }),
    };
  };
  const current = rows.find((b) => b.startMs <= t && b.status !== "requested");
  const next = rows.find((b) => b.startMs > t && b !== current);
  return { current: current ? dto(current) : null, next: next ? dto(next) : null };
}

async function lastCleanedAt(ds: DataSource, instrumentId: number): Promise<string | null> {
  const row = await ds.getRepository(AuditEntry).findOne({
    where: { entityType: "instrument", entityId: instrumentId, action: "instrument.cleaned" },
    order: { id: "DESC" },
  });
  return row?.at ?? null;
}

async function instrumentRecord(deps: Deps, user: AuthUser, i: Instrument): Promise<ScanInstrumentRecord> {
  const where = await pathFinder(deps.ds);
  const { current, next } = await bookingsOf(deps, user, i.id);
  return {
    name: i.name,
    kind: i.kind,
    status: i.status,
    location: where(i.locationId),
    lastCleanedAt: await lastCleanedAt(deps.ds, i.id),
    currentBooking: current,
    nextBooking: next,
    openFaults: await openFaults(deps.ds.manager, i.id),
    // The plans of the bookings shown, as far as the run-plan policy lets this person see them.
    runPlans: plansOfBookings(deps.ds, [current?.id, next?.id].filter((x): x is number => typeof x === "number"))
      .filter((p) => runPlanPolicy.can(user, "see", factsOf(p)))
      .map((p) => ({ id: p.id, title: p.title, bookingId: p.bookingId as number, heldReservations: p.heldCount })),
    abilities: instrumentPolicy.abilities(user, i),
  };
}

export async function describeContainer(deps: Deps, user: AuthUser, id: number): Promise<ScanResultDto> {
  const c = await deps.ds.getRepository(Container).findOneBy({ id });
  if (!c) throw new NotFound("That container");
  return { type: "container", id, url: recordPath("container", id), record: await containerRecord(deps.ds, user, c) };
}

export async function describeInstrument(deps: Deps, user: AuthUser, id: number): Promise<ScanResultDto> {
  const i = await deps.ds.getRepository(Instrument).findOneBy({ id });
  if (!i) throw new NotFound("That instrument");
  return { type: "instrument", id, url: recordPath("instrument", id), record: await instrumentRecord(deps, user, i) };
}

/** The record a label token stands for; 404 with code "label_malformed" (wrong shape, no lookup), "label_unknown" or "label_replaced". */
export async function resolveLabel(deps: Deps, user: AuthUser, token: string): Promise<ScanResultDto> {
  if (!isLabelTokenShape(token)) {
    // 404 like any code that leads nowhere (API.md), with its own code for the Scan page.
    throw new AppError(404, "label_malformed", "This is not a Phasebook label code: a code is 22 to 64 letters, digits, '-' or '_'.");
  }
  const c = await deps.ds.getRepository(Container).findOneBy({ labelToken: token });
  if (c) return describeContainer(deps, user, c.id);
  const i = await deps.ds.getRepository(Instrument).findOneBy({ labelToken: token });
  if (i) return describeInstrument(deps, user, i.id);
  const old = await deps.ds.getRepository(LabelHistory).findOneBy({ token });
  if (old) throw new LabelReplaced(old.retiredAt, old.entityType);
  throw new NotFound("No record with this label", "label_unknown");
}

/** Every location with its full path, sorted by path, for pick lists. */
export async function locationChoices(ds: DataSource): Promise<{ id: number; path: string }[]> {
  const all = await allLocations(ds);
  const paths = locationPaths(all);
  return all.map((l) => ({ id: l.id, path: paths.get(l.id) ?? l.name })).sort((a, b) => a.path.localeCompare(b.path));
}
