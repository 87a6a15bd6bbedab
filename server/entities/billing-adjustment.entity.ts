import { Column, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

/**
 * A credit (negative) or charge (positive) a manager enters for an account with a reason. It
 * lands on the account's statement of the first run for its period or a later one.
 */
@Entity("billing_adjustments")
export class BillingAdjustment {
  @PrimaryGeneratedColumn("increment") id: number;
  @Index() @Column("integer") accountId: number;
  @Column("integer") amountCents: number;
  @Column("text") reason: string;
  /** The month it belongs to (YYYY-MM): billed by that month's run or, if that is final, the next. */
  @Column("text") period: string;
  @Column("integer", { nullable: true }) createdById: number | null;
  @Column("text") createdAt: string;
}
