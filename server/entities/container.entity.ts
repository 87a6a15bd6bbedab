import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";

export type ContainerKind = "bottle" | "vial" | "solution" | "waste";
export type ContainerStatus = "sealed" | "in_use" | "on_hold" | "empty" | "disposed";

/** A bottle, vial, prepared solution or waste container of one chemical. */
@Entity("containers")
@Index(["chemicalId", "status"])
// The Stockroom search counts one chemical's (one place's) containers in a place and state from the index alone.
@Index(["chemicalId", "locationId", "status"])
@Index(["locationId", "status"])
export class Container {
  @PrimaryGeneratedColumn("increment") id: number;
  @Column("integer") chemicalId: number;
  @Column("text", { default: "bottle" }) kind: ContainerKind;
  /** Indexed: the Stockroom sorts by what is left. */
  @Index() @Column("real") quantity: number;
  @Column("real") initialQuantity: number;
  @Column("text") unit: string;
  @Index() @Column("integer", { nullable: true }) locationId: number | null;
  @Index() @Column("text", { default: "sealed" }) status: ContainerStatus;
  @Column("text", { nullable: true }) openedAt: string | null;
  @Index() @Column("text", { nullable: true }) expiresAt: string | null;
  @Column("text", { nullable: true }) retestAt: string | null;
  @Column("integer", { nullable: true }) groupId: number | null;
  /** An external customer's own container (its people handle it); null for the host institution's stock. */
  @Column("text", { nullable: true }) organisation: string | null;
  @Index({ unique: true }) @Column("text") labelToken: string;
  @Column("text", { default: "" }) supplier: string;
  @Index() @Column("text", { default: "" }) lot: string;
  @Column("integer", { nullable: true }) priceCents: number | null;
  /** Prepared solutions: concentration in mol/L. */
  @Column("real", { nullable: true }) concentrationMolPerL: number | null;
  @Column("text", { nullable: true }) holdReason: string | null;
  @Column("text") createdAt: string;

  @ManyToOne("Chemical", { onDelete: "RESTRICT", nullable: false })
  @JoinColumn({ name: "chemicalId" })
  chemical?: unknown;

  @ManyToOne("Location", { onDelete: "SET NULL", nullable: true })
  @JoinColumn({ name: "locationId" })
  location?: unknown;

  @ManyToOne("ResearchGroup", { onDelete: "SET NULL", nullable: true })
  @JoinColumn({ name: "groupId" })
  group?: unknown;

}
