/**
 * The run-plan policy as a table: kinds of person × actions × states of the plan (issue 12:
 * who may see, edit, attach and release a plan — its author, the booking's owner, the manager).
 * Each row is the rule written in words in server/modules/runplans/run-plan.policy.ts.
 */
import { describe, expect, it } from "vitest";
import { runPlanPolicy, type RunPlanFacts } from "../../server/modules/runplans";
import type { AuthUser } from "../../server/middleware/auth";
import type { Role } from "@shared/schemas/auth";

const person = (id: number, roles: Role[]): AuthUser => ({ id, email: `p${id}@kestrelbay.example`, name: `P${id}`, roles, groupId: null, leadOf: [], organisation: null }) as AuthUser;

const AUTHOR = person(1, ["member"]);
const BOOKING_OWNER = person(2, ["member"]);
const STRANGER = person(3, ["member"]);
const MANAGER = person(4, ["manager", "member"]);
const SAFETY = person(5, ["safety_officer"]);
const ADMIN = person(6, ["admin"]);

const draft: RunPlanFacts = { id: 10, authorId: 1, bookingOwnerId: null, heldCount: 0 };
const reserved: RunPlanFacts = { id: 10, authorId: 1, bookingOwnerId: 2, heldCount: 2 };
const attachedReleased: RunPlanFacts = { id: 10, authorId: 1, bookingOwnerId: 2, heldCount: 0 };

type Row = [string, AuthUser, RunPlanFacts, { see: boolean; edit: boolean; attach: boolean; release: boolean }];

const TABLE: Row[] = [
  ["author, draft", AUTHOR, draft, { see: true, edit: true, attach: true, release: false }],
  ["author, holding stock", AUTHOR, reserved, { see: true, edit: false, attach: false, release: true }],
  ["booking's owner, holding stock", BOOKING_OWNER, reserved, { see: true, edit: false, attach: false, release: true }],
  ["booking's owner, released", BOOKING_OWNER, attachedReleased, { see: true, edit: false, attach: false, release: false }],
  ["another member, draft", STRANGER, draft, { see: false, edit: false, attach: false, release: false }],
  ["another member, holding stock", STRANGER, reserved, { see: false, edit: false, attach: false, release: false }],
  ["manager, draft", MANAGER, draft, { see: true, edit: true, attach: true, release: false }],
  ["manager, holding stock", MANAGER, reserved, { see: true, edit: false, attach: false, release: true }],
  ["safety officer", SAFETY, reserved, { see: false, edit: false, attach: false, release: false }],
  ["administrator", ADMIN, draft, { see: false, edit: false, attach: false, release: false }],
];

describe("run-plan policy", () => {
  it.each(TABLE)("%s", (_label, actor, plan, expected) => {
    expect(runPlanPolicy.abilities(actor, plan)).toEqual(expected);
  });

  it("hides a plan from those who may not see it as 404, and names the state nobody may act in as 409", () => {
    expect(runPlanPolicy.check(STRANGER, "see", draft)?.status).toBe(404);
    expect(runPlanPolicy.check(STRANGER, "edit", draft)?.status).toBe(404);
    expect(runPlanPolicy.check(BOOKING_OWNER, "edit", attachedReleased)).toEqual(expect.objectContaining({ status: 403, code: "not_your_plan" }));
    expect(runPlanPolicy.check(AUTHOR, "edit", reserved)).toEqual(expect.objectContaining({ status: 409, code: "plan_has_reservations" }));
    expect(runPlanPolicy.check(AUTHOR, "release", draft)).toEqual(expect.objectContaining({ status: 409, code: "nothing_held" }));
  });
});
