/**
 * Who sees and changes training records and training requests (the rules as they were before
 * the People area moved into a module, unchanged):
 *
 * - A person sees their own training records and requests; the manager sees everyone's (404 for
 *   anyone else's: whose training it is does not leak).
 * - The manager grants (or renews) and revokes training; revoking a record already revoked is a
 *   state nobody acts in (409). An expired record may still be revoked.
 * - Anyone signed in may ask for training on an instrument, once: a second request while the
 *   first is open is 409. The manager closes open requests (granted or dismissed); a closed one
 *   stays closed (409).
 */
import { definePolicy, deny } from "../../core/policy";
import { hasRole, type AuthUser } from "../../middleware/auth";

export interface TrainingRecordFacts {
  id: number;
  userId: number;
  revokedAt: string | null;
}

export interface TrainingRequestFacts {
  id: number;
  userId: number;
  status: "open" | "granted" | "dismissed";
}

/** Asking for training: the instrument, and the asker's open request on it if there is one. */
export interface TrainingAskFacts {
  instrumentId: number;
  openRequestId: number | null;
}

const isManager = (a: AuthUser) => hasRole(a, "manager");

const ownOrManager = (what: string) => (a: AuthUser, r: { userId: number }) =>
  isManager(a) || r.userId === a.id ? null : deny(404, "not_found", `That ${what} was not found.`);

/**
 * Whose training a list shows: the person the manager asked for (or everyone's), anyone else's
 * own whatever they asked for. The same rule as the policies' `view`, as a filter for lists.
 */
export function visibleTrainee(a: AuthUser, asked?: number): number | undefined {
  return isManager(a) ? asked : a.id;
}

export const trainingPolicy = definePolicy<"view" | "revoke", AuthUser, TrainingRecordFacts>({
  view: ownOrManager("training record"),
  revoke: (a, r) => {
    if (!isManager(a)) return deny(403, "manager_only", "Only the facility manager revokes training.");
    return r.revokedAt ? deny(409, "already_revoked", `Training record ${r.id} is already revoked.`) : null;
  },
});

export const trainingRequestPolicy = definePolicy<"view" | "close", AuthUser, TrainingRequestFacts>({
  view: ownOrManager("training request"),
  close: (a, r) => {
    if (!isManager(a)) return deny(403, "manager_only", "Only the facility manager answers training requests.");
    return r.status === "open" ? null : deny(409, "request_closed", `This request is already closed (${r.status}).`);
  },
});

export const trainingAskPolicy = definePolicy<"ask", AuthUser, TrainingAskFacts>({
  ask: (_a, f) => (f.openRequestId === null ? null : deny(409, "request_open", "You have already asked for training on this instrument.")),
});
