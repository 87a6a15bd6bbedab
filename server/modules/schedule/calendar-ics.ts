/**
 * iCalendar (RFC 5545) for Phasebook bookings: the per-person secret feed and a single
 * booking's .ics. Times are written in UTC (DTSTART/DTEND with "Z"), so a calendar program
 * needs no VTIMEZONE to place them; DTEND is the booking's exclusive end (RFC 5545 §3.6.1).
 */
import ical, { ICalEventStatus } from "ical-generator";
import { BOOKING_STATUS_LABELS, type BookingStatus } from "@shared/schemas/bookings";

export interface CalendarBooking {
  id: number;
  status: BookingStatus;
  startsAt: string;
  endsAt: string;
  purpose: string;
  updatedAt: string;
  createdAt: string;
  instruments: string[];
}

function statusOf(s: BookingStatus): ICalEventStatus {
  if (s === "requested") return ICalEventStatus.TENTATIVE;
  if (s === "cancelled" || s === "declined") return ICalEventStatus.CANCELLED;
  return ICalEventStatus.CONFIRMED;
}

export function bookingsCalendar(opts: { name: string; host: string; publicUrl: string; bookings: CalendarBooking[]; stamp: Date; location?: string }): string {
  const cal = ical({ name: opts.name, prodId: { company: "Phasebook", product: "Phasebook", language: "EN" } });
  for (const b of opts.bookings) {
    const what = b.instruments.join(" + ");
    cal.createEvent({
      // A stable UID per booking lets calendar programs update the same event when it moves.
      id: `booking-${b.id}@${opts.host}`,
      start: new Date(b.startsAt),
      end: new Date(b.endsAt),
      stamp: opts.stamp,
      created: new Date(b.createdAt),
      lastModified: new Date(b.updatedAt),
      summary: `${what} (${BOOKING_STATUS_LABELS[b.status]})`,
      description: [b.purpose && `Purpose: ${b.purpose}`, `State: ${BOOKING_STATUS_LABELS[b.status]}`, `Phasebook: ${opts.publicUrl}/bookings`]
        .filter(Boolean)
        .join("\n"),
      location: opts.location ?? "",
      status: statusOf(b.status),
      url: `${opts.publicUrl}/bookings`,
    });
  }
  // RFC 5545 §3.1: every content line ends in CRLF, the last one (END:VCALENDAR) included;
  // ical-generator leaves the last one bare.
  const text = cal.toString();
  return text.endsWith("\r\n") ? text : `${text}\r\n`;
}
