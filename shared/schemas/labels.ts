/**
 * Labels and Scan: what GET /api/scan/:labelToken answers, the label PDF query, label stocks,
 * and the inputs of the quick actions a scan offers.
 *
 * Scan answers: 200 { type, id, url, record }; 404 code "label_malformed" for a token of the
 * wrong shape (checked before any lookup); 404 code "label_unknown"; 404 with code
 * "label_replaced" (and replacedAt) for a token retired when its label was re-issued.
 */
import { z } from "zod";
import { isLabelTokenShape, MAX_LABELS_PER_REQUEST } from "../domain/labels";
import { id, wholeNumber } from "./common";
import { containerAbilities } from "./stock";
import { faultDto, instrumentAbilities } from "./instruments";
import { bookingAbilities } from "./bookings";

export const labelTokenParam = z.object({
  labelToken: z.string().refine(isLabelTokenShape, "A label code is 22 to 64 letters, digits, '-' or '_'."),
});

const idList = z
  .string()
  .trim()
  .regex(/^\d+(,\d+)*$/, "Give ids separated by commas, e.g. 1,2,3")
  .transform((s) => [...new Set(s.split(",").map(Number))]);

export const LABEL_SIZES = ["vial", "bottle"] as const;
export const labelSize = z.enum(LABEL_SIZES);
export type LabelSizeName = z.infer<typeof labelSize>;

export const labelsPdfQuery = z
  .object({
    containerIds: idList.optional(),
    instrumentIds: idList.optional(),
    /** A label stock from GET /api/labels/stocks; without it each label is its own page (label printer roll). */
    stockId: id().optional(),
    /** Vial or bottle design for single labels; by default vials get the vial label, everything else the bottle label. */
    size: labelSize.optional(),
    /** Positions already used on the first sheet. */
    skip: wholeNumber(0, 400, "number of positions to skip").default(0),
  })
  .refine((q) => (q.containerIds?.length ?? 0) + (q.instrumentIds?.length ?? 0) > 0, {
    message: "Name the containers (containerIds=1,2) or instruments (instrumentIds=3) to label.",
    path: ["containerIds"],
  });
export type LabelsPdfQuery = z.infer<typeof labelsPdfQuery>;

export { MAX_LABELS_PER_REQUEST };

export const labelStockDto = z.object({
  id: z.number(),
  name: z.string(),
  size: labelSize,
  pageWidthMm: z.number(),
  pageHeightMm: z.number(),
  labelWidthMm: z.number(),
  labelHeightMm: z.number(),
  columns: z.number(),
  rows: z.number(),
  marginTopMm: z.number(),
  marginLeftMm: z.number(),
  gapXMm: z.number(),
  gapYMm: z.number(),
});
export type LabelStockDto = z.infer<typeof labelStockDto>;

const mm = (max: number) => z.number().min(0).max(max);
export const labelStockInput = z.object({
  name: z.string().trim().min(1, "Name the stock").max(120),
  size: labelSize,
  pageWidthMm: mm(1000).refine((n) => n > 0, "Give the page width"),
  pageHeightMm: mm(1000).refine((n) => n > 0, "Give the page height"),
  labelWidthMm: mm(1000).refine((n) => n >= 15, "Labels narrower than 15 mm cannot hold a readable QR code"),
  labelHeightMm: mm(1000).refine((n) => n >= 10, "Labels lower than 10 mm cannot hold a readable QR code"),
  columns: z.number().int().min(1).max(20),
  rows: z.number().int().min(1).max(40),
  marginTopMm: mm(500).default(0),
  marginLeftMm: mm(500).default(0),
  gapXMm: mm(100).default(0),
  gapYMm: mm(100).default(0),
});
export type LabelStockInput = z.infer<typeof labelStockInput>;

export const LABELLED_TYPES = ["container", "instrument"] as const;
export const labelledType = z.enum(LABELLED_TYPES);
export type LabelledTypeName = z.infer<typeof labelledType>;

export const reissueParams = z.object({ type: labelledType, id: id() });
export const reissueInput = z.object({ reason: z.string().trim().max(300).default("") });
export type ReissueInput = z.infer<typeof reissueInput>;

export const labelHistoryEntryDto = z.object({
  retiredAt: z.string(),
  retiredBy: z.string().nullable(),
  reason: z.string(),
  /** The first characters only: enough to match a label in hand, not enough to use it. */
  tokenPrefix: z.string(),
});
export type LabelHistoryEntryDto = z.infer<typeof labelHistoryEntryDto>;

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

/** Client route of each record type (kept here so server answers and client links agree). */
export function recordPath(type: LabelledTypeName, id: number): string {
  return type === "container" ? `/stockroom/containers/${id}` : `/instruments/${id}`;
}

export const locationChoiceDto = z.object({ id: z.number(), path: z.string() });
export type LocationChoiceDto = z.infer<typeof locationChoiceDto>;
