import { Column, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

export type BillingRunStatus = "final" | "voided";

/**
 * A finalised monthly billing run. Its statements and lines never change afterwards; a run can
 * only be voided (and the month run again). Previews are computed on demand and never stored.
 */
@Entity("billing_runs")
export class BillingRun {
  @PrimaryGeneratedColumn("increment") id: number;
  /** Local calendar month, YYYY-MM. */
  @Index() @Column("text") period: string;
  @Column("text") status: BillingRunStatus;
  @Column("text") currency: string;
  @Column("integer") totalCents: number;
  @Column("integer", { nullable: true }) createdById: number | null;
  @Column("text") createdAt: string;
  @Column("text", { nullable: true }) voidedAt: string | null;
  @Column("integer", { nullable: true }) voidedById: number | null;
  @Column("text", { nullable: true }) voidReason: string | null;
  /**
   * The facility's recovery account the run's journal credits (RECOVERY_ACCOUNT when it was
   * finalised); set together with its journal_lines. Null for runs finalised before journals
   * were stored: their journal is built from the statements when downloaded.
   */
  @Column("text", { nullable: true }) recoveryAccount: string | null;
}
