/**
 * Scan: what GET /api/scan/:labelToken answers, and the inputs of the quick actions a scan offers.
 *
 * Scan answers: 200 { type, id, url, record }; 404 code "label_malformed" for a token of the
 * wrong shape (checked before any lookup); 404 code "label_unknown"; 404 with code
 * "label_replaced" (and replacedAt) for a token retired when its label was re-issued.
 */
import { z } from "zod";
import { id } from "./common";
import { containerAbilities } from "./stock";
import { faultDto, instrumentAbilities } from "./instruments";
import { bookingAbilities } from "./bookings";

/** The booking shown on a scanned instrument; another person's booking is a busy block without personal details. */
export const scanBookingDto = z.object({
  id: z.number().nullable(),
  start: z.string(),
  end: z.string(),
  status: z.string(),
  mine: z.boolean(),
  who: z.string().nullable(),
  checkedInAt: z.string().nullable(),
  checkedOutAt: z.string().nullable(),
  /** What the scanner may do to it (check in, check out…), from the Schedule's booking policy. */
  abilities: bookingAbilities,
});
export type ScanBookingDto = z.infer<typeof scanBookingDto>;

export const scanContainerRecord = z.object({
  chemicalId: z.number(),
  name: z.string(),
  casNumber: z.string(),
  kind: z.string(),
  quantity: z.number(),
  unit: z.string(),
  status: z.string(),
  holdReason: z.string().nullable(),
  locationId: z.number().nullable(),
  location: z.string().nullable(),
  expiresAt: z.string().nullable(),
  hazardStatements: z.array(z.string()),
  pictograms: z.array(z.string()),
  signalWord: z.string().nullable(),
  /** handlingCautions() of the chemical (shared/domain/cautions.ts), computed by the server with its formula-derived flags. */
  cautions: z.array(z.string()),
  /** What the caller may do to it, decided by the server's container policy. */
  abilities: containerAbilities,
});
export type ScanContainerRecord = z.infer<typeof scanContainerRecord>;

export const scanInstrumentRecord = z.object({
  name: z.string(),
  kind: z.string(),
  status: z.string(),
  location: z.string().nullable(),
  lastCleanedAt: z.string().nullable(),
  currentBooking: scanBookingDto.nullable(),
  nextBooking: scanBookingDto.nullable(),
  /** Fault reports nobody has closed yet. */
  openFaults: z.array(faultDto),
  /** Run plans attached to the current and next booking that the scanner may see (run-plan policy). */
  runPlans: z.array(z.object({ id: z.number(), title: z.string(), bookingId: z.number(), heldReservations: z.number() })),
  /** What the caller may do to it, decided by the server's instrument policy. */
  abilities: instrumentAbilities,
});
export type ScanInstrumentRecord = z.infer<typeof scanInstrumentRecord>;

export const scanResultDto = z.discriminatedUnion("type", [
  z.object({ type: z.literal("container"), id: z.number(), url: z.string(), record: scanContainerRecord }),
  z.object({ type: z.literal("instrument"), id: z.number(), url: z.string(), record: scanInstrumentRecord }),
]);
export type ScanResultDto = z.infer<typeof scanResultDto>;

const note = (what: string, required: boolean) =>
  required ? z.string().trim().min(3, `Describe the ${what} in a few words`).max(1000) : z.string().trim().max(1000).default("");

export const reportProblemInput = z.object({ note: note("problem", true) });
export type ReportProblemInput = z.infer<typeof reportProblemInput>;

export const moveContainerInput = z.object({ locationId: id("Choose a location") });
export type MoveContainerInput = z.infer<typeof moveContainerInput>;

export const markEmptyInput = z.object({ wasteNote: note("waste", false) });
export type MarkEmptyInput = z.infer<typeof markEmptyInput>;

export const disposeInput = z.object({ wasteNote: note("waste stream or where it went", true) });
export type DisposeInput = z.infer<typeof disposeInput>;

export const cleanedInput = z.object({ note: note("cleaning", false) });
export type CleanedInput = z.infer<typeof cleanedInput>;

/** One fault report form for the Scan page and the instrument page. */
export { reportFaultInput, type ReportFaultInput } from "./instruments";

export const locationChoiceDto = z.object({ id: z.number(), path: z.string() });
export type LocationChoiceDto = z.infer<typeof locationChoiceDto>;
