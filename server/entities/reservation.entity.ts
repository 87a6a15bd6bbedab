import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";

export type ReservationState = "held" | "released" | "used";

/**
 * An amount of a container held for a booking (by its run plan), in the container's unit. While
 * held, nobody draws it except on that booking; draws on the booking count against it (`drawn`).
 * Cancelling the booking releases it; checking in turns what is left of it into a usage.
 */
@Entity("reservations")
@Index(["containerId", "state"])
export class Reservation {
  @PrimaryGeneratedColumn("increment") id: number;
  @Column("integer") containerId: number;
  @Index() @Column("integer") bookingId: number;
  @Index() @Column("integer", { nullable: true }) runPlanId: number | null;
  @Column("real") amount: number;
  @Column("real", { default: 0 }) drawn: number;
  @Column("text") unit: string;
  @Column("text", { default: "held" }) state: ReservationState;
  @Column("text", { default: "" }) note: string;
  @Column("integer", { nullable: true }) usageId: number | null;
  @Column("integer", { nullable: true }) createdById: number | null;
  @Column("text") createdAt: string;
  @Column("text", { nullable: true }) closedAt: string | null;

  @ManyToOne("Container", { onDelete: "RESTRICT", nullable: false })
  @JoinColumn({ name: "containerId" })
  container?: unknown;

  @ManyToOne("Booking", { onDelete: "CASCADE", nullable: false })
  @JoinColumn({ name: "bookingId" })
  booking?: unknown;

  @ManyToOne("RunPlan", { onDelete: "SET NULL", nullable: true })
  @JoinColumn({ name: "runPlanId" })
  runPlan?: unknown;
}
