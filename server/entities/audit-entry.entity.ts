import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";

/** Who did what to which record, kept for the facility's records. */
@Entity("audit_log")
@Index(["entityType", "entityId"])
export class AuditEntry {
  @PrimaryGeneratedColumn("increment") id: number;
  @Index() @Column("text") at: string;
  @Column("integer", { nullable: true }) actorId: number | null;
  @Column("text") action: string;
  @Column("text") entityType: string;
  @Column("integer", { nullable: true }) entityId: number | null;
  /** JSON with the details that matter for this action. */
  @Column("text", { default: "{}" }) detail: string;

  @ManyToOne("User", { onDelete: "SET NULL", nullable: true })
  @JoinColumn({ name: "actorId" })
  actor?: unknown;

}
