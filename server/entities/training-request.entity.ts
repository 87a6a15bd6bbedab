import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";

export type TrainingRequestStatus = "open" | "granted" | "dismissed";

/** A member asking the manager for training on one instrument; it waits in the manager's queue. */
@Entity("training_requests")
export class TrainingRequest {
  @PrimaryGeneratedColumn("increment") id: number;
  @Index() @Column("integer") userId: number;
  @Column("integer") instrumentId: number;
  @Column("text", { default: "" }) note: string;
  @Index() @Column("text", { default: "open" }) status: TrainingRequestStatus;
  @Column("text") createdAt: string;
  @Column("text", { nullable: true }) closedAt: string | null;
  @Column("integer", { nullable: true }) closedById: number | null;

  @ManyToOne("User", { onDelete: "CASCADE", nullable: false })
  @JoinColumn({ name: "userId" })
  user?: unknown;

  @ManyToOne("Instrument", { onDelete: "CASCADE", nullable: false })
  @JoinColumn({ name: "instrumentId" })
  instrument?: unknown;
}
