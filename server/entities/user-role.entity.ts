import { Entity, JoinColumn, ManyToOne, PrimaryColumn } from "typeorm";
import type { Role } from "@shared/schemas/auth";
import type { User } from "./user.entity";

/** One role a person holds; a person may hold several. */
@Entity("user_roles")
export class UserRole {
  @PrimaryColumn("integer") userId: number;
  @PrimaryColumn("text") role: Role;

  @ManyToOne("User", "roleRows", { onDelete: "CASCADE" })
  @JoinColumn({ name: "userId" })
  user: User;
}
