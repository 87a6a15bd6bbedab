import type { UserDto } from "@shared/schemas/auth";
import type { UserAdminDto } from "@shared/schemas/users";
import type { User } from "../entities";

export function presentUser(u: User): UserDto {
  return { id: u.id, email: u.email, name: u.name, roles: u.roles };
}

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
