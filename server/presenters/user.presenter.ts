import type { UserAdminDto } from "@shared/schemas/users";
import type { User } from "../entities";

export function presentUserAdmin(u: User): UserAdminDto {
  return {
    id: u.id,
    email: u.email,
    name: u.name,
    roles: u.roles,
    active: u.active,
    departmentId: u.departmentId,
    groupId: u.groupId,
    createdAt: u.createdAt,
  };
}
