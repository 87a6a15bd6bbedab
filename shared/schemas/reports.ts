import { z } from "zod";
import { id } from "./common";

const month = z.string().regex(/^\d{4}-(0[1-9]|1[0-2])$/, "Give a month as YYYY-MM");

/** GET /api/reports/utilisation(.csv)?from=YYYY-MM&to=YYYY-MM&instrumentId= */
export const utilisationQuery = z.object({ from: month, to: month, instrumentId: id().optional() });
export type UtilisationQuery = z.infer<typeof utilisationQuery>;

/** One instrument's month in the utilisation report (GET /api/reports/utilisation). */
export const utilisationRow = z.object({
  instrumentId: z.number(),
  instrumentName: z.string(),
  period: z.string(),
  bookableHours: z.number(),
  bookedHours: z.number(),
  usedHours: z.number(),
  bookedPct: z.number().nullable(),
  usedPct: z.number().nullable(),
});
export type UtilisationRow = z.infer<typeof utilisationRow>;

export const utilisationReport = z.object({ items: z.array(utilisationRow), total: z.number().int(), tz: z.string() });
export type UtilisationReport = z.infer<typeof utilisationReport>;
