import { Column, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

export type MailStatus = "pending" | "sent" | "failed";

/**
 * The outbox: every mail is written here in the same transaction as the change it reports,
 * then delivered with retries, so a mail server outage never loses or blocks the change.
 */
@Entity("outbound_mail")
@Index(["status", "nextAttemptAt"])
export class OutboundMail {
  @PrimaryGeneratedColumn("increment") id: number;
  @Column("text") to: string;
  @Column("text") subject: string;
  @Column("text") text: string;
  @Column("text", { nullable: true }) html: string | null;
  /** JSON array of { filename, contentType, base64 } attachments. */
  @Column("text", { default: "[]" }) attachments: string;
  @Column("text", { default: "pending" }) status: MailStatus;
  @Column("integer", { default: 0 }) attempts: number;
  @Column("text") nextAttemptAt: string;
  @Column("text", { nullable: true }) lastError: string | null;
  @Column("text") createdAt: string;
  @Column("text", { nullable: true }) sentAt: string | null;
}
