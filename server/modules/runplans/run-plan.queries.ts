/**
 * Reads of run plans and of what a plan needs from other areas' tables: the chemicals it
 * names, the cell, the booking it is attached to, the containers it may take from and the waste
 * containers. Every SQL string of the run-plans area lives here.
 */
import type { DataSource } from "typeorm";
import type { BookingStatus } from "@shared/schemas/bookings";
import { prepared } from "../../db/prepared";
import { NotFound } from "../../errors";
import type { Chemical, Container, Instrument, RunPlan } from "../../entities";
import type { RunPlanFacts } from "./run-plan.policy";

export interface PlanRow extends RunPlan {
  authorName: string;
  bookingOwnerId: number | null;
  heldCount: number;
}

const PLAN_COLUMNS = `p.*, u.name AS authorName, b.userId AS bookingOwnerId,
  (SELECT COUNT(*) FROM reservations r WHERE r.runPlanId = p.id AND r.state = 'held') AS heldCount`;
const PLAN_FROM = `FROM run_plans p JOIN users u ON u.id = p.authorId LEFT JOIN bookings b ON b.id = p.bookingId`;

export function planRow(conn: DataSource, id: number): PlanRow {
  const row = prepared(conn, `SELECT ${PLAN_COLUMNS} ${PLAN_FROM} WHERE p.id = ?`).get(id) as PlanRow | undefined;
  if (!row) throw new NotFound("That run plan");
  return row;
}

export const factsOf = (p: PlanRow): RunPlanFacts => ({ id: p.id, authorId: p.authorId, bookingOwnerId: p.bookingOwnerId, heldCount: p.heldCount });

/** Plans the person may see (author, booking owner; the manager all), optionally of one booking; newest first. */
export function listPlans(conn: DataSource, viewer: { id: number; manager: boolean }, q: { bookingId?: number; mine?: boolean; limit: number; offset: number }): { items: PlanRow[]; total: number } {
  const where = [`(? = 1 OR p.authorId = ? OR b.userId = ?)`];
  const args: unknown[] = [viewer.manager && !q.mine ? 1 : 0, viewer.id, viewer.id];
  if (q.bookingId !== undefined) {
    where.push("p.bookingId = ?");
    args.push(q.bookingId);
  }
  const sql = `${PLAN_FROM} WHERE ${where.join(" AND ")}`;
  const { n } = prepared(conn, `SELECT COUNT(*) AS n ${sql}`).get(...args) as { n: number };
  const items = prepared(conn, `SELECT ${PLAN_COLUMNS} ${sql} ORDER BY p.id DESC LIMIT ? OFFSET ?`).all(...args, q.limit, q.offset) as PlanRow[];
  return { items, total: n };
}

/** Summaries of the plans attached to some bookings, for the Scan page and booking lists. */
export function plansOfBookings(conn: DataSource, bookingIds: number[]): PlanRow[] {
  if (bookingIds.length === 0) return [];
  return prepared(conn, `SELECT ${PLAN_COLUMNS} ${PLAN_FROM} WHERE p.bookingId IN (SELECT value FROM json_each(?)) ORDER BY p.id`).all(JSON.stringify(bookingIds)) as PlanRow[];
}

export function chemicalsById(conn: DataSource, ids: number[]): Map<number, Chemical> {
  const rows = prepared(conn, `SELECT * FROM chemicals WHERE id IN (SELECT value FROM json_each(?))`).all(JSON.stringify([...new Set(ids)])) as Chemical[];
  return new Map(rows.map((c) => [c.id, c]));
}

/** The Stockroom's chemical for a solvent by its CAS number (the first on record), or null. */
export function chemicalByCas(conn: DataSource, cas: string | null): Chemical | null {
  if (!cas) return null;
  return (prepared(conn, `SELECT * FROM chemicals WHERE casNumber = ? ORDER BY id LIMIT 1`).get(cas) as Chemical | undefined) ?? null;
}

export function instrumentById(conn: DataSource, id: number | null | undefined): Instrument | null {
  if (id === null || id === undefined) return null;
  return (prepared(conn, `SELECT * FROM instruments WHERE id = ?`).get(id) as Instrument | undefined) ?? null;
}

export interface BookingFacts {
  id: number;
  userId: number;
  status: BookingStatus;
  startsAt: string;
  endsAt: string;
  endMs: number;
  instruments: { id: number; name: string; kind: string }[];
}

export function bookingFacts(conn: DataSource, id: number | null): BookingFacts | null {
  if (id === null) return null;
  const b = prepared(conn, `SELECT id, userId, status, startsAt, endsAt, endMs FROM bookings WHERE id = ?`).get(id) as Omit<BookingFacts, "instruments"> | undefined;
  if (!b) return null;
  const instruments = prepared(conn, `SELECT i.id, i.name, i.kind FROM booking_instruments bi JOIN instruments i ON i.id = bi.instrumentId WHERE bi.bookingId = ? ORDER BY i.id`).all(id) as BookingFacts["instruments"];
  return { ...b, instruments };
}

export type ContainerWithHeld = Container & { held: number };

/** Bottles and vials of a chemical that still hold something, with what is held on each for bookings. */
export function stockContainers(conn: DataSource, chemicalId: number): ContainerWithHeld[] {
  return prepared(
    conn,
    `SELECT c.*, (SELECT COALESCE(SUM(r.amount - r.drawn), 0) FROM reservations r WHERE r.containerId = c.id AND r.state = 'held') AS held
       FROM containers c WHERE c.chemicalId = ? AND c.kind IN ('bottle', 'vial') AND c.status IN ('sealed', 'in_use') AND c.quantity > 0
      ORDER BY c.status = 'in_use' DESC, c.expiresAt IS NULL, c.expiresAt, c.id`,
  ).all(chemicalId) as ContainerWithHeld[];
}

export type WasteContainer = Container & { formula: string | null; densityGPerMl: number | null; molarMass: number | null };

/** Waste containers in use, with their chemical's formula (halogenated or not). */
export function wasteContainers(conn: DataSource): WasteContainer[] {
  return prepared(
    conn,
    `SELECT c.*, ch.formula AS formula, ch.densityGPerMl AS densityGPerMl, ch.molarMass AS molarMass FROM containers c JOIN chemicals ch ON ch.id = c.chemicalId
      WHERE c.kind = 'waste' AND c.status = 'in_use' ORDER BY c.id`,
  ).all() as WasteContainer[];
}
