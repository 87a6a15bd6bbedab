/**
 * Dates for the demo scenario, all relative to the moment of seeding, so a demo seeded on any
 * day still has upcoming grants, expiring training and bottles near their expiry date.
 */

const DAY_MS = 24 * 60 * 60 * 1000;

/** An ISO 8601 UTC timestamp `days` (may be fractional or negative) after `now`. */
export function isoAfter(now: Date, days: number): string {
  return new Date(now.getTime() + days * DAY_MS).toISOString();
}

/** A calendar date (YYYY-MM-DD, UTC) `days` after `now`, for date-only fields. */
export function dateAfter(now: Date, days: number): string {
  return isoAfter(now, days).slice(0, 10);
}
