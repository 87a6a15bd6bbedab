/**
 * Who may do what to a booking, and when. Every booking route, every command, the Scan page's
 * booking line and every `abilities` flag sent to the client call this and nothing else. The
 * rules are the Schedule's as they were before they moved here:
 *
 * - The person who booked it and the manager see a booking in full; everyone else a busy block.
 * - Cancel: the owner or the manager, while it is requested or confirmed; a member not once it
 *   has started; a manager cancelling someone else's booking says why.
 * - Move: the owner or the manager, while it is requested or confirmed and has not started.
 * - Check in: the owner, of a confirmed booking, from `checkInEarlyMinutes` before its start
 *   until its end. Check out: the owner, of a booking in progress.
 * - Approve (not once it is over) and decline: the manager, of a request.
 * - No-show: the manager (or the no-show job), of a confirmed booking that has started.
 */
import type { BookingStatus } from "@shared/schemas/bookings";
import { MINUTE_MS } from "@shared/domain/intervals";
import { definePolicy, deny, type Denial } from "../../core/policy";
import { hasRole, type AuthUser } from "../../middleware/auth";

/** What the policy needs to know about a booking (a row, an entity or a DTO will do). */
export interface BookingFacts {
  id: number;
  userId: number;
  status: BookingStatus;
  startMs: number;
  endMs: number;
}

/** A booking as the policy judges it: the booking, the moment, and when check-in opens. */
export interface BookingCase {
  booking: BookingFacts;
  nowMs: number;
  /** The booking settings' check-in opening, minutes before the start. */
  checkInEarlyMinutes: number;
}

const isManager = (a: AuthUser) => hasRole(a, "manager");
const owns = (a: AuthUser, b: BookingFacts) => b.userId === a.id;
const stateWord = (s: BookingStatus) => s.replace("_", " ");
const OPEN: readonly BookingStatus[] = ["requested", "confirmed"];

/** The owner and the manager see a booking in full; everyone else sees a busy block. */
export function seesInFull(a: AuthUser, b: Pick<BookingFacts, "userId">): boolean {
  return b.userId === a.id || isManager(a);
}

const ownerOrManager = (verb: string) => (a: AuthUser, b: BookingFacts) =>
  owns(a, b) || isManager(a) ? null : deny(403, "not_your_booking", `Only the person who booked it or a manager may ${verb} this booking.`);

const ownerOnly = (verb: string) => (a: AuthUser, b: BookingFacts) => (owns(a, b) ? null : deny(403, "not_your_booking", `Only the person who booked it may ${verb}.`));

const managerOnly = (verb: string) => (a: AuthUser) => (isManager(a) ? null : deny(403, "manager_only", `Only the facility manager may ${verb} a booking.`));

/** A request waiting for the manager's decision. */
function waitingForDecision(b: BookingFacts): Denial | null {
  return b.status === "requested" ? null : deny(409, "not_requested", `This booking is ${stateWord(b.status)}, not waiting for approval.`);
}

/** Whether a booking can be recorded as a no-show now: confirmed, nobody checked in, and started. */
export function noShowDenial({ booking: b, nowMs }: BookingCase): Denial | null {
  if (b.status !== "confirmed") {
    return deny(409, "not_confirmed", `This booking is ${stateWord(b.status)}; only a confirmed booking nobody checked in to can be a no-show.`);
  }
  return b.startMs > nowMs ? deny(422, "not_started", "The booking has not started yet.") : null;
}

export const bookingPolicy = definePolicy<"cancel" | "move" | "checkIn" | "checkOut" | "approve" | "decline" | "noShow", AuthUser, BookingCase>({
  cancel: (a, { booking: b, nowMs }) => {
    const whose = ownerOrManager("cancel")(a, b);
    if (whose) return whose;
    if (!OPEN.includes(b.status)) return deny(409, "not_cancellable", `This booking is ${stateWord(b.status)} and cannot be cancelled.`);
    if (!isManager(a) && b.startMs <= nowMs) return deny(422, "already_started", "The booking has started; ask the facility manager to cancel it.");
    return null;
  },
  move: (a, { booking: b, nowMs }) =>
    ownerOrManager("move")(a, b) ??
    (OPEN.includes(b.status) && b.startMs > nowMs ? null : deny(409, "booking_started", "Only a booking that has not started may be moved.")),
  checkIn: (a, { booking: b, nowMs, checkInEarlyMinutes }) => {
    const whose = ownerOnly("check in")(a, b);
    if (whose) return whose;
    if (b.status !== "confirmed") return deny(409, "not_confirmed", `This booking is ${stateWord(b.status)}; only a confirmed booking can be checked in.`);
    if (nowMs < b.startMs - checkInEarlyMinutes * MINUTE_MS) return deny(422, "too_early", `Check-in opens ${checkInEarlyMinutes} minutes before the start.`);
    if (nowMs >= b.endMs) return deny(422, "too_late", "The booking is over.");
    return null;
  },
  checkOut: (a, { booking: b }) => ownerOnly("check out")(a, b) ?? (b.status === "in_progress" ? null : deny(409, "not_in_progress", "Check in before checking out.")),
  approve: (a, { booking: b, nowMs }) =>
    managerOnly("approve")(a) ?? waitingForDecision(b) ?? (b.endMs <= nowMs ? deny(422, "booking_over", "This booking is already over.") : null),
  decline: (a, { booking: b }) => managerOnly("decline")(a) ?? waitingForDecision(b),
  noShow: (a, c) => managerOnly("record a no-show for")(a) ?? noShowDenial(c),
});

export type BookingPolicyAction = (typeof bookingPolicy.actions)[number];

/** A manager cancelling someone else's booking gives the person a reason (422 naming the field). */
export function cancelReasonMissing(a: AuthUser, b: BookingFacts, reason: string | undefined): Denial | null {
  return isManager(a) && !owns(a, b) && !reason ? deny(422, "reason_required", "Give the person a reason for cancelling their booking.") : null;
}
