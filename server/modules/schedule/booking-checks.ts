/**
 * The checks a booking passes before it is written: the instruments exist and are in service,
 * the account may be charged (Recharge's account policy), and every session keeps the booking
 * rules (shared/domain/booking-rules) and finds its instruments free, cleaning buffers
 * included. They run inside the caller's serialised transaction, on its connection.
 */
import type { DataSource } from "typeorm";
import { checkBookingRules, type BookableHours, type TrainingRecord as DomainTraining } from "@shared/domain/booking-rules";
import { conflicts, MINUTE_MS } from "@shared/domain/intervals";
import { INSTRUMENT_STATUS_LABELS } from "@shared/schemas/instruments";
import type { OccurrenceProblem } from "@shared/schemas/bookings";
import type { Account, Instrument, TrainingRecord } from "../../entities";
import { AppError, RuleBroken, type FieldError } from "../../errors";
import type { AuthUser } from "../../middleware/auth";
import { accountPolicy } from "../recharge";
import { localRange } from "./booking-mail";
import { accountAndMembership, holdersNear, instrumentsByIds, MAX_BOOKING_MS, trainingRecordsOf } from "./booking.queries";

/** One thing wrong with one session: 403 (training), 422 (a rule) or 409 (taken). */
export type Problem = { status: 403 | 409 | 422; path: string; message: string };

export interface Session {
  start: Date;
  end: Date;
}

/** The instruments of these ids, in that order; 422 for unknown ones and ones not in service. */
export function instrumentsInService(ds: DataSource, ids: number[]): Instrument[] {
  const found = instrumentsByIds(ds, ids);
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

/**
 * The account a booking charges: 422 for an unknown account or one closed on the booked day;
 * 403 when Recharge's account policy says the person may not charge it (not a member, or an
 * external customer's person on an internal account without the manager's stated exception).
 */
export function chargeableAccount(ds: DataSource, actor: AuthUser, accountId: number, at: Date): Account {
  const { account, membership } = accountAndMembership(ds, accountId, actor.id);
  if (!account) throw new RuleBroken("Unknown account.", [{ path: "accountId", message: "No such account" }], "unknown_account");
  accountPolicy.authorize(actor, "charge", { account, membership });
  const day = at.toISOString().slice(0, 10);
  if (!account.active || (account.validTo && account.validTo < day) || (account.validFrom && account.validFrom > day)) {
    throw new RuleBroken("This account cannot be charged at that date.", [{ path: "accountId", message: "The account is closed or not yet open" }], "account_closed");
  }
  return account;
}

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

/** Which of these instruments are held by another booking (cleaning buffers included) over [startMs, endMs). */
export function takenInstruments(ds: DataSource, instruments: Instrument[], startMs: number, endMs: number, excludeId: number): Instrument[] {
  const holders = holdersNear(ds, instruments.map((i) => i.id), startMs - MAX_BOOKING_MS, endMs + MAX_BOOKING_MS, excludeId);
  return instruments.filter((i) => conflicts({ start: startMs, end: endMs }, i.cleaningBufferMinutes, holders.filter((h) => h.instrumentId === i.id)).length > 0);
}

/** The rule breaks of one session on one instrument, as problems. */
function ruleProblems(inst: Instrument, s: Session, opts: { now: Date; tz: string; training: TrainingRecord[]; many: boolean }): Problem[] {
  const violations = checkBookingRules({ start: s.start, end: s.end, now: opts.now, tz: opts.tz, rules: instrumentRules(inst), training: bestTraining(opts.training, inst.id) });
  return violations.map((v) => {
    const instrumentSpecific = !["in_past", "end_before_start", "zero_length", "invalid_time"].includes(v.code);
    const training = v.code === "training_missing" || v.code === "training_expired";
    return {
      status: training ? 403 : 422,
      path: training ? "instrumentIds" : v.path,
      message: opts.many && instrumentSpecific ? `${inst.name}: ${v.message}` : v.message,
    };
  });
}

/** Every problem of every session, with the whole series checked against the Schedule at once. */
export function problemsFor(
  ds: DataSource,
  opts: { ownerId: number; instruments: Instrument[]; sessions: Session[]; excludeId?: number; now: Date; tz: string },
): Problem[][] {
  const ids = opts.instruments.map((i) => i.id);
  const training = trainingRecordsOf(ds, opts.ownerId, ids);
  const maxBuffer = Math.max(0, ...opts.instruments.map((i) => i.cleaningBufferMinutes)) * MINUTE_MS;
  const first = Math.min(...opts.sessions.map((s) => s.start.getTime()));
  const last = Math.max(...opts.sessions.map((s) => s.end.getTime()));
  const holders = holdersNear(ds, ids, first - maxBuffer, last + maxBuffer, opts.excludeId);
  const many = opts.instruments.length > 1;

  return opts.sessions.map((s) => {
    const found: Problem[] = [];
    for (const inst of opts.instruments) {
      found.push(...ruleProblems(inst, s, { now: opts.now, tz: opts.tz, training, many }));
      const hit = conflicts({ start: s.start, end: s.end }, inst.cleaningBufferMinutes, holders.filter((h) => h.instrumentId === inst.id));
      if (hit.length) {
        const buffer = inst.cleaningBufferMinutes ? ` (counting its ${inst.cleaningBufferMinutes}-minute cleaning buffer)` : "";
        found.push({ status: 409, path: "start", message: `${inst.name} is already booked then${buffer}` });
      }
    }
    return dedupe(found);
  });
}

/** Turns the problems of one session into the error the contract names: 403, then 422, then 409. */
export function errorFor(problems: Problem[]): AppError {
  const pick = (s: number) => problems.filter((p) => p.status === s).map((p): FieldError => ({ path: p.path, message: p.message }));
  const forbidden = pick(403);
  if (forbidden.length) return new AppError(403, "not_allowed_to_book", forbidden.map((f) => f.message).join("; "), forbidden);
  const broken = pick(422);
  if (broken.length) return new RuleBroken(broken.map((f) => f.message).join("; "), broken, "booking_rule_broken");
  const taken = pick(409);
  return new AppError(409, "slot_taken", taken.map((f) => f.message).join("; "), taken);
}

/** The error for a series with failing sessions: nothing is booked, and each failing session is named. */
export function seriesError(sessions: Session[], perSession: Problem[][], tz: string): AppError {
  if (sessions.length === 1) return errorFor(perSession[0]);
  const failing = perSession.map((p, index) => ({ p, index })).filter((x) => x.p.length > 0);
  const occurrences: OccurrenceProblem[] = failing.map(({ p, index }) => ({
    index,
    start: sessions[index].start.toISOString(),
    end: sessions[index].end.toISOString(),
    status: errorFor(p).status as 403 | 409 | 422,
    reasons: p.map(({ path, message }) => ({ path, message })),
  }));
  const worst = errorFor(failing.flatMap((f) => f.p));
  const detail = `${failing.length} of ${sessions.length} weekly sessions cannot be booked, so none was: ${occurrences
    .map((o) => `session ${o.index + 1} (${localRange(o.start, o.end, tz)}): ${o.reasons.map((r) => r.message).join("; ")}`)
    .join(" | ")}`;
  return new AppError(worst.status, worst.code, detail, worst.errors, { occurrences });
}

/** 422 unless the end comes after the start. */
export function requireLength(start: Date, end: Date, distinguishZero: boolean): void {
  if (end.getTime() > start.getTime()) return;
  const zero = distinguishZero && end.getTime() === start.getTime();
  throw new RuleBroken(
    zero ? "The booking has no length." : "The end must come after the start.",
    [{ path: "end", message: zero ? "The booking has no length" : "The end must come after the start" }],
    zero ? "zero_length" : "end_before_start",
  );
}
