/**
 * The facility's settings (GET /api/facility): its name, currency and, above all, its time zone.
 * Bookings are shown and typed in the facility's zone, not the browser's, so a visitor abroad
 * books the same local hours the instruments are open.
 */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "./api-client";
import { facilityAnswer } from "./boot-answers";

export const facilityQueryOptions = () =>
  queryOptions({
    queryKey: ["facility"] as const,
    queryFn: async ({ signal }) => facilityAnswer(await api.get<unknown>("/facility", { signal })),
    // A server setting that changes only with a restart.
    staleTime: Infinity,
  });

export const useFacility = () => useQuery(facilityQueryOptions());

/** The facility's zone, or undefined while it loads; screens that show times wait for it. */
export function useFacilityZone(): string | undefined {
  return useFacility().data?.timeZone;
}
