/**
 * Display formats shared by the screens. Times arrive as ISO 8601 with an offset. Given a zone
 * (the facility's, from `useFacilityZone`), they are shown on that zone's clock and labelled
 * with its short name; without one, in the browser's zone.
 */
import { DateTime } from "luxon";
import { zoneShortName } from "@shared/domain/facility-time";

const DATE_TIME_OPTIONS: Intl.DateTimeFormatOptions = { weekday: "short", day: "numeric", month: "short", hour: "2-digit", minute: "2-digit" };
const TIME_OPTIONS: Intl.DateTimeFormatOptions = { hour: "2-digit", minute: "2-digit" };
/**
 * A formatter made on first use, not when the module loads: building the first Intl formatter
 * loads the browser's locale data, a cost better paid by the screen that shows a date than by
 * every page's start-up.
 */
function onFirstUse(options: Intl.DateTimeFormatOptions): { format(date: Date): string } {
  let made: Intl.DateTimeFormat | undefined;
  return { format: (date) => (made ??= new Intl.DateTimeFormat(undefined, options)).format(date) };
}

const dateTime = onFirstUse(DATE_TIME_OPTIONS);
const time = onFirstUse(TIME_OPTIONS);
const dateOnly = onFirstUse({ day: "numeric", month: "short", year: "numeric" });

function sameDay(a: Date, b: Date): boolean {
  return a.getFullYear() === b.getFullYear() && a.getMonth() === b.getMonth() && a.getDate() === b.getDate();
}

/**
 * "Tue 2 Dec, 14:00 – 16:30", or with both dates when the span crosses midnight. With a zone:
 * on that zone's clock, followed by its short name at the start ("… 16:30 AST").
 */
export function formatSpan(startIso: string, endIso: string, zone?: string): string {
  const start = new Date(startIso);
  const end = new Date(endIso);
  if (Number.isNaN(start.getTime()) || Number.isNaN(end.getTime())) return `${startIso} – ${endIso}`;
  if (zone) {
    const s = DateTime.fromJSDate(start, { zone });
    const e = DateTime.fromJSDate(end, { zone });
    const endText = s.hasSame(e, "day") ? e.toLocaleString(TIME_OPTIONS) : e.toLocaleString(DATE_TIME_OPTIONS);
    return `${s.toLocaleString(DATE_TIME_OPTIONS)} – ${endText} ${zoneShortName(start, zone)}`;
  }
  return `${dateTime.format(start)} – ${sameDay(start, end) ? time.format(end) : dateTime.format(end)}`;
}

/** One moment; with a zone, on that zone's clock and labelled with its short name. */
export function formatDateTime(iso: string, zone?: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return zone ? `${DateTime.fromJSDate(d, { zone }).toLocaleString(DATE_TIME_OPTIONS)} ${zoneShortName(d, zone)}` : dateTime.format(d);
}

/** A calendar date; with a zone, the date on that zone's clock (an expiry at 23:59 local stays on its day). */
export function formatDate(iso: string, zone?: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return zone ? DateTime.fromJSDate(d, { zone }).toLocaleString({ day: "numeric", month: "short", year: "numeric" }) : dateOnly.format(d);
}

/** "no_show" → "No-show", "in_progress" → "In progress": status codes as words. */
export function humanize(code: string): string {
  if (code === "no_show") return "No-show";
  const words = code.replace(/_/g, " ");
  return words.charAt(0).toUpperCase() + words.slice(1);
}
