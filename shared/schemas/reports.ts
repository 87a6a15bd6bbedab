import { z } from "zod";

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

export const utilisationReport = z.object({ items: z.array(utilisationRow), tz: z.string() });
export type UtilisationReport = z.infer<typeof utilisationReport>;
