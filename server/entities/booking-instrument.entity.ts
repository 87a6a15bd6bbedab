import { Entity, Index, JoinColumn, ManyToOne, PrimaryColumn } from "typeorm";

/** One instrument held by a booking. */
@Entity("booking_instruments")
@Index(["instrumentId", "bookingId"])
export class BookingInstrument {
  @PrimaryColumn("integer") bookingId: number;
  @PrimaryColumn("integer") instrumentId: number;

  @ManyToOne("Booking", { onDelete: "CASCADE", nullable: false })
  @JoinColumn({ name: "bookingId" })
  booking?: unknown;

  @ManyToOne("Instrument", { onDelete: "RESTRICT", nullable: false })
  @JoinColumn({ name: "instrumentId" })
  instrument?: unknown;
}
