/**
 * Wall-clock times in the facility's zone, for forms and labels. A person in another zone sees
 * and types the facility's local hours (the hours the instruments are bookable); these helpers
 * turn those wall-clock values into instants with the right offset, and back.
 */
import { DateTime, IANAZone } from "luxon";
import type { Instant } from "./intervals";

const INPUT_FORMAT = "yyyy-LL-dd'T'HH:mm";

/** An instant as the value of `<input type="datetime-local">`, read on the facility's clock. */
export function toZonedInput(at: Instant, zone: string): string {
  return DateTime.fromMillis(typeof at === "number" ? at : at.getTime(), { zone }).toFormat(INPUT_FORMAT);
}

/**
 * A `datetime-local` value read as the facility's wall-clock time → ISO 8601 with that moment's
 * offset (e.g. "2026-07-09T10:00:00-03:00"). A time in the spring-forward gap is moved ahead by
 * the gap; of the two readings of a repeated autumn hour the earlier is taken — whatever the
 * date the page was loaded (see resolveWallClock, which forms should use to let people choose).
 * Answers null for text that is not a wall-clock time.
 */
export function zonedInputToIso(value: string, zone: string): string | null {
  const r = resolveWallClock(value, zone);
  if (r.kind === "exact") return r.iso;
  if (r.kind === "ambiguous") return r.choices[0].iso;
  if (r.kind === "skipped") return r.after;
  return null;
}

const WALL_CLOCK = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})(?::(\d{2}))?$/;
const HOUR_MS = 3_600_000;
const DAY_MS = 24 * HOUR_MS;

export interface WallClockChoice {
  /** ISO 8601 with the offset in force at that instant, e.g. "2026-11-01T01:30:00-03:00". */
  iso: string;
  /** "-03:00". */
  offset: string;
  /** The zone's short name then, e.g. "ADT" (CLDR English names; "GMT-3" where there is none). */
  abbreviation: string;
  /** "01:30 ADT (UTC−03:00), the first time" — words for a radio button. */
  label: string;
}

export type WallClockResolution =
  | { kind: "exact"; iso: string }
  | { kind: "ambiguous"; choices: [WallClockChoice, WallClockChoice]; message: string }
  | {
      kind: "skipped";
      message: string;
      /** The same wall-clock time read with the offset before the change (it lands after the gap); for callers that must pick. */
      after: string;
    }
  | { kind: "invalid"; message: string };

function formatOffset(minutes: number): string {
  const sign = minutes < 0 ? "-" : "+";
  const abs = Math.abs(minutes);
  return `${sign}${String(Math.floor(abs / 60)).padStart(2, "0")}:${String(abs % 60).padStart(2, "0")}`;
}

function isoAt(ms: number, offsetMinutes: number): string {
  const local = new Date(ms + offsetMinutes * 60_000).toISOString().slice(0, 19);
  return `${local}${formatOffset(offsetMinutes)}`;
}

function hhmm(ms: number, offsetMinutes: number): string {
  return new Date(ms + offsetMinutes * 60_000).toISOString().slice(11, 16);
}

/**
 * Reads a wall-clock time ("2026-11-01T01:30") typed for `zone` and says which instant it is:
 * - "exact": one instant;
 * - "ambiguous": the hour clocks go back repeats, so two instants (earlier first), each with its
 *   offset and abbreviation ("01:30 ADT" and "01:30 AST" in America/Halifax), for the person to
 *   choose;
 * - "skipped": the time does not exist that day (clocks go forward over it), with a sentence;
 * - "invalid": not a date and time, or an unknown zone.
 * Offsets are looked up at the candidate instants themselves (the zone's rules at that moment),
 * never from "now", so the answer does not depend on when it is asked.
 */
export function resolveWallClock(value: string, zone: string): WallClockResolution {
  const m = WALL_CLOCK.exec(typeof value === "string" ? value.trim() : "");
  if (!m) return { kind: "invalid", message: "Give a date and a time, e.g. 2026-11-01T09:30." };
  if (!IANAZone.isValidZone(zone)) return { kind: "invalid", message: `"${zone}" is not a time zone Phasebook knows.` };
  const [y, mo, d, h, mi, s] = [m[1], m[2], m[3], m[4], m[5], m[6] ?? "0"].map(Number);
  const wall = Date.UTC(y, mo - 1, d, h, mi, s);
  const check = new Date(wall);
  if (y < 1 || check.getUTCFullYear() !== y || check.getUTCMonth() !== mo - 1 || check.getUTCDate() !== d || h > 23 || mi > 59 || s > 59) {
    return { kind: "invalid", message: `${value.replace("T", " ")} is not a date and time on the calendar.` };
  }
  const tz = IANAZone.create(zone);
  const offsetAt = (ms: number) => tz.offset(ms);
  // Every offset the zone uses within a day either side: a wall-clock time can only be one of those.
  const offsets = [...new Set([offsetAt(wall - DAY_MS), offsetAt(wall), offsetAt(wall + DAY_MS)])];
  const instants = [...new Set(offsets.map((o) => wall - o * 60_000).filter((ms) => offsetAt(ms) === (wall - ms) / 60_000))].sort((a, b) => a - b);

  if (instants.length === 1) return { kind: "exact", iso: isoAt(instants[0], offsetAt(instants[0])) };

  const names = (ms: number) => DateTime.fromMillis(ms, { zone }).setLocale("en-US").offsetNameShort ?? formatOffset(offsetAt(ms));
  const day = DateTime.fromMillis(wall, { zone: "UTC" }).setLocale("en-GB").toFormat("d LLLL yyyy");
  const time = value.trim().slice(11, 16);
  if (instants.length >= 2) {
    const [first, second] = [instants[0], instants[instants.length - 1]];
    const choice = (ms: number, which: string): WallClockChoice => {
      const offset = formatOffset(offsetAt(ms));
      const abbreviation = names(ms);
      return { iso: isoAt(ms, offsetAt(ms)), offset, abbreviation, label: `${time} ${abbreviation} (UTC${offset.replace("-", "−")}), ${which}` };
    };
    const a = choice(first, "the first time");
    const b = choice(second, `the second time, ${Math.round((second - first) / 60_000)} minutes later`);
    return {
      kind: "ambiguous",
      choices: [a, b],
      message: `${time} happens twice on ${day} in ${zone.replace(/_/g, " ")}: clocks go back that night. Choose ${a.abbreviation} (the first) or ${b.abbreviation} (the second).`,
    };
  }

  // No instant reads as this wall-clock time: it lies in the gap. Find the change-over instant.
  const before = offsetAt(wall - DAY_MS);
  const afterOffset = offsetAt(wall + DAY_MS);
  let lo = wall - afterOffset * 60_000; // still on the old offset
  let hi = wall - before * 60_000; // already on the new one
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    if (offsetAt(mid) === before) lo = mid;
    else hi = mid;
  }
  const gapStart = hhmm(hi, before);
  const gapEnd = hhmm(hi, afterOffset);
  const after = wall - before * 60_000;
  return {
    kind: "skipped",
    after: isoAt(after, offsetAt(after)),
    message:
      `${time} does not exist on ${day} in ${zone.replace(/_/g, " ")}: clocks go forward from ${gapStart} to ${gapEnd} that night. ` +
      `Choose a time before ${gapStart} or from ${gapEnd}.`,
  };
}

export { zoneShortName } from "./zone-labels";

export type ZonedIsoCheck = { ok: true } | { ok: false; code: "skipped_time"; message: string };

/**
 * For the server: refuses an ISO time that is a facility wall-clock time in the skipped spring
 * hour written with one of the zone's own offsets ("2026-03-08T02:30:00-04:00" in Halifax: 02:30
 * does not exist that night), with resolveWallClock's sentence. Any other instant passes,
 * whatever its offset ("Z", or a time sent from another zone); text that is not an ISO time
 * with an offset is left to the schema.
 */
export function checkZonedIso(iso: string, zone: string): ZonedIsoCheck {
  const m = /^(\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(?::\d{2})?)(?:\.\d+)?([+-]\d{2}:\d{2})$/.exec(iso);
  if (!m || !IANAZone.isValidZone(zone)) return { ok: true };
  const at = Date.parse(iso);
  if (Number.isNaN(at)) return { ok: true };
  const tz = IANAZone.create(zone);
  const zoneOffsets = new Set([tz.offset(at - DAY_MS), tz.offset(at), tz.offset(at + DAY_MS)].map(formatOffset));
  if (!zoneOffsets.has(m[2])) return { ok: true };
  const wall = resolveWallClock(m[1], zone);
  return wall.kind === "skipped" ? { ok: false, code: "skipped_time", message: wall.message } : { ok: true };
}
