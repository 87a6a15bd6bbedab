/**
 * Bookings: create (single, multi-instrument or weekly series, all-or-nothing), move, approve,
 * decline, cancel, check-in/out and no-show. Every write that checks the Schedule and then
 * changes it runs inside one serialTransaction, so of N simultaneous requests for a slot exactly
 * one wins. The rules themselves are the pure functions of shared/domain.
 */
import crypto from "node:crypto";
import { In, type DataSource, type EntityManager } from "typeorm";
import { checkBookingRules, type BookableHours, type TrainingRecord as DomainTraining } from "@shared/domain/booking-rules";
import { conflicts, MINUTE_MS } from "@shared/domain/intervals";
import { weeklyOccurrences } from "@shared/domain/recurrence";
import type { BookingListQuery, BookingPolicy, CreateBookingParsed, MoveBookingInput, OccurrenceProblem } from "@shared/schemas/bookings";
import { INSTRUMENT_STATUS_LABELS } from "@shared/schemas/instruments";
import type { Config } from "../config";
import { Account, Booking, Instrument, SetupInstrument, TrainingRecord, User, UserRole } from "../entities";
import { UNTOUCHED_BOOKING } from "../entities/booking.entity";
import { AppError, BadRequest, Conflict, Forbidden, NotFound, RuleBroken, type FieldError } from "../errors";
import { serialTransaction } from "../db/serial";
import { prepared, readEntities, readEntity } from "../db/prepared";
import { hasRole, type AuthUser } from "../middleware/auth";
import { audit } from "../core/audit";
import { enqueueMail } from "../core/outbox";
import { readBookingPolicy } from "./booking-policy";
import * as mail from "./booking-mail";

/** No booking may be longer than a week (the instrument form's ceiling), which bounds window queries. */
export const MAX_BOOKING_MS = 7 * 24 * 60 * MINUTE_MS;

const HOLDING = "b.status NOT IN ('declined','cancelled')";

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

export interface BookingServiceDeps {
  ds: DataSource;
  now: () => Date;
  config: Pick<Config, "FACILITY_TZ" | "PUBLIC_URL">;
}

type Problem = { status: 403 | 409 | 422; path: string; message: string };

function instrumentRules(i: Instrument) {
  return {
    minLeadMinutes: i.minLeadMinutes,
    maxLengthMinutes: i.maxLengthMinutes,
    bookableHours: JSON.parse(i.bookableHours) as BookableHours,
    afterHoursAllowed: i.afterHoursAllowed,
    trainingRequired: i.trainingRequired,
  };
}

/** The record that helps the person most: not revoked, latest expiry (null = never expires). */
function bestTraining(records: TrainingRecord[], instrumentId: number): DomainTraining | null {
  const live = records.filter((r) => r.instrumentId === instrumentId && !r.revokedAt);
  if (live.length === 0) return null;
  live.sort((a, b) => (a.expiresAt === null ? -1 : b.expiresAt === null ? 1 : b.expiresAt.localeCompare(a.expiresAt)));
  const r = live[0];
  return { expiresAt: r.expiresAt ? new Date(r.expiresAt) : null, afterHours: r.afterHours, revoked: false };
}

function dedupe(problems: Problem[]): Problem[] {
  const seen = new Set<string>();
  return problems.filter((p) => {
    const k = `${p.status}|${p.path}|${p.message}`;
    if (seen.has(k)) return false;
    seen.add(k);
    return true;
  });
}

/** Turns the problems of one session into the error the contract names: 403, then 422, then 409. */
function errorFor(problems: Problem[]): AppError {
  const pick = (s: number) => problems.filter((p) => p.status === s).map((p): FieldError => ({ path: p.path, message: p.message }));
  const forbidden = pick(403);
  if (forbidden.length) return new AppError(403, "not_allowed_to_book", forbidden.map((f) => f.message).join("; "), forbidden);
  const broken = pick(422);
  if (broken.length) return new RuleBroken(broken.map((f) => f.message).join("; "), broken, "booking_rule_broken");
  const taken = pick(409);
  return new AppError(409, "slot_taken", taken.map((f) => f.message).join("; "), taken);
}

export function createBookingService(deps: BookingServiceDeps) {
  const { ds } = deps;
  const tz = deps.config.FACILITY_TZ;
  const mailCtx = { publicUrl: deps.config.PUBLIC_URL, tz };

  async function instrumentsFor(em: EntityManager, ids: number[]): Promise<Instrument[]> {
    const found = readEntities(em.connection, Instrument, `SELECT * FROM instruments WHERE id IN (SELECT value FROM json_each(?))`, JSON.stringify(ids));
    const missing = ids.filter((id) => !found.some((i) => i.id === id));
    if (missing.length) {
      throw new RuleBroken(`Unknown instrument ${missing.join(", ")}.`, [{ path: "instrumentIds", message: `No instrument with id ${missing.join(", ")}` }], "unknown_instrument");
    }
    const out = found.filter((i) => i.status !== "in_service");
    if (out.length) {
      const message = out.map((i) => `${i.name} is ${INSTRUMENT_STATUS_LABELS[i.status].toLowerCase()}`).join("; ");
      throw new RuleBroken(message, [{ path: "instrumentIds", message }], "instrument_not_in_service");
    }
    return ids.map((id) => found.find((i) => i.id === id)!);
  }

  function instrumentIdsOf(em: EntityManager, bookingIds: number[]): Map<number, number[]> {
    const map = new Map<number, number[]>();
    if (bookingIds.length === 0) return map;
    // One statement for any number of ids: the list travels as one JSON array.
    const rows = prepared(
      em.connection,
      `SELECT bookingId, instrumentId FROM booking_instruments WHERE bookingId IN (SELECT value FROM json_each(?)) ORDER BY instrumentId`,
    ).all(JSON.stringify(bookingIds)) as { bookingId: number; instrumentId: number }[];
    for (const r of rows) {
      const list = map.get(r.bookingId);
      if (list) list.push(r.instrumentId);
      else map.set(r.bookingId, [r.instrumentId]);
    }
    return map;
  }

  /** Bookings holding a slot on these instruments near [fromMs, toMs), for the overlap check. */
  function holdersNear(em: EntityManager, instrumentIds: number[], fromMs: number, toMs: number, excludeId?: number) {
    const marks = instrumentIds.map(() => "?").join(",");
    // The booking's times are copied onto booking_instruments (see the entity), so this walks
    // each instrument's (instrumentId, startMs) index over the narrow window only; CROSS JOIN
    // keeps that table as the outer loop.
    return prepared(
      em.connection,
      `SELECT bi.bookingId AS id, bi.startMs AS start, bi.endMs AS end, bi.instrumentId FROM booking_instruments bi CROSS JOIN bookings b ON b.id = bi.bookingId
        WHERE bi.instrumentId IN (${marks}) AND bi.startMs < ? AND bi.endMs > ? AND bi.startMs > ? AND ${HOLDING} AND b.id <> ?`,
    ).all(...instrumentIds, toMs, fromMs, fromMs - MAX_BOOKING_MS, excludeId ?? -1) as { id: number; start: number; end: number; instrumentId: number }[];
  }

  /** Every problem of every session, with the whole series checked against the Schedule at once. */
  async function problemsFor(
    em: EntityManager,
    opts: {
      ownerId: number;
      instruments: Instrument[];
      sessions: { start: Date; end: Date }[];
      exemptFromTraining: boolean;
      excludeId?: number;
      now: Date;
    },
  ): Promise<Problem[][]> {
    const ids = opts.instruments.map((i) => i.id);
    const training = readEntities(
      em.connection,
      TrainingRecord,
      `SELECT * FROM training_records WHERE userId = ? AND instrumentId IN (SELECT value FROM json_each(?))`,
      opts.ownerId,
      JSON.stringify(ids),
    );
    const maxBuffer = Math.max(0, ...opts.instruments.map((i) => i.cleaningBufferMinutes)) * MINUTE_MS;
    const first = Math.min(...opts.sessions.map((s) => s.start.getTime()));
    const last = Math.max(...opts.sessions.map((s) => s.end.getTime()));
    const holders = holdersNear(em, ids, first - maxBuffer, last + maxBuffer, opts.excludeId);
    const many = opts.instruments.length > 1;

    return opts.sessions.map((s) => {
      const found: Problem[] = [];
      for (const inst of opts.instruments) {
        const rules = instrumentRules(inst);
        const violations = checkBookingRules({
          start: s.start,
          end: s.end,
          now: opts.now,
          tz,
          rules: opts.exemptFromTraining ? { ...rules, trainingRequired: false } : rules,
          training: bestTraining(training, inst.id),
        });
        for (const v of violations) {
          const instrumentSpecific = !["in_past", "end_before_start", "zero_length", "invalid_time"].includes(v.code);
          const training = v.code === "training_missing" || v.code === "training_expired";
          found.push({
            status: training ? 403 : 422,
            path: training ? "instrumentIds" : v.path,
            message: many && instrumentSpecific ? `${inst.name}: ${v.message}` : v.message,
          });
        }
        const mine = holders.filter((h) => h.instrumentId === inst.id);
        const hit = conflicts({ start: s.start, end: s.end }, inst.cleaningBufferMinutes, mine);
        if (hit.length) {
          const buffer = inst.cleaningBufferMinutes ? ` (counting its ${inst.cleaningBufferMinutes}-minute cleaning buffer)` : "";
          found.push({ status: 409, path: "start", message: `${inst.name} is already booked then${buffer}` });
        }
      }
      return dedupe(found);
    });
  }

  async function mayCharge(em: EntityManager, actor: AuthUser, accountId: number, at: Date): Promise<Account> {
    const account = readEntity(em.connection, Account, `SELECT * FROM accounts WHERE id = ?`, accountId);
    if (!account) throw new RuleBroken("Unknown account.", [{ path: "accountId", message: "No such account" }], "unknown_account");
    const member = prepared(em.connection, `SELECT 1 AS yes FROM account_members WHERE accountId = ? AND userId = ?`).get(accountId, actor.id) !== undefined;
    const allowed = hasRole(actor, "manager") || member || account.ownerId === actor.id;
    if (!allowed) throw new Forbidden("You may not charge this account.", "account_not_allowed");
    const day = at.toISOString().slice(0, 10);
    if (!account.active || (account.validTo && account.validTo < day) || (account.validFrom && account.validFrom > day)) {
      throw new RuleBroken("This account cannot be charged at that date.", [{ path: "accountId", message: "The account is closed or not yet open" }], "account_closed");
    }
    return account;
  }

  async function resolveInstrumentIds(em: EntityManager, input: CreateBookingParsed): Promise<number[]> {
    const ids = new Set(input.instrumentIds ?? []);
    if (input.setupId !== undefined) {
      const rows = await em.findBy(SetupInstrument, { setupId: input.setupId });
      if (rows.length === 0) throw new RuleBroken("Unknown setup.", [{ path: "setupId", message: "No such setup" }], "unknown_setup");
      for (const r of rows) ids.add(r.instrumentId);
    }
    return [...ids];
  }

  async function managerEmails(em: EntityManager): Promise<string[]> {
    const rows: { email: string }[] = await em.query(
      `SELECT u.email FROM users u JOIN user_roles r ON r.userId = u.id WHERE r.role = 'manager' AND u.active = 1`,
    );
    return rows.map((r) => r.email);
  }

  async function loadForChange(em: EntityManager, id: number): Promise<{ booking: Booking; instruments: Instrument[]; owner: User }> {
    const booking = await em.findOneBy(Booking, { id });
    if (!booking) throw new NotFound("That booking");
    const ids = instrumentIdsOf(em, [id]).get(id) ?? [];
    const instruments = await em.findBy(Instrument, { id: In(ids) });
    const owner = (await em.findOneBy(User, { id: booking.userId }))!;
    return { booking, instruments, owner };
  }

  function names(instruments: Instrument[]): string[] {
    return instruments.map((i) => i.name);
  }

  return {
    async create(actor: AuthUser, input: CreateBookingParsed): Promise<BookingWithInstruments[]> {
      const start = new Date(input.start);
      const end = new Date(input.end);
      if (end.getTime() <= start.getTime()) {
        const zero = end.getTime() === start.getTime();
        throw new RuleBroken(zero ? "The booking has no length." : "The end must come after the start.", [
          { path: "end", message: zero ? "The booking has no length" : "The end must come after the start" },
        ], zero ? "zero_length" : "end_before_start");
      }
      const sessions = weeklyOccurrences({ start, end, weeks: input.repeatWeeks, tz });

      return serialTransaction(ds, async (em) => {
        const now = deps.now();
        const ids = await resolveInstrumentIds(em, input);
        const instruments = await instrumentsFor(em, ids);
        await mayCharge(em, actor, input.accountId, start);
        const isManager = hasRole(actor, "manager");
        const perSession = await problemsFor(em, { ownerId: actor.id, instruments, sessions, exemptFromTraining: false, now });

        const failing = perSession.map((p, index) => ({ p, index })).filter((x) => x.p.length > 0);
        if (failing.length) {
          if (sessions.length === 1) throw errorFor(perSession[0]);
          const occurrences: OccurrenceProblem[] = failing.map(({ p, index }) => ({
            index,
            start: sessions[index].start.toISOString(),
            end: sessions[index].end.toISOString(),
            status: errorFor(p).status as 403 | 409 | 422,
            reasons: p.map(({ path, message }) => ({ path, message })),
          }));
          const worst = errorFor(failing.flatMap((f) => f.p));
          const detail = `${failing.length} of ${sessions.length} weekly sessions cannot be booked, so none was: ${occurrences
            .map((o) => `session ${o.index + 1} (${mail.localRange(o.start, o.end, tz)}): ${o.reasons.map((r) => r.message).join("; ")}`)
            .join(" | ")}`;
          throw new AppError(worst.status, worst.code, detail, worst.errors, { occurrences });
        }

        const needsApproval = !isManager && instruments.some((i) => i.requiresApproval);
        const status = needsApproval ? "requested" : "confirmed";
        const seriesId = sessions.length > 1 ? crypto.randomUUID() : null;
        const iso = now.toISOString();
        const made: BookingWithInstruments[] = [];
        for (const s of sessions) {
          const row = {
            userId: actor.id,
            accountId: input.accountId,
            purpose: input.purpose,
            status,
            startsAt: s.start.toISOString(),
            endsAt: s.end.toISOString(),
            startMs: s.start.getTime(),
            endMs: s.end.getTime(),
            ...UNTOUCHED_BOOKING,
            seriesId,
            createdAt: iso,
            updatedAt: iso,
          } as const;
          // Prepared inserts on the transaction's connection, and the row as written rather than
          // read back: the booking create is the Schedule's hottest write.
          const id = Number(
            prepared(
              em.connection,
              `INSERT INTO bookings (userId, accountId, purpose, status, startsAt, endsAt, startMs, endMs, seriesId, lateCancel, createdAt, updatedAt)
               VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, 0, ?, ?)`,
            ).run(row.userId, row.accountId, row.purpose, row.status, row.startsAt, row.endsAt, row.startMs, row.endMs, row.seriesId, row.createdAt, row.updatedAt)
              .lastInsertRowid,
          );
          const link = prepared(em.connection, `INSERT INTO booking_instruments (bookingId, instrumentId) VALUES (?, ?)`);
          for (const instrumentId of ids) link.run(id, instrumentId);
          const booking: BookingRow = { id, ...row, lateCancel: false };
          made.push({ booking, instrumentIds: [...ids].sort((a, b) => a - b) });
        }
        await audit(em, now, actor.id, needsApproval ? "booking.requested" : "booking.confirmed", "booking", made[0].booking.id, {
          instrumentIds: ids,
          sessions: sessions.length,
          seriesId,
          bookingIds: made.map((m) => m.booking.id),
        });
        const first = made[0].booking;
        if (needsApproval) {
          await enqueueMail(em, now, mail.requestReceivedMail(actor.email, first, names(instruments), mailCtx, sessions.length));
          for (const to of await managerEmails(em)) {
            await enqueueMail(em, now, mail.approvalNeededMail(to, actor.name, first, names(instruments), mailCtx));
          }
        } else {
          await enqueueMail(em, now, mail.confirmedMail(actor.email, first, names(instruments), mailCtx, sessions.length));
        }
        return made;
      });
    },

    async move(actor: AuthUser, id: number, input: MoveBookingInput): Promise<BookingWithInstruments> {
      const start = new Date(input.start);
      const end = new Date(input.end);
      return serialTransaction(ds, async (em) => {
        const now = deps.now();
        const { booking, instruments, owner } = await loadForChange(em, id);
        const isManager = hasRole(actor, "manager");
        if (booking.userId !== actor.id && !isManager) throw new Forbidden("Only the person who booked it or a manager may move this booking.");
        if (!["requested", "confirmed"].includes(booking.status) || booking.startMs <= now.getTime()) {
          throw new Conflict("Only a booking that has not started may be moved.", "booking_started");
        }
        if (end.getTime() <= start.getTime()) {
          throw new RuleBroken("The end must come after the start.", [{ path: "end", message: "The end must come after the start" }], "end_before_start");
        }
        await instrumentsFor(em, instruments.map((i) => i.id));
        const ownerRoles = (await em.findBy(UserRole, { userId: owner.id })).map((r) => r.role);
        const [problems] = await problemsFor(em, {
          ownerId: owner.id,
          instruments,
          sessions: [{ start, end }],
          exemptFromTraining: false,
          excludeId: booking.id,
          now,
        });
        if (problems.length) throw errorFor(problems);
        const needsApproval = !isManager && !ownerRoles.includes("manager") && instruments.some((i) => i.requiresApproval);
        const status = needsApproval ? "requested" : booking.status;
        const before = { start: booking.startsAt, end: booking.endsAt, status: booking.status };
        await em.update(Booking, booking.id, {
          startsAt: start.toISOString(),
          endsAt: end.toISOString(),
          startMs: start.getTime(),
          endMs: end.getTime(),
          status,
          reminderSentAt: null,
          updatedAt: now.toISOString(),
        });
        const moved = await em.findOneByOrFail(Booking, { id });
        await audit(em, now, actor.id, "booking.moved", "booking", id, { before, after: { start: moved.startsAt, end: moved.endsAt, status } });
        await enqueueMail(em, now, mail.movedMail(owner.email, moved, names(instruments), mailCtx, needsApproval && before.status === "confirmed"));
        return { booking: moved, instrumentIds: instruments.map((i) => i.id).sort((a, b) => a - b) };
      });
    },

    async approve(actor: AuthUser, id: number): Promise<BookingWithInstruments> {
      return serialTransaction(ds, async (em) => {
        const now = deps.now();
        const { booking, instruments, owner } = await loadForChange(em, id);
        if (booking.status !== "requested") throw new Conflict(`This booking is ${booking.status.replace("_", " ")}, not waiting for approval.`, "not_requested");
        if (booking.endMs <= now.getTime()) throw new RuleBroken("This booking is already over.", [{ path: "start", message: "The booking is in the past" }]);
        await instrumentsFor(em, instruments.map((i) => i.id));
        const holders = holdersNear(em, instruments.map((i) => i.id), booking.startMs - MAX_BOOKING_MS, booking.endMs + MAX_BOOKING_MS, booking.id);
        const taken = instruments.filter(
          (i) => conflicts({ start: booking.startMs, end: booking.endMs }, i.cleaningBufferMinutes, holders.filter((h) => h.instrumentId === i.id)).length > 0,
        );
        if (taken.length) throw new AppError(409, "slot_taken", `${taken.map((i) => i.name).join(", ")} is now booked by someone else at that time.`);
        await em.update(Booking, id, { status: "confirmed", decidedById: actor.id, updatedAt: now.toISOString() });
        const b = await em.findOneByOrFail(Booking, { id });
        await audit(em, now, actor.id, "booking.approved", "booking", id, { userId: b.userId });
        await enqueueMail(em, now, mail.confirmedMail(owner.email, b, names(instruments), mailCtx));
        return { booking: b, instrumentIds: instruments.map((i) => i.id).sort((a, c) => a - c) };
      });
    },

    async decline(actor: AuthUser, id: number, reason: string): Promise<BookingWithInstruments> {
      return serialTransaction(ds, async (em) => {
        const now = deps.now();
        const { booking, instruments, owner } = await loadForChange(em, id);
        if (booking.status !== "requested") throw new Conflict(`This booking is ${booking.status.replace("_", " ")}, not waiting for approval.`, "not_requested");
        await em.update(Booking, id, { status: "declined", declineReason: reason, decidedById: actor.id, updatedAt: now.toISOString() });
        const b = await em.findOneByOrFail(Booking, { id });
        await audit(em, now, actor.id, "booking.declined", "booking", id, { userId: b.userId, reason });
        await enqueueMail(em, now, mail.declinedMail(owner.email, b, names(instruments), reason, mailCtx));
        return { booking: b, instrumentIds: instruments.map((i) => i.id).sort((a, c) => a - c) };
      });
    },

    async cancel(actor: AuthUser, id: number, reason?: string): Promise<BookingWithInstruments> {
      return serialTransaction(ds, async (em) => {
        const now = deps.now();
        const policy = await readBookingPolicy(em);
        const { booking, instruments, owner } = await loadForChange(em, id);
        const isManager = hasRole(actor, "manager");
        const isOwner = booking.userId === actor.id;
        if (!isOwner && !isManager) throw new Forbidden("Only the person who booked it or a manager may cancel this booking.");
        if (!["requested", "confirmed"].includes(booking.status)) {
          throw new Conflict(`This booking is ${booking.status.replace("_", " ")} and cannot be cancelled.`, "not_cancellable");
        }
        if (!isManager && booking.startMs <= now.getTime()) {
          throw new RuleBroken("The booking has started; ask the facility manager to cancel it.", [{ path: "start", message: "Already started" }], "already_started");
        }
        if (isManager && !isOwner && !reason) {
          throw new RuleBroken("Give the person a reason for cancelling their booking.", [{ path: "reason", message: "Give a reason" }]);
        }
        const late = booking.status === "confirmed" && isLateCancel(booking.startMs, now.getTime(), policy);
        await em.update(Booking, id, {
          status: "cancelled",
          cancelledAt: now.toISOString(),
          cancelledById: actor.id,
          cancelReason: reason ?? null,
          lateCancel: late,
          updatedAt: now.toISOString(),
        });
        const b = await em.findOneByOrFail(Booking, { id });
        await audit(em, now, actor.id, "booking.cancelled", "booking", id, { userId: b.userId, reason: reason ?? null, lateCancel: late });
        await enqueueMail(em, now, mail.cancelledMail(owner.email, b, names(instruments), mailCtx, { byManager: !isOwner, reason, late }));
        return { booking: b, instrumentIds: instruments.map((i) => i.id).sort((a, c) => a - c) };
      });
    },

    async checkIn(actor: AuthUser, id: number): Promise<BookingWithInstruments> {
      return serialTransaction(ds, async (em) => {
        const now = deps.now();
        const policy = await readBookingPolicy(em);
        const { booking, instruments } = await loadForChange(em, id);
        if (booking.userId !== actor.id) throw new Forbidden("Only the person who booked it may check in.");
        if (booking.status !== "confirmed") throw new Conflict(`This booking is ${booking.status.replace("_", " ")}; only a confirmed booking can be checked in.`, "not_confirmed");
        const t = now.getTime();
        if (t < booking.startMs - policy.checkInEarlyMinutes * MINUTE_MS) {
          throw new RuleBroken(`Check-in opens ${policy.checkInEarlyMinutes} minutes before the start.`, [{ path: "start", message: "Too early to check in" }], "too_early");
        }
        if (t >= booking.endMs) throw new RuleBroken("The booking is over.", [{ path: "end", message: "The booking has ended" }], "too_late");
        await em.update(Booking, id, { status: "in_progress", checkedInAt: now.toISOString(), updatedAt: now.toISOString() });
        const b = await em.findOneByOrFail(Booking, { id });
        await audit(em, now, actor.id, "booking.checked_in", "booking", id, {});
        return { booking: b, instrumentIds: instruments.map((i) => i.id).sort((a, c) => a - c) };
      });
    },

    async checkOut(actor: AuthUser, id: number): Promise<BookingWithInstruments> {
      return serialTransaction(ds, async (em) => {
        const now = deps.now();
        const { booking, instruments } = await loadForChange(em, id);
        if (booking.userId !== actor.id) throw new Forbidden("Only the person who booked it may check out.");
        if (booking.status !== "in_progress") throw new Conflict("Check in before checking out.", "not_in_progress");
        await em.update(Booking, id, { status: "completed", checkedOutAt: now.toISOString(), updatedAt: now.toISOString() });
        const b = await em.findOneByOrFail(Booking, { id });
        await audit(em, now, actor.id, "booking.checked_out", "booking", id, {});
        return { booking: b, instrumentIds: instruments.map((i) => i.id).sort((a, c) => a - c) };
      });
    },

    async noShow(actor: AuthUser | null, id: number): Promise<BookingWithInstruments> {
      return serialTransaction(ds, async (em) => {
        const now = deps.now();
        const { booking, instruments, owner } = await loadForChange(em, id);
        if (booking.status !== "confirmed") throw new Conflict(`This booking is ${booking.status.replace("_", " ")}; only a confirmed booking nobody checked in to can be a no-show.`, "not_confirmed");
        if (booking.startMs > now.getTime()) throw new RuleBroken("The booking has not started yet.", [{ path: "start", message: "Not started yet" }], "not_started");
        await em.update(Booking, id, { status: "no_show", updatedAt: now.toISOString() });
        const b = await em.findOneByOrFail(Booking, { id });
        await audit(em, now, actor?.id ?? null, "booking.no_show", "booking", id, { userId: b.userId, automatic: actor === null });
        await enqueueMail(em, now, mail.noShowMail(owner.email, b, names(instruments), mailCtx));
        return { booking: b, instrumentIds: instruments.map((i) => i.id).sort((a, c) => a - c) };
      });
    },

    async get(id: number): Promise<BookingWithInstruments> {
      const booking = await ds.getRepository(Booking).findOneBy({ id });
      if (!booking) throw new NotFound("That booking");
      const ids = instrumentIdsOf(ds.manager, [id]).get(id) ?? [];
      return { booking, instrumentIds: ids };
    },

    /** Bookings overlapping a window (or the caller's own), newest state, with their instruments. */
    async list(actor: AuthUser, q: BookingListQuery): Promise<{ items: BookingWithInstruments[]; total: number }> {
      if (!q.mine && (!q.from || !q.to)) {
        throw new BadRequest("Give a window with from and to, or ask for mine=true.", [
          ...(q.from ? [] : [{ path: "query.from", message: "Required unless mine=true" }]),
          ...(q.to ? [] : [{ path: "query.to", message: "Required unless mine=true" }]),
        ]);
      }
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
      const from = oneInstrumentWindow ? "booking_instruments bi CROSS JOIN bookings b ON b.id = bi.bookingId" : "bookings b";
      const clause = where.length ? `WHERE ${where.join(" AND ")}` : "";
      // One instrument's window comes out of its index already in time order.
      const order = q.mine && !q.from ? "b.startMs DESC" : oneInstrumentWindow ? "bi.startMs ASC" : "b.startMs ASC, b.id ASC";
      // Prepared and cached per shape (the Schedule asks for the same few shapes all day), and
      // only the columns a booking is shown with: turning columns into JS values is the cost.
      const rows = prepared(ds, `SELECT ${BOOKING_ROW_COLUMNS} FROM ${from} ${clause} ORDER BY ${order} LIMIT ? OFFSET ?`).all(...args, q.limit, q.offset) as BookingRow[];
      const total =
        rows.length < q.limit && q.offset === 0
          ? rows.length
          : (prepared(ds, `SELECT COUNT(*) n FROM ${from} ${clause}`).get(...args) as { n: number }).n;
      const map = instrumentIdsOf(ds.manager, rows.map((r) => r.id));
      return { items: rows.map((r) => ({ booking: r, instrumentIds: map.get(r.id) ?? [] })), total };
    },

    async policy(): Promise<BookingPolicy> {
      return readBookingPolicy(ds.manager);
    },
  };
}

/** Cancelling a confirmed booking less than `lateCancelHours` before its start is late. */
export function isLateCancel(startMs: number, nowMs: number, policy: Pick<BookingPolicy, "lateCancelHours">): boolean {
  return startMs - nowMs < policy.lateCancelHours * 60 * MINUTE_MS;
}

export type BookingService = ReturnType<typeof createBookingService>;
