/**
 * Changes to a booking once it exists: move, approve, decline, cancel, check in, check out and
 * no-show. Each is one serialised transaction that reads the booking, asks the booking policy
 * (booking.policy.ts) with the clock, re-checks the Schedule where the change needs it, writes,
 * audits and queues the owner's mail. Creating bookings is booking-create.commands.ts's.
 */
import type { EntityManager } from "typeorm";
import type { MoveBookingInput } from "@shared/schemas/bookings";
import { Booking, type Instrument } from "../../entities";
import { AppError, RuleBroken } from "../../errors";
import { serialTransaction } from "../../db/serial";
import { PolicyDenied } from "../../core/policy";
import { hasRole, type AuthUser } from "../../middleware/auth";
import { audit } from "../../core/audit";
import { enqueueMail } from "../../core/outbox";
import * as mail from "./booking-mail";
import { bookingPolicy, cancelReasonMissing, noShowDenial, type BookingCase } from "./booking.policy";
import { isLateCancel, readBookingSettings } from "./booking-settings";
import { errorFor, instrumentsInService, problemsFor, requireLength, takenInstruments } from "./booking-checks";
import { loadForChange, rolesOf, type BookingForChange, type BookingWithInstruments } from "./booking.queries";
import type { ScheduleDeps } from "./deps";
import { bookingCheckedIn, bookingEnded } from "../runplans";

const mailContext = (deps: ScheduleDeps): mail.MailContext => ({ publicUrl: deps.config.PUBLIC_URL, tz: deps.config.FACILITY_TZ });
const names = (instruments: Instrument[]) => instruments.map((i) => i.name);

/** The booking as the policy judges it now, with the settings' check-in opening. */
function caseOf(em: EntityManager, booking: Booking, now: Date): BookingCase {
  return { booking, nowMs: now.getTime(), checkInEarlyMinutes: readBookingSettings(em.connection).checkInEarlyMinutes };
}

/** Writes a change to a booking and reads it back. */
async function update(em: EntityManager, id: number, now: Date, change: Partial<Omit<Booking, "user" | "account">>): Promise<Booking> {
  await em.update(Booking, id, { ...change, updatedAt: now.toISOString() });
  return em.findOneByOrFail(Booking, { id });
}

/**
 * One change to one booking: load it with its instruments and owner, let `authorize` ask the
 * policy, do the work (which answers the changed booking), and answer it with its instruments.
 */
function changeBooking(
  deps: ScheduleDeps,
  id: number,
  authorize: (c: BookingCase) => void,
  work: (em: EntityManager, found: BookingForChange, now: Date) => Promise<Booking>,
): Promise<BookingWithInstruments> {
  return serialTransaction(deps.ds, async (em) => {
    const now = deps.now();
    const found = await loadForChange(em, id);
    authorize(caseOf(em, found.booking, now));
    const booking = await work(em, found, now);
    return { booking, instrumentIds: found.instruments.map((i) => i.id).sort((a, b) => a - b) };
  });
}

/** Moves a booking that has not started, after checking the new time as a new booking would be. */
export function moveBooking(deps: ScheduleDeps, actor: AuthUser, id: number, input: MoveBookingInput): Promise<BookingWithInstruments> {
  const start = new Date(input.start);
  const end = new Date(input.end);
  return changeBooking(
    deps,
    id,
    (c) => bookingPolicy.authorize(actor, "move", c),
    async (em, { booking, instruments, owner }, now) => {
      requireLength(start, end, false);
      instrumentsInService(em.connection, instruments.map((i) => i.id));
      const [problems] = problemsFor(em.connection, { ownerId: owner.id, instruments, sessions: [{ start, end }], excludeId: booking.id, now, tz: deps.config.FACILITY_TZ });
      if (problems.length) throw errorFor(problems);
      // A move by anyone but a manager (for anyone but a manager) goes back to the approval queue.
      const ownerIsManager = (await rolesOf(em, owner.id)).includes("manager");
      const needsApproval = !hasRole(actor, "manager") && !ownerIsManager && instruments.some((i) => i.requiresApproval);
      const status = needsApproval ? "requested" : booking.status;
      const before = { start: booking.startsAt, end: booking.endsAt, status: booking.status };
      const moved = await update(em, id, now, { startsAt: start.toISOString(), endsAt: end.toISOString(), startMs: start.getTime(), endMs: end.getTime(), status, reminderSentAt: null });
      await audit(em, now, actor.id, "booking.moved", "booking", id, { before, after: { start: moved.startsAt, end: moved.endsAt, status } });
      await enqueueMail(em, now, mail.movedMail(owner.email, moved, names(instruments), mailContext(deps), needsApproval && before.status === "confirmed"));
      return moved;
    },
  );
}

/** The manager confirms a request, unless its instruments have been taken meanwhile (409). */
export function approveBooking(deps: ScheduleDeps, actor: AuthUser, id: number): Promise<BookingWithInstruments> {
  return changeBooking(
    deps,
    id,
    (c) => bookingPolicy.authorize(actor, "approve", c),
    async (em, { booking, instruments, owner }, now) => {
      instrumentsInService(em.connection, instruments.map((i) => i.id));
      const taken = takenInstruments(em.connection, instruments, booking.startMs, booking.endMs, booking.id);
      if (taken.length) throw new AppError(409, "slot_taken", `${taken.map((i) => i.name).join(", ")} is now booked by someone else at that time.`);
      const b = await update(em, id, now, { status: "confirmed", decidedById: actor.id });
      await audit(em, now, actor.id, "booking.approved", "booking", id, { userId: b.userId });
      await enqueueMail(em, now, mail.confirmedMail(owner.email, b, names(instruments), mailContext(deps)));
      return b;
    },
  );
}

/** The manager declines a request with a reason the person receives. */
export function declineBooking(deps: ScheduleDeps, actor: AuthUser, id: number, reason: string): Promise<BookingWithInstruments> {
  return changeBooking(
    deps,
    id,
    (c) => bookingPolicy.authorize(actor, "decline", c),
    async (em, { instruments, owner }, now) => {
      const b = await update(em, id, now, { status: "declined", declineReason: reason, decidedById: actor.id });
      await bookingEnded(em, now, actor.id, id, "The booking was declined.");
      await audit(em, now, actor.id, "booking.declined", "booking", id, { userId: b.userId, reason });
      await enqueueMail(em, now, mail.declinedMail(owner.email, b, names(instruments), reason, mailContext(deps)));
      return b;
    },
  );
}

/** Cancels a booking; a confirmed one cancelled inside the late window is flagged for billing. */
export function cancelBooking(deps: ScheduleDeps, actor: AuthUser, id: number, reason?: string): Promise<BookingWithInstruments> {
  return changeBooking(
    deps,
    id,
    (c) => bookingPolicy.authorize(actor, "cancel", c),
    async (em, { booking, instruments, owner }, now) => {
      const missing = cancelReasonMissing(actor, booking, reason);
      if (missing) throw new RuleBroken(missing.reason, [{ path: "reason", message: "Give a reason" }], missing.code);
      const late = booking.status === "confirmed" && isLateCancel(booking.startMs, now.getTime(), readBookingSettings(em.connection));
      const b = await update(em, id, now, { status: "cancelled", cancelledAt: now.toISOString(), cancelledById: actor.id, cancelReason: reason ?? null, lateCancel: late });
      // Stock a run plan held for this booking goes back to the shelf.
      await bookingEnded(em, now, actor.id, id, "The booking was cancelled.");
      await audit(em, now, actor.id, "booking.cancelled", "booking", id, { userId: b.userId, reason: reason ?? null, lateCancel: late });
      await enqueueMail(em, now, mail.cancelledMail(owner.email, b, names(instruments), mailContext(deps), { byManager: booking.userId !== actor.id, reason, late }));
      return b;
    },
  );
}

/** The owner checks in: the booking is in progress from now (billing uses this time). */
export function checkIn(deps: ScheduleDeps, actor: AuthUser, id: number): Promise<BookingWithInstruments> {
  return changeBooking(
    deps,
    id,
    (c) => bookingPolicy.authorize(actor, "checkIn", c),
    async (em, _found, now) => {
      const b = await update(em, id, now, { status: "in_progress", checkedInAt: now.toISOString() });
      // What a run plan reserved for this booking is used from now: it becomes usage on the booking.
      const stock = await bookingCheckedIn(em, now, actor, id);
      await audit(em, now, actor.id, "booking.checked_in", "booking", id, stock.used || stock.released ? { reservations: stock } : {});
      return b;
    },
  );
}

/** The owner checks out: the booking is completed at this time. */
export function checkOut(deps: ScheduleDeps, actor: AuthUser, id: number): Promise<BookingWithInstruments> {
  return changeBooking(
    deps,
    id,
    (c) => bookingPolicy.authorize(actor, "checkOut", c),
    async (em, _found, now) => {
      const b = await update(em, id, now, { status: "completed", checkedOutAt: now.toISOString() });
      await audit(em, now, actor.id, "booking.checked_out", "booking", id, {});
      return b;
    },
  );
}

/** Records a no-show: by the manager (actor), or by the no-show job (null) after the grace period. */
export function recordNoShow(deps: ScheduleDeps, actor: AuthUser | null, id: number): Promise<BookingWithInstruments> {
  return changeBooking(
    deps,
    id,
    (c) => {
      if (actor) return bookingPolicy.authorize(actor, "noShow", c);
      // The job is not a person: only the booking's state and the clock decide.
      const d = noShowDenial(c);
      if (d) throw new PolicyDenied(d);
    },
    async (em, { instruments, owner }, now) => {
      const b = await update(em, id, now, { status: "no_show" });
      await bookingEnded(em, now, actor?.id ?? null, id, "Nobody checked in (no-show).");
      await audit(em, now, actor?.id ?? null, "booking.no_show", "booking", id, { userId: b.userId, automatic: actor === null });
      await enqueueMail(em, now, mail.noShowMail(owner.email, b, names(instruments), mailContext(deps)));
      return b;
    },
  );
}
