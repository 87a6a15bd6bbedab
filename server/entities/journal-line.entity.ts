import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";

/**
 * One line of a finalised billing run's double-entry journal for the finance office, stored when
 * the run is finalised (shared/domain/journal.ts buildJournal): per internal statement, a debit
 * to the customer's account and an equal credit to the facility's recovery account. Kept as
 * written, so the journal, and the reversal of a voided run, never change with later edits of
 * an account's code or of RECOVERY_ACCOUNT. Exactly one of debitCents and creditCents is set.
 */
@Entity("journal_lines")
export class JournalLine {
  @PrimaryGeneratedColumn("increment") id: number;
  @Index() @Column("integer") runId: number;
  /** Order of the line in the journal file. */
  @Column("integer") position: number;
  @Column("text") period: string;
  @Column("text") account: string;
  @Column("text", { default: "" }) department: string;
  @Column("integer", { nullable: true }) debitCents: number | null;
  @Column("integer", { nullable: true }) creditCents: number | null;
  @Column("text") currency: string;
  @Column("text") description: string;

  @ManyToOne("BillingRun", { onDelete: "CASCADE", nullable: false })
  @JoinColumn({ name: "runId" })
  run?: unknown;
}
