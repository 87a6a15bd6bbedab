/** GET /api/bookings: bookings overlapping a window (others' as busy blocks), or the caller's own. */
import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import type { z } from "zod";
import { bookingListItem } from "@shared/schemas/bookings";
import { pageOf } from "@shared/schemas/common";
import { api, parseResponse } from "@/lib/api-client";
import { bookingKeys, type BookingQuery } from "./keys";

const bookingPage = pageOf(bookingListItem);
export type BookingPage = z.infer<typeof bookingPage>;

export async function getBookings(q: BookingQuery, signal?: AbortSignal): Promise<BookingPage> {
  const data = await api.get<unknown>("/bookings", { query: q, signal });
  return parseResponse(bookingPage, data, "GET /api/bookings");
}

export const bookingsQueryOptions = (q: BookingQuery) =>
  queryOptions({ queryKey: bookingKeys.list(q), queryFn: ({ signal }) => getBookings(q, signal), placeholderData: keepPreviousData });

export const useBookings = (q: BookingQuery, enabled = true) => useQuery({ ...bookingsQueryOptions(q), enabled });
