/**
 * iCalendar (RFC 5545) for Phasebook bookings: the per-person secret feed and a single
 * booking's .ics. Times are written in UTC (DTSTART/DTEND with "Z"), so a calendar program
 * needs no VTIMEZONE to place them; DTEND is the booking's exclusive end (RFC 5545 §3.6.1).
 */
import ical, { ICalEventStatus } from "ical-generator";
import type { DataSource } from "typeorm";
import { BOOKING_STATUS_LABELS, type BookingStatus } from "@shared/schemas/bookings";
import { User } from "../entities";

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

/** How far back the feed reaches: recent history stays visible, old years do not bloat it. */
const FEED_PAST_DAYS = 90;

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

async function calendarBookings(ds: DataSource, where: string, args: unknown[]): Promise<CalendarBooking[]> {
  const rows: (Omit<CalendarBooking, "instruments"> & { names: string | null })[] = await ds.query(
    `SELECT b.id, b.status, b.startsAt, b.endsAt, b.purpose, b.updatedAt, b.createdAt,
            (SELECT group_concat(i.name, '|') FROM booking_instruments bi JOIN instruments i ON i.id = bi.instrumentId WHERE bi.bookingId = b.id) AS names
     FROM bookings b WHERE ${where} ORDER BY b.startMs`,
    args,
  );
  return rows.map(({ names, ...r }) => ({ ...r, instruments: (names ?? "").split("|").filter(Boolean).sort() }));
}

export async function feedForToken(ds: DataSource, token: string, now: Date, publicUrl: string, facility?: string): Promise<string | null> {
  const user = await ds.getRepository(User).findOneBy({ calendarToken: token, active: true });
  if (!user) return null;
  const since = now.getTime() - FEED_PAST_DAYS * 24 * 3600 * 1000;
  const bookings = await calendarBookings(ds, `b.userId = ? AND b.endMs > ? AND b.status <> 'declined'`, [user.id, since]);
  return bookingsCalendar({ name: `Phasebook – ${user.name}`, host: new URL(publicUrl).hostname, publicUrl, bookings, stamp: now, location: facility });
}

export async function bookingIcs(ds: DataSource, bookingId: number, now: Date, publicUrl: string, facility?: string): Promise<string> {
  const bookings = await calendarBookings(ds, `b.id = ?`, [bookingId]);
  return bookingsCalendar({ name: "Phasebook booking", host: new URL(publicUrl).hostname, publicUrl, bookings, stamp: now, location: facility });
}
