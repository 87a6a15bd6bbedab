/**
 * Wall-clock times in the facility's zone, for forms and labels. A person in another zone sees
 * and types the facility's local hours (the hours the instruments are bookable); these helpers
 * turn those wall-clock values into instants with the right offset, and back.
 */
import { DateTime } from "luxon";
import type { Instant } from "./intervals";

const INPUT_FORMAT = "yyyy-LL-dd'T'HH:mm";

/** An instant as the value of `<input type="datetime-local">`, read on the facility's clock. */
export function toZonedInput(at: Instant, zone: string): string {
  return DateTime.fromMillis(typeof at === "number" ? at : at.getTime(), { zone }).toFormat(INPUT_FORMAT);
}

/**
 * A `datetime-local` value read as the facility's wall-clock time → ISO 8601 with that moment's
 * offset (e.g. "2026-07-09T10:00:00-03:00"). Luxon moves a time that falls in the spring-forward
 * gap ahead by the gap and takes the earlier of the two readings of a repeated autumn hour.
 * Answers null for text that is not a wall-clock time.
 */
export function zonedInputToIso(value: string, zone: string): string | null {
  if (!/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2})?$/.test(value)) return null;
  const dt = DateTime.fromISO(value, { zone });
  return dt.isValid ? dt.toISO({ suppressMilliseconds: true }) : null;
}

/** The zone's short name at that instant ("AST" in winter, "ADT" in summer for Halifax), for labels. */
export function zoneShortName(at: Instant, zone: string, locale = "en-US"): string {
  return DateTime.fromMillis(typeof at === "number" ? at : at.getTime(), { zone }).setLocale(locale).offsetNameShort ?? zone;
}
