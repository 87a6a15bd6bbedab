import { z } from "zod";
import { role, passwordSchema } from "./auth";
import { id, pageQuery, searchText } from "./common";

/** What the signed-in administrator may do to a person (the user policy's answer, per row). */
export const userAbilities = z.object({
  edit: z.boolean(),
  deactivate: z.boolean(),
  reactivate: z.boolean(),
  /** False for one's own account: nobody removes their own Administrator role. */
  removeAdminRole: z.boolean(),
});
export type UserAbilities = z.infer<typeof userAbilities>;

/**
 * The external customer a person works for, written as on that customer's accounts; empty or
 * null for the host institution's own people.
 */
const organisation = z
  .string()
  .trim()
  .max(200, "Use at most 200 characters")
  .transform((v) => v || null)
  .nullable();

export const userAdminDto = z.object({
  id: z.number(),
  email: z.string(),
  name: z.string(),
  roles: z.array(role),
  active: z.boolean(),
  departmentId: z.number().nullable(),
  groupId: z.number().nullable(),
  /** The external customer's organisation; null for the host institution's own people. */
  organisation: z.string().nullable(),
  createdAt: z.string(),
  abilities: userAbilities,
});
export type UserAdminDto = z.infer<typeof userAdminDto>;

export const userListQuery = pageQuery.extend({
  q: searchText.optional(),
});
export type UserListQuery = z.infer<typeof userListQuery>;

export const createUserInput = z.object({
  email: z.email({ message: "Enter a valid e-mail address" }).max(254).transform((e) => e.toLowerCase()),
  name: z.string().trim().min(1, "Enter the person's name").max(120),
  roles: z.array(role).min(1, "Give at least one role"),
  password: passwordSchema.optional(),
  departmentId: id().nullable().optional(),
  groupId: id().nullable().optional(),
  organisation: organisation.optional(),
});
export type CreateUserInput = z.infer<typeof createUserInput>;

export const updateUserInput = z
  .object({
    name: z.string().trim().min(1, "Enter the person's name").max(120),
    roles: z.array(role).min(1, "Give at least one role"),
    active: z.boolean(),
    departmentId: id().nullable(),
    groupId: id().nullable(),
    organisation,
  })
  .partial();
export type UpdateUserInput = z.infer<typeof updateUserInput>;

/** The organisations already known (external accounts and people), offered when typing one. */
export const organisationList = z.object({ items: z.array(z.string()) });

export const departmentDto = z.object({ id: z.number(), name: z.string(), code: z.string() });
export type DepartmentDto = z.infer<typeof departmentDto>;

export const groupDto = z.object({
  id: z.number(),
  name: z.string(),
  departmentId: z.number(),
  leadId: z.number().nullable(),
});
export type GroupDto = z.infer<typeof groupDto>;
