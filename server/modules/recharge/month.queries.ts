/**
 * The reads of a month's pricing (month-stream.ts): reference data, this month's bookings and
 * usages a page at a time (keyset pages, so no page is read twice and only one is in memory),
 * what locked (final) months left to correct, the members' caps and the open adjustments.
 * `ownRun` is the run being written, whose own lines are not "billed earlier".
 */
import type { EntityManager } from "typeorm";
import type { InstrumentKind } from "@shared/domain/billing";
import { Account, Rate } from "../../entities";
import { parseHours, type BookingRow, type InstrumentInfo } from "./month-pricer";

export async function loadInstruments(em: EntityManager): Promise<Map<number, InstrumentInfo>> {
  const rows: { id: number; name: string; kind: InstrumentKind; bookableHours: string }[] = await em.query(
    `SELECT id, name, kind, bookableHours FROM instruments`,
  );
  return new Map(rows.map((r) => [r.id, { name: r.name, kind: r.kind, bookableHours: parseHours(r.bookableHours) }]));
}

export const loadRates = (em: EntityManager): Promise<Rate[]> => em.find(Rate);

export async function loadAccounts(em: EntityManager): Promise<Map<number, Account>> {
  return new Map((await em.find(Account)).map((a) => [a.id, a]));
}

/** Final runs other than the one being written: their months are locked. */
export function otherFinalRuns(em: EntityManager, ownRun: number): Promise<{ period: string; createdAt: string }[]> {
  return em.query(`SELECT period, createdAt FROM billing_runs WHERE status = 'final' AND id <> ?`, [ownRun]);
}

const BOOKING_COLUMNS = `b.id, b.userId, b.accountId, b.status, b.startsAt, b.endsAt, b.checkedInAt, b.checkedOutAt, b.cancelledAt, b.lateCancel, bi.instrumentId`;

/**
 * The next page of billable bookings starting in [startMs, endMs), after `after` in (startMs, id)
 * order. The page starts its walk of the startMs index at `after` (not at the month's start, which
 * made every page read all the pages before it), and the status test is kept off its own index
 * (`+status`): that index would read every booking of every month with that status, then sort them.
 */
export function bookingIdPage(
  em: EntityManager,
  range: { startMs: number; endMs: number },
  after: { startMs: number; id: number } | null,
  limit: number,
): Promise<{ id: number; startMs: number }[]> {
  return em.query(
    `SELECT id, startMs FROM bookings
     WHERE startMs >= ? AND startMs < ? AND +status IN ('confirmed', 'in_progress', 'completed', 'no_show', 'cancelled')
       ${after ? "AND (startMs > ? OR id > ?)" : ""}
     ORDER BY startMs, id LIMIT ?`,
    after ? [after.startMs, range.endMs, after.startMs, after.id, limit] : [range.startMs, range.endMs, limit],
  );
}

/** Those bookings, one row per instrument. */
export function bookingRows(em: EntityManager, ids: number[]): Promise<BookingRow[]> {
  return em.query(
    `SELECT ${BOOKING_COLUMNS} FROM bookings b JOIN booking_instruments bi ON bi.bookingId = b.id
     WHERE b.id IN (${ids.map(() => "?").join(",")}) ORDER BY b.startMs, b.id, bi.instrumentId`,
    ids,
  );
}

/** Bookings that start before the month and changed after the earliest final run was made. */
export function bookingsChangedSince(em: EntityManager, beforeMs: number, since: string): Promise<(BookingRow & { updatedAt: string })[]> {
  return em.query(
    `SELECT ${BOOKING_COLUMNS}, b.updatedAt FROM bookings b JOIN booking_instruments bi ON bi.bookingId = b.id
     WHERE b.startMs < ? AND b.updatedAt > ? ORDER BY b.startMs, b.id, bi.instrumentId`,
    [beforeMs, since],
  );
}

/** What final runs billed per booking and instrument (time and corrections). */
export async function billedBookingTotals(em: EntityManager, ownRun: number): Promise<Map<string, number>> {
  const rows: { bookingId: number; instrumentId: number; total: number }[] = await em.query(
    `SELECT cl.bookingId, cl.instrumentId, SUM(cl.amountCents) AS total FROM charge_lines cl JOIN billing_runs r ON r.id = cl.runId
     WHERE r.status = 'final' AND r.id <> ? AND cl.bookingId IS NOT NULL AND cl.kind IN ('instrument', 'correction') GROUP BY cl.bookingId, cl.instrumentId`,
    [ownRun],
  );
  return new Map(rows.map((r) => [`${r.bookingId}|${r.instrumentId}`, Number(r.total)]));
}

export interface UsageRow {
  id: number;
  userId: number;
  accountId: number | null;
  amount: number;
  unit: string;
  /** Rounded cost at the time of use; only used for usages logged before the exact figures below were kept. */
  costCents: number | null;
  /** The cost kept unrounded at the time of use (container_usages; decimal text). */
  costQuantity: string | null;
  costUnit: string | null;
  unitCostCents: string | null;
  at: string;
  chemicalName: string;
}

const USAGE_SQL = `SELECT u.id, u.userId, COALESCE(u.accountId, b.accountId) AS accountId, u.amount, u.unit, u.costCents, u.costQuantity, u.costUnit, u.unitCostCents, u.at, ch.name AS chemicalName
    FROM container_usages u LEFT JOIN bookings b ON b.id = u.bookingId
    JOIN containers c ON c.id = u.containerId JOIN chemicals ch ON ch.id = c.chemicalId`;

/**
 * The next page of usages logged in [startIso, endIso), after `after` in (at, id) order: the walk of
 * the `at` index (whose entries are in (at, id) order) starts at `after`, so each page reads its own
 * rows only.
 */
export function usagePage(
  em: EntityManager,
  range: { startIso: string; endIso: string },
  after: { at: string; id: number } | null,
  limit: number,
): Promise<UsageRow[]> {
  return em.query(
    `${USAGE_SQL} WHERE u.at >= ? AND u.at < ? ${after ? "AND (u.at > ? OR u.id > ?)" : ""} ORDER BY u.at, u.id LIMIT ?`,
    after ? [after.at, range.endIso, after.at, after.id, limit] : [range.startIso, range.endIso, limit],
  );
}

/** Usages logged before the month that no final run has billed. */
export function unbilledEarlierUsages(em: EntityManager, beforeIso: string, ownRun: number): Promise<UsageRow[]> {
  return em.query(
    `${USAGE_SQL} WHERE u.at < ? AND u.id NOT IN (SELECT cl.usageId FROM charge_lines cl JOIN billing_runs r ON r.id = cl.runId
      WHERE r.status = 'final' AND r.id <> ? AND cl.usageId IS NOT NULL) ORDER BY u.at, u.id`,
    [beforeIso, ownRun],
  );
}

export function memberCaps(em: EntityManager): Promise<{ accountId: number; userId: number; monthlyCapCents: number }[]> {
  return em.query(`SELECT accountId, userId, monthlyCapCents FROM account_members WHERE monthlyCapCents IS NOT NULL`);
}

/** Adjustments for the month or earlier that no final run has billed. */
export function openAdjustments(
  em: EntityManager,
  period: string,
  ownRun: number,
): Promise<{ id: number; accountId: number; amountCents: number; reason: string; period: string; createdAt: string }[]> {
  return em.query(
    `SELECT a.id, a.accountId, a.amountCents, a.reason, a.period, a.createdAt FROM billing_adjustments a
     WHERE a.period <= ? AND a.id NOT IN (SELECT cl.adjustmentId FROM charge_lines cl JOIN billing_runs r ON r.id = cl.runId
       WHERE r.status = 'final' AND r.id <> ? AND cl.adjustmentId IS NOT NULL) ORDER BY a.id`,
    [period, ownRun],
  );
}
