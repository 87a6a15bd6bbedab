import { Column, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

export type StockAlertKind = "reorder" | "expiring" | "over_limit";

/**
 * Alerts already mailed, so the hourly job tells people once (and again only after a quiet
 * period) rather than every hour.
 */
@Entity("stock_alerts")
@Index(["kind", "subjectId"])
export class StockAlert {
  @PrimaryGeneratedColumn("increment") id: number;
  @Column("text") kind: StockAlertKind;
  /** Chemical, container or location id, by kind. */
  @Column("integer") subjectId: number;
  @Column("text") sentAt: string;
}
