/**
 * The words of Phasebook's booking and training mail. Each function returns a MailMessage for
 * the outbox; times are written in the facility's time zone, with the zone named.
 */
import { DateTime } from "luxon";
import { facilityZone } from "@shared/domain/zones";
import type { MailMessage } from "../../core/outbox";

export interface MailBooking {
  id: number;
  startsAt: string;
  endsAt: string;
  purpose: string;
}

export interface MailContext {
  publicUrl: string;
  tz: string;
}

export function localRange(startIso: string, endIso: string, tz: string): string {
  const s = DateTime.fromISO(startIso, { zone: facilityZone(tz) });
  const e = DateTime.fromISO(endIso, { zone: facilityZone(tz) });
  const sameDay = s.hasSame(e, "day");
  return `${s.toFormat("ccc d LLL yyyy, HH:mm")}–${e.toFormat(sameDay ? "HH:mm" : "ccc d LLL yyyy, HH:mm")} (${tz})`;
}

function lines(...parts: (string | null | undefined | false)[]): string {
  return parts.filter((p) => p !== null && p !== undefined && p !== false).join("\n");
}

function what(b: MailBooking, instruments: string[], c: MailContext): string {
  return lines(`Instruments: ${instruments.join(", ")}`, `When: ${localRange(b.startsAt, b.endsAt, c.tz)}`, b.purpose && `Purpose: ${b.purpose}`);
}

function link(c: MailContext): string {
  return `${c.publicUrl}/bookings`;
}

export function requestReceivedMail(to: string, b: MailBooking, instruments: string[], c: MailContext, sessions = 1): MailMessage {
  return {
    to,
    subject: `Booking request received: ${instruments.join(" + ")}`,
    text: lines(
      "Your booking request was received and waits for the facility manager's approval.",
      sessions > 1 ? `It is a weekly series of ${sessions} sessions; the first is:` : "",
      "",
      what(b, instruments, c),
      "",
      `You will get another message when it is confirmed or declined. Your bookings: ${link(c)}`,
    ),
  };
}

export function approvalNeededMail(to: string, requester: string, b: MailBooking, instruments: string[], c: MailContext): MailMessage {
  return {
    to,
    subject: `Approval needed: ${requester} asks for ${instruments.join(" + ")}`,
    text: lines(`${requester} asked for a booking that needs your approval.`, "", what(b, instruments, c), "", `Approval queue: ${c.publicUrl}/schedule/approvals`),
  };
}

export function confirmedMail(to: string, b: MailBooking, instruments: string[], c: MailContext, sessions = 1): MailMessage {
  return {
    to,
    subject: `Booking confirmed: ${instruments.join(" + ")}`,
    text: lines(
      "Your booking is confirmed.",
      sessions > 1 ? `It is a weekly series of ${sessions} sessions; the first is:` : "",
      "",
      what(b, instruments, c),
      "",
      "Check in when you start and check out when you finish; billing uses those times.",
      `Add it to your calendar: ${c.publicUrl}/api/bookings/${b.id}.ics`,
    ),
  };
}

export function declinedMail(to: string, b: MailBooking, instruments: string[], reason: string, c: MailContext): MailMessage {
  return {
    to,
    subject: `Booking declined: ${instruments.join(" + ")}`,
    text: lines("Your booking request was declined.", "", what(b, instruments, c), "", `Reason: ${reason}`, "", `Find another slot: ${c.publicUrl}/schedule`),
  };
}

export function cancelledMail(
  to: string,
  b: MailBooking,
  instruments: string[],
  c: MailContext,
  opts: { byManager: boolean; reason?: string | null; late: boolean },
): MailMessage {
  return {
    to,
    subject: `Booking cancelled: ${instruments.join(" + ")}`,
    text: lines(
      opts.byManager ? "The facility manager cancelled your booking." : "Your booking is cancelled.",
      "",
      what(b, instruments, c),
      opts.reason ? `Reason: ${opts.reason}` : "",
      opts.late ? "It was cancelled inside the late-cancellation window, so it may be charged under the facility's policy." : "",
    ),
  };
}

export function movedMail(to: string, b: MailBooking, instruments: string[], c: MailContext, needsApproval: boolean): MailMessage {
  return {
    to,
    subject: `Booking moved: ${instruments.join(" + ")}`,
    text: lines(
      needsApproval ? "Your booking was moved and waits for the facility manager's approval again." : "Your booking was moved.",
      "",
      what(b, instruments, c),
    ),
  };
}

export function reminderMail(to: string, b: MailBooking, instruments: string[], c: MailContext): MailMessage {
  return {
    to,
    subject: `Reminder: ${instruments.join(" + ")} tomorrow`,
    text: lines(
      "A reminder of your booking:",
      "",
      what(b, instruments, c),
      "",
      "If you no longer need it, cancel it so someone else can use the instrument.",
      `Your bookings: ${link(c)}`,
    ),
  };
}

export function noShowMail(to: string, b: MailBooking, instruments: string[], c: MailContext): MailMessage {
  return {
    to,
    subject: `Recorded as a no-show: ${instruments.join(" + ")}`,
    text: lines("Nobody checked in to this booking, so it is recorded as a no-show.", "", what(b, instruments, c)),
  };
}

export function trainingExpiringMail(to: string, instrument: string, expiresAt: string, c: MailContext): MailMessage {
  const when = DateTime.fromISO(expiresAt, { zone: c.tz }).toFormat("ccc d LLL yyyy");
  return {
    to,
    subject: `Training on ${instrument} expires on ${when}`,
    text: lines(
      `Your training record for ${instrument} expires on ${when}.`,
      "After that you cannot book it. Ask the facility manager for a refresher before then.",
      `Ask for training: ${c.publicUrl}/training`,
    ),
  };
}

export function outOfServiceMail(to: string, instrument: string, status: string, note: string, b: MailBooking, c: MailContext): MailMessage {
  return {
    to,
    subject: `${instrument} is ${status.toLowerCase()}`,
    text: lines(
      `${instrument} is now ${status.toLowerCase()}. You have a booking on it:`,
      `When: ${localRange(b.startsAt, b.endsAt, c.tz)}`,
      note ? `Note from the facility manager: ${note}` : "",
      "",
      "The facility manager will tell you whether it can go ahead; you may cancel it or book another instrument.",
      `Your bookings: ${link(c)}`,
    ),
  };
}
