import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";

export type MovementKind = "received" | "moved" | "prepared";

/**
 * Where a container has been: each receipt and each move, with who and when. The safety
 * review and "where did this bottle go" both read this history.
 */
@Entity("container_movements")
export class ContainerMovement {
  @PrimaryGeneratedColumn("increment") id: number;
  @Index() @Column("integer") containerId: number;
  @Column("integer", { nullable: true }) fromLocationId: number | null;
  @Column("integer", { nullable: true }) toLocationId: number | null;
  @Column("integer", { nullable: true }) userId: number | null;
  @Column("text") kind: MovementKind;
  @Column("text", { default: "" }) note: string;
  @Column("text") at: string;

  @ManyToOne("Container", { onDelete: "CASCADE", nullable: false })
  @JoinColumn({ name: "containerId" })
  container?: unknown;

  @ManyToOne("Location", { onDelete: "SET NULL", nullable: true })
  @JoinColumn({ name: "fromLocationId" })
  fromLocation?: unknown;

  @ManyToOne("Location", { onDelete: "SET NULL", nullable: true })
  @JoinColumn({ name: "toLocationId" })
  toLocation?: unknown;

  @ManyToOne("User", { onDelete: "SET NULL", nullable: true })
  @JoinColumn({ name: "userId" })
  user?: unknown;
}
