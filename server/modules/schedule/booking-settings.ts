/**
 * The facility's booking settings (late-cancellation window, no-show grace, check-in opening),
 * kept as one settings row so the manager can change them without a deploy. These are numbers
 * the rules use; who may do what to a booking is booking.policy.ts's.
 */
import type { DataSource, EntityManager } from "typeorm";
import { DEFAULT_BOOKING_SETTINGS, bookingSettings, type BookingSettings } from "@shared/schemas/bookings";
import { MINUTE_MS } from "@shared/domain/intervals";
import { Setting } from "../../entities";
import { prepared } from "../../db/prepared";
import { serialTransaction } from "../../db/serial";
import { audit } from "../../core/audit";
import type { Deps } from "../../core/deps";
import type { AuthUser } from "../../middleware/auth";

/** The settings row's key; its first name, kept so databases already written keep their settings. */
export const BOOKING_SETTINGS_KEY = "booking_policy";

/** Built once: the week of bookings reads the settings on every request. */
const storedSettings = bookingSettings.partial();

/** The last stored text and what it parsed to: the row is read every time, parsed only when it changed. */
let last: { value: string; settings: BookingSettings } | null = null;

function parseSettings(value: string | undefined): BookingSettings {
  if (value === undefined) return DEFAULT_BOOKING_SETTINGS;
  if (last?.value === value) return last.settings;
  const parsed = storedSettings.safeParse(JSON.parse(value));
  const settings = Object.freeze({ ...DEFAULT_BOOKING_SETTINGS, ...(parsed.success ? parsed.data : {}) });
  last = { value, settings };
  return settings;
}

/**
 * The settings as they stand, read with a prepared statement (on the transaction's connection
 * inside one): the week of bookings and every booking change read them for check-in's opening.
 */
export function readBookingSettings(ds: DataSource): BookingSettings {
  const row = prepared(ds, `SELECT value FROM settings WHERE key = ?`).get(BOOKING_SETTINGS_KEY) as { value: string } | undefined;
  return parseSettings(row?.value);
}

/** The manager replaces the settings; audited with the new values. */
export async function saveBookingSettings(deps: Deps, actor: AuthUser, settings: BookingSettings): Promise<BookingSettings> {
  await serialTransaction(deps.ds, async (em: EntityManager) => {
    await em.save(Setting, { key: BOOKING_SETTINGS_KEY, value: JSON.stringify(settings) });
    await audit(em, deps.now(), actor.id, "booking_policy.changed", "setting", null, settings);
  });
  return settings;
}

/** Cancelling a confirmed booking less than `lateCancelHours` before its start is late. */
export function isLateCancel(startMs: number, nowMs: number, settings: Pick<BookingSettings, "lateCancelHours">): boolean {
  return startMs - nowMs < settings.lateCancelHours * 60 * MINUTE_MS;
}
