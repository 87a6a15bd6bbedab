import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";

/** A research group led by a group lead (PI) within a department. */
@Entity("research_groups")
export class ResearchGroup {
  @PrimaryGeneratedColumn("increment") id: number;
  @Column("text") name: string;
  @Column("integer") departmentId: number;
  @Column("integer", { nullable: true }) leadId: number | null;

  @ManyToOne("Department", { onDelete: "RESTRICT", nullable: false })
  @JoinColumn({ name: "departmentId" })
  department?: unknown;

  @ManyToOne("User", { onDelete: "SET NULL", nullable: true })
  @JoinColumn({ name: "leadId" })
  lead?: unknown;

}
