/** Query keys for the Schedule: every input of a fetch is in its key. */
import type { BookingListQuery } from "@shared/schemas/bookings";

export type BookingQuery = Partial<Omit<BookingListQuery, "status">> & { status?: string };

export const bookingKeys = {
  all: ["bookings"] as const,
  lists: () => [...bookingKeys.all, "list"] as const,
  list: (q: BookingQuery) => [...bookingKeys.lists(), q] as const,
  settings: () => [...bookingKeys.all, "settings"] as const,
};

export const scheduleKeys = {
  accounts: () => ["accounts"] as const,
  setups: () => ["setups"] as const,
  calendarFeed: () => ["calendar", "me"] as const,
  utilisation: (q: { from: string; to: string }) => ["reports", "utilisation", q] as const,
};
