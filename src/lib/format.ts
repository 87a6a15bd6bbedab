/**
 * Display formats shared by the screens. Times arrive as ISO 8601 with an offset. Given a zone
 * (the facility's, from `useFacilityZone`), they are shown on that zone's clock and labelled
 * with its short name; without one, in the browser's zone. The browser's Intl does the work
 * (zone-labels.ts): its formatters are made on first use, so no page pays for locale data before
 * it shows a date, and the date library stays off the screens that only show times.
 */
import { formatInZone, zoneShortName } from "@shared/domain/zone-labels";

const DATE_TIME_OPTIONS: Intl.DateTimeFormatOptions = { weekday: "short", day: "numeric", month: "short", hour: "2-digit", minute: "2-digit" };
const TIME_OPTIONS: Intl.DateTimeFormatOptions = { hour: "2-digit", minute: "2-digit" };
const DATE_OPTIONS: Intl.DateTimeFormatOptions = { day: "numeric", month: "short", year: "numeric" };
const DAY_KEY: Intl.DateTimeFormatOptions = { year: "numeric", month: "2-digit", day: "2-digit" };

/**
 * "Tue 2 Dec, 14:00 – 16:30", or with both dates when the span crosses midnight. With a zone:
 * on that zone's clock, followed by its short name at the start ("… 16:30 AST").
 */
export function formatSpan(startIso: string, endIso: string, zone?: string): string {
  const start = new Date(startIso);
  const end = new Date(endIso);
  if (Number.isNaN(start.getTime()) || Number.isNaN(end.getTime())) return `${startIso} – ${endIso}`;
  const sameDay = formatInZone(start, zone, DAY_KEY) === formatInZone(end, zone, DAY_KEY);
  const text = `${formatInZone(start, zone, DATE_TIME_OPTIONS)} – ${formatInZone(end, zone, sameDay ? TIME_OPTIONS : DATE_TIME_OPTIONS)}`;
  return zone ? `${text} ${zoneShortName(start, zone)}` : text;
}

/** One moment; with a zone, on that zone's clock and labelled with its short name. */
export function formatDateTime(iso: string, zone?: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  const text = formatInZone(d, zone, DATE_TIME_OPTIONS);
  return zone ? `${text} ${zoneShortName(d, zone)}` : text;
}

/** A calendar date; with a zone, the date on that zone's clock (an expiry at 23:59 local stays on its day). */
export function formatDate(iso: string, zone?: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return formatInZone(d, zone, DATE_OPTIONS);
}

/** "no_show" → "No-show", "in_progress" → "In progress": status codes as words. */
export function humanize(code: string): string {
  if (code === "no_show") return "No-show";
  const words = code.replace(/_/g, " ");
  return words.charAt(0).toUpperCase() + words.slice(1);
}

let counts: Intl.NumberFormat | undefined;
/** "1,000": a count with thousands separators, from one formatter made on first use (`toLocaleString` with a locale makes one per call). */
export function formatCount(value: number): string {
  return (counts ??= new Intl.NumberFormat("en")).format(value);
}
