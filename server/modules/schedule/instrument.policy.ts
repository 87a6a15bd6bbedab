/**
 * Who may do what to an instrument. Anyone signed in may report a fault (the report is stored,
 * shown on the instrument and mailed to the manager) and record that an interface cell was
 * cleaned; only the manager edits an instrument or takes it out of service and back.
 *
 * A change of status asks for the matching action: leaving service (for maintenance or
 * retirement) is takeOutOfService, coming back is returnToService, and between maintenance
 * and retirement it is an edit (statusAction below).
 */
import type { InstrumentKind, InstrumentStatus } from "../../entities/instrument.entity";
import { definePolicy, deny } from "../../core/policy";
import { hasRole, type AuthUser } from "../../middleware/auth";

export interface InstrumentFacts {
  id: number;
  name: string;
  kind: InstrumentKind;
  status: InstrumentStatus;
}

const managerOnly = (what: string) => (a: AuthUser) => (hasRole(a, "manager") ? null : deny(403, "manager_only", `Only the facility manager may ${what}.`));

export const instrumentPolicy = definePolicy<"reportFault" | "recordCleaned" | "edit" | "takeOutOfService" | "returnToService" | "closeFault", AuthUser, InstrumentFacts>({
  reportFault: (_a, i) => (i.status === "retired" ? deny(409, "instrument_retired", `${i.name} is retired.`) : null),
  recordCleaned: (_a, i) => (i.kind === "interface_cell" ? null : deny(422, "not_interface_cell", `Cleaning is recorded for interface cells only; ${i.name} is not one.`)),
  edit: managerOnly("change an instrument"),
  takeOutOfService: (a, i) =>
    managerOnly("take an instrument out of service")(a) ?? (i.status === "in_service" ? null : deny(409, "not_in_service", `${i.name} is not in service.`)),
  // Back from maintenance, or out of retirement: the manager's status list allows both.
  returnToService: (a, i) => managerOnly("put an instrument back in service")(a) ?? (i.status === "in_service" ? deny(409, "already_in_service", `${i.name} is already in service.`) : null),
  closeFault: managerOnly("close a fault report"),
});

export type InstrumentAction = (typeof instrumentPolicy.actions)[number];

/** The action a change of status from `from` to `to` needs of the policy. */
export function statusAction(from: InstrumentStatus, to: InstrumentStatus): InstrumentAction {
  if (from === "in_service") return "takeOutOfService";
  if (to === "in_service") return "returnToService";
  return "edit";
}
