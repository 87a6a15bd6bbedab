/**
 * The booking mutations: create (POST /api/bookings), move (PATCH), and the state changes
 * approve, decline, cancel, check-in, check-out and no-show. Each invalidates the booking lists
 * and the start page, the narrowest keys that show a booking.
 */
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { madeBookingsDto, oneBookingDto, type CreateBookingInput, type MoveBookingInput } from "@shared/schemas/bookings";
import { api, parseResponse } from "@/lib/api-client";
import { bookingKeys } from "./keys";

const one = oneBookingDto;
const made = madeBookingsDto;

function useInvalidate() {
  const queryClient = useQueryClient();
  return () =>
    Promise.all([
      queryClient.invalidateQueries({ queryKey: bookingKeys.lists() }),
      queryClient.invalidateQueries({ queryKey: ["dashboard"] }),
    ]);
}

export function useCreateBooking() {
  const invalidate = useInvalidate();
  return useMutation({
    mutationFn: async (input: CreateBookingInput) => parseResponse(made, await api.post<unknown>("/bookings", input), "POST /api/bookings"),
    onSuccess: invalidate,
  });
}

export function useMoveBooking() {
  const invalidate = useInvalidate();
  return useMutation({
    mutationFn: async ({ id, ...input }: MoveBookingInput & { id: number }) =>
      parseResponse(one, await api.patch<unknown>(`/bookings/${id}`, input), "PATCH /api/bookings/:id").booking,
    onSettled: invalidate,
  });
}

export type BookingAction = "approve" | "decline" | "cancel" | "check-in" | "check-out" | "no-show";

export function useBookingAction() {
  const invalidate = useInvalidate();
  return useMutation({
    mutationFn: async ({ id, action, reason }: { id: number; action: BookingAction; reason?: string }) =>
      parseResponse(one, await api.post<unknown>(`/bookings/${id}/${action}`, reason ? { reason } : {}), `POST /api/bookings/:id/${action}`).booking,
    onSuccess: invalidate,
  });
}
