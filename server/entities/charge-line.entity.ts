import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";

/**
 * instrument: one booking on one instrument at one rate (a rate change splits it);
 * consumable: one container usage at cost × mark-up; adjustment: a manager's credit or charge;
 * correction: the difference for a booking changed after its month was finalised;
 * cap_credit: brings one member's month on one account down to the cap.
 */
export type ChargeKind = "instrument" | "consumable" | "adjustment" | "correction" | "cap_credit";

/** One line of a statement, kept as billed so a finalised statement never changes. */
@Entity("charge_lines")
export class ChargeLine {
  @PrimaryGeneratedColumn("increment") id: number;
  @Index() @Column("integer") statementId: number;
  @Index() @Column("integer") runId: number;
  @Column("integer") accountId: number;
  @Column("text") kind: ChargeKind;
  @Index() @Column("integer", { nullable: true }) bookingId: number | null;
  @Column("integer", { nullable: true }) instrumentId: number | null;
  @Index() @Column("integer", { nullable: true }) usageId: number | null;
  @Column("integer", { nullable: true }) adjustmentId: number | null;
  @Index() @Column("integer", { nullable: true }) userId: number | null;
  @Column("integer", { nullable: true }) rateId: number | null;
  @Column("text") description: string;
  /**
   * Exact decimal text ("1.5", "31.4225"), or a reduced fraction ("1/6") where no decimal is
   * exact: hours for instrument time, the amount in the chemical's cost unit for consumables,
   * 1 for single amounts (adjustments, corrections, cap credits).
   */
  @Column("text") quantity: string;
  /** h, mL, g, each… */
  @Column("text") unit: string;
  /**
   * The price of ONE unit in cents, mark-up included, as exact decimal text (may hold fractions
   * of a cent): quantity × unitPriceCents rounds (once, half away from zero) to amountCents.
   */
  @Column("text") unitPriceCents: string;
  @Column("integer") amountCents: number;
  /** When the charged thing happened (session start, usage time, entry time). */
  @Column("text") at: string;

  @ManyToOne("Statement", { onDelete: "CASCADE", nullable: false })
  @JoinColumn({ name: "statementId" })
  statement?: unknown;
}
