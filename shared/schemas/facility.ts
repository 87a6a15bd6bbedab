/** The facility's settings every screen needs: GET /api/facility. */
import { z } from "zod";

export const facilityDto = z.object({
  name: z.string(),
  /** IANA zone name (FACILITY_TZ); bookable hours and the Schedule's grid are in this zone. */
  timeZone: z.string(),
  currency: z.string(),
  /** A production server running the invented demo on purpose (DEMO_SEED): every page shows a banner. */
  publicDemo: z.boolean(),
});
export type FacilityDto = z.infer<typeof facilityDto>;
