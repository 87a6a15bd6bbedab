/** Health, the audit log, the system status and the development mailbox: their answers as the API sends them. */
import { z } from "zod";
import { id, pageQuery } from "./common";

export const healthDto = z.object({ status: z.enum(["ok", "degraded"]), db: z.enum(["ok", "unavailable"]) });

export const auditQuery = pageQuery.extend({ entityType: z.string().max(40).optional(), entityId: id().optional() });

export const auditEntryDto = z.object({
  id: z.number(),
  at: z.string(),
  actorId: z.number().nullable(),
  action: z.string(),
  entityType: z.string(),
  entityId: z.number().nullable(),
  detail: z.unknown(),
});
export type AuditEntryDto = z.infer<typeof auditEntryDto>;

/** What the local fake mailbox received (development only). */
export const mailboxMessageDto = z.object({
  id: z.string(),
  from: z.string().nullable(),
  to: z.array(z.string()),
  subject: z.string(),
  text: z.string(),
  html: z.string().nullable().optional(),
  date: z.string(),
});
export type MailboxMessageDto = z.infer<typeof mailboxMessageDto>;
export const mailboxPageDto = z.object({ items: z.array(mailboxMessageDto), total: z.number() });
export type MailboxPageDto = z.infer<typeof mailboxPageDto>;

/** The last nightly backup as the job recorded it. */
export const backupResultDto = z.object({
  at: z.string(),
  ok: z.boolean(),
  folder: z.string(),
  bytes: z.number().nullable(),
  error: z.string().nullable(),
});

/** What an administrator needs to know about the running server: mail, payments and backups. */
export const systemStatusDto = z.object({
  /** production, a production server running the public demo, or the development demo. */
  mode: z.enum(["production", "public_demo", "development"]),
  mail: z.object({
    /** smtp: SMTP_URL; fake: the local fake mailbox; none: mail waits in the outbox. */
    via: z.enum(["smtp", "fake", "none"]),
    pending: z.number(),
    failed: z.number(),
    oldestPendingAt: z.string().nullable(),
  }),
  payments: z.object({
    /** service: STRIPE_SECRET_KEY; test: the local fake or a test endpoint; none: card invoices wait. */
    via: z.enum(["service", "test", "none"]),
    /** External statements of final runs whose invoice the payment service does not have yet. */
    invoicesWaiting: z.number(),
  }),
  backup: z.object({
    /** True when the nightly backup runs (production with BACKUP_DIR). */
    scheduled: z.boolean(),
    dir: z.string().nullable(),
    keepDays: z.number(),
    last: backupResultDto.nullable(),
  }),
});
export type SystemStatusDto = z.infer<typeof systemStatusDto>;
