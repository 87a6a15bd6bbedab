/**
 * Time intervals for Phasebook's Schedule. Every interval is half-open, [start, end), in UTC
 * epoch milliseconds, so a booking that ends at 11:00 and one that starts at 11:00 touch
 * without overlapping. The cleaning buffer of an instrument follows each session: the
 * instrument is blocked until end + buffer, because interface cells must be cleaned and dried
 * before the next user.
 */

/** A moment as the rest of the code base hands it over: a Date or epoch milliseconds (UTC). */
export type Instant = Date | number;

export interface Interval {
  start: number;
  end: number;
}

export interface Timed {
  start: Instant;
  end: Instant;
}

export const MINUTE_MS = 60_000;

export function toMs(t: Instant): number {
  return typeof t === "number" ? t : t.getTime();
}

export function toInterval(timed: Timed): Interval {
  return { start: toMs(timed.start), end: toMs(timed.end) };
}

/** Real elapsed minutes, not wall-clock difference: across a DST change the two differ. */
export function elapsedMinutes(timed: Timed): number {
  return (toMs(timed.end) - toMs(timed.start)) / MINUTE_MS;
}

/** An empty interval ([t, t)) overlaps nothing, not even an interval around t. */
export function overlaps(a: Timed, b: Timed): boolean {
  const x = toInterval(a);
  const y = toInterval(b);
  return x.start < x.end && y.start < y.end && x.start < y.end && y.start < x.end;
}

/** The span a booking takes out of the Schedule: the session plus the cleaning buffer after it. */
export function blockedInterval(booking: Timed, bufferMinutes: number): Interval {
  if (!Number.isFinite(bufferMinutes) || bufferMinutes < 0) {
    throw new RangeError(`bufferMinutes must be zero or more, got ${bufferMinutes}`);
  }
  const { start, end } = toInterval(booking);
  return { start, end: end + bufferMinutes * MINUTE_MS };
}

/**
 * The existing bookings on the same instrument that a candidate collides with. The instrument's
 * buffer follows both the candidate and each existing booking, so back-to-back sessions are
 * allowed exactly when the gap between them is at least the buffer. The caller passes only
 * bookings that hold the slot (see `holdsSlot`).
 */
export function conflicts<T extends Timed>(candidate: Timed, bufferMinutes: number, existing: readonly T[]): T[] {
  const blocked = blockedInterval(candidate, bufferMinutes);
  return existing.filter((booking) => overlaps(blocked, blockedInterval(booking, bufferMinutes)));
}

export type BookingStatus =
  | "requested"
  | "confirmed"
  | "declined"
  | "cancelled"
  | "in_progress"
  | "completed"
  | "no_show";

/**
 * Whether a booking in this state keeps its slot. A request holds the slot while it waits for
 * approval, so two people cannot both ask for the same hour; a no-show keeps it because the
 * instrument stood idle for that person.
 */
export function holdsSlot(status: BookingStatus): boolean {
  return status !== "declined" && status !== "cancelled";
}

/** Union of intervals, sorted and with overlapping or touching pieces merged. */
export function mergeIntervals(intervals: readonly Interval[]): Interval[] {
  const sorted = intervals.filter((i) => i.start < i.end).sort((a, b) => a.start - b.start);
  const merged: Interval[] = [];
  for (const i of sorted) {
    const last = merged[merged.length - 1];
    if (last && i.start <= last.end) last.end = Math.max(last.end, i.end);
    else merged.push({ ...i });
  }
  return merged;
}

/** The part of `interval` inside `within`, or null when they do not overlap. */
export function clip(interval: Interval, within: Interval): Interval | null {
  const start = Math.max(interval.start, within.start);
  const end = Math.min(interval.end, within.end);
  return start < end ? { start, end } : null;
}

export function totalMs(intervals: readonly Interval[]): number {
  return intervals.reduce((sum, i) => sum + (i.end - i.start), 0);
}
