/**
 * Showing an instant on the facility's clock with the browser's own Intl, without luxon: what
 * every screen that lists times needs, so the first screens do not load and run the date library.
 * The arithmetic on wall-clock times (forms, DST gaps, recurrence) stays in facility-time.ts and
 * zones.ts, with luxon. Formatters are made on first use and kept per zone and options.
 */
import type { Instant } from "./intervals";

const made = new Map<string, Intl.DateTimeFormat>();

function formatter(locale: string | undefined, options: Intl.DateTimeFormatOptions): Intl.DateTimeFormat {
  const key = `${locale ?? ""}|${JSON.stringify(options)}`;
  let f = made.get(key);
  if (!f) made.set(key, (f = new Intl.DateTimeFormat(locale, options)));
  return f;
}

const toDate = (at: Instant) => (typeof at === "number" ? new Date(at) : at);

/** The instant on `zone`'s clock (the device's own without one) in the browser's locale, with the given fields. */
export function formatInZone(at: Instant, zone: string | undefined, options: Intl.DateTimeFormatOptions): string {
  return formatter(undefined, zone ? { ...options, timeZone: zone } : options).format(toDate(at));
}

/** The zone's short name at that instant ("AST" in winter, "ADT" in summer for Halifax), for labels. */
export function zoneShortName(at: Instant, zone: string, locale = "en-US"): string {
  try {
    const parts = formatter(locale, { timeZone: zone, timeZoneName: "short" }).formatToParts(toDate(at));
    return parts.find((p) => p.type === "timeZoneName")?.value ?? zone;
  } catch {
    // Not a zone Intl knows: the name as given.
    return zone;
  }
}
