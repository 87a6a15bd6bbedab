/**
 * Who may do what to a container, and in which state. Every route that changes a container
 * (the Stockroom's and the Scan page's alike), every command and every `abilities` flag sent to
 * the client call this and nothing else.
 *
 * - A member handles (draws from, moves, marks empty, pours waste into) containers of their own
 *   research group and the facility's shared stock (no group); an external customer's people
 *   handle only their own organisation's containers; the manager and the safety officer handle any.
 * - A container on hold is handled by nobody but the manager and the safety officer (who release
 *   it); nothing is drawn from it until then. A disposed container is handled by nobody.
 * - Who used a container, on which account and at what cost is seen by the owning group's members
 *   and lead (or the owning organisation's people), the manager and the safety officer.
 */
import type { ContainerKind, ContainerStatus } from "../../entities/container.entity";
import { definePolicy, deny, type Denial } from "../../core/policy";
import { hasRole, type AuthUser } from "../../middleware/auth";

/** What the policy needs to know about a container (a row, an entity or a DTO will do). */
export interface ContainerFacts {
  id: number;
  groupId: number | null;
  organisation: string | null;
  status: ContainerStatus;
  kind: ContainerKind;
  /** The chemical's own hold, which stops drawing from every container of it. */
  chemicalHoldReason?: string | null;
  holdReason?: string | null;
}

const isKeeper = (a: AuthUser) => hasRole(a, "manager", "safety_officer");

/** Organisation names as people type them on accounts: compared without case or outer spaces. */
export function sameOrganisation(a: string | null, b: string | null): boolean {
  return a !== null && b !== null && a.trim().toLowerCase() === b.trim().toLowerCase();
}

/** Why this person is not among the container's owners, or null when they are. */
function notOwner(a: AuthUser, c: ContainerFacts): Denial | null {
  if (c.organisation !== null) {
    if (sameOrganisation(a.organisation, c.organisation)) return null;
    return deny(403, "not_your_container", `Container ${c.id} belongs to ${c.organisation}; only its people, the manager or the safety officer handle it.`);
  }
  if (a.organisation !== null) {
    return deny(403, "not_your_container", `Container ${c.id} is the facility's stock; people of an external customer handle only their own organisation's containers.`);
  }
  if (c.groupId === null || c.groupId === a.groupId || a.leadOf.includes(c.groupId)) return null;
  return deny(403, "not_your_container", `Container ${c.id} belongs to another research group; ask them, the manager or the safety officer.`);
}

/** Disposed → nobody (409); the manager and the safety officer → any; others → their own. */
function ownOrKeeper(a: AuthUser, c: ContainerFacts): Denial | null {
  if (c.status === "disposed") return deny(409, "container_disposed", `Container ${c.id} has been disposed of.`);
  return isKeeper(a) ? null : notOwner(a, c);
}

/** The common rule of every hands-on change: disposed → nobody; keepers → yes; others → own and not on hold. */
function handle(verb: string): (a: AuthUser, c: ContainerFacts) => Denial | null {
  return (a, c) => {
    const whose = ownOrKeeper(a, c);
    if (whose || isKeeper(a)) return whose;
    if (c.status === "on_hold") {
      return deny(403, "container_on_hold", `Container ${c.id} is on hold (${c.holdReason ?? "no reason given"}); only the safety officer or the manager may ${verb} it, and release it.`);
    }
    return null;
  };
}

const then =
  (...checks: ((a: AuthUser, c: ContainerFacts) => Denial | null)[]) =>
  (a: AuthUser, c: ContainerFacts): Denial | null => {
    for (const check of checks) {
      const d = check(a, c);
      if (d) return d;
    }
    return null;
  };

const keepersOnly = (what: string) => (a: AuthUser, c: ContainerFacts) =>
  isKeeper(a) ? null : deny(403, "stock_keepers_only", `Only the manager or the safety officer may ${what} container ${c.id}.`);

export const containerPolicy = definePolicy<
  "draw" | "move" | "markEmpty" | "pourWaste" | "dispose" | "hold" | "release" | "seeHistory" | "reportProblem" | "relabel",
  AuthUser,
  ContainerFacts
>({
  // Nothing is drawn from a held container by anyone (API.md: 409), so the hold is a state here.
  draw: then(ownOrKeeper, (_a, c) => {
    if (c.kind === "waste") return deny(409, "waste_container", `Container ${c.id} is a waste container; nothing is taken from it.`);
    if (c.status === "on_hold") return deny(409, "container_on_hold", `Container ${c.id} is on hold: ${c.holdReason ?? "no reason given"}. Release it first.`);
    if (c.status === "empty") return deny(409, "container_empty", `Container ${c.id} is marked empty.`);
    if (c.chemicalHoldReason) return deny(409, "chemical_on_hold", `Its chemical is on hold: ${c.chemicalHoldReason}`);
    return null;
  }),
  move: handle("move"),
  markEmpty: then(handle("mark empty"), (_a, c) => {
    if (c.status === "empty") return deny(409, "container_empty", `Container ${c.id} is already empty.`);
    if (c.status === "on_hold") return deny(409, "container_on_hold", `Container ${c.id} is on hold; release it first.`);
    return null;
  }),
  pourWaste: then(handle("pour into"), (_a, c) => {
    if (c.kind !== "waste") return deny(409, "not_waste_container", `Container ${c.id} is not a waste container.`);
    if (c.status === "on_hold") return deny(409, "container_on_hold", `Waste container ${c.id} is on hold: ${c.holdReason ?? "no reason given"}`);
    if (c.status === "empty") return deny(409, "container_empty", `Waste container ${c.id} has been emptied; use another.`);
    return null;
  }),
  dispose: then(keepersOnly("dispose of"), (_a, c) => (c.status === "disposed" ? deny(409, "container_disposed", `Container ${c.id} is already disposed of.`) : null)),
  hold: then(keepersOnly("place a hold on"), (_a, c) =>
    c.status === "empty" || c.status === "disposed" ? deny(409, `container_${c.status}`, `Container ${c.id} is ${c.status}; there is nothing to hold.`) : null,
  ),
  release: then(keepersOnly("release"), (_a, c) => (c.status === "on_hold" ? null : deny(409, "not_on_hold", `Container ${c.id} is not on hold.`))),
  // Shared stock has no owning group: its history is the stock keepers' to see.
  seeHistory: (a, c) =>
    isKeeper(a) || ((c.groupId !== null || c.organisation !== null) && notOwner(a, c) === null)
      ? null
      : deny(403, "history_hidden", "Who used this container and at what cost is shown to its owners, the manager and the safety officer."),
  // Anyone who finds a cracked cap or a missing label should be able to say so.
  reportProblem: () => null,
  relabel: keepersOnly("re-label"),
});

export type ContainerAction = (typeof containerPolicy.actions)[number];
