import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";

export type LabelledType = "container" | "instrument";

/**
 * A label token that was retired when its label was re-issued. Kept so a scan of the old,
 * still-stuck label answers "this label was replaced" instead of "unknown", and so the record
 * shows when and by whom its labels changed.
 */
@Entity("label_history")
@Index(["entityType", "entityId"])
export class LabelHistory {
  @PrimaryGeneratedColumn("increment") id: number;
  @Column("text") entityType: LabelledType;
  @Column("integer") entityId: number;
  @Index({ unique: true }) @Column("text") token: string;
  @Column("text") retiredAt: string;
  @Column("integer", { nullable: true }) retiredById: number | null;
  @Column("text", { default: "" }) reason: string;

  @ManyToOne("User", { onDelete: "SET NULL", nullable: true })
  @JoinColumn({ name: "retiredById" })
  retiredBy?: unknown;
}
