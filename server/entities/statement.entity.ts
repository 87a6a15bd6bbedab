import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";

/**
 * Where an external statement's invoice stands: queued until the payment service has it, then
 * open, paid, payment_failed (still open, a payment was declined) or void. Internal statements
 * settle by journal and stay "none".
 */
export type InvoiceStatus = "none" | "queued" | "open" | "paid" | "payment_failed" | "void";

/** One account's statement in one billing run; its total is the sum of its lines. */
@Entity("statements")
@Index(["runId", "accountId"], { unique: true })
export class Statement {
  @PrimaryGeneratedColumn("increment") id: number;
  @Column("integer") runId: number;
  @Index() @Column("integer") accountId: number;
  @Column("text") period: string;
  @Column("integer") totalCents: number;
  @Column("text") currency: string;
  @Column("text", { default: "none" }) invoiceStatus: InvoiceStatus;
  @Index() @Column("text", { nullable: true }) invoiceId: string | null;
  @Column("text", { nullable: true }) invoiceNumber: string | null;
  @Column("text", { nullable: true }) invoiceUrl: string | null;
  @Column("integer", { default: 0 }) invoiceAttempts: number;
  @Column("text", { nullable: true }) invoiceNextAttemptAt: string | null;
  @Column("text", { nullable: true }) invoiceLastError: string | null;
  @Column("text", { nullable: true }) paidAt: string | null;
  /** When the PDF went to the outbox; null until the statement has been mailed (or needs no mail). */
  @Column("text", { nullable: true }) mailedAt: string | null;
  @Column("text") createdAt: string;

  @ManyToOne("BillingRun", { onDelete: "CASCADE", nullable: false })
  @JoinColumn({ name: "runId" })
  run?: unknown;
}
