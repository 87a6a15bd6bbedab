/** GET /api/bookings: bookings overlapping a window (others' as busy blocks), or the caller's own. */
import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { bookingDto, busyBlockDto } from "@shared/schemas/bookings";
import { api, parseResponse } from "@/lib/api-client";
import { bookingKeys, type BookingQuery } from "./keys";

const bookingPage = z.object({ items: z.array(z.union([bookingDto, busyBlockDto])), total: z.number() });
export type BookingPage = z.infer<typeof bookingPage>;

export async function getBookings(q: BookingQuery, signal?: AbortSignal): Promise<BookingPage> {
  const data = await api.get<unknown>("/bookings", { query: q, signal });
  return parseResponse(bookingPage, data, "GET /api/bookings");
}

export const bookingsQueryOptions = (q: BookingQuery) =>
  queryOptions({ queryKey: bookingKeys.list(q), queryFn: ({ signal }) => getBookings(q, signal), placeholderData: keepPreviousData });

export const useBookings = (q: BookingQuery, enabled = true) => useQuery({ ...bookingsQueryOptions(q), enabled });
