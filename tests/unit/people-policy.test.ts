/**
 * The People area's policies as tables: every action × every kind of person × every state of
 * the record, through the real policy functions. Each cell is "ok" or the refusal's
 * "status code". The rules are the ones the People area had before it became a module (issue 9:
 * moved unchanged), written down here once.
 */
import { describe, expect, it } from "vitest";
import type { Role } from "@shared/schemas/auth";
import { userAbilities } from "@shared/schemas/users";
import { trainingAbilities, trainingRequestDto } from "@shared/schemas/training";
import type { AuthUser } from "../../server/middleware/auth";
import type { Policy } from "../../server/core/policy";
import {
  trainingAskPolicy,
  trainingPolicy,
  trainingRequestPolicy,
  userPolicy,
  visibleTrainee,
  type PersonFacts,
  type TrainingRecordFacts,
  type TrainingRequestFacts,
} from "../../server/modules/people";

const OWN_GROUP = 1;
const OTHER_GROUP = 2;

function person(id: number, roles: Role[], extra: Partial<AuthUser> = {}): AuthUser {
  return { id, email: `p${id}@kestrelbay.example`, name: `Person ${id}`, roles, groupId: OWN_GROUP, leadOf: [], organisation: null, ...extra };
}

/** The kinds of person. "owner" holds the training records and requests below. */
const ACTORS = {
  owner: person(10, ["member"]),
  ownGroupMember: person(11, ["member"]),
  otherGroupMember: person(12, ["member"], { groupId: OTHER_GROUP }),
  groupLead: person(13, ["group_lead", "member"], { leadOf: [OWN_GROUP] }),
  external: person(14, ["member"], { groupId: null, organisation: "Tidewater Metals Recovery Ltd" }),
  manager: person(15, ["manager", "member"], { groupId: null }),
  safetyOfficer: person(16, ["safety_officer", "member"], { groupId: null }),
  admin: person(17, ["admin"], { groupId: null }),
} satisfies Record<string, AuthUser>;
type ActorKind = keyof typeof ACTORS;
const KINDS = Object.keys(ACTORS) as ActorKind[];

type Cell = "ok" | `${number} ${string}`;

function verdict<A extends string, R>(policy: Policy<A, AuthUser, R>, actor: AuthUser, action: A, record: R): Cell {
  const d = policy.check(actor, action, record);
  return d ? `${d.status} ${d.code}` : "ok";
}

/** Expands { action: { actor: { state: cell } } } (with "*" for every actor not listed) into rows. */
function rows<A extends string, S extends string>(table: Record<A, Partial<Record<ActorKind | "*", Record<S, Cell>>>>) {
  const out: { action: A; kind: ActorKind; state: S; expected: Cell }[] = [];
  for (const action of Object.keys(table) as A[]) {
    for (const kind of KINDS) {
      const byState = table[action][kind] ?? table[action]["*"];
      if (!byState) throw new Error(`No row for ${action} × ${kind}`);
      for (const state of Object.keys(byState) as S[]) out.push({ action, kind, state, expected: byState[state] });
    }
  }
  return out;
}

describe("the training record policy", () => {
  const records = {
    current: { id: 1, userId: ACTORS.owner.id, revokedAt: null },
    // Expired by date: the state shown is "expired", but nothing in the record stops a revoke.
    past: { id: 2, userId: ACTORS.owner.id, revokedAt: null },
    revoked: { id: 3, userId: ACTORS.owner.id, revokedAt: "2026-01-05T10:00:00.000Z" },
  } satisfies Record<string, TrainingRecordFacts>;
  type State = keyof typeof records;
  const hidden = { current: "404 not_found", past: "404 not_found", revoked: "404 not_found" } as const;
  const seen = { current: "ok", past: "ok", revoked: "ok" } as const;
  const notManager = { current: "403 manager_only", past: "403 manager_only", revoked: "403 manager_only" } as const;

  const table = rows<"view" | "revoke", State>({
    view: { owner: seen, manager: seen, "*": hidden },
    revoke: { manager: { current: "ok", past: "ok", revoked: "409 already_revoked" }, "*": notManager },
  });

  it.each(table)("$action by $kind on a $state record: $expected", ({ action, kind, state, expected }) => {
    expect(verdict(trainingPolicy, ACTORS[kind], action, records[state])).toBe(expected);
  });

  it("sends the abilities the training DTO declares, the same answers as the checks", () => {
    const abilities = trainingPolicy.abilities(ACTORS.manager, records.current);
    expect(Object.keys(abilities).sort()).toEqual(Object.keys(trainingAbilities.shape).sort());
    expect(abilities).toEqual({ view: true, revoke: true });
    expect(trainingPolicy.abilities(ACTORS.owner, records.current)).toEqual({ view: true, revoke: false });
  });
});

describe("whose training a list shows", () => {
  it.each(KINDS)("%s", (kind) => {
    const actor = ACTORS[kind];
    // The manager sees whom they ask for, or everyone; anyone else their own, whatever they ask for.
    if (kind === "manager") {
      expect(visibleTrainee(actor, ACTORS.owner.id)).toBe(ACTORS.owner.id);
      expect(visibleTrainee(actor)).toBeUndefined();
    } else {
      expect(visibleTrainee(actor, ACTORS.owner.id === actor.id ? 999 : ACTORS.owner.id)).toBe(actor.id);
      expect(visibleTrainee(actor)).toBe(actor.id);
    }
  });
});

describe("the training request policy", () => {
  const requests = {
    ownOpen: { id: 1, userId: ACTORS.owner.id, status: "open" },
    ownGranted: { id: 2, userId: ACTORS.owner.id, status: "granted" },
    ownDismissed: { id: 3, userId: ACTORS.owner.id, status: "dismissed" },
    someoneElsesOpen: { id: 4, userId: 999, status: "open" },
  } satisfies Record<string, TrainingRequestFacts>;
  type State = keyof typeof requests;
  const all = (cell: Cell) => ({ ownOpen: cell, ownGranted: cell, ownDismissed: cell, someoneElsesOpen: cell });

  const table = rows<"view" | "close", State>({
    view: {
      owner: { ownOpen: "ok", ownGranted: "ok", ownDismissed: "ok", someoneElsesOpen: "404 not_found" },
      manager: all("ok"),
      "*": all("404 not_found"),
    },
    close: {
      manager: { ownOpen: "ok", ownGranted: "409 request_closed", ownDismissed: "409 request_closed", someoneElsesOpen: "ok" },
      "*": all("403 manager_only"),
    },
  });

  it.each(table)("$action by $kind on $state: $expected", ({ action, kind, state, expected }) => {
    expect(verdict(trainingRequestPolicy, ACTORS[kind], action, requests[state])).toBe(expected);
  });

  it("sends the abilities the request DTO declares", () => {
    expect(Object.keys(trainingRequestPolicy.abilities(ACTORS.manager, requests.ownOpen)).sort()).toEqual(
      Object.keys(trainingRequestDto.shape.abilities.shape).sort(),
    );
  });
});

describe("asking for training", () => {
  const asks = { noOpenRequest: { instrumentId: 1, openRequestId: null }, openRequest: { instrumentId: 1, openRequestId: 7 } };
  const table = rows<"ask", keyof typeof asks>({ ask: { "*": { noOpenRequest: "ok", openRequest: "409 request_open" } } });

  it.each(table)("$action by $kind with $state: $expected", ({ action, kind, state, expected }) => {
    expect(verdict(trainingAskPolicy, ACTORS[kind], action, asks[state])).toBe(expected);
  });
});

describe("the user policy", () => {
  /** The person acted on; "themself" is the actor's own account. */
  const people = (actor: AuthUser) =>
    ({
      themself: { id: actor.id, name: actor.name, active: true, roles: actor.roles },
      activeMember: { id: 50, name: "Active Member", active: true, roles: ["member"] },
      deactivatedMember: { id: 51, name: "Gone Member", active: false, roles: ["member"] },
      anotherAdmin: { id: 52, name: "Other Admin", active: true, roles: ["admin"] },
    }) satisfies Record<string, PersonFacts>;
  type State = keyof ReturnType<typeof people>;
  const all = (cell: Cell) => ({ themself: cell, activeMember: cell, deactivatedMember: cell, anotherAdmin: cell });
  const refused = all("403 admins_only");

  const table = rows<"edit" | "deactivate" | "reactivate" | "removeAdminRole", State>({
    edit: { admin: all("ok"), "*": refused },
    deactivate: {
      admin: { themself: "422 own_account", activeMember: "ok", deactivatedMember: "409 already_deactivated", anotherAdmin: "ok" },
      "*": refused,
    },
    reactivate: {
      admin: { themself: "409 already_active", activeMember: "409 already_active", deactivatedMember: "ok", anotherAdmin: "409 already_active" },
      "*": refused,
    },
    removeAdminRole: {
      admin: { themself: "422 own_admin_role", activeMember: "422 not_an_administrator", deactivatedMember: "422 not_an_administrator", anotherAdmin: "ok" },
      "*": refused,
    },
  });

  it.each(table)("$action by $kind on $state: $expected", ({ action, kind, state, expected }) => {
    const actor = ACTORS[kind];
    expect(verdict(userPolicy, actor, action, people(actor)[state])).toBe(expected);
  });

  it("says why in a sentence, and sends the abilities the person row declares", () => {
    const admin = ACTORS.admin;
    expect(userPolicy.check(admin, "deactivate", people(admin).themself)?.reason).toMatch(/your own account; ask another administrator/);
    const abilities = userPolicy.abilities(admin, people(admin).themself);
    expect(Object.keys(abilities).sort()).toEqual(Object.keys(userAbilities.shape).sort());
    expect(abilities).toEqual({ edit: true, deactivate: false, reactivate: false, removeAdminRole: false });
  });
});
