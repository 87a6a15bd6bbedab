/**
 * The outbox. Services enqueue mail inside their own transaction; deliverDueMail() sends it
 * later with retries and backoff, so an unreachable mail server never loses or blocks a change.
 */
import type { DataSource, EntityManager } from "typeorm";
import { OutboundMail } from "../entities";
import type { Mailer } from "../integrations/mailer";
import { prepared } from "../db/prepared";

export interface MailMessage {
  to: string;
  subject: string;
  text: string;
  html?: string;
  attachments?: { filename: string; contentType: string; base64: string }[];
}

/** Minutes to wait before each retry; after the last one the mail is marked failed. */
const BACKOFF_MINUTES = [1, 5, 15, 60, 180, 720];

export async function enqueueMail(em: EntityManager, now: Date, msg: MailMessage): Promise<void> {
  // Prepared, on the caller's transaction connection (see audit.service.ts for why).
  prepared(
    em.connection,
    `INSERT INTO outbound_mail ("to", subject, text, html, attachments, status, attempts, nextAttemptAt, createdAt) VALUES (?, ?, ?, ?, ?, 'pending', 0, ?, ?)`,
  ).run(msg.to, msg.subject, msg.text, msg.html ?? null, JSON.stringify(msg.attachments ?? []), now.toISOString(), now.toISOString());
}

export async function deliverDueMail(
  ds: DataSource,
  mailer: Mailer,
  now: Date,
  from: string,
  batch = 50,
): Promise<{ sent: number; failed: number }> {
  const repo = ds.getRepository(OutboundMail);
  const due = await repo
    .createQueryBuilder("m")
    .where("m.status = 'pending' AND m.nextAttemptAt <= :now", { now: now.toISOString() })
    .orderBy("m.id")
    .limit(batch)
    .getMany();
  let sent = 0;
  let failed = 0;
  for (const m of due) {
    try {
      await mailer.send({
        from,
        to: m.to,
        subject: m.subject,
        text: m.text,
        html: m.html ?? undefined,
        attachments: (JSON.parse(m.attachments) as { filename: string; contentType: string; base64: string }[]).map((a) => ({
          filename: a.filename,
          contentType: a.contentType,
          content: Buffer.from(a.base64, "base64"),
        })),
      });
      await repo.update(m.id, { status: "sent", sentAt: now.toISOString(), attempts: m.attempts + 1, lastError: null });
      sent++;
    } catch (e) {
      const attempts = m.attempts + 1;
      const wait = BACKOFF_MINUTES[attempts - 1];
      await repo.update(m.id, {
        attempts,
        lastError: String((e as Error).message ?? e).slice(0, 500),
        status: wait === undefined ? "failed" : "pending",
        nextAttemptAt: new Date(now.getTime() + (wait ?? 0) * 60_000).toISOString(),
      });
      failed++;
    }
  }
  return { sent, failed };
}
