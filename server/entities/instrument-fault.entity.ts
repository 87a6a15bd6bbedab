import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";

/**
 * A fault someone reported on an instrument (from its page or by scanning its label). Reporting
 * changes nothing else: the manager reads it and decides whether to take the instrument out of
 * service; closing it records what was done.
 */
@Entity("instrument_faults")
@Index(["instrumentId", "closedAt"])
export class InstrumentFault {
  @PrimaryGeneratedColumn("increment") id: number;
  @Column("integer") instrumentId: number;
  @Column("integer", { nullable: true }) reportedById: number | null;
  @Column("text") note: string;
  @Column("text") reportedAt: string;
  @Column("text", { nullable: true }) closedAt: string | null;
  @Column("integer", { nullable: true }) closedById: number | null;
  @Column("text", { default: "" }) resolution: string;

  @ManyToOne("Instrument", { onDelete: "CASCADE", nullable: false })
  @JoinColumn({ name: "instrumentId" })
  instrument?: unknown;

  @ManyToOne("User", { onDelete: "SET NULL", nullable: true })
  @JoinColumn({ name: "reportedById" })
  reportedBy?: unknown;
}
