import { Column, Entity, Index, JoinColumn, ManyToOne, OneToMany, PrimaryGeneratedColumn } from "typeorm";
import type { Role } from "@shared/schemas/auth";
import { UserRole } from "./user-role.entity";

/** A person who signs in: researcher, group lead, manager, safety officer or administrator. */
@Entity("users")
export class User {
  @PrimaryGeneratedColumn("increment") id: number;
  @Index({ unique: true }) @Column("text") email: string;
  /** Indexed: the people list reads in name order. */
  @Index() @Column("text") name: string;
  @Column("text") passwordHash: string;
  @Column("boolean", { default: true }) active: boolean;
  @Column("integer", { nullable: true }) departmentId: number | null;
  @Column("integer", { nullable: true }) groupId: number | null;
  /** The external customer this person works for (as on its accounts); null for the host institution's own people. */
  @Column("text", { nullable: true }) organisation: string | null;
  /** Secret for the personal iCalendar feed; rotating it retires old feed URLs. */
  @Index({ unique: true }) @Column("text") calendarToken: string;
  @Column("text") createdAt: string;
  @Column("text") updatedAt: string;

  @OneToMany(() => UserRole, (r) => r.user, { cascade: true, eager: true }) roleRows: UserRole[];

  get roles(): Role[] {
    return (this.roleRows ?? []).map((r) => r.role).sort();
  }

  @ManyToOne("Department", { onDelete: "SET NULL", nullable: true })
  @JoinColumn({ name: "departmentId" })
  department?: unknown;

  @ManyToOne("ResearchGroup", { onDelete: "SET NULL", nullable: true })
  @JoinColumn({ name: "groupId" })
  group?: unknown;

}
