import { Column, Entity, JoinColumn, ManyToOne, PrimaryColumn } from "typeorm";

/** A person allowed to charge an account, optionally up to a monthly cap. */
@Entity("account_members")
export class AccountMember {
  @PrimaryColumn("integer") accountId: number;
  @PrimaryColumn("integer") userId: number;
  @Column("integer", { nullable: true }) monthlyCapCents: number | null;
  /** Set when the manager allowed a person of another organisation on this account, and why. */
  @Column("text", { nullable: true }) exceptionReason: string | null;

  @ManyToOne("Account", { onDelete: "CASCADE", nullable: false })
  @JoinColumn({ name: "accountId" })
  account?: unknown;

  @ManyToOne("User", { onDelete: "CASCADE", nullable: false })
  @JoinColumn({ name: "userId" })
  user?: unknown;

}
