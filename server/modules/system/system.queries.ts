/** Reads of the system area: a database probe, pages of the audit log and the administrator's status page. */
import type { DataSource } from "typeorm";
import { AuditEntry } from "../../entities";
import { prepared } from "../../db/prepared";
import type { Ctx } from "../../context";
import type { SystemStatusDto } from "@shared/schemas/system";
import type { FacilityDto } from "@shared/schemas/facility";
import type { Config } from "../../config";
import { readBackupStatus } from "../../ops/nightly-backup";

/** The facility's name, zone and currency (GET /api/facility, and every page load's boot block). */
export function facilitySettings(config: Config): FacilityDto {
  return { name: config.FACILITY_NAME, timeZone: config.FACILITY_TZ, currency: config.CURRENCY, publicDemo: config.publicDemo };
}

/** True when the database answers a trivial query. */
export function databaseAnswers(ds: DataSource): boolean {
  try {
    prepared(ds, "SELECT 1").get();
    return true;
  } catch {
    return false;
  }
}

export async function auditPage(ds: DataSource, q: { limit: number; offset: number; entityType?: string; entityId?: number }) {
  const [items, total] = await ds.getRepository(AuditEntry).findAndCount({
    where: { ...(q.entityType ? { entityType: q.entityType } : {}), ...(q.entityId ? { entityId: q.entityId } : {}) },
    order: { id: "DESC" },
    skip: q.offset,
    take: q.limit,
  });
  return { items: items.map((a) => ({ ...a, detail: JSON.parse(a.detail) as unknown })), total };
}

/** Mail, payments and backups as the administrator's status page shows them. */
export async function systemStatus(ctx: Ctx): Promise<SystemStatusDto> {
  const { config } = ctx;
  const production = config.NODE_ENV === "production";
  const mail = prepared(
    ctx.ds,
    `SELECT SUM(status = 'pending') AS pending, SUM(status = 'failed') AS failed, MIN(CASE WHEN status = 'pending' THEN createdAt END) AS oldest FROM outbound_mail`,
  ).get() as { pending: number | null; failed: number | null; oldest: string | null };
  const invoices = prepared(
    ctx.ds,
    `SELECT COUNT(*) AS n FROM statements s JOIN billing_runs r ON r.id = s.runId WHERE r.status = 'final' AND s.invoiceStatus = 'queued'`,
  ).get() as { n: number };
  const last = await readBackupStatus(ctx.ds);
  return {
    mode: production ? (config.publicDemo ? "public_demo" : "production") : "development",
    mail: {
      via: config.SMTP_URL ? "smtp" : ctx.mailboxUrl ? "fake" : "none",
      pending: mail.pending ?? 0,
      failed: mail.failed ?? 0,
      oldestPendingAt: mail.oldest,
    },
    payments: { via: config.STRIPE_SECRET_KEY ? "service" : ctx.payments ? "test" : "none", invoicesWaiting: invoices.n },
    backup: {
      scheduled: production && Boolean(config.BACKUP_DIR),
      dir: config.BACKUP_DIR ?? null,
      keepDays: config.BACKUP_KEEP,
      last: last ? { at: last.at, ok: last.ok, folder: last.folder, bytes: last.bytes, error: last.error } : null,
    },
  };
}
