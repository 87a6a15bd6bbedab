/**
 * Timed jobs inside the server process: each runs on its own interval, never overlaps itself,
 * and logs rather than crashes on failure.
 */
import type { DataSource } from "typeorm";
import type Stripe from "stripe";
import type { Clock } from "../clock";
import type { Config } from "../config";
import type { Mailer } from "../integrations/mailer";
import { deliverDueMail } from "../core/outbox";
import { refreshPlannerStatistics } from "../db/prepared";
import { runStockAlerts } from "../modules/safety";
import { markNoShows, sendBookingReminders, sendTrainingExpiryNotices } from "../modules/schedule";
import { mailStatementsJob, sendInvoicesJob } from "../modules/recharge";
import { runNightlyBackup } from "../ops/nightly-backup";

export interface JobDeps {
  ds: DataSource;
  mailer: Mailer;
  clock: Clock;
  config: Config;
  /** The payment service; without it external invoices stay queued. */
  payments?: Stripe;
}

export interface Job {
  name: string;
  everyMs: number;
  run(deps: JobDeps): Promise<unknown>;
}

export const jobs: Job[] = [
  {
    name: "deliver-mail",
    everyMs: 5_000,
    run: (d) => deliverDueMail(d.ds, d.mailer, d.clock.now(), d.config.MAIL_FROM),
  },
  {
    // Reorder points, expiry within 30 days, locations over their limit; each subject at most weekly.
    name: "stock-alerts",
    everyMs: 60 * 60_000,
    run: (d) => runStockAlerts(d.ds, d.clock.now(), { tz: d.config.FACILITY_TZ, publicUrl: d.config.PUBLIC_URL }),
  },
  { name: "booking-reminders", everyMs: 5 * 60_000, run: (d) => sendBookingReminders(d.ds, d.clock.now(), d.config) },
  { name: "no-shows", everyMs: 60_000, run: (d) => markNoShows(d.ds, d.clock.now(), d.config) },
  { name: "training-expiry-notices", everyMs: 60 * 60_000, run: (d) => sendTrainingExpiryNotices(d.ds, d.clock.now(), d.config) },
  // Recharge: invoices the payment service did not take yet, and statement PDFs not yet mailed.
  sendInvoicesJob,
  mailStatementsJob,
  {
    // The query planner's statistics, refreshed where tables grew or shrank tenfold (the lists' plans rely on them).
    name: "planner-statistics",
    everyMs: 60 * 60_000,
    run: async (d) => refreshPlannerStatistics(d.ds),
  },
  {
    // Production with BACKUP_DIR: one dated backup folder a night, BACKUP_KEEP days kept (ops/nightly-backup.ts).
    name: "nightly-backup",
    everyMs: 15 * 60_000,
    run: (d) => (d.config.NODE_ENV === "production" ? runNightlyBackup({ ds: d.ds, now: () => d.clock.now(), config: d.config }) : Promise.resolve(null)),
  },
];

export function startScheduler(deps: JobDeps, list: Job[] = jobs): { stop(): void } {
  const timers = list.map((job) => {
    let running = false;
    const tick = async () => {
      if (running) return;
      running = true;
      try {
        await job.run(deps);
      } catch (e) {
        console.error(`job ${job.name} failed:`, (e as Error).message);
      } finally {
        running = false;
      }
    };
    const t = setInterval(() => void tick(), job.everyMs);
    t.unref();
    return t;
  });
  return { stop: () => timers.forEach(clearInterval) };
}
