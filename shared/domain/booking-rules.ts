/**
 * The per-instrument booking rules of Phasebook, checked as one pure function that lists every
 * rule a proposed booking breaks (so a form can show them all at once) and never throws.
 * Durations are real elapsed time (UTC arithmetic); bookable hours are wall-clock times in the
 * facility's IANA time zone, so "08:00–18:00" means 08:00 local on both sides of a DST change.
 * Local-time conversions follow the IANA tz database through luxon.
 */
import { DateTime } from "luxon";
import { type Instant, type Interval, MINUTE_MS, clip, mergeIntervals, toMs } from "./intervals";
import { facilityZone } from "./zones";

export const WEEKDAYS = ["mon", "tue", "wed", "thu", "fri", "sat", "sun"] as const;
export type Weekday = (typeof WEEKDAYS)[number];

const WEEKDAY_NAMES: Record<Weekday, string> = {
  mon: "Mondays",
  tue: "Tuesdays",
  wed: "Wednesdays",
  thu: "Thursdays",
  fri: "Fridays",
  sat: "Saturdays",
  sun: "Sundays",
};

/** A wall-clock window on one local day, "HH:MM" 24-hour; `to` may be "24:00" (the next midnight). */
export interface TimeWindow {
  from: string;
  to: string;
}

/** Weekly bookable hours; a missing or empty day is not bookable. */
export type BookableHours = Partial<Record<Weekday, TimeWindow[]>>;

export interface BookingRules {
  minLeadMinutes?: number;
  maxLengthMinutes?: number;
  /** Omitted: the instrument can be booked at any hour (midnight is still a boundary). */
  bookableHours?: BookableHours;
  afterHoursAllowed?: boolean;
  trainingRequired?: boolean;
}

export interface TrainingRecord {
  /** Kept for callers that store it; the instrument's `trainingRequired` rule is what decides. */
  required?: boolean;
  /** The record is valid strictly before this moment; null means it never expires. */
  expiresAt: Instant | null;
  revoked?: boolean;
  /** After-hours endorsement. */
  afterHours?: boolean;
}

export type TrainingState = "current" | "expiring" | "expired" | "none";

export type BookingRuleCode =
  | "invalid_time"
  | "invalid_time_zone"
  | "end_before_start"
  | "zero_length"
  | "in_past"
  | "lead_time"
  | "too_long"
  | "spans_midnight"
  | "outside_bookable_hours"
  | "training_missing"
  | "training_expired";

export interface RuleViolation<C extends string = string> {
  code: C;
  path: string;
  message: string;
}

export interface BookingCheckInput {
  start: Instant;
  end: Instant;
  now: Instant;
  tz: string;
  rules: BookingRules;
  training?: TrainingRecord | null;
}

const CLOCK = /^([01]\d|2[0-3]):([0-5]\d)$|^24:00$/;

/** Minutes after local midnight for "HH:MM" ("24:00" gives 1440); null when malformed. */
export function parseClock(text: string): number | null {
  if (!CLOCK.test(text)) return null;
  const [h, m] = text.split(":").map(Number);
  return h * 60 + m;
}

/** A local calendar day's start in `tz` (luxon moves a midnight that does not exist forward). */
function localDayStart(at: number, tz: string): DateTime {
  return DateTime.fromMillis(at, { zone: facilityZone(tz) }).startOf("day");
}

function weekdayOf(day: DateTime): Weekday {
  return WEEKDAYS[day.weekday - 1];
}

/** The instant of a wall-clock time on a local day; a time inside a spring-forward gap moves forward. */
function localClockToMs(day: DateTime, minutesAfterMidnight: number): number {
  if (minutesAfterMidnight === 24 * 60) return day.plus({ days: 1 }).startOf("day").toMillis();
  const hour = Math.floor(minutesAfterMidnight / 60);
  return day.set({ hour, minute: minutesAfterMidnight % 60, second: 0, millisecond: 0 }).toMillis();
}

/**
 * The real instants of one local day's windows. Malformed windows are skipped, which makes
 * their hours unbookable rather than open; `validateBookableHours` reports them.
 */
export function windowsOnLocalDay(day: DateTime, hours: BookableHours): Interval[] {
  const windows = hours[weekdayOf(day)] ?? [];
  const result: Interval[] = [];
  for (const w of windows) {
    const from = parseClock(w.from);
    const to = parseClock(w.to);
    if (from === null || to === null || from >= to) continue;
    const start = localClockToMs(day, from);
    const end = localClockToMs(day, to);
    if (start < end) result.push({ start, end });
  }
  return result;
}

/** Every bookable window meeting `range`, clipped to it, in real instants (DST aware). */
export function bookableWindows(range: { start: Instant; end: Instant }, tz: string, hours: BookableHours): Interval[] {
  const bounds = { start: toMs(range.start), end: toMs(range.end) };
  const pieces: Interval[] = [];
  for (let day = localDayStart(bounds.start, tz); day.toMillis() < bounds.end; day = day.plus({ days: 1 }).startOf("day")) {
    for (const w of windowsOnLocalDay(day, hours)) {
      const c = clip(w, bounds);
      if (c) pieces.push(c);
    }
  }
  return mergeIntervals(pieces);
}

/** Problems with a bookable-hours setting, for the instrument form. */
export function validateBookableHours(hours: BookableHours): RuleViolation[] {
  const problems: RuleViolation[] = [];
  for (const day of WEEKDAYS) {
    const parsed = (hours[day] ?? []).map((w, i) => ({ i, from: parseClock(w.from), to: parseClock(w.to) }));
    for (const p of parsed) {
      if (p.from === null || p.to === null) {
        problems.push({ code: "bad_clock", path: `bookableHours.${day}.${p.i}`, message: "Give times as HH:MM, 00:00 to 24:00" });
      } else if (p.from >= p.to) {
        problems.push({ code: "empty_window", path: `bookableHours.${day}.${p.i}`, message: "A window must end after it starts, on the same day" });
      }
    }
    const ok = parsed.filter((p) => p.from !== null && p.to !== null && p.from < p.to).sort((a, b) => a.from! - b.from!);
    for (let k = 1; k < ok.length; k++) {
      if (ok[k].from! < ok[k - 1].to!) {
        problems.push({ code: "overlapping_windows", path: `bookableHours.${day}.${ok[k].i}`, message: `Windows on ${WEEKDAY_NAMES[day]} overlap` });
      }
    }
  }
  return problems;
}

const DAY_MS = 24 * 60 * MINUTE_MS;

/** The state of a training record at a moment; a revoked record counts as no training at all. */
export function trainingState(record: TrainingRecord | null | undefined, at: Instant, expiringWithinDays = 30): TrainingState {
  if (!record || record.revoked) return "none";
  if (record.expiresAt === null) return "current";
  const expires = toMs(record.expiresAt);
  const t = toMs(at);
  if (expires <= t) return "expired";
  return expires - t <= expiringWithinDays * DAY_MS ? "expiring" : "current";
}

function fmtLocal(ms: number, tz: string): string {
  return DateTime.fromMillis(ms, { zone: facilityZone(tz) }).toFormat("yyyy-MM-dd HH:mm");
}

function describeWindows(windows: TimeWindow[]): string {
  return windows.map((w) => `${w.from}–${w.to}`).join(", ");
}

function timingViolations(start: number, end: number, now: number, rules: BookingRules): RuleViolation<BookingRuleCode>[] {
  const found: RuleViolation<BookingRuleCode>[] = [];
  const lead = rules.minLeadMinutes ?? 0;
  if (start < now) {
    found.push({ code: "in_past", path: "start", message: "The booking starts in the past" });
  } else if (start < now + lead * MINUTE_MS) {
    found.push({ code: "lead_time", path: "start", message: `Book at least ${lead} minutes ahead` });
  }
  const max = rules.maxLengthMinutes;
  if (max !== undefined && end - start > max * MINUTE_MS) {
    found.push({ code: "too_long", path: "end", message: `A booking may last at most ${max} minutes` });
  }
  return found;
}

function hoursViolations(start: number, end: number, tz: string, rules: BookingRules): RuleViolation<BookingRuleCode>[] {
  const day = localDayStart(start, tz);
  if (end > day.plus({ days: 1 }).startOf("day").toMillis()) {
    return [{ code: "spans_midnight", path: "end", message: "Only people endorsed for after-hours work may book across midnight" }];
  }
  if (!rules.bookableHours) return [];
  const fits = windowsOnLocalDay(day, rules.bookableHours).some((w) => start >= w.start && end <= w.end);
  if (fits) return [];
  const key = weekdayOf(day);
  const windows = rules.bookableHours[key] ?? [];
  const message =
    windows.length === 0
      ? `${WEEKDAY_NAMES[key]} are not bookable on this instrument`
      : `On ${WEEKDAY_NAMES[key]} the booking must lie within ${describeWindows(windows)} (${tz} time); it runs ${fmtLocal(start, tz)} to ${fmtLocal(end, tz)}`;
  return [{ code: "outside_bookable_hours", path: "start", message }];
}

function trainingViolations(end: number, rules: BookingRules, training: TrainingRecord | null | undefined): RuleViolation<BookingRuleCode>[] {
  if (!rules.trainingRequired) return [];
  // Checked at the booked end: training that lapses during the session does not cover it.
  const state = trainingState(training, end);
  if (state === "none") {
    return [{ code: "training_missing", path: "training", message: "You need current training on this instrument" }];
  }
  if (state === "expired") {
    return [{ code: "training_expired", path: "training", message: "Your training on this instrument expires before the booking ends" }];
  }
  return [];
}

function isValidZone(tz: string): boolean {
  return facilityZone(tz).isValid;
}

/** Every rule the proposed booking breaks; an empty list means it may be booked. */
export function checkBookingRules(input: BookingCheckInput): RuleViolation<BookingRuleCode>[] {
  const start = toMs(input.start);
  const end = toMs(input.end);
  const now = toMs(input.now);
  if (!Number.isFinite(start)) return [{ code: "invalid_time", path: "start", message: "Give a valid start time" }];
  if (!Number.isFinite(end)) return [{ code: "invalid_time", path: "end", message: "Give a valid end time" }];
  if (!isValidZone(input.tz)) return [{ code: "invalid_time_zone", path: "tz", message: `Unknown time zone ${input.tz}` }];
  if (end < start) return [{ code: "end_before_start", path: "end", message: "The end must come after the start" }];
  if (end === start) return [{ code: "zero_length", path: "end", message: "The booking has no length" }];

  const endorsed = Boolean(input.training && !input.training.revoked && input.training.afterHours);
  const afterHoursOk = endorsed && Boolean(input.rules.afterHoursAllowed);
  return [
    ...timingViolations(start, end, now, input.rules),
    ...(afterHoursOk ? [] : hoursViolations(start, end, input.tz, input.rules)),
    ...trainingViolations(end, input.rules, input.training),
  ];
}
