/**
 * What an administrator may do to a person's account, and in which state.
 *
 * - Administrators change people (the routes' role gate says who is one; the policy says it
 *   again, so the abilities it sends stand on their own).
 * - Nobody deactivates their own account or removes their own Administrator role (422: ask
 *   another administrator), so a facility is never left without someone to manage people.
 * - Deactivating applies to an active person and reactivating to a deactivated one (409 the
 *   other way round). A deactivation ends the person's sessions: the command does so once the
 *   policy allowed it.
 */
import type { Role } from "@shared/schemas/auth";
import { definePolicy, deny, type Denial } from "../../core/policy";
import { hasRole, type AuthUser } from "../../middleware/auth";

/** What the policy needs to know about a person (an entity or a DTO will do). */
export interface PersonFacts {
  id: number;
  name: string;
  active: boolean;
  roles: readonly Role[];
}

const adminsOnly = (a: AuthUser): Denial | null => (hasRole(a, "admin") ? null : deny(403, "admins_only", "Only an administrator changes people's accounts."));

const then =
  (...checks: ((a: AuthUser, p: PersonFacts) => Denial | null)[]) =>
  (a: AuthUser, p: PersonFacts): Denial | null => {
    for (const check of checks) {
      const d = check(a, p);
      if (d) return d;
    }
    return null;
  };

export const userPolicy = definePolicy<"edit" | "deactivate" | "reactivate" | "removeAdminRole", AuthUser, PersonFacts>({
  edit: adminsOnly,
  deactivate: then(adminsOnly, (a, p) => {
    if (p.id === a.id) return deny(422, "own_account", "You cannot deactivate your own account; ask another administrator.");
    return p.active ? null : deny(409, "already_deactivated", `${p.name} is already deactivated.`);
  }),
  reactivate: then(adminsOnly, (_a, p) => (p.active ? deny(409, "already_active", `${p.name} is already active.`) : null)),
  removeAdminRole: then(adminsOnly, (a, p) => {
    if (!p.roles.includes("admin")) return deny(422, "not_an_administrator", `${p.name} does not hold the Administrator role.`);
    return p.id === a.id ? deny(422, "own_admin_role", "You cannot remove your own Administrator role; ask another administrator.") : null;
  }),
});

export type UserAction = (typeof userPolicy.actions)[number];
