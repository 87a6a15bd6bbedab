import { z } from "zod";
import { pageQuery } from "./common";

export const INSTRUMENT_KINDS = ["potentiostat", "interface_cell", "support"] as const;
export const instrumentKind = z.enum(INSTRUMENT_KINDS);
export type InstrumentKind = z.infer<typeof instrumentKind>;

export const INSTRUMENT_STATUSES = ["in_service", "under_maintenance", "retired"] as const;
export const instrumentStatus = z.enum(INSTRUMENT_STATUSES);
export type InstrumentStatus = z.infer<typeof instrumentStatus>;

export const INSTRUMENT_KIND_LABELS: Record<InstrumentKind, string> = {
  potentiostat: "Potentiostat",
  interface_cell: "Interface cell",
  support: "Support equipment",
};
export const INSTRUMENT_STATUS_LABELS: Record<InstrumentStatus, string> = {
  in_service: "In service",
  under_maintenance: "Under maintenance",
  retired: "Retired",
};

const hhmm = z.string().regex(/^([01]\d|2[0-4]):[0-5]\d$/, "Use HH:MM, 24-hour");
export const WEEKDAYS = ["mon", "tue", "wed", "thu", "fri", "sat", "sun"] as const;
export const bookableHours = z.partialRecord(z.enum(WEEKDAYS), z.array(z.object({ from: hhmm, to: hhmm })));
export type BookableHours = z.infer<typeof bookableHours>;

export const instrumentDto = z.object({
  id: z.number(),
  name: z.string(),
  kind: instrumentKind,
  status: instrumentStatus,
  model: z.string(),
  serialNumber: z.string(),
  description: z.string(),
  locationId: z.number().nullable(),
  fourElectrode: z.boolean(),
  interfaceAreaCm2: z.number().nullable(),
  trainingRequired: z.boolean(),
  requiresApproval: z.boolean(),
  cleaningBufferMinutes: z.number(),
  minLeadMinutes: z.number(),
  maxLengthMinutes: z.number(),
  bookableHours,
  afterHoursAllowed: z.boolean(),
});
export type InstrumentDto = z.infer<typeof instrumentDto>;

export const instrumentListQuery = pageQuery.extend({
  kind: instrumentKind.optional(),
  status: instrumentStatus.optional(),
});
export type InstrumentListQuery = z.infer<typeof instrumentListQuery>;
