/**
 * GET /api/dashboard: the figures on each role's start page. `member` is always there; the
 * `manager` and `safety` sections only for the roles they serve (safety: the safety officer
 * and the manager).
 */
import { z } from "zod";
import { bookingStatus } from "./bookings";

export const dashboardBookingDto = z.object({
  id: z.number().int(),
  status: bookingStatus,
  start: z.string(),
  end: z.string(),
  instrumentNames: z.array(z.string()),
});
export type DashboardBookingDto = z.infer<typeof dashboardBookingDto>;

const count = z.number().int().nonnegative();

export const dashboardDto = z.object({
  member: z.object({ nextBookings: z.array(dashboardBookingDto) }),
  manager: z
    .object({
      pendingApprovals: count,
      openTrainingRequests: count,
      trainingExpiringSoon: count,
      instrumentsOutOfService: count,
    })
    .optional(),
  safety: z
    .object({
      expiredContainers: count,
      expiringSoon: count,
      onHold: count,
      chemicalsOnHold: count,
      locationsOverLimit: count,
    })
    .optional(),
});
export type DashboardDto = z.infer<typeof dashboardDto>;
