/** The Safety review's lists (GET /api/safety/review): hazardous substances, expired, no location, holds, halogenated waste, sheets due. */
import { z } from "zod";

export const reviewContainer = z.object({
  id: z.number(),
  chemicalId: z.number(),
  chemicalName: z.string(),
  quantity: z.number(),
  initialQuantity: z.number(),
  unit: z.string(),
  status: z.string(),
  kind: z.string(),
  locationId: z.number().nullable(),
  locationPath: z.string().nullable(),
  expiresAt: z.string().nullable(),
  retestAt: z.string().nullable(),
  holdReason: z.string().nullable(),
  lot: z.string(),
});
export type ReviewContainer = z.infer<typeof reviewContainer>;

export const safetyReviewDto = z.object({
  today: z.string(),
  sdsReviewMonths: z.number(),
  hazardous: z.array(
    z.object({ chemicalId: z.number(), name: z.string(), casNumber: z.string(), carcinogen: z.boolean(), acuteToxic: z.boolean(), hazardStatements: z.array(z.string()), containers: z.array(reviewContainer) }),
  ),
  expired: z.array(reviewContainer),
  noLocation: z.array(reviewContainer),
  /** Flammable or combustible liquids whose volume cannot be computed (no density on record). */
  unknownVolume: z.array(reviewContainer),
  onHold: z.object({ containers: z.array(reviewContainer), chemicals: z.array(z.object({ chemicalId: z.number(), name: z.string(), reason: z.string().nullable() })) }),
  halogenatedWaste: z.array(reviewContainer.extend({ fillPercent: z.number().nullable() })),
  sdsDue: z.array(z.object({ chemicalId: z.number(), name: z.string(), reviewedOn: z.string().nullable() })),
});

