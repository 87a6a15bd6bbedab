/**
 * Which bookings the Schedule asks for: the states it shows and the window of whole days the
 * calendar displays, midnight to midnight on the facility's clock. The calendar and the route's
 * loader build the same query here, so the loader's prefetch is exactly the calendar's first fetch.
 */
import { DateTime } from "luxon";
import type { BookingQuery } from "./keys";

export const SCHEDULE_STATUSES = "requested,confirmed,in_progress,completed,no_show";

export interface ScheduleWindow {
  from: string;
  to: string;
}

/** The calendar's shown range: its whole days (a time grid starts at 06:00, but the day is fetched whole). */
export function windowOfView(view: { activeStart: Date; activeEnd: Date; currentStart: Date; currentEnd: Date }): ScheduleWindow {
  const from = Math.min(view.activeStart.getTime(), view.currentStart.getTime());
  const to = Math.max(view.activeEnd.getTime(), view.currentEnd.getTime());
  return { from: new Date(from).toISOString(), to: new Date(to).toISOString() };
}

/** The week (Monday to Monday, facility time) the Schedule opens on. */
export function openingWeek(zone: string, now: number = Date.now()): ScheduleWindow {
  const monday = DateTime.fromMillis(now, { zone }).startOf("week");
  return { from: monday.toJSDate().toISOString(), to: monday.plus({ weeks: 1 }).toJSDate().toISOString() };
}

export function scheduleQuery(window: ScheduleWindow, instrumentId?: number): BookingQuery {
  return { from: window.from, to: window.to, instrumentId, status: SCHEDULE_STATUSES };
}
