/**
 * Who may do what with an account, and who may be made one of its members.
 *
 * - The manager sees, edits and adjusts every account; its owner and its members see it (404 for
 *   anyone else: an account one may not see is not known to exist). The account list shows the
 *   manager every account, an owner theirs, and a member those they may charge today.
 * - Who may charge an account: the manager; the owner; a member of the same organisation as the
 *   account (the host institution's people on internal accounts, an external customer's people on
 *   that customer's account), or one the manager let in by an explicit, stated exception.
 * - A group lead adds to an account only people of the same organisation (422 with a code saying
 *   why otherwise); the manager may make an exception, saying why.
 */
import { definePolicy, deny, type Denial } from "../../core/policy";
import { hasRole, type AuthUser } from "../../middleware/auth";

export interface AccountFacts {
  id: number;
  code: string;
  kind: "internal" | "external";
  organisation: string | null;
  ownerId: number | null;
  /** Active and within its validity dates today (the facility's date); left out: not known, taken as open. */
  chargeable?: boolean;
}

/** The account and what the actor's membership of it says (null: not a member). */
export interface AccountWithMembership {
  account: AccountFacts;
  membership: { exceptionReason: string | null } | null;
}

/** The person a group lead or the manager wants to add. */
export interface Newcomer {
  id: number;
  name: string;
  organisation: string | null;
}

const sameOrg = (a: string | null, b: string | null) => a !== null && b !== null && a.trim().toLowerCase() === b.trim().toLowerCase();

/** Whether a person belongs with an account's organisation, and if not, why (422, stable code). */
export function organisationMismatch(account: AccountFacts, person: Newcomer): Denial | null {
  if (account.kind === "internal") {
    return person.organisation === null
      ? null
      : deny(422, "external_person_internal_account", `${person.name} works for ${person.organisation}; internal account ${account.code} is for the host institution's own people.`);
  }
  if (person.organisation === null) {
    return deny(422, "internal_person_external_account", `${person.name} is not one of ${account.organisation ?? "the customer"}'s people; account ${account.code} is that customer's.`);
  }
  return sameOrg(person.organisation, account.organisation)
    ? null
    : deny(422, "other_organisation", `${person.name} works for ${person.organisation}; account ${account.code} is ${account.organisation ?? "another customer"}'s.`);
}

const isManager = (a: AuthUser) => hasRole(a, "manager");
const owns = (a: AuthUser, acc: AccountFacts) => acc.ownerId === a.id;

const manageMembers = (a: AuthUser, { account }: AccountWithMembership): Denial | null =>
  isManager(a) || (owns(a, account) && hasRole(a, "group_lead")) ? null : deny(403, "not_account_owner", `Only account ${account.code}'s group lead or the manager decides who may charge it.`);

export const accountPolicy = definePolicy<"view" | "manageMembers" | "addMember" | "makeException" | "edit" | "adjust" | "charge", AuthUser, AccountWithMembership>({
  // 404, not 403: an account one may not see should not be known to exist.
  view: (a, { account, membership }) => (isManager(a) || owns(a, account) || membership ? null : deny(404, "not_found", "That account was not found.")),
  manageMembers,
  // Nobody new starts charging a closed account (or one past its dates).
  addMember: (a, r) =>
    manageMembers(a, r) ??
    (r.account.chargeable === false ? deny(422, "account_not_valid", `Account ${r.account.code} is closed or past its validity dates; nobody new may charge it.`) : null),
  // Letting someone of another organisation charge an account is the manager's call, and said why.
  makeException: (a) => (isManager(a) ? null : deny(403, "exception_manager_only", "Only the facility manager may let someone of another organisation charge an account.")),
  edit: (a) => (isManager(a) ? null : deny(403, "manager_only", "Only the facility manager changes accounts.")),
  adjust: (a) => (isManager(a) ? null : deny(403, "manager_only", "Only the facility manager credits or adjusts accounts.")),
  charge: (a, { account, membership }) => {
    if (isManager(a) || owns(a, account)) return null;
    if (!membership) return deny(403, "account_not_allowed", `You may not charge account ${account.code}.`);
    if (membership.exceptionReason) return null;
    const mismatch = organisationMismatch(account, { id: a.id, name: a.name, organisation: a.organisation });
    return mismatch ? deny(403, "account_not_allowed", `You may not charge account ${account.code}: ${mismatch.reason}`) : null;
  },
});

/** Whether the account list shows this account: the manager every one, an owner theirs, a member those they may charge today. */
export function listsAccount(a: AuthUser, r: AccountWithMembership): boolean {
  if (!accountPolicy.can(a, "view", r)) return false;
  if (isManager(a) || owns(a, r.account)) return true;
  return r.account.chargeable !== false && accountPolicy.can(a, "charge", r);
}

/** What adding a person to an account comes to: refused (with why), or allowed with the exception it rests on (null: none needed). */
export type Admission = { denial: Denial } | { denial: null; exceptionReason: string | null };

/**
 * Whether the actor may let this person charge the account. The group lead adds only people of
 * the account's organisation (422 with the mismatch's code otherwise); the manager may add
 * anyone else too, but only by stating an exception (`exceptionReason`), which only the manager
 * may send (403). A reason sent where no exception is needed is not kept. A membership the
 * manager already excused keeps its exception when its cap is changed.
 */
export function admitMember(
  a: AuthUser,
  r: AccountWithMembership,
  person: Newcomer,
  opts: { exceptionReason?: string | null; existingException?: string | null } = {},
): Admission {
  const refused = accountPolicy.check(a, "addMember", r) ?? (opts.exceptionReason ? accountPolicy.check(a, "makeException", r) : null);
  if (refused) return { denial: refused };
  const mismatch = organisationMismatch(r.account, person);
  if (!mismatch) return { denial: null, exceptionReason: null };
  if (opts.exceptionReason) return { denial: null, exceptionReason: opts.exceptionReason };
  if (opts.existingException) return { denial: null, exceptionReason: opts.existingException };
  return { denial: mismatch };
}
