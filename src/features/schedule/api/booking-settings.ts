/**
 * The facility's booking settings (late-cancellation window, no-show grace, check-in opening):
 * GET /api/bookings/policy (everyone) and PUT (manager).
 */
import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { bookingSettingsAnswer, type BookingSettings } from "@shared/schemas/bookings";
import { api, parseResponse } from "@/lib/api-client";
import { bookingKeys } from "./keys";

export const bookingSettingsQueryOptions = () =>
  queryOptions({
    queryKey: bookingKeys.settings(),
    queryFn: async ({ signal }) => parseResponse(bookingSettingsAnswer, await api.get<unknown>("/bookings/policy", { signal }), "GET /api/bookings/policy").policy,
  });

export const useBookingSettings = () => useQuery(bookingSettingsQueryOptions());

export function useSaveBookingSettings() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (settings: BookingSettings) =>
      parseResponse(bookingSettingsAnswer, await api.put<unknown>("/bookings/policy", settings), "PUT /api/bookings/policy").policy,
    onSuccess: (settings) => qc.setQueryData(bookingKeys.settings(), settings),
  });
}
