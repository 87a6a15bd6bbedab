import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryColumn } from "typeorm";

/**
 * One instrument held by a booking. startMs and endMs are copies of the booking's times, kept
 * by database triggers (migration BookingInstrumentTimes), so that one instrument's window is a
 * walk along the (instrumentId, startMs) index instead of a look at every booking in the
 * window. Writers leave them alone: the triggers fill them on insert and follow every move.
 */
@Entity("booking_instruments")
@Index(["instrumentId", "bookingId"])
@Index(["instrumentId", "startMs"])
export class BookingInstrument {
  @PrimaryColumn("integer") bookingId: number;
  @PrimaryColumn("integer") instrumentId: number;

  @Column("integer", { default: 0 }) startMs: number;
  @Column("integer", { default: 0 }) endMs: number;

  @ManyToOne("Booking", { onDelete: "CASCADE", nullable: false })
  @JoinColumn({ name: "bookingId" })
  booking?: unknown;

  @ManyToOne("Instrument", { onDelete: "RESTRICT", nullable: false })
  @JoinColumn({ name: "instrumentId" })
  instrument?: unknown;
}
