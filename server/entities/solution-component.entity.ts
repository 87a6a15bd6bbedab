import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";

export type ComponentRole = "solute" | "solvent";

/**
 * The lineage of a prepared solution: which parent containers went into it and how much of
 * each. The solvent's row also tells the safety review which liquid the solution mostly is.
 */
@Entity("solution_components")
export class SolutionComponent {
  @PrimaryGeneratedColumn("increment") id: number;
  @Index() @Column("integer") solutionContainerId: number;
  @Index() @Column("integer") parentContainerId: number;
  @Column("text") role: ComponentRole;
  /** Taken from the parent, in the parent's unit. */
  @Column("real") amount: number;
  @Column("text") unit: string;

  @ManyToOne("Container", { onDelete: "CASCADE", nullable: false })
  @JoinColumn({ name: "solutionContainerId" })
  solution?: unknown;

  @ManyToOne("Container", { onDelete: "RESTRICT", nullable: false })
  @JoinColumn({ name: "parentContainerId" })
  parent?: unknown;
}
