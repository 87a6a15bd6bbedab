/**
 * Reads of bookings: the Schedule's window and My bookings (contract GET /api/bookings), one
 * booking, and what the booking checks need (bookings holding a slot, instruments, training,
 * the account to charge). Every SQL string that reads bookings for the Schedule lives here.
 * The hot reads use prepared statements (DEVELOPERS.md, "Reading on the hot paths").
 */
import { In, type DataSource, type EntityManager } from "typeorm";
import { MINUTE_MS } from "@shared/domain/intervals";
import type { BookingListQuery } from "@shared/schemas/bookings";
import { Account, Booking, Instrument, SetupInstrument, TrainingRecord, User, UserRole } from "../../entities";
import { BadRequest, NotFound } from "../../errors";
import { prepared, readEntities, readEntity } from "../../db/prepared";
import type { AuthUser } from "../../middleware/auth";

/** No booking may be longer than a week (the instrument form's ceiling), which bounds window queries. */
export const MAX_BOOKING_MS = 7 * 24 * 60 * MINUTE_MS;

const HOLDING = "b.status NOT IN ('declined','cancelled')";

/** The columns a booking is shown with, as the list reads them. */
export interface BookingRow {
  id: number;
  userId: number;
  accountId: number;
  purpose: string;
  status: Booking["status"];
  startsAt: string;
  endsAt: string;
  startMs: number;
  endMs: number;
  checkedInAt: string | null;
  checkedOutAt: string | null;
  seriesId: string | null;
  declineReason: string | null;
  cancelReason: string | null;
  lateCancel: number | boolean;
  createdAt: string;
}

const BOOKING_ROW_COLUMNS = (
  ["id", "userId", "accountId", "purpose", "status", "startsAt", "endsAt", "startMs", "endMs", "checkedInAt", "checkedOutAt", "seriesId", "declineReason", "cancelReason", "lateCancel", "createdAt"] satisfies (keyof BookingRow)[]
)
  .map((c) => `b.${c}`)
  .join(", ");

export interface BookingWithInstruments {
  booking: Booking | BookingRow;
  instrumentIds: number[];
}

/** Each booking's instrument ids, in id order; one statement for any number of bookings. */
export function instrumentIdsOf(ds: DataSource, bookingIds: number[]): Map<number, number[]> {
  const map = new Map<number, number[]>();
  if (bookingIds.length === 0) return map;
  // The list travels as one JSON array, so this stays one cached statement.
  const rows = prepared(ds, `SELECT bookingId, instrumentId FROM booking_instruments WHERE bookingId IN (SELECT value FROM json_each(?)) ORDER BY instrumentId`).all(
    JSON.stringify(bookingIds),
  ) as { bookingId: number; instrumentId: number }[];
  for (const r of rows) {
    const list = map.get(r.bookingId);
    if (list) list.push(r.instrumentId);
    else map.set(r.bookingId, [r.instrumentId]);
  }
  return map;
}

export interface Holder {
  id: number;
  start: number;
  end: number;
  instrumentId: number;
}

/** Bookings holding a slot on these instruments near [fromMs, toMs), for the overlap check. */
export function holdersNear(ds: DataSource, instrumentIds: number[], fromMs: number, toMs: number, excludeId?: number): Holder[] {
  const marks = instrumentIds.map(() => "?").join(",");
  // The booking's times are copied onto booking_instruments (see the entity), so this walks
  // each instrument's (instrumentId, startMs) index over the narrow window only; CROSS JOIN
  // keeps that table as the outer loop.
  return prepared(
    ds,
    `SELECT bi.bookingId AS id, bi.startMs AS start, bi.endMs AS end, bi.instrumentId FROM booking_instruments bi CROSS JOIN bookings b ON b.id = bi.bookingId
      WHERE bi.instrumentId IN (${marks}) AND bi.startMs < ? AND bi.endMs > ? AND bi.startMs > ? AND ${HOLDING} AND b.id <> ?`,
  ).all(...instrumentIds, toMs, fromMs, fromMs - MAX_BOOKING_MS, excludeId ?? -1) as Holder[];
}

/** The instruments of these ids that exist (any order). */
export function instrumentsByIds(ds: DataSource, ids: number[]): Instrument[] {
  return readEntities(ds, Instrument, `SELECT * FROM instruments WHERE id IN (SELECT value FROM json_each(?))`, JSON.stringify(ids));
}

/** A person's training records on these instruments, revoked ones included. */
export function trainingRecordsOf(ds: DataSource, userId: number, instrumentIds: number[]): TrainingRecord[] {
  return readEntities(ds, TrainingRecord, `SELECT * FROM training_records WHERE userId = ? AND instrumentId IN (SELECT value FROM json_each(?))`, userId, JSON.stringify(instrumentIds));
}

/** The account a booking would charge, and the person's membership of it (null: not a member). */
export function accountAndMembership(ds: DataSource, accountId: number, userId: number): { account: Account | undefined; membership: { exceptionReason: string | null } | null } {
  const account = readEntity(ds, Account, `SELECT * FROM accounts WHERE id = ?`, accountId);
  const membership = prepared(ds, `SELECT exceptionReason FROM account_members WHERE accountId = ? AND userId = ?`).get(accountId, userId) as { exceptionReason: string | null } | undefined;
  return { account, membership: membership ?? null };
}

/** A setup's instrument ids (empty for an unknown setup). */
export async function setupInstrumentIds(em: EntityManager, setupId: number): Promise<number[]> {
  return (await em.findBy(SetupInstrument, { setupId })).map((r) => r.instrumentId);
}

export async function managerEmails(em: EntityManager): Promise<string[]> {
  const rows: { email: string }[] = await em.query(`SELECT u.email FROM users u JOIN user_roles r ON r.userId = u.id WHERE r.role = 'manager' AND u.active = 1`);
  return rows.map((r) => r.email);
}

export async function rolesOf(em: EntityManager, userId: number): Promise<string[]> {
  return (await em.findBy(UserRole, { userId })).map((r) => r.role);
}

export interface BookingForChange {
  booking: Booking;
  instruments: Instrument[];
  owner: User;
}

/** A booking with its instruments and owner, read inside the change's transaction; 404 when unknown. */
export async function loadForChange(em: EntityManager, id: number): Promise<BookingForChange> {
  const booking = await em.findOneBy(Booking, { id });
  if (!booking) throw new NotFound("That booking");
  const ids = instrumentIdsOf(em.connection, [id]).get(id) ?? [];
  const instruments = await em.findBy(Instrument, { id: In(ids) });
  const owner = (await em.findOneBy(User, { id: booking.userId }))!;
  return { booking, instruments, owner };
}

/** One booking with its instrument ids; 404 when unknown. */
export async function getBooking(ds: DataSource, id: number): Promise<BookingWithInstruments> {
  const booking = await ds.getRepository(Booking).findOneBy({ id });
  if (!booking) throw new NotFound("That booking");
  return { booking, instrumentIds: instrumentIdsOf(ds, [id]).get(id) ?? [] };
}

/** The window's conditions, with one instrument's window walking its own index. */
function windowWhere(actor: AuthUser, q: BookingListQuery): { where: string[]; args: unknown[]; oneInstrumentWindow: boolean } {
  const where: string[] = [];
  const args: unknown[] = [];
  // One instrument's window walks its (instrumentId, startMs) index on booking_instruments,
  // where the booking's times are copied; anything else reads the bookings' time index.
  const oneInstrumentWindow = Boolean(q.instrumentId && q.from && q.to);
  if (q.from && q.to) {
    const from = new Date(q.from).getTime();
    const to = new Date(q.to).getTime();
    if (to <= from) throw new BadRequest("The window must end after it starts.", [{ path: "query.to", message: "Must be after from" }]);
    const t = oneInstrumentWindow ? "bi" : "b";
    where.push(`${t}.startMs < ? AND ${t}.endMs > ? AND ${t}.startMs > ?`);
    args.push(to, from, from - MAX_BOOKING_MS);
  } else if (q.from) {
    where.push("b.endMs > ?");
    args.push(new Date(q.from).getTime());
  } else if (q.to) {
    where.push("b.startMs < ?");
    args.push(new Date(q.to).getTime());
  }
  if (q.instrumentId) {
    where.push(oneInstrumentWindow ? "bi.instrumentId = ?" : "b.id IN (SELECT bookingId FROM booking_instruments WHERE instrumentId = ?)");
    args.push(q.instrumentId);
  }
  if (q.status?.length) {
    where.push(`b.status IN (${q.status.map(() => "?").join(",")})`);
    args.push(...q.status);
  }
  if (q.mine) {
    where.push("b.userId = ?");
    args.push(actor.id);
  }
  return { where, args, oneInstrumentWindow };
}

/** Bookings overlapping a window (or the caller's own), newest state, with their instruments. */
export function listBookings(ds: DataSource, actor: AuthUser, q: BookingListQuery): { items: BookingWithInstruments[]; total: number } {
  if (!q.mine && (!q.from || !q.to)) {
    throw new BadRequest("Give a window with from and to, or ask for mine=true.", [
      ...(q.from ? [] : [{ path: "query.from", message: "Required unless mine=true" }]),
      ...(q.to ? [] : [{ path: "query.to", message: "Required unless mine=true" }]),
    ]);
  }
  const { where, args, oneInstrumentWindow } = windowWhere(actor, q);
  const from = oneInstrumentWindow ? "booking_instruments bi CROSS JOIN bookings b ON b.id = bi.bookingId" : "bookings b";
  const clause = where.length ? `WHERE ${where.join(" AND ")}` : "";
  // One instrument's window comes out of its index already in time order.
  const order = q.mine && !q.from ? "b.startMs DESC" : oneInstrumentWindow ? "bi.startMs ASC" : "b.startMs ASC, b.id ASC";
  // Prepared and cached per shape (the Schedule asks for the same few shapes all day), and
  // only the columns a booking is shown with: turning columns into JS values is the cost.
  const rows = prepared(ds, `SELECT ${BOOKING_ROW_COLUMNS} FROM ${from} ${clause} ORDER BY ${order} LIMIT ? OFFSET ?`).all(...args, q.limit, q.offset) as BookingRow[];
  const total =
    rows.length < q.limit && q.offset === 0 ? rows.length : (prepared(ds, `SELECT COUNT(*) n FROM ${from} ${clause}`).get(...args) as { n: number }).n;
  const map = instrumentIdsOf(ds, rows.map((r) => r.id));
  return { items: rows.map((r) => ({ booking: r, instrumentIds: map.get(r.id) ?? [] })), total };
}

/** Names of users and codes of accounts, one prepared statement each whatever the number of ids. */
export function userNamesAndAccountCodes(ds: DataSource, userIds: number[], accountIds: number[]): { users: Map<number, string>; accounts: Map<number, string> } {
  const users = new Map<number, string>();
  const accounts = new Map<number, string>();
  if (userIds.length) {
    const rows = prepared(ds, `SELECT id, name FROM users WHERE id IN (SELECT value FROM json_each(?))`).all(JSON.stringify(userIds)) as { id: number; name: string }[];
    for (const r of rows) users.set(r.id, r.name);
  }
  if (accountIds.length) {
    const rows = prepared(ds, `SELECT id, code FROM accounts WHERE id IN (SELECT value FROM json_each(?))`).all(JSON.stringify(accountIds)) as { id: number; code: string }[];
    for (const r of rows) accounts.set(r.id, r.code);
  }
  return { users, accounts };
}
