import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";

/** A planned interface experiment: its input as the person gave it, and the booking it is attached to. */
@Entity("run_plans")
export class RunPlan {
  @PrimaryGeneratedColumn("increment") id: number;
  @Index() @Column("integer") authorId: number;
  @Index() @Column("integer", { nullable: true }) bookingId: number | null;
  @Index() @Column("integer", { nullable: true }) cellId: number | null;
  @Column("text") title: string;
  @Column("text") solvent: string;
  /** JSON of the plan's input (shared/schemas/run-plan-records.ts runPlanInput). */
  @Column("text") input: string;
  @Column("text") createdAt: string;
  @Column("text") updatedAt: string;

  @ManyToOne("User", { onDelete: "RESTRICT", nullable: false })
  @JoinColumn({ name: "authorId" })
  author?: unknown;

  @ManyToOne("Booking", { onDelete: "SET NULL", nullable: true })
  @JoinColumn({ name: "bookingId" })
  booking?: unknown;

  @ManyToOne("Instrument", { onDelete: "SET NULL", nullable: true })
  @JoinColumn({ name: "cellId" })
  cell?: unknown;
}
