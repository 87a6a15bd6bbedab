/**
 * What reservations take from a container: the amount held for bookings, the free amount, the
 * refusal of a draw into another booking's reservation, and a draw on the booking counting
 * against its own reservation. `withdraw` (container.commands.ts) calls these before it writes.
 */
import type { DataSource } from "typeorm";
import type { Container, Reservation } from "../../entities";
import { AppError } from "../../errors";
import { prepared } from "../../db/prepared";

/** Quantities are stored as reals; differences below this are rounding, not stock. */
export const EPSILON = 1e-9;

function formatQty(n: number): string {
  return Number(n.toPrecision(6)).toString();
}

/** What is held on a container for bookings other than `exceptBookingId` (all bookings when null), in its unit. */
export function heldOnContainer(conn: DataSource, containerId: number, exceptBookingId: number | null): number {
  const row = prepared(
    conn,
    `SELECT COALESCE(SUM(amount - drawn), 0) AS held FROM reservations WHERE containerId = ? AND state = 'held' AND (? IS NULL OR bookingId <> ?)`,
  ).get(containerId, exceptBookingId, exceptBookingId) as { held: number };
  return Math.max(0, row.held);
}

/** The free amount of a container: what it holds less what is held for bookings (other than `exceptBookingId`). */
export function freeInContainer(conn: DataSource, c: Pick<Container, "id" | "quantity">, exceptBookingId: number | null = null): number {
  return Math.max(0, c.quantity - heldOnContainer(conn, c.id, exceptBookingId));
}

/**
 * The refusal of a draw that would take from another booking's reservation: 409 naming the
 * container and what is free. Called by `withdraw` before it writes anything.
 */
export function checkNotReserved(conn: DataSource, c: Container, take: number, bookingId: number | null, amountField: string): void {
  const held = heldOnContainer(conn, c.id, bookingId);
  if (held <= EPSILON) return;
  const free = Math.max(0, c.quantity - held);
  if (take <= free + EPSILON) return;
  const msg = `Container ${c.id} has ${formatQty(free)} ${c.unit} free: ${formatQty(held)} ${c.unit} of its ${formatQty(c.quantity)} ${c.unit} is reserved for another booking's run.`;
  throw new AppError(409, "reserved_for_booking", msg, [{ path: amountField, message: msg }], { containerId: c.id, free, unit: c.unit });
}

/** A draw on a booking counts against that booking's reservation of the container first. */
export function drawAgainstReservation(conn: DataSource, containerId: number, bookingId: number | null, take: number, nowIso: string): void {
  if (bookingId === null) return;
  let left = take;
  const rows = prepared(conn, `SELECT id, amount, drawn FROM reservations WHERE containerId = ? AND bookingId = ? AND state = 'held' ORDER BY id`).all(containerId, bookingId) as {
    id: number;
    amount: number;
    drawn: number;
  }[];
  for (const r of rows) {
    if (left <= EPSILON) break;
    const part = Math.min(left, r.amount - r.drawn);
    left -= part;
    const drawn = r.drawn + part;
    const done = drawn >= r.amount - EPSILON;
    prepared(conn, `UPDATE reservations SET drawn = ?, state = ?, closedAt = ? WHERE id = ?`).run(drawn, done ? "used" : "held", done ? nowIso : null, r.id);
  }
}

export interface ReservationRow extends Reservation {
  chemicalName: string;
}

/** Reservations of a booking, a plan or a container, newest first, with the chemical's name. */
export function reservationsWhere(conn: DataSource, where: { bookingId?: number; runPlanId?: number; containerId?: number }): ReservationRow[] {
  const [column, value] =
    where.runPlanId !== undefined ? ["r.runPlanId", where.runPlanId] : where.bookingId !== undefined ? ["r.bookingId", where.bookingId] : ["r.containerId", where.containerId];
  return prepared(
    conn,
    `SELECT r.*, ch.name AS chemicalName FROM reservations r JOIN containers c ON c.id = r.containerId JOIN chemicals ch ON ch.id = c.chemicalId WHERE ${column} = ? ORDER BY r.id DESC LIMIT 200`,
  ).all(value) as ReservationRow[];
}
