import { Column, Entity, JoinColumn, ManyToOne, PrimaryColumn } from "typeorm";

/** One instrument of a setup. */
@Entity("setup_instruments")
export class SetupInstrument {
  @PrimaryColumn("integer") setupId: number;
  @PrimaryColumn("integer") instrumentId: number;
  @Column("integer", { default: 0 }) position: number;

  @ManyToOne("Setup", { onDelete: "CASCADE", nullable: false })
  @JoinColumn({ name: "setupId" })
  setup?: unknown;

  @ManyToOne("Instrument", { onDelete: "CASCADE", nullable: false })
  @JoinColumn({ name: "instrumentId" })
  instrument?: unknown;
}
