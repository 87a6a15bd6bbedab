/**
 * Labels and Scan: resolves a scanned label token to its record (or says the label was
 * replaced), re-issues labels (retiring the old token into the label history), keeps the
 * label stocks, and gathers what a label PDF prints.
 */
import type { DataSource, EntityManager } from "typeorm";
import { In } from "typeorm";
import { DateTime } from "luxon";
import { isLabelTokenShape, labelUrl, MAX_LABELS_PER_REQUEST, SINGLE_LABEL, stockProblems, type LabelStockLayout } from "@shared/domain/labels";
import { handlingCautions } from "@shared/domain/cautions";
import { presentChemical } from "../presenters/stock.presenter";
import { pictogramsFor, signalWordFor, type GhsPictogram } from "@shared/domain/hazards";
import {
  recordPath,
  type LabelHistoryEntryDto,
  type LabelStockDto,
  type LabelStockInput,
  type LabelledTypeName,
  type LabelsPdfQuery,
  type ScanBookingDto,
  type ScanContainerRecord,
  type ScanInstrumentRecord,
  type ScanResultDto,
} from "@shared/schemas/labels";
import { INSTRUMENT_KIND_LABELS } from "@shared/schemas/instruments";
import { AuditEntry, Chemical, Container, Instrument, LabelHistory, LabelStock, Location, User } from "../entities";
import { AppError, NotFound, RuleBroken } from "../errors";
import { hasRole, type AuthUser } from "../middleware/auth";
import { serialTransaction } from "../db/serial";
import { newToken } from "../core/tokens";
import { audit } from "../core/audit";
import { renderLabelsPdf, type LabelContent } from "./label-pdf";

export interface LabelServiceDeps {
  ds: DataSource;
  now: () => Date;
  publicUrl: string;
  facilityTz: string;
}

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
export async function locationPaths(em: EntityManager | DataSource): Promise<(id: number | null) => string | null> {
  const all = await em.getRepository(Location).find();
  const byId = new Map(all.map((l) => [l.id, l]));
  return (id) => {
    const parts: string[] = [];
    let cur = id === null ? undefined : byId.get(id);
    for (let guard = 0; cur && guard < 10; guard++) {
      parts.unshift(cur.name);
      cur = cur.parentId === null ? undefined : byId.get(cur.parentId);
    }
    return parts.length ? parts.join(" › ") : null;
  };
}

function jsonList(s: string): string[] {
  try {
    const v = JSON.parse(s) as unknown;
    return Array.isArray(v) ? v.map(String) : [];
  } catch {
    return [];
  }
}

/** Members handle their own group's containers and the facility's shared stock; managers and the safety officer handle all. */
export async function mayHandleContainer(em: EntityManager | DataSource, user: AuthUser, c: Container): Promise<boolean> {
  if (hasRole(user, "manager", "safety_officer")) return true;
  if (c.groupId === null) return true;
  const u = await em.getRepository(User).findOneBy({ id: user.id });
  return u?.groupId === c.groupId;
}

export function createLabelService(deps: LabelServiceDeps) {
  const { ds, now } = deps;

  async function containerRecord(user: AuthUser, c: Container): Promise<ScanContainerRecord> {
    const chem = await ds.getRepository(Chemical).findOneByOrFail({ id: c.chemicalId });
    const where = await locationPaths(ds);
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
      mayHandle: await mayHandleContainer(ds, user, c),
    };
  }

  async function bookingsOf(user: AuthUser, instrumentId: number): Promise<{ current: ScanBookingDto | null; next: ScanBookingDto | null }> {
    const t = now().getTime();
    const rows: { id: number; userId: number; status: string; startsAt: string; endsAt: string; startMs: number; endMs: number; checkedInAt: string | null; checkedOutAt: string | null; userName: string }[] =
      await ds.query(
        `SELECT b.id, b.userId, b.status, b.startsAt, b.endsAt, b.startMs, b.endMs, b.checkedInAt, b.checkedOutAt, u.name AS userName
           FROM bookings b JOIN booking_instruments bi ON bi.bookingId = b.id JOIN users u ON u.id = b.userId
          WHERE bi.instrumentId = ? AND b.endMs > ? AND b.status IN (${ACTIVE_BOOKING.map(() => "?").join(",")})
          ORDER BY b.startMs LIMIT 5`,
        [instrumentId, t, ...ACTIVE_BOOKING],
      );
    const seesNames = hasRole(user, "manager", "admin");
    const dto = (b: (typeof rows)[number]): ScanBookingDto => {
      const mine = b.userId === user.id;
      return {
        id: mine || seesNames ? b.id : null,
        start: b.startsAt,
        end: b.endsAt,
        status: b.status,
        mine,
        who: mine || seesNames ? b.userName : null,
        checkedInAt: mine || seesNames ? b.checkedInAt : null,
        checkedOutAt: mine || seesNames ? b.checkedOutAt : null,
      };
    };
    const current = rows.find((b) => b.startMs <= t && b.status !== "requested");
    const next = rows.find((b) => b.startMs > t && b !== current);
    return { current: current ? dto(current) : null, next: next ? dto(next) : null };
  }

  async function lastCleanedAt(instrumentId: number): Promise<string | null> {
    const row = await ds.getRepository(AuditEntry).findOne({
      where: { entityType: "instrument", entityId: instrumentId, action: "instrument.cleaned" },
      order: { id: "DESC" },
    });
    return row?.at ?? null;
  }

  async function instrumentRecord(user: AuthUser, i: Instrument): Promise<ScanInstrumentRecord> {
    const where = await locationPaths(ds);
    const { current, next } = await bookingsOf(user, i.id);
    return {
      name: i.name,
      kind: i.kind,
      status: i.status,
      location: where(i.locationId),
      lastCleanedAt: await lastCleanedAt(i.id),
      currentBooking: current,
      nextBooking: next,
    };
  }

  async function describeContainer(user: AuthUser, id: number): Promise<ScanResultDto> {
    const c = await ds.getRepository(Container).findOneBy({ id });
    if (!c) throw new NotFound("That container");
    return { type: "container", id, url: recordPath("container", id), record: await containerRecord(user, c) };
  }

  async function describeInstrument(user: AuthUser, id: number): Promise<ScanResultDto> {
    const i = await ds.getRepository(Instrument).findOneBy({ id });
    if (!i) throw new NotFound("That instrument");
    return { type: "instrument", id, url: recordPath("instrument", id), record: await instrumentRecord(user, i) };
  }

  /** The record a label token stands for; 404 with code "label_malformed" (wrong shape, no lookup), "label_unknown" or "label_replaced". */
  async function resolve(user: AuthUser, token: string): Promise<ScanResultDto> {
    if (!isLabelTokenShape(token)) throw new AppError(404, "label_malformed", "This is not a Phasebook label code.");
    const c = await ds.getRepository(Container).findOneBy({ labelToken: token });
    if (c) return describeContainer(user, c.id);
    const i = await ds.getRepository(Instrument).findOneBy({ labelToken: token });
    if (i) return describeInstrument(user, i.id);
    const old = await ds.getRepository(LabelHistory).findOneBy({ token });
    if (old) throw new LabelReplaced(old.retiredAt, old.entityType);
    throw new NotFound("No record with this label", "label_unknown");
  }

  /** Gives the record a new token; the old one goes to the history and answers "replaced" from now on. */
  async function reissue(actor: AuthUser, type: LabelledTypeName, id: number, reason: string): Promise<{ token: string; url: string }> {
    const token = newToken(24);
    await serialTransaction(ds, async (em) => {
      const Entity = type === "container" ? Container : Instrument;
      const row = await em.getRepository<Container | Instrument>(Entity).findOneBy({ id });
      if (!row) throw new NotFound(type === "container" ? "That container" : "That instrument");
      const t = now().toISOString();
      await em.insert(LabelHistory, { entityType: type, entityId: id, token: row.labelToken, retiredAt: t, retiredById: actor.id, reason });
      await em.update(Entity, id, { labelToken: token });
      // The audit keeps a prefix only: a full retired token is harmless, but there is no need to spread it.
      await audit(em, now(), actor.id, "label.reissued", type, id, { reason, retiredTokenPrefix: row.labelToken.slice(0, 6) });
    });
    return { token, url: labelUrl(deps.publicUrl, token) };
  }

  async function history(type: LabelledTypeName, id: number): Promise<LabelHistoryEntryDto[]> {
    const rows = await ds.getRepository(LabelHistory).find({ where: { entityType: type, entityId: id }, order: { id: "DESC" } });
    const names = new Map(
      (await ds.getRepository(User).findBy({ id: In(rows.map((r) => r.retiredById).filter((x): x is number => x !== null)) })).map((u) => [u.id, u.name]),
    );
    return rows.map((r) => ({
      retiredAt: r.retiredAt,
      retiredBy: r.retiredById === null ? null : (names.get(r.retiredById) ?? null),
      reason: r.reason,
      tokenPrefix: r.token.slice(0, 6),
    }));
  }

  function presentStock(s: LabelStock): LabelStockDto {
    const { createdAt: _c, ...rest } = s;
    void _c;
    return rest;
  }

  async function listStocks(): Promise<LabelStockDto[]> {
    return (await ds.getRepository(LabelStock).find({ order: { id: "ASC" } })).map(presentStock);
  }

  async function addStock(actor: AuthUser, input: LabelStockInput): Promise<LabelStockDto> {
    const problems = stockProblems(input);
    if (problems.length) throw new RuleBroken("These labels do not fit on the page.", problems.map((message) => ({ path: "columns", message })));
    const id = await serialTransaction(ds, async (em) => {
      const res = await em.insert(LabelStock, { ...input, createdAt: now().toISOString() });
      const newId = res.identifiers[0].id as number;
      await audit(em, now(), actor.id, "label_stock.created", "label_stock", newId, { ...input });
      return newId;
    });
    return presentStock(await ds.getRepository(LabelStock).findOneByOrFail({ id }));
  }

  /** The label PDF for containers and instruments; 422 over the maximum, 404 naming ids that do not exist. */
  async function labelsPdf(actor: AuthUser, q: LabelsPdfQuery): Promise<{ pdf: Buffer; count: number }> {
    const cIds = q.containerIds ?? [];
    const iIds = q.instrumentIds ?? [];
    const count = cIds.length + iIds.length;
    if (count > MAX_LABELS_PER_REQUEST) {
      throw new RuleBroken(`Ask for at most ${MAX_LABELS_PER_REQUEST} labels at a time; this asked for ${count}.`, [
        { path: "containerIds", message: `At most ${MAX_LABELS_PER_REQUEST} labels per PDF.` },
      ], "too_many_labels");
    }
    let stock: LabelStockLayout | null = null;
    if (q.stockId !== undefined) {
      stock = await ds.getRepository(LabelStock).findOneBy({ id: q.stockId });
      if (!stock) throw new NotFound("That label stock");
    }
    const containers = cIds.length ? await ds.getRepository(Container).findBy({ id: In(cIds) }) : [];
    const instruments = iIds.length ? await ds.getRepository(Instrument).findBy({ id: In(iIds) }) : [];
    const missing = [
      ...cIds.filter((id) => !containers.some((c) => c.id === id)).map((id) => `container ${id}`),
      ...iIds.filter((id) => !instruments.some((i) => i.id === id)).map((id) => `instrument ${id}`),
    ];
    if (missing.length) throw new NotFound(`No label can be made: ${missing.join(", ")}`);

    const chemicals = new Map(
      (await ds.getRepository(Chemical).findBy({ id: In([...new Set(containers.map((c) => c.chemicalId))]) })).map((c) => [c.id, c]),
    );
    const where = await locationPaths(ds);
    const today = DateTime.fromJSDate(now()).setZone(deps.facilityTz).toISODate();
    const labels: LabelContent[] = [];
    for (const id of cIds) {
      const c = containers.find((x) => x.id === id)!;
      const chem = chemicals.get(c.chemicalId)!;
      const hCodes = jsonList(chem.hazardStatements);
      const stored = jsonList(chem.pictograms) as GhsPictogram[];
      const signal = chem.signalWord ?? signalWordFor(hCodes);
      const amount = `${c.initialQuantity} ${c.unit}`;
      const conc = c.concentrationMolPerL !== null ? `${c.concentrationMolPerL} mol/L · ` : "";
      labels.push({
        url: labelUrl(deps.publicUrl, c.labelToken),
        size: q.size ?? (c.kind === "vial" ? "vial" : "bottle"),
        title: chem.name,
        subtitle: `${conc}${c.kind} ${amount} · CAS ${chem.casNumber} · container ${c.id}`,
        signalWord: signal === "Danger" || signal === "Warning" ? signal : null,
        hCodes,
        pictograms: stored.length ? stored : pictogramsFor(hCodes),
        location: where(c.locationId),
        dates: [`Printed ${today}`, ...(c.expiresAt ? [`Expires ${c.expiresAt}`] : [])],
      });
    }
    for (const id of iIds) {
      const i = instruments.find((x) => x.id === id)!;
      labels.push({
        url: labelUrl(deps.publicUrl, i.labelToken),
        size: q.size ?? "bottle",
        title: i.name,
        subtitle: [INSTRUMENT_KIND_LABELS[i.kind], i.model, i.serialNumber && `S/N ${i.serialNumber}`].filter(Boolean).join(" · "),
        signalWord: null,
        hCodes: [],
        pictograms: [],
        location: where(i.locationId),
        dates: [`Printed ${today}`],
      });
    }
    const pdf = await renderLabelsPdf(labels, (l) => stock ?? SINGLE_LABEL[l.size], { now: now(), skip: q.skip });
    await serialTransaction(ds, (em) =>
      audit(em, now(), actor.id, "labels.printed", "label", null, { containerIds: cIds, instrumentIds: iIds, stockId: q.stockId ?? null }),
    );
    return { pdf, count };
  }

  /** Every location with its full path, sorted by path, for pick lists. */
  async function locationChoices(): Promise<{ id: number; path: string }[]> {
    const where = await locationPaths(ds);
    const all = await ds.getRepository(Location).find();
    return all.map((l) => ({ id: l.id, path: where(l.id)! })).sort((a, b) => a.path.localeCompare(b.path));
  }

  return { resolve, locationChoices, describeContainer, describeInstrument, reissue, history, listStocks, addStock, labelsPdf };
}

export type LabelService = ReturnType<typeof createLabelService>;
