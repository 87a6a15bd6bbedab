import { Column, Entity, PrimaryColumn } from "typeorm";

/** A payment-service event already handled: the same event id delivered again changes nothing. */
@Entity("processed_events")
export class ProcessedEvent {
  @PrimaryColumn("text") id: string;
  @Column("text") type: string;
  @Column("text") processedAt: string;
}
