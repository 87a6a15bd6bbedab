/**
 * The administrator's changes to people: adding a person (who is mailed a link to choose a
 * password unless given one) and changing name, roles, department, group, organisation or
 * whether they may sign in. The user policy decides on the person; a deactivation ends their
 * sessions.
 */
import type { EntityManager } from "typeorm";
import type { Role } from "@shared/schemas/auth";
import type { CreateUserInput, UpdateUserInput } from "@shared/schemas/users";
import { User, UserRole } from "../../entities";
import { AppError, Conflict, NotFound } from "../../errors";
import { serialTransaction } from "../../db/serial";
import { audit } from "../../core/audit";
import { newToken } from "../../core/tokens";
import type { AuthUser } from "../../middleware/auth";
import type { PeopleDeps } from "./people.deps";
import { checkNewPasswordOf, hashPassword, issueReset } from "./password.commands";
import { endSessionsOf } from "./session-store";
import { findUser } from "./user.queries";
import { userPolicy, type PersonFacts, type UserAction } from "./user.policy";

async function setRoles(em: EntityManager, userId: number, roles: Role[]): Promise<void> {
  await em.delete(UserRole, { userId });
  await em.insert(
    UserRole,
    [...new Set(roles)].map((role) => ({ userId, role })),
  );
}

/** The policy's refusal, naming the form field it concerns so the form can show it there. */
function authorizeField(actor: AuthUser, action: UserAction, person: PersonFacts, field: string): void {
  const d = userPolicy.check(actor, action, person);
  if (d) throw new AppError(d.status, d.code, d.reason, [{ path: field, message: d.reason }]);
}

export async function createUser(deps: PeopleDeps, actor: AuthUser | null, input: CreateUserInput): Promise<User> {
  if (input.password !== undefined) checkNewPasswordOf(deps, input.email, input.password, "password");
  const passwordHash = await hashPassword(input.password ?? newToken(), deps.bcryptCost);
  const id = await serialTransaction(deps.ds, async (em) => {
    const exists = await em.findOne(User, { where: { email: input.email } });
    if (exists) throw new Conflict("Someone with this e-mail address already has an account.", "email_taken");
    const t = deps.now().toISOString();
    const res = await em.insert(User, {
      email: input.email,
      name: input.name,
      passwordHash,
      active: true,
      departmentId: input.departmentId ?? null,
      groupId: input.groupId ?? null,
      organisation: input.organisation ?? null,
      calendarToken: newToken(24),
      createdAt: t,
      updatedAt: t,
    });
    const userId = res.identifiers[0].id as number;
    await setRoles(em, userId, input.roles);
    await audit(em, deps.now(), actor?.id ?? null, "user.created", "user", userId, { email: input.email, roles: input.roles, organisation: input.organisation ?? null });
    if (!input.password) await issueReset(em, deps, { id: userId, email: input.email }, "welcome");
    return userId;
  });
  return (await findUser(deps.ds, id))!;
}

/** Asks the policy about each change the patch makes to the person. */
function authorizeUpdate(actor: AuthUser, user: User, input: UpdateUserInput): void {
  const person: PersonFacts = { id: user.id, name: user.name, active: user.active, roles: user.roles };
  userPolicy.authorize(actor, "edit", person);
  if (input.active === false && user.active) authorizeField(actor, "deactivate", person, "active");
  if (input.active === true && !user.active) authorizeField(actor, "reactivate", person, "active");
  if (input.roles && !input.roles.includes("admin") && user.roles.includes("admin")) authorizeField(actor, "removeAdminRole", person, "roles");
}

export async function updateUser(deps: PeopleDeps, actor: AuthUser, id: number, input: UpdateUserInput): Promise<User> {
  const deactivated = await serialTransaction(deps.ds, async (em) => {
    const user = await em.findOne(User, { where: { id } });
    if (!user) throw new NotFound("That person");
    authorizeUpdate(actor, user, input);
    const patch: Partial<Pick<User, "name" | "active" | "departmentId" | "groupId" | "organisation">> & { updatedAt: string } = {
      updatedAt: deps.now().toISOString(),
    };
    if (input.name !== undefined) patch.name = input.name;
    if (input.active !== undefined) patch.active = input.active;
    if (input.departmentId !== undefined) patch.departmentId = input.departmentId;
    if (input.groupId !== undefined) patch.groupId = input.groupId;
    if (input.organisation !== undefined) patch.organisation = input.organisation;
    await em.update(User, id, patch);
    if (input.roles) await setRoles(em, id, input.roles);
    await audit(em, deps.now(), actor.id, input.active === false ? "user.deactivated" : "user.updated", "user", id, { ...input });
    return input.active === false;
  });
  if (deactivated) await endSessionsOf(deps.ds, id);
  return (await findUser(deps.ds, id))!;
}
