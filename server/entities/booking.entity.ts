import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";

export type BookingStatus = "requested" | "confirmed" | "declined" | "cancelled" | "in_progress" | "completed" | "no_show";

/**
 * A reservation of one or more instruments (a potentiostat with an interface cell) for one
 * time range, charged to one account. Times are kept both as ISO strings and as epoch
 * milliseconds; the latter make the overlap query a plain integer comparison.
 */
@Entity("bookings")
@Index(["startMs", "endMs"])
export class Booking {
  @PrimaryGeneratedColumn("increment") id: number;
  @Index() @Column("integer") userId: number;
  @Index() @Column("integer") accountId: number;
  @Column("text", { default: "" }) purpose: string;
  @Index() @Column("text") status: BookingStatus;
  @Column("text") startsAt: string;
  @Column("text") endsAt: string;
  @Column("integer") startMs: number;
  @Column("integer") endMs: number;
  @Column("text", { nullable: true }) checkedInAt: string | null;
  @Column("text", { nullable: true }) checkedOutAt: string | null;
  /** Bookings made together as a weekly series share this id. */
  @Index() @Column("text", { nullable: true }) seriesId: string | null;
  @Column("text", { nullable: true }) declineReason: string | null;
  @Column("text", { nullable: true }) cancelReason: string | null;
  @Column("text", { nullable: true }) cancelledAt: string | null;
  @Column("integer", { nullable: true }) cancelledById: number | null;
  /** Cancelled inside the cancellation window: billed at the late-cancellation share. */
  @Column("boolean", { default: false }) lateCancel: boolean;
  @Column("integer", { nullable: true }) decidedById: number | null;
  @Column("text", { nullable: true }) reminderSentAt: string | null;
  @Column("text") createdAt: string;
  @Column("text") updatedAt: string;

  @ManyToOne("User", { onDelete: "RESTRICT", nullable: false })
  @JoinColumn({ name: "userId" })
  user?: unknown;

  @ManyToOne("Account", { onDelete: "RESTRICT", nullable: false })
  @JoinColumn({ name: "accountId" })
  account?: unknown;
}

/** What a booking holds before anything has happened to it (no check-in, decision or cancellation). */
export const UNTOUCHED_BOOKING = {
  checkedInAt: null,
  checkedOutAt: null,
  seriesId: null,
  declineReason: null,
  cancelReason: null,
  cancelledAt: null,
  cancelledById: null,
  lateCancel: false,
  decidedById: null,
  reminderSentAt: null,
} as const satisfies Partial<Booking>;
