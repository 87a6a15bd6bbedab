/** The facility's booking policy: GET /api/bookings/policy (everyone) and PUT (manager). */
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { bookingPolicy, type BookingPolicy } from "@shared/schemas/bookings";
import { api, parseResponse } from "@/lib/api-client";
import { bookingKeys } from "./keys";

const answer = z.object({ policy: bookingPolicy });

export const useBookingPolicy = () =>
  useQuery({
    queryKey: bookingKeys.policy(),
    queryFn: async ({ signal }) => parseResponse(answer, await api.get<unknown>("/bookings/policy", { signal }), "GET /api/bookings/policy").policy,
  });

export function useSaveBookingPolicy() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (policy: BookingPolicy) => parseResponse(answer, await api.put<unknown>("/bookings/policy", policy), "PUT /api/bookings/policy").policy,
    onSuccess: (policy) => qc.setQueryData(bookingKeys.policy(), policy),
  });
}
