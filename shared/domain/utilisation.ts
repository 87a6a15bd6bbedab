/**
 * Utilisation of one Phasebook instrument over a period (normally a local calendar month):
 * booked and used hours against the bookable hours of that period. Bookable hours are the
 * weekly windows laid over the period's local days, in real elapsed time, so the spring-forward
 * night is an hour shorter and the fall-back night an hour longer.
 *
 * Booked hours are not clipped to the bookable windows (endorsed after-hours work counts), so a
 * percentage can exceed 100. Overlapping pieces are counted once.
 */
import { DateTime } from "luxon";
import { type BookableHours, bookableWindows } from "./booking-rules";
import { type BookingStatus, type Instant, type Interval, clip, mergeIntervals, toMs, totalMs } from "./intervals";

export interface UtilisationBooking {
  start: Instant;
  end: Instant;
  status: BookingStatus;
  checkedInAt?: Instant | null;
  checkedOutAt?: Instant | null;
}

export interface UtilisationInput {
  monthStart: Instant;
  monthEnd: Instant;
  tz: string;
  bookableHours: BookableHours;
  bookings: readonly UtilisationBooking[];
}

export interface Utilisation {
  bookableHours: number;
  bookedHours: number;
  usedHours: number;
  /** Percent of bookable hours; null when nothing was bookable. */
  bookedPct: number | null;
  usedPct: number | null;
}

/** States whose time counts as booked: the instrument was set aside for someone. */
const BOOKED_STATES: ReadonlySet<BookingStatus> = new Set(["confirmed", "in_progress", "completed", "no_show"]);

const HOUR_MS = 3_600_000;

/** The local calendar month "YYYY-MM" as real instants [first midnight, next month's first midnight). */
export function monthRange(period: string, tz: string): { monthStart: Date; monthEnd: Date } {
  const first = DateTime.fromFormat(period, "yyyy-MM", { zone: tz });
  if (!first.isValid) throw new RangeError(`Give the month as YYYY-MM in a known time zone, got ${period} / ${tz}`);
  return { monthStart: first.toJSDate(), monthEnd: first.plus({ months: 1 }).toJSDate() };
}

function clippedHours(pieces: Interval[], period: Interval): number {
  const inside = pieces.map((p) => clip(p, period)).filter((p): p is Interval => p !== null);
  return totalMs(mergeIntervals(inside)) / HOUR_MS;
}

function usedPieces(bookings: readonly UtilisationBooking[]): Interval[] {
  // A session still running has no check-out yet; it counts once it is closed.
  return bookings
    .filter((b) => b.checkedInAt != null && b.checkedOutAt != null)
    .map((b) => ({ start: toMs(b.checkedInAt!), end: toMs(b.checkedOutAt!) }));
}

function percent(part: number, whole: number): number | null {
  return whole > 0 ? (part / whole) * 100 : null;
}

export function utilisation(input: UtilisationInput): Utilisation {
  const period = { start: toMs(input.monthStart), end: toMs(input.monthEnd) };
  const bookable = totalMs(bookableWindows(period, input.tz, input.bookableHours)) / HOUR_MS;
  const booked = clippedHours(
    input.bookings.filter((b) => BOOKED_STATES.has(b.status)).map((b) => ({ start: toMs(b.start), end: toMs(b.end) })),
    period,
  );
  const used = clippedHours(usedPieces(input.bookings), period);
  return {
    bookableHours: bookable,
    bookedHours: booked,
    usedHours: used,
    bookedPct: percent(booked, bookable),
    usedPct: percent(used, bookable),
  };
}
