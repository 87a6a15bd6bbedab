/**
 * Who may do what to a run plan. Every run-plan route, command and `abilities` flag asks this.
 *
 * - See: its author, the owner of the booking it is attached to, and the manager. Anyone else
 *   gets 404: a plan names a person's chemistry and booking.
 * - Edit: its author or the manager, while it holds no reservation (release it first: 409).
 * - Attach (to a booking, reserving its stock): its author or the manager, while it holds no
 *   reservation. Which booking is checked by the command: one's own (the manager: anyone's),
 *   requested or confirmed, not over, with a potentiostat and an interface cell.
 * - Release its reservation: its author, the booking's owner or the manager, while one is held.
 */
import { definePolicy, deny, type Denial } from "../../core/policy";
import { hasRole, type AuthUser } from "../../middleware/auth";

/** What the policy needs to know about a plan. */
export interface RunPlanFacts {
  id: number;
  authorId: number;
  /** The owner of the booking it is attached to, or null. */
  bookingOwnerId: number | null;
  /** Reservations the plan holds now. */
  heldCount: number;
}

const isManager = (a: AuthUser) => hasRole(a, "manager");
const isAuthor = (a: AuthUser, p: RunPlanFacts) => p.authorId === a.id;
const ownsBooking = (a: AuthUser, p: RunPlanFacts) => p.bookingOwnerId !== null && p.bookingOwnerId === a.id;

function see(a: AuthUser, p: RunPlanFacts): Denial | null {
  return isAuthor(a, p) || ownsBooking(a, p) || isManager(a) ? null : deny(404, "run_plan_not_found", "That run plan was not found.");
}

const authorOrManager = (verb: string) => (a: AuthUser, p: RunPlanFacts) =>
  see(a, p) ?? (isAuthor(a, p) || isManager(a) ? null : deny(403, "not_your_plan", `Only the plan's author or the facility manager may ${verb} it.`));

const nothingHeld = (verb: string) => (_a: AuthUser, p: RunPlanFacts) =>
  p.heldCount > 0 ? deny(409, "plan_has_reservations", `This plan holds stock for its booking; release the reservation before you ${verb} it.`) : null;

const then =
  (...checks: ((a: AuthUser, p: RunPlanFacts) => Denial | null)[]) =>
  (a: AuthUser, p: RunPlanFacts): Denial | null => {
    for (const check of checks) {
      const d = check(a, p);
      if (d) return d;
    }
    return null;
  };

export const runPlanPolicy = definePolicy<"see" | "edit" | "attach" | "release", AuthUser, RunPlanFacts>({
  see,
  edit: then(authorOrManager("edit"), nothingHeld("edit")),
  attach: then(authorOrManager("attach"), nothingHeld("attach")),
  release: (a, p) =>
    see(a, p) ??
    (isAuthor(a, p) || ownsBooking(a, p) || isManager(a) ? null : deny(403, "not_your_plan", "Only the plan's author, the booking's owner or the manager may release it.")) ??
    (p.heldCount === 0 ? deny(409, "nothing_held", "This plan holds no stock.") : null),
});

export type RunPlanAction = (typeof runPlanPolicy.actions)[number];
