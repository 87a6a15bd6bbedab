/**
 * Reads for the calendars: a person's secret feed (contract GET /api/calendar/:token.ics), one
 * booking's .ics, and the feed's address. The text itself is written by calendar-ics.ts.
 */
import type { DataSource } from "typeorm";
import { User } from "../../entities";
import { bookingsCalendar, type CalendarBooking } from "./calendar-ics";

/** How far back the feed reaches: recent history stays visible, old years do not bloat it. */
const FEED_PAST_DAYS = 90;

/** The secret feed's address for a token. */
export const feedUrl = (publicUrl: string, token: string) => `${publicUrl}/api/calendar/${token}.ics`;

async function calendarBookings(ds: DataSource, where: string, args: unknown[]): Promise<CalendarBooking[]> {
  const rows: (Omit<CalendarBooking, "instruments"> & { names: string | null })[] = await ds.query(
    `SELECT b.id, b.status, b.startsAt, b.endsAt, b.purpose, b.updatedAt, b.createdAt,
            (SELECT group_concat(i.name, '|') FROM booking_instruments bi JOIN instruments i ON i.id = bi.instrumentId WHERE bi.bookingId = b.id) AS names
     FROM bookings b WHERE ${where} ORDER BY b.startMs`,
    args,
  );
  return rows.map(({ names, ...r }) => ({ ...r, instruments: (names ?? "").split("|").filter(Boolean).sort() }));
}

/** The feed of the active person holding this token, or null (an unknown token leads nowhere). */
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

/** The person's current feed token. */
export async function calendarTokenOf(ds: DataSource, userId: number): Promise<string> {
  return (await ds.getRepository(User).findOneByOrFail({ id: userId })).calendarToken;
}
