/**
 * Creating bookings (contract POST /api/bookings): one session, several instruments at once, a
 * setup, or a weekly series, all or nothing. The check and the write are one serialised
 * transaction, so of N simultaneous requests for a slot exactly one wins. This is the
 * Schedule's hottest write: its reads and inserts are prepared statements on the
 * transaction's connection, and the rows are answered as written rather than read back.
 */
import crypto from "node:crypto";
import type { EntityManager } from "typeorm";
import { weeklyOccurrences } from "@shared/domain/recurrence";
import type { CreateBookingParsed } from "@shared/schemas/bookings";
import type { Instrument } from "../../entities";
import { UNTOUCHED_BOOKING } from "../../entities/booking.entity";
import { RuleBroken } from "../../errors";
import { serialTransaction } from "../../db/serial";
import { prepared } from "../../db/prepared";
import { hasRole, type AuthUser } from "../../middleware/auth";
import { audit } from "../../core/audit";
import { enqueueMail } from "../../core/outbox";
import * as mail from "./booking-mail";
import { chargeableAccount, instrumentsInService, problemsFor, requireLength, seriesError, type Session } from "./booking-checks";
import { managerEmails, setupInstrumentIds, type BookingRow, type BookingWithInstruments } from "./booking.queries";
import type { ScheduleDeps } from "./deps";

/** The instruments asked for by id and through a setup, each once. */
async function resolveInstrumentIds(em: EntityManager, input: CreateBookingParsed): Promise<number[]> {
  const ids = new Set(input.instrumentIds ?? []);
  if (input.setupId !== undefined) {
    const rows = await setupInstrumentIds(em, input.setupId);
    if (rows.length === 0) throw new RuleBroken("Unknown setup.", [{ path: "setupId", message: "No such setup" }], "unknown_setup");
    for (const id of rows) ids.add(id);
  }
  return [...ids];
}

/** Writes one booking per session with its instrument links; answers the rows as written. */
function insertSessions(
  em: EntityManager,
  actor: AuthUser,
  input: CreateBookingParsed,
  sessions: Session[],
  ids: number[],
  opts: { status: "requested" | "confirmed"; seriesId: string | null; at: string },
): BookingWithInstruments[] {
  const insert = prepared(
    em.connection,
    `INSERT INTO bookings (userId, accountId, purpose, status, startsAt, endsAt, startMs, endMs, seriesId, lateCancel, createdAt, updatedAt)
     VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, 0, ?, ?)`,
  );
  const link = prepared(em.connection, `INSERT INTO booking_instruments (bookingId, instrumentId) VALUES (?, ?)`);
  const sorted = [...ids].sort((a, b) => a - b);
  return sessions.map((s) => {
    const row = {
      userId: actor.id,
      accountId: input.accountId,
      purpose: input.purpose,
      status: opts.status,
      startsAt: s.start.toISOString(),
      endsAt: s.end.toISOString(),
      startMs: s.start.getTime(),
      endMs: s.end.getTime(),
      ...UNTOUCHED_BOOKING,
      seriesId: opts.seriesId,
      createdAt: opts.at,
      updatedAt: opts.at,
    } as const;
    const id = Number(
      insert.run(row.userId, row.accountId, row.purpose, row.status, row.startsAt, row.endsAt, row.startMs, row.endMs, row.seriesId, row.createdAt, row.updatedAt).lastInsertRowid,
    );
    for (const instrumentId of ids) link.run(id, instrumentId);
    const booking: BookingRow = { id, ...row, lateCancel: false };
    return { booking, instrumentIds: sorted };
  });
}

/** The person is told their booking is confirmed, or that it waits; the managers are asked to decide. */
async function mailNewBookings(deps: ScheduleDeps, em: EntityManager, actor: AuthUser, first: mail.MailBooking, instruments: Instrument[], sessions: number, needsApproval: boolean, now: Date) {
  const names = instruments.map((i) => i.name);
  const c = { publicUrl: deps.config.PUBLIC_URL, tz: deps.config.FACILITY_TZ };
  if (!needsApproval) {
    await enqueueMail(em, now, mail.confirmedMail(actor.email, first, names, c, sessions));
    return;
  }
  await enqueueMail(em, now, mail.requestReceivedMail(actor.email, first, names, c, sessions));
  for (const to of await managerEmails(em)) await enqueueMail(em, now, mail.approvalNeededMail(to, actor.name, first, names, c));
}

/** Books every session of the request, or none: 403 (training, account), 422 (rules) or 409 (taken). */
export async function createBookings(deps: ScheduleDeps, actor: AuthUser, input: CreateBookingParsed): Promise<BookingWithInstruments[]> {
  const start = new Date(input.start);
  const end = new Date(input.end);
  requireLength(start, end, true);
  const tz = deps.config.FACILITY_TZ;
  const sessions = weeklyOccurrences({ start, end, weeks: input.repeatWeeks, tz });

  return serialTransaction(deps.ds, async (em) => {
    const now = deps.now();
    const ids = await resolveInstrumentIds(em, input);
    const instruments = instrumentsInService(em.connection, ids);
    chargeableAccount(em.connection, actor, input.accountId, start);
    const perSession = problemsFor(em.connection, { ownerId: actor.id, instruments, sessions, now, tz });
    if (perSession.some((p) => p.length > 0)) throw seriesError(sessions, perSession, tz);

    const needsApproval = !hasRole(actor, "manager") && instruments.some((i) => i.requiresApproval);
    const seriesId = sessions.length > 1 ? crypto.randomUUID() : null;
    const made = insertSessions(em, actor, input, sessions, ids, { status: needsApproval ? "requested" : "confirmed", seriesId, at: now.toISOString() });
    await audit(em, now, actor.id, needsApproval ? "booking.requested" : "booking.confirmed", "booking", made[0].booking.id, {
      instrumentIds: ids,
      sessions: sessions.length,
      seriesId,
      bookingIds: made.map((m) => m.booking.id),
    });
    await mailNewBookings(deps, em, actor, made[0].booking, instruments, sessions.length, needsApproval, now);
    return made;
  });
}
