/**
 * The Schedule's timed jobs: reminders the day before, automatic no-shows after the grace
 * period, and notices of training that expires within 30 days. Each is a plain function of the
 * data source and a moment, so tests run it with a fixed clock; each marks what it handled so a
 * second run (or a restart) sends nothing twice.
 */
import type { DataSource } from "typeorm";
import type { Config } from "../../config";
import { serialTransaction } from "../../db/serial";
import { Booking, TrainingRecord } from "../../entities";
import { enqueueMail } from "../../core/outbox";
import { recordNoShow } from "./booking.commands";
import { readBookingSettings } from "./booking-settings";
import { reminderMail, trainingExpiringMail } from "./booking-mail";

type Cfg = Pick<Config, "FACILITY_TZ" | "PUBLIC_URL">;
const HOUR_MS = 3_600_000;
const DAY_MS = 24 * HOUR_MS;

/** Confirmed bookings that start within the next 24 hours get one reminder each. */
export async function sendBookingReminders(ds: DataSource, now: Date, config: Cfg): Promise<number> {
  return serialTransaction(ds, async (em) => {
    const due: { id: number; startsAt: string; endsAt: string; purpose: string; email: string; names: string }[] = await em.query(
      `SELECT b.id, b.startsAt, b.endsAt, b.purpose, u.email,
              (SELECT group_concat(i.name, '|') FROM booking_instruments bi JOIN instruments i ON i.id = bi.instrumentId WHERE bi.bookingId = b.id) AS names
       FROM bookings b JOIN users u ON u.id = b.userId
       WHERE b.status = 'confirmed' AND b.reminderSentAt IS NULL AND b.startMs > ? AND b.startMs <= ?`,
      [now.getTime(), now.getTime() + DAY_MS],
    );
    for (const b of due) {
      await enqueueMail(em, now, reminderMail(b.email, b, b.names.split("|").sort(), { publicUrl: config.PUBLIC_URL, tz: config.FACILITY_TZ }));
      await em.update(Booking, b.id, { reminderSentAt: now.toISOString() });
    }
    return due.length;
  });
}

/** Confirmed bookings nobody checked in to within the grace period become no-shows. */
export async function markNoShows(ds: DataSource, now: Date, config: Cfg): Promise<number> {
  const settings = readBookingSettings(ds);
  const cutoff = now.getTime() - settings.noShowGraceMinutes * 60_000;
  const due: { id: number }[] = await ds.query(
    `SELECT id FROM bookings WHERE status = 'confirmed' AND checkedInAt IS NULL AND startMs <= ? ORDER BY startMs LIMIT 200`,
    [cutoff],
  );
  const deps = { ds, now: () => now, config };
  let marked = 0;
  for (const { id } of due) {
    // The command re-checks the state inside its own transaction: a check-in that just landed wins.
    try {
      await recordNoShow(deps, null, id);
      marked++;
    } catch {
      /* state changed meanwhile */
    }
  }
  return marked;
}

/** One notice per training record, 30 days or less before it expires. */
export async function sendTrainingExpiryNotices(ds: DataSource, now: Date, config: Cfg): Promise<number> {
  return serialTransaction(ds, async (em) => {
    const due: { id: number; expiresAt: string; email: string; instrument: string }[] = await em.query(
      `SELECT t.id, t.expiresAt, u.email, i.name AS instrument FROM training_records t
       JOIN users u ON u.id = t.userId JOIN instruments i ON i.id = t.instrumentId
       WHERE t.revokedAt IS NULL AND t.expiryNoticeSentAt IS NULL AND t.expiresAt IS NOT NULL AND t.expiresAt > ? AND t.expiresAt <= ? AND u.active = 1`,
      [now.toISOString(), new Date(now.getTime() + 30 * DAY_MS).toISOString()],
    );
    for (const r of due) {
      await enqueueMail(em, now, trainingExpiringMail(r.email, r.instrument, r.expiresAt, { publicUrl: config.PUBLIC_URL, tz: config.FACILITY_TZ }));
      await em.update(TrainingRecord, r.id, { expiryNoticeSentAt: now.toISOString() });
    }
    return due.length;
  });
}
