/** People, departments and research groups → the DTOs of shared/schemas/users. */
import type { DepartmentDto, GroupDto, UserAdminDto } from "@shared/schemas/users";
import type { Department, ResearchGroup, User } from "../../entities";
import type { AuthUser } from "../../middleware/auth";
import { userPolicy } from "./user.policy";

export function presentUserAdmin(u: User, viewer: AuthUser): UserAdminDto {
  return {
    id: u.id,
    email: u.email,
    name: u.name,
    roles: u.roles,
    active: u.active,
    departmentId: u.departmentId,
    groupId: u.groupId,
    organisation: u.organisation,
    createdAt: u.createdAt,
    abilities: userPolicy.abilities(viewer, { id: u.id, name: u.name, active: u.active, roles: u.roles }),
  };
}

export const presentDepartment = (d: Department): DepartmentDto => ({ id: d.id, name: d.name, code: d.code });

export const presentGroup = (g: ResearchGroup): GroupDto => ({ id: g.id, name: g.name, departmentId: g.departmentId, leadId: g.leadId });
