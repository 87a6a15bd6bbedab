/**
 * Weekly repeats for long measurement campaigns on Phasebook's Schedule.
 *
 * An occurrence repeats at the same LOCAL wall-clock time each week, so across a DST change its
 * UTC time moves by an hour; its length is the first session's real duration. That matches how
 * RFC 5545 expands a DTSTART with a TZID (instances computed in local time; a DTEND gives every
 * instance the same exact duration; a start inside a spring-forward gap is read with the offset
 * before the gap, an ambiguous one as its first occurrence; RFC 5545 §3.3.5, §3.3.10, §3.8.5.3,
 * from memory), so an exported series and our own expansion agree.
 *
 * Why luxon rather than the `rrule` package: we only need "the same weekday and time, N times",
 * which is `plus({ weeks: i })` on a zoned DateTime and already behaves as above. rrule computes
 * in UTC-as-local "floating" dates and needs its results re-interpreted in the zone, an easy
 * place for an hour to slip at a DST change.
 */
import { DateTime } from "luxon";
import { facilityZone } from "./zones";
import { type Instant, toMs } from "./intervals";
import { MAX_WEEKLY_OCCURRENCES } from "./recurrence-limits";

export interface Occurrence {
  /** 0 for the first session. */
  index: number;
  start: Date;
  end: Date;
}

export interface WeeklyInput {
  start: Instant;
  end: Instant;
  /** How many sessions in all, the first included. */
  weeks: number;
  tz: string;
}

export { MAX_WEEKLY_OCCURRENCES };

export function weeklyOccurrences({ start, end, weeks, tz }: WeeklyInput): Occurrence[] {
  const startMs = toMs(start);
  const durationMs = toMs(end) - startMs;
  if (!Number.isFinite(durationMs) || durationMs <= 0) throw new RangeError("The first session must end after it starts");
  if (!Number.isInteger(weeks) || weeks < 1 || weeks > MAX_WEEKLY_OCCURRENCES) {
    throw new RangeError(`weeks must be a whole number from 1 to ${MAX_WEEKLY_OCCURRENCES}, got ${weeks}`);
  }
  const first = DateTime.fromMillis(startMs, { zone: facilityZone(tz) });
  if (!first.isValid) throw new RangeError(`Unknown time zone ${tz}`);
  return Array.from({ length: weeks }, (_, index) => {
    const s = first.plus({ weeks: index }).toMillis();
    return { index, start: new Date(s), end: new Date(s + durationMs) };
  });
}
