/**
 * Labels: the label token, the label PDF query, label stocks, re-issuing a label and its history.
 * What a scan answers and the quick actions it offers are in scan.ts (they bring the Stockroom's,
 * the instruments' and the Schedule's schemas with them; printing labels needs none of those).
 */
import { z } from "zod";
import { isLabelTokenShape, MAX_LABELS_PER_REQUEST } from "../domain/labels";
import { id, wholeNumber } from "./common";

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

/** Client route of each record type (kept here so server answers and client links agree). */
export function recordPath(type: LabelledTypeName, id: number): string {
  return type === "container" ? `/stockroom/containers/${id}` : `/instruments/${id}`;
}
