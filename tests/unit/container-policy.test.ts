/**
 * The container policy as a table: every action × every kind of person × the container's states.
 * Each row states what issue 9 decided; the expectation is written out, not computed.
 */
import { describe, expect, it } from "vitest";
import { containerPolicy, type ContainerFacts } from "../../server/modules/stockroom/container.policy";
import { instrumentPolicy } from "../../server/modules/schedule/instrument.policy";
import type { AuthUser } from "../../server/middleware/auth";
import type { Role } from "@shared/schemas/auth";

const OWN_GROUP = 1;
const OTHER_GROUP = 2;
const CUSTOMER = "Tidewater Metals Recovery Ltd";

const person = (roles: Role[], extra: Partial<AuthUser> = {}): AuthUser => ({ id: 10, email: "p@kestrelbay.example", name: "P", roles, groupId: null, leadOf: [], organisation: null, ...extra });

const PEOPLE = {
  ownMember: person(["member"], { groupId: OWN_GROUP }),
  otherMember: person(["member"], { groupId: OTHER_GROUP }),
  ownLead: person(["group_lead", "member"], { groupId: null, leadOf: [OWN_GROUP] }),
  external: person(["member"], { organisation: CUSTOMER }),
  manager: person(["manager"]),
  safety: person(["safety_officer"]),
  admin: person(["admin"]),
} as const;
type Who = keyof typeof PEOPLE;

const container = (over: Partial<ContainerFacts> = {}): ContainerFacts => ({ id: 7, groupId: OWN_GROUP, organisation: null, status: "in_use", kind: "bottle", chemicalHoldReason: null, holdReason: null, ...over });

const RECORDS = {
  own: container(),
  shared: container({ groupId: null }),
  customers: container({ groupId: null, organisation: CUSTOMER }),
  onHold: container({ status: "on_hold", holdReason: "Cap liner cracked" }),
  disposed: container({ status: "disposed" }),
  empty: container({ status: "empty" }),
  sharedWaste: container({ groupId: null, kind: "waste" }),
} as const;
type Rec = keyof typeof RECORDS;

// [action, record, who] → expected status (null = allowed).
const Y = null;
type Row = [string, Rec, Partial<Record<Who, number | null>>];
const TABLE: Row[] = [
  // Drawing: owners and keepers; others 403; states 409 for everyone.
  ["draw", "own", { ownMember: Y, ownLead: Y, otherMember: 403, external: 403, manager: Y, safety: Y, admin: 403 }],
  ["draw", "shared", { ownMember: Y, otherMember: Y, ownLead: Y, external: 403, manager: Y, safety: Y, admin: Y }],
  ["draw", "customers", { ownMember: 403, otherMember: 403, external: Y, manager: Y, safety: Y }],
  ["draw", "onHold", { ownMember: 409, otherMember: 403, external: 403, manager: 409, safety: 409 }],
  ["draw", "disposed", { ownMember: 409, otherMember: 409, manager: 409, safety: 409 }],
  ["draw", "empty", { ownMember: 409, manager: 409 }],
  ["draw", "sharedWaste", { ownMember: 409, manager: 409 }],
  // Moving: owners (not on hold) and keepers (also on hold); nobody moves a disposed one.
  ["move", "own", { ownMember: Y, ownLead: Y, otherMember: 403, external: 403, manager: Y, safety: Y, admin: 403 }],
  ["move", "shared", { ownMember: Y, otherMember: Y, external: 403, manager: Y }],
  ["move", "customers", { ownMember: 403, external: Y, manager: Y }],
  ["move", "onHold", { ownMember: 403, otherMember: 403, external: 403, manager: Y, safety: Y }],
  ["move", "disposed", { ownMember: 409, manager: 409, safety: 409 }],
  // Marking empty.
  ["markEmpty", "own", { ownMember: Y, otherMember: 403, external: 403, manager: Y }],
  ["markEmpty", "onHold", { ownMember: 403, manager: 409, safety: 409 }],
  ["markEmpty", "empty", { ownMember: 409, manager: 409 }],
  ["markEmpty", "disposed", { ownMember: 409, manager: 409 }],
  // Pouring waste: into waste containers of one's own or the shared stock.
  ["pourWaste", "sharedWaste", { ownMember: Y, otherMember: Y, external: 403, manager: Y, safety: Y }],
  ["pourWaste", "own", { ownMember: 409, manager: 409 }],
  // Disposal, holds and release, relabelling: the stock keepers.
  ["dispose", "own", { ownMember: 403, ownLead: 403, external: 403, manager: Y, safety: Y, admin: 403 }],
  ["dispose", "onHold", { manager: Y, safety: Y, ownMember: 403 }],
  ["dispose", "disposed", { manager: 409, safety: 409 }],
  ["hold", "own", { ownMember: 403, manager: Y, safety: Y }],
  ["hold", "empty", { manager: 409 }],
  ["release", "onHold", { ownMember: 403, manager: Y, safety: Y }],
  ["release", "own", { manager: 409 }],
  ["relabel", "own", { ownMember: 403, manager: Y, safety: Y, admin: 403 }],
  // The history (who, which account, what cost): owners and keepers; the shared stock's, keepers only.
  ["seeHistory", "own", { ownMember: Y, ownLead: Y, otherMember: 403, external: 403, manager: Y, safety: Y, admin: 403 }],
  ["seeHistory", "customers", { external: Y, ownMember: 403, manager: Y }],
  ["seeHistory", "shared", { ownMember: 403, otherMember: 403, manager: Y, safety: Y }],
  // Anyone may report a problem.
  ["reportProblem", "own", { ownMember: Y, otherMember: Y, external: Y, admin: Y, manager: Y }],
];

describe("the container policy", () => {
  for (const [action, rec, expected] of TABLE) {
    for (const [who, status] of Object.entries(expected) as [Who, number | null][]) {
      it(`${action} on a ${rec} container by ${who}: ${status === null ? "allowed" : status}`, () => {
        const d = containerPolicy.check(PEOPLE[who], action as never, RECORDS[rec]);
        expect(d?.status ?? null).toBe(status);
        if (d) expect(d.reason.length).toBeGreaterThan(10);
      });
    }
  }

  it("sends as abilities exactly what it allows", () => {
    const a = containerPolicy.abilities(PEOPLE.otherMember, RECORDS.own);
    expect(a).toMatchObject({ draw: false, move: false, markEmpty: false, dispose: false, seeHistory: false, reportProblem: true });
  });
});

describe("the instrument policy", () => {
  const cell = { id: 1, name: "Cell A", kind: "interface_cell" as const, status: "in_service" as const };
  const retired = { ...cell, status: "retired" as const };
  const potentiostat = { ...cell, kind: "potentiostat" as const };
  const down = { ...cell, status: "under_maintenance" as const };

  it.each([
    ["reportFault", cell, "external", null],
    ["reportFault", cell, "admin", null],
    ["reportFault", retired, "ownMember", 409],
    ["recordCleaned", cell, "ownMember", null],
    ["recordCleaned", potentiostat, "ownMember", 422],
    ["takeOutOfService", cell, "external", 403],
    ["takeOutOfService", cell, "ownMember", 403],
    ["takeOutOfService", cell, "manager", null],
    ["takeOutOfService", down, "manager", 409],
    ["returnToService", down, "manager", null],
    ["returnToService", down, "safety", 403],
    ["closeFault", cell, "manager", null],
    ["closeFault", cell, "ownMember", 403],
  ] as const)("%s on %o by %s → %s", (action, rec, who, status) => {
    expect(instrumentPolicy.check(PEOPLE[who], action, rec)?.status ?? null).toBe(status);
  });
});
