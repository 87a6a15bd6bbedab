/** Health, the audit log and the development mailbox: their answers as the API sends them. */
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
