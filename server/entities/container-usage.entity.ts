import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";

/**
 * An amount taken from a container: what was logged (amount, unit), what it came to in the
 * container's own unit, and its cost for recharge billing.
 */
@Entity("container_usages")
export class ContainerUsage {
  @PrimaryGeneratedColumn("increment") id: number;
  @Index() @Column("integer") containerId: number;
  @Index() @Column("integer") userId: number;
  @Index() @Column("integer", { nullable: true }) bookingId: number | null;
  /** The account charged for the consumable; the booking's account when a booking is named. */
  @Column("integer", { nullable: true }) accountId: number | null;
  @Column("real") amount: number;
  @Column("text") unit: string;
  @Column("real") amountInContainerUnit: number;
  /** At unit cost, before any mark-up; null when the chemical has no unit cost. */
  @Column("integer", { nullable: true }) costCents: number | null;
  /**
   * The cost as worked out at the time of use, unrounded (decimal strings): the quantity in the
   * chemical's cost unit and the price of one unit. Billing rounds once, at the charge line,
   * after the mark-up; costCents above is that figure rounded, for display.
   */
  @Column("text", { nullable: true }) costQuantity: string | null;
  @Column("text", { nullable: true }) costUnit: string | null;
  @Column("text", { nullable: true }) unitCostCents: string | null;
  @Column("text", { default: "" }) note: string;
  @Index() @Column("text") at: string;

  @ManyToOne("Container", { onDelete: "RESTRICT", nullable: false })
  @JoinColumn({ name: "containerId" })
  container?: unknown;

  @ManyToOne("User", { onDelete: "RESTRICT", nullable: false })
  @JoinColumn({ name: "userId" })
  user?: unknown;

  @ManyToOne("Booking", { onDelete: "SET NULL", nullable: true })
  @JoinColumn({ name: "bookingId" })
  booking?: unknown;

  @ManyToOne("Account", { onDelete: "SET NULL", nullable: true })
  @JoinColumn({ name: "accountId" })
  account?: unknown;
}
