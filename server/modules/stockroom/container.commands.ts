/**
 * Changes to containers: receiving deliveries, usage, moves, holds, emptying, pouring waste and
 * disposal. Each is one serialised transaction that reads the container, asks the container
 * policy, checks the amounts and writes, so parallel usages of one bottle are applied one after
 * another and never over-draw. The Scan page's quick actions call these same functions.
 */
import type { EntityManager } from "typeorm";
import { UnitError } from "@shared/domain/units";
import { isHalogenated } from "@shared/domain/chemistry";
import {
  addAmounts,
  compareAmounts,
  exactAmountInContainerUnit,
  exactAmountToNumber,
  subtractAmount,
  toExactAmount,
  withdrawExact,
  type ExactAmount,
} from "@shared/domain/exact-amounts";
import { lineAmountCents, usageCost } from "@shared/domain/charges";
import { receiptVolumeCheck } from "@shared/domain/storage";
import type { DisposeInput, MoveInput, ReceiveInput, UsageInput, WasteAddInput } from "@shared/schemas/stock";
import { Booking, Chemical, Container, ContainerMovement, Location } from "../../entities";
import type { MovementKind } from "../../entities/container-movement.entity";
import { NotFound, RuleBroken } from "../../errors";
import { serialTransaction } from "../../db/serial";
import { prepared, readEntity } from "../../db/prepared";
import { hasRole, type AuthUser } from "../../middleware/auth";
import { audit } from "../../core/audit";
import { enqueueMail } from "../../core/outbox";
import { newToken } from "../../core/tokens";
import type { Deps } from "../../core/deps";
import type { ContainerRow } from "./stock.presenter";
import { containerRow } from "./container.queries";
import { containerPolicy } from "./container.policy";
import { checkNotReserved, drawAgainstReservation } from "./reservation.queries";

/** A UnitError from the domain as a 422 naming the request's field. */
export function unitProblem(e: UnitError, fields: { amount: string; unit: string }): RuleBroken {
  const path = e.field === "amount" ? fields.amount : fields.unit;
  return new RuleBroken(e.message, [{ path, message: e.message }], e.code === "invalid_amount" ? "invalid_amount" : "unit_not_convertible");
}

function formatQty(n: number): string {
  return Number(n.toPrecision(6)).toString();
}

/** The container and its chemical's hold, as the policy sees them, read on the transaction's connection. */
function loadForChange(em: EntityManager, id: number): { c: Container; chem: Chemical } {
  const c = readEntity(em.connection, Container, `SELECT * FROM containers WHERE id = ?`, id);
  if (!c) throw new NotFound("That container");
  const chem = readEntity(em.connection, Chemical, `SELECT * FROM chemicals WHERE id = ?`, c.chemicalId)!;
  return { c, chem };
}

const facts = (c: Container, chem: Chemical) => ({ ...c, chemicalHoldReason: chem.onHoldReason });

export async function requireLocation(em: EntityManager, id: number | null | undefined, field: string): Promise<number | null> {
  if (id === null || id === undefined) return null;
  const l = await em.findOneBy(Location, { id });
  if (!l) throw new RuleBroken(`There is no location ${id}.`, [{ path: field, message: "Choose an existing location." }], "unknown_location");
  return id;
}

export async function recordMovement(
  em: EntityManager,
  at: Date,
  m: { containerId: number; from: number | null; to: number | null; userId: number | null; kind: MovementKind; note?: string },
): Promise<void> {
  await em.insert(ContainerMovement, { containerId: m.containerId, fromLocationId: m.from, toLocationId: m.to, userId: m.userId, kind: m.kind, note: m.note ?? "", at: at.toISOString() });
}

/** n containers of one delivery, each with its own random label token. */
export async function receiveContainers(deps: Deps, actor: AuthUser, input: ReceiveInput): Promise<ContainerRow[]> {
  return serialTransaction(deps.ds, async (em) => {
    const chem = await em.findOneBy(Chemical, { id: input.chemicalId });
    if (!chem) throw new RuleBroken(`There is no chemical ${input.chemicalId}.`, [{ path: "chemicalId", message: "Choose an existing chemical." }], "unknown_chemical");
    const locationId = await requireLocation(em, input.locationId, "locationId");
    // A flammable or combustible liquid received by mass (or amount) without a density would be
    // left out of the storage totals by volume: ask for the density, unless the person says so.
    const volume = receiptVolumeCheck(input.unit, chem);
    if (volume.volumeUnknown && !input.allowUnknownVolume) {
      throw new RuleBroken(volume.message!, [{ path: "unit", message: volume.message! }], "density_needed", { missing: volume.missing, nfpaClass: volume.nfpaClass });
    }
    if (input.expiresAt && input.retestAt && input.retestAt > input.expiresAt) {
      throw new RuleBroken("The retest date is after the expiry date.", [{ path: "retestAt", message: "A retest date after the expiry date is never reached; check both dates." }]);
    }
    const ids: number[] = [];
    const now = deps.now();
    const at = now.toISOString();
    // A waste container fills rather than empties: its size is the capacity, it starts empty and in use.
    const waste = input.kind === "waste";
    for (let i = 0; i < input.count; i++) {
      const res = await em.insert(Container, {
        chemicalId: chem.id,
        kind: input.kind,
        quantity: waste ? 0 : input.quantity,
        initialQuantity: input.quantity,
        unit: input.unit,
        locationId,
        status: waste ? "in_use" : "sealed",
        openedAt: waste ? at : null,
        expiresAt: input.expiresAt ?? null,
        retestAt: input.retestAt ?? null,
        groupId: input.groupId ?? null,
        organisation: input.organisation?.trim() || null,
        // Random and unguessable: a label must not lead to another container's record.
        labelToken: newToken(18),
        supplier: input.supplier,
        lot: input.lot,
        priceCents: input.priceCents ?? null,
        concentrationMolPerL: null,
        holdReason: null,
        createdAt: at,
      });
      const id = res.identifiers[0].id as number;
      ids.push(id);
      await recordMovement(em, now, { containerId: id, from: null, to: locationId, userId: actor.id, kind: "received", note: input.supplier ? `from ${input.supplier}` : "" });
    }
    await audit(em, now, actor.id, "containers.received", "chemical", chem.id, { containerIds: ids, lot: input.lot, quantity: input.quantity, unit: input.unit });
    return ids.map((id) => containerRow(em.connection, id));
  });
}

export interface Withdrawal {
  container: Container;
  amountInContainerUnit: number;
  usageId: number;
}

/**
 * Takes an amount from a container inside the caller's transaction: asks the policy, converts
 * the amount, checks what is left, decrements, and records the usage with its cost. Shared by
 * usage and solution preparation so both follow the same rules.
 */
export async function withdraw(
  em: EntityManager,
  now: Date,
  actor: AuthUser,
  containerId: number,
  amount: number,
  unit: string,
  opts: { bookingId?: number | null; note?: string; fields?: { amount: string; unit: string; container?: string } },
): Promise<Withdrawal> {
  const fields = { amount: "amount", unit: "unit", ...opts.fields };
  // Prepared reads on the transaction's connection: the usage is the Stockroom's hottest write.
  const c = readEntity(em.connection, Container, `SELECT * FROM containers WHERE id = ?`, containerId);
  if (!c) {
    if (fields.container) throw new RuleBroken(`There is no container ${containerId}.`, [{ path: fields.container, message: "Choose an existing container." }], "unknown_container");
    throw new NotFound("That container");
  }
  const chem = readEntity(em.connection, Chemical, `SELECT * FROM chemicals WHERE id = ?`, c.chemicalId)!;
  containerPolicy.authorize(actor, "draw", facts(c, chem));
  // Exact arithmetic in whole base units (nL, µg, nmol): the take that empties a container leaves exactly zero.
  let w: ReturnType<typeof withdrawExact>;
  try {
    w = withdrawExact(c.quantity, amount, unit, c, chem);
  } catch (e) {
    if (e instanceof UnitError) throw unitProblem(e, fields);
    throw e;
  }
  const take = exactAmountToNumber(w.take);
  if (!w.enough) {
    const msg = `Container ${c.id} has ${formatQty(c.quantity)} ${c.unit} left; ${formatQty(amount)} ${unit} is ${formatQty(take)} ${c.unit}.`;
    throw new RuleBroken(msg, [{ path: fields.amount, message: msg }], "not_enough_left", { left: c.quantity, unit: c.unit });
  }
  const bookingId = opts.bookingId ?? null;
  // Amounts held for other bookings' runs are not there to take (409 naming what is free).
  checkNotReserved(em.connection, c, take, bookingId, fields.amount);
  let accountId: number | null = null;
  if (bookingId !== null) {
    const b = await em.findOneBy(Booking, { id: bookingId });
    if (!b || (b.userId !== actor.id && !hasRole(actor, "manager"))) {
      throw new RuleBroken(`Booking ${bookingId} is not one of yours.`, [{ path: "bookingId", message: "Choose one of your own bookings." }], "unknown_booking");
    }
    accountId = b.accountId;
  }
  drawAgainstReservation(em.connection, c.id, bookingId, take, now.toISOString());
  const change = { quantity: exactAmountToNumber(w.left), status: w.empty ? ("empty" as const) : ("in_use" as const), openedAt: c.openedAt ?? now.toISOString() };
  // Prepared statements on the transaction's connection: TypeORM's builders cost more than the writes themselves.
  prepared(em.connection, `UPDATE containers SET quantity = ?, status = ?, openedAt = ? WHERE id = ?`).run(change.quantity, change.status, change.openedAt, c.id);
  // A prepared solution's cost was charged when its parents were used. The cost is kept
  // unrounded (quantity × price of one unit); costCents is only its rounded display figure.
  const cost = c.kind === "solution" ? null : usageCost(amount, unit, chem);
  const costCents = cost === null ? null : lineAmountCents(cost.quantity, cost.unitCostCents);
  const usageId = Number(
    prepared(
      em.connection,
      `INSERT INTO container_usages (containerId, userId, bookingId, accountId, amount, unit, amountInContainerUnit, costCents, costQuantity, costUnit, unitCostCents, note, at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
    ).run(c.id, actor.id, bookingId, accountId, amount, unit, take, costCents, cost?.quantity ?? null, cost?.unit ?? null, cost?.unitCostCents ?? null, opts.note ?? "", now.toISOString()).lastInsertRowid,
  );
  return { container: Object.assign(c, change), amountInContainerUnit: take, usageId };
}

/** Contract POST /api/containers/:id/usage. */
export async function logUsage(deps: Deps, actor: AuthUser, id: number, input: UsageInput): Promise<ContainerRow> {
  return serialTransaction(deps.ds, async (em) => {
    const now = deps.now();
    const w = await withdraw(em, now, actor, id, input.amount, input.unit, { bookingId: input.bookingId, note: input.note });
    await audit(em, now, actor.id, "container.used", "container", id, { amount: input.amount, unit: input.unit, amountInContainerUnit: w.amountInContainerUnit, usageId: w.usageId });
    return containerRow(em.connection, id);
  });
}

/** One change to one container: load, authorise the action, do the work, answer the fresh row. */
function changeContainer(
  deps: Deps,
  actor: AuthUser,
  id: number,
  action: "move" | "markEmpty" | "pourWaste" | "dispose" | "hold" | "release",
  work: (em: EntityManager, c: Container, chem: Chemical, now: Date) => Promise<void>,
): Promise<ContainerRow> {
  return serialTransaction(deps.ds, async (em) => {
    const { c, chem } = loadForChange(em, id);
    containerPolicy.authorize(actor, action, facts(c, chem));
    await work(em, c, chem, deps.now());
    return containerRow(em.connection, id);
  });
}

export const moveContainer = (deps: Deps, actor: AuthUser, id: number, input: MoveInput) =>
  changeContainer(deps, actor, id, "move", async (em, c, _chem, now) => {
    await requireLocation(em, input.locationId, "locationId");
    if (c.locationId === input.locationId) throw new RuleBroken("The container is already there.", [{ path: "locationId", message: "Choose a different location." }], "same_location");
    await em.update(Container, c.id, { locationId: input.locationId });
    await recordMovement(em, now, { containerId: c.id, from: c.locationId, to: input.locationId, userId: actor.id, kind: "moved", note: input.note });
    await audit(em, now, actor.id, "container.moved", "container", c.id, { from: c.locationId, to: input.locationId });
  });

export const holdContainer = (deps: Deps, actor: AuthUser, id: number, reason: string) =>
  changeContainer(deps, actor, id, "hold", async (em, c, _chem, now) => {
    await em.update(Container, c.id, { status: "on_hold", holdReason: reason });
    await audit(em, now, actor.id, "container.held", "container", c.id, { reason, previous: c.status });
  });

export const releaseContainer = (deps: Deps, actor: AuthUser, id: number) =>
  changeContainer(deps, actor, id, "release", async (em, c, _chem, now) => {
    // Back to what it was: opened bottles are in use, unopened ones sealed.
    const status = c.openedAt ? "in_use" : "sealed";
    await em.update(Container, c.id, { status, holdReason: null });
    await audit(em, now, actor.id, "container.released", "container", c.id, { reason: c.holdReason });
  });

/** Marks a container empty; a waste note (from the Scan page) says where what was left went. */
export const markContainerEmpty = (deps: Deps, actor: AuthUser, id: number, wasteNote = "") =>
  changeContainer(deps, actor, id, "markEmpty", async (em, c, chem, now) => {
    await em.update(Container, c.id, { status: "empty", quantity: 0 });
    await audit(em, now, actor.id, "container.emptied", "container", c.id, { quantityBefore: c.quantity, unit: c.unit, wasteNote, halogenated: halogenatedOrNull(chem) });
  });

/**
 * Pour into a waste container: the amount, in any unit the container's chemical converts to,
 * adds to what it holds; more than its capacity (initialQuantity) is refused (422) so the
 * fill level the safety review shows never passes 100 %.
 */
export const pourWaste = (deps: Deps, actor: AuthUser, id: number, input: WasteAddInput) =>
  changeContainer(deps, actor, id, "pourWaste", async (em, c, chem, now) => {
    let add: ExactAmount;
    try {
      add = exactAmountInContainerUnit(input.amount, input.unit, c, chem);
    } catch (e) {
      if (e instanceof UnitError) throw unitProblem(e, { amount: "amount", unit: "unit" });
      throw e;
    }
    const capacity = toExactAmount(c.initialQuantity, c.unit);
    const filled = addAmounts(toExactAmount(c.quantity, c.unit), add);
    if (compareAmounts(filled, capacity) > 0) {
      const room = Math.max(0, exactAmountToNumber(subtractAmount(capacity, toExactAmount(Math.min(c.quantity, c.initialQuantity), c.unit))));
      const msg = `Waste container ${c.id} has room for ${formatQty(room)} ${c.unit}; ${formatQty(input.amount)} ${input.unit} is ${formatQty(exactAmountToNumber(add))} ${c.unit}. Use another container and arrange collection.`;
      throw new RuleBroken(msg, [{ path: "amount", message: msg }], "waste_container_full", { room, unit: c.unit });
    }
    await em.update(Container, c.id, { quantity: exactAmountToNumber(filled), status: "in_use", openedAt: c.openedAt ?? now.toISOString() });
    await audit(em, now, actor.id, "container.waste_added", "container", c.id, { amount: input.amount, unit: input.unit, amountInContainerUnit: exactAmountToNumber(add), note: input.note ?? "" });
  });

export const disposeContainer = (deps: Deps, actor: AuthUser, id: number, input: DisposeInput & { wasteNote?: string }) =>
  changeContainer(deps, actor, id, "dispose", async (em, c, chem, now) => {
    await em.update(Container, c.id, { status: "disposed", quantity: 0 });
    await audit(em, now, actor.id, "container.disposed", "container", c.id, {
      reason: input.reason ?? "",
      wasteNote: input.wasteNote ?? "",
      quantityBefore: c.quantity,
      unit: c.unit,
      // Halogenated waste goes to its own stream; the safety review counts it from these entries.
      halogenated: halogenatedOrNull(chem),
    });
  });

/** Whether the chemical's formula holds a halogen, or null when it has no readable formula. */
function halogenatedOrNull(chem: Chemical): boolean | null {
  if (!chem.formula) return null;
  try {
    return isHalogenated(chem.formula);
  } catch {
    return null;
  }
}

/** Anyone signed in may report a problem with a container (a cracked cap, a missing label); the safety officers hear of it. */
export async function reportContainerProblem(deps: Deps & { config: { PUBLIC_URL: string } }, actor: AuthUser, id: number, note: string): Promise<void> {
  await serialTransaction(deps.ds, async (em) => {
    const { c, chem } = loadForChange(em, id);
    containerPolicy.authorize(actor, "reportProblem", facts(c, chem));
    const t = deps.now();
    await audit(em, t, actor.id, "container.problem_reported", "container", id, { note });
    const officers = (await em.query(
      `SELECT u.email FROM users u JOIN user_roles r ON r.userId = u.id WHERE r.role = 'safety_officer' AND u.active = 1 ORDER BY u.id`,
    )) as { email: string }[];
    for (const { email } of officers) {
      await enqueueMail(em, t, {
        to: email,
        subject: `Problem reported: ${chem.name}, container ${c.id}`,
        text: `${actor.name} (${actor.email}) reported a problem with container ${c.id} (${chem.name}, CAS ${chem.casNumber}):\n\n${note}\n\nOpen it: ${deps.config.PUBLIC_URL}/stockroom/containers/${c.id}`,
      });
    }
  });
}
