import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";

/** A person's certification on one instrument, with its expiry and after-hours endorsement. */
@Entity("training_records")
@Index(["userId", "instrumentId"])
export class TrainingRecord {
  @PrimaryGeneratedColumn("increment") id: number;
  @Column("integer") userId: number;
  @Column("integer") instrumentId: number;
  @Column("text") grantedAt: string;
  @Column("text", { nullable: true }) expiresAt: string | null;
  @Column("boolean", { default: false }) afterHours: boolean;
  @Column("text", { nullable: true }) revokedAt: string | null;
  @Column("integer", { nullable: true }) grantedById: number | null;
  @Column("text", { default: "" }) notes: string;
  /** When the "expires within 30 days" notice went out, so it goes once per record. */
  @Column("text", { nullable: true }) expiryNoticeSentAt: string | null;

  @ManyToOne("User", { onDelete: "CASCADE", nullable: false })
  @JoinColumn({ name: "userId" })
  user?: unknown;

  @ManyToOne("Instrument", { onDelete: "CASCADE", nullable: false })
  @JoinColumn({ name: "instrumentId" })
  instrument?: unknown;

  @ManyToOne("User", { onDelete: "SET NULL", nullable: true })
  @JoinColumn({ name: "grantedById" })
  grantedBy?: unknown;

}
