/**
 * Reservations: amounts of a container held for a booking by its run plan. The Stockroom keeps
 * them because they decide what may be drawn: while held, an amount is taken only on its booking
 * (`withdraw` refuses others with 409 naming the container and what is free). Run plans hold
 * them, the Schedule's cancel releases them and check-in turns what is left into usage, each
 * inside the caller's transaction. Who may draw from a container stays the container policy's.
 */
import type { EntityManager } from "typeorm";
import { UnitError } from "@shared/domain/units";
import { exactAmountInContainerUnit, exactAmountToNumber } from "@shared/domain/exact-amounts";
import { Chemical, Container, Reservation } from "../../entities";
import { AppError, Conflict, RuleBroken } from "../../errors";
import { readEntity } from "../../db/prepared";
import { EPSILON, freeInContainer } from "./reservation.queries";
import type { AuthUser } from "../../middleware/auth";
import { audit } from "../../core/audit";
import { containerPolicy } from "./container.policy";
import { unitProblem, withdraw } from "./container.commands";


function formatQty(n: number): string {
  return Number(n.toPrecision(6)).toString();
}

export interface HoldRequest {
  containerId: number;
  bookingId: number;
  runPlanId: number | null;
  /** What the plan needs, in any unit the container's chemical converts to. */
  amount: number;
  unit: string;
  field: string;
}

/**
 * Holds an amount of a container for a booking, inside the caller's transaction: the person must
 * be allowed to draw from it (container policy), and the container must have that much free
 * (409 `not_enough_free` naming the container and what is left otherwise).
 */
export async function holdReservation(em: EntityManager, now: Date, actor: AuthUser, req: HoldRequest): Promise<Reservation> {
  const conn = em.connection;
  const c = readEntity(conn, Container, `SELECT * FROM containers WHERE id = ?`, req.containerId);
  if (!c) throw new RuleBroken(`There is no container ${req.containerId}.`, [{ path: req.field, message: "Choose an existing container." }], "unknown_container");
  const chem = readEntity(conn, Chemical, `SELECT * FROM chemicals WHERE id = ?`, c.chemicalId)!;
  containerPolicy.authorize(actor, "draw", { ...c, chemicalHoldReason: chem.onHoldReason });
  let amount: number;
  try {
    amount = exactAmountToNumber(exactAmountInContainerUnit(req.amount, req.unit, c, chem));
  } catch (e) {
    if (e instanceof UnitError) throw unitProblem(e, { amount: req.field, unit: req.field });
    throw e;
  }
  const free = freeInContainer(conn, c);
  if (amount > free + EPSILON) {
    const msg = `Container ${c.id} (${chem.name}) has ${formatQty(free)} ${c.unit} left to reserve; the plan needs ${formatQty(amount)} ${c.unit}.`;
    throw new Conflict(msg, "not_enough_free", { containerId: c.id, left: free, unit: c.unit });
  }
  const res = await em.insert(Reservation, {
    containerId: c.id,
    bookingId: req.bookingId,
    runPlanId: req.runPlanId,
    amount,
    drawn: 0,
    unit: c.unit,
    state: "held",
    note: "",
    usageId: null,
    createdById: actor.id,
    createdAt: now.toISOString(),
    closedAt: null,
  });
  const id = res.identifiers[0].id as number;
  await audit(em, now, actor.id, "reservation.held", "container", c.id, { reservationId: id, bookingId: req.bookingId, runPlanId: req.runPlanId, amount, unit: c.unit });
  return (await em.findOneBy(Reservation, { id }))!;
}

/** Releases every held reservation of a booking (cancelled, declined, no-show) or of a plan; answers how many. */
export async function releaseReservations(em: EntityManager, now: Date, actorId: number | null, where: { bookingId?: number; runPlanId?: number }, why: string): Promise<number> {
  const rows = (await em.query(
    `SELECT id, containerId FROM reservations WHERE state = 'held' AND ${where.bookingId !== undefined ? "bookingId = ?" : "runPlanId = ?"}`,
    [where.bookingId ?? where.runPlanId],
  )) as { id: number; containerId: number }[];
  for (const r of rows) {
    await em.update(Reservation, r.id, { state: "released", note: why, closedAt: now.toISOString() });
    await audit(em, now, actorId, "reservation.released", "container", r.containerId, { reservationId: r.id, why });
  }
  return rows.length;
}

/**
 * Check-in: what is left of each held reservation of the booking becomes a usage on the booking
 * (its account charged as for any usage). A reservation that can no longer be drawn (the
 * container went on hold, was emptied, or the person may not draw from it) is released with the
 * reason, so the check-in itself never fails on stock.
 */
export async function useReservations(em: EntityManager, now: Date, actor: AuthUser, bookingId: number): Promise<{ used: number; released: number }> {
  const rows = (await em.query(`SELECT id, containerId, amount, drawn, unit FROM reservations WHERE state = 'held' AND bookingId = ? ORDER BY id`, [bookingId])) as {
    id: number;
    containerId: number;
    amount: number;
    drawn: number;
    unit: string;
  }[];
  let used = 0;
  let released = 0;
  for (const r of rows) {
    const left = r.amount - r.drawn;
    try {
      const w = await withdraw(em, now, actor, r.containerId, left, r.unit, { bookingId, note: `Run plan reservation ${r.id}, used at check-in` });
      await em.update(Reservation, r.id, { state: "used", drawn: r.amount, usageId: w.usageId, closedAt: now.toISOString() });
      await audit(em, now, actor.id, "reservation.used", "container", r.containerId, { reservationId: r.id, usageId: w.usageId, amount: left, unit: r.unit });
      used += 1;
    } catch (e) {
      if (!(e instanceof AppError)) throw e;
      await em.update(Reservation, r.id, { state: "released", note: `Not drawn at check-in: ${e.message}`, closedAt: now.toISOString() });
      await audit(em, now, actor.id, "reservation.released", "container", r.containerId, { reservationId: r.id, why: e.message });
      released += 1;
    }
  }
  return { used, released };
}

