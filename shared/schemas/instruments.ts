import { z } from "zod";
import { id, pageQuery } from "./common";

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

export const INSTRUMENT_ACTIONS = ["reportFault", "recordCleaned", "edit", "takeOutOfService", "returnToService", "closeFault"] as const;
export const instrumentAbilities = z.object(Object.fromEntries(INSTRUMENT_ACTIONS.map((a) => [a, z.boolean()])) as Record<(typeof INSTRUMENT_ACTIONS)[number], z.ZodBoolean>);
export type InstrumentAbilities = z.infer<typeof instrumentAbilities>;

/** A fault someone reported on an instrument. */
export const faultDto = z.object({ id: z.number(), note: z.string(), reportedAt: z.string(), reportedBy: z.string().nullable() });
export type FaultDto = z.infer<typeof faultDto>;

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
  /** Micro-interface cells: radius of the inlaid disc interface, cm. */
  interfaceRadiusCm: z.number().nullable(),
  /** Interface cells: the volume of each phase a run fills in, mL (run plans weigh for these). */
  aqueousFillMl: z.number().nullable(),
  organicFillMl: z.number().nullable(),
  trainingRequired: z.boolean(),
  requiresApproval: z.boolean(),
  cleaningBufferMinutes: z.number(),
  minLeadMinutes: z.number(),
  maxLengthMinutes: z.number(),
  bookableHours,
  afterHoursAllowed: z.boolean(),
  /** What the caller may do to it, decided by the server's instrument policy. */
  abilities: instrumentAbilities,
});
export type InstrumentDto = z.infer<typeof instrumentDto>;

/** GET /api/instruments/:id: the instrument with the fault reports nobody has closed yet. */
export const instrumentDetailDto = instrumentDto.extend({ openFaults: z.array(faultDto) });
export type InstrumentDetailDto = z.infer<typeof instrumentDetailDto>;

export const instrumentListQuery = pageQuery.extend({
  kind: instrumentKind.optional(),
  status: instrumentStatus.optional(),
});
export type InstrumentListQuery = z.infer<typeof instrumentListQuery>;

/** Adding an instrument (manager). Rules default to the cautious side: training required. */
export const instrumentInput = z.object({
  name: z.string().trim().min(1, "Give the instrument a name").max(120),
  kind: instrumentKind,
  status: instrumentStatus.default("in_service"),
  model: z.string().trim().max(200).default(""),
  serialNumber: z.string().trim().max(100).default(""),
  description: z.string().trim().max(2000).default(""),
  locationId: id().nullable().default(null),
  fourElectrode: z.boolean().default(false),
  interfaceAreaCm2: z.number().positive().nullable().default(null),
  interfaceRadiusCm: z.number().positive("The radius must be above zero").max(10).nullable().default(null),
  aqueousFillMl: z.number().positive("The volume must be above zero").max(10_000).nullable().default(null),
  organicFillMl: z.number().positive("The volume must be above zero").max(10_000).nullable().default(null),
  trainingRequired: z.boolean().default(true),
  requiresApproval: z.boolean().default(false),
  cleaningBufferMinutes: z.number().int().min(0).max(24 * 60).default(0),
  minLeadMinutes: z.number().int().min(0).max(60 * 24 * 60).default(0),
  maxLengthMinutes: z.number().int().min(1).max(7 * 24 * 60).default(480),
  bookableHours: bookableHours.default({}),
  afterHoursAllowed: z.boolean().default(false),
});
export type InstrumentInput = z.input<typeof instrumentInput>;

/** Editing an instrument: any field; a status change can carry a note for the people told. */
export const instrumentPatch = z
  .object({
    name: z.string().trim().min(1, "Give the instrument a name").max(120),
    kind: instrumentKind,
    status: instrumentStatus,
    model: z.string().trim().max(200),
    serialNumber: z.string().trim().max(100),
    description: z.string().trim().max(2000),
    locationId: id().nullable(),
    fourElectrode: z.boolean(),
    interfaceAreaCm2: z.number().positive("The area must be above zero").nullable(),
    interfaceRadiusCm: z.number().positive("The radius must be above zero").max(10).nullable(),
    aqueousFillMl: z.number().positive("The volume must be above zero").max(10_000).nullable(),
    organicFillMl: z.number().positive("The volume must be above zero").max(10_000).nullable(),
    trainingRequired: z.boolean(),
    requiresApproval: z.boolean(),
    cleaningBufferMinutes: z.number().int().min(0).max(24 * 60),
    minLeadMinutes: z.number().int().min(0).max(60 * 24 * 60),
    maxLengthMinutes: z.number().int().min(1).max(7 * 24 * 60),
    bookableHours,
    afterHoursAllowed: z.boolean(),
    statusNote: z.string().trim().max(500),
  })
  .partial();
export type InstrumentPatch = z.input<typeof instrumentPatch>;
export type InstrumentPatchParsed = z.output<typeof instrumentPatch>;


/** A fault report anyone signed in may send (POST /api/instruments/:id/faults). */
export const reportFaultInput = z.object({ note: z.string().trim().min(3, "Describe the fault in a few words").max(1000) });
export type ReportFaultInput = z.infer<typeof reportFaultInput>;

export const closeFaultInput = z.object({ resolution: z.string().trim().min(3, "Say what was done").max(1000) });
export type CloseFaultInput = z.infer<typeof closeFaultInput>;
export const faultParams = z.object({ id: id(), faultId: id() });

/** A fault report as stored, open or closed with what was done. */
export const faultReportDto = faultDto.extend({ closedAt: z.string().nullable(), closedBy: z.string().nullable(), resolution: z.string() });
export type FaultReportDto = z.infer<typeof faultReportDto>;
