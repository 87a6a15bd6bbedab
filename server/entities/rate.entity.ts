import { Column, Entity, Index, PrimaryGeneratedColumn } from "typeorm";
import type { CustomerClass } from "./account.entity";
import type { InstrumentKind } from "./instrument.entity";

/**
 * One row of the recharge rate schedule: an hourly rate for one instrument (or every instrument
 * of a kind) and one customer class, valid on the local dates [effectiveFrom, effectiveTo).
 * Rounding increment and minimum charge override the billing policy when set.
 */
@Entity("rates")
@Index(["customerClass", "instrumentId", "instrumentKind"])
export class Rate {
  @PrimaryGeneratedColumn("increment") id: number;
  @Column("integer", { nullable: true }) instrumentId: number | null;
  @Column("text", { nullable: true }) instrumentKind: InstrumentKind | null;
  @Column("text") customerClass: CustomerClass;
  @Column("integer") hourlyRateCents: number;
  /** First local day the rate applies (YYYY-MM-DD, facility time zone). */
  @Column("text") effectiveFrom: string;
  /** First local day it no longer applies; null: until further notice. */
  @Column("text", { nullable: true }) effectiveTo: string | null;
  /** Minimum charge in minutes for a session that ran; null: the policy's. */
  @Column("integer", { nullable: true }) minimumMinutes: number | null;
  /** Billed minutes are rounded up to this; null: the policy's. */
  @Column("integer", { nullable: true }) roundingIncrementMinutes: number | null;
  /** Multiplies the rate outside the instrument's bookable hours; null: no after-hours pricing. */
  @Column("real", { nullable: true }) afterHoursFactor: number | null;
  @Column("text", { default: "" }) note: string;
  @Column("integer", { nullable: true }) createdById: number | null;
  @Column("text") createdAt: string;
}
