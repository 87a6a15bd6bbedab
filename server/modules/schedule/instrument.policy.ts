/**
 * Who may do what to an instrument. Anyone signed in may report a fault (the report is stored,
 * shown on the instrument and mailed to the manager) and record that an interface cell was
 * cleaned; only the manager edits an instrument or takes it out of service and back.
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
  returnToService: (a, i) =>
    managerOnly("put an instrument back in service")(a) ?? (i.status === "under_maintenance" ? null : deny(409, "not_under_maintenance", `${i.name} is not under maintenance.`)),
  closeFault: managerOnly("close a fault report"),
});
