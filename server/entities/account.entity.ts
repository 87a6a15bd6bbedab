import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";

export type AccountKind = "internal" | "external";
export type CustomerClass = "internal" | "external_academic" | "commercial";

/**
 * Something the facility charges: an internal cost centre or grant (settled by journal), or an
 * external customer (settled by invoice and card payment).
 */
@Entity("accounts")
export class Account {
  @PrimaryGeneratedColumn("increment") id: number;
  /** Cost centre or grant code for internal accounts; customer reference for external ones. */
  @Index({ unique: true }) @Column("text") code: string;
  @Column("text") name: string;
  @Column("text") kind: AccountKind;
  @Column("text") customerClass: CustomerClass;
  @Column("integer", { nullable: true }) departmentId: number | null;
  /** The group lead who owns the account and decides who may charge it. */
  @Column("integer", { nullable: true }) ownerId: number | null;
  @Column("text", { nullable: true }) validFrom: string | null;
  @Column("text", { nullable: true }) validTo: string | null;
  @Column("text", { nullable: true }) organisation: string | null;
  @Column("text", { nullable: true }) billingEmail: string | null;
  @Column("text", { nullable: true }) paymentCustomerId: string | null;
  @Column("boolean", { default: true }) active: boolean;
  @Column("text") createdAt: string;

  @ManyToOne("Department", { onDelete: "SET NULL", nullable: true })
  @JoinColumn({ name: "departmentId" })
  department?: unknown;

  @ManyToOne("User", { onDelete: "SET NULL", nullable: true })
  @JoinColumn({ name: "ownerId" })
  owner?: unknown;

}
