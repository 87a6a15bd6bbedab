/**
 * What a plan can start from: chemicals in the Stockroom that say which ions they give (GET
 * /api/chemicals), the interface cells with their area and fill volumes (GET /api/instruments),
 * and the person's own bookings ahead (GET /api/bookings?mine=true) to reserve for.
 */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { chemicalDto } from "@shared/schemas/stock";
import { instrumentDto } from "@shared/schemas/instruments";
import { bookingListItem } from "@shared/schemas/bookings";
import { api, parseResponse } from "@/lib/api-client";
import { runPlanKeys } from "./keys";

const chemicals = z.object({ items: z.array(chemicalDto), total: z.number() });
const instruments = z.object({ items: z.array(instrumentDto), total: z.number() });
const bookings = z.object({ items: z.array(bookingListItem), total: z.number() });

export const electrolytesQueryOptions = () =>
  queryOptions({
    queryKey: runPlanKeys.electrolytes(),
    queryFn: async ({ signal }) => {
      const page = parseResponse(chemicals, await api.get<unknown>("/chemicals", { query: { limit: 500 }, signal }), "GET /api/chemicals");
      return page.items.filter((c) => c.ions !== null);
    },
  });
export const useStockElectrolytes = () => useQuery(electrolytesQueryOptions());

export const instrumentsQueryOptions = () =>
  queryOptions({
    queryKey: runPlanKeys.cells(),
    queryFn: async ({ signal }) => parseResponse(instruments, await api.get<unknown>("/instruments", { query: { limit: 500 }, signal }), "GET /api/instruments").items,
  });
export const useInstrumentChoices = () => useQuery(instrumentsQueryOptions());

export const myBookingsQueryOptions = (fromIso: string) =>
  queryOptions({
    queryKey: [...runPlanKeys.bookings(), fromIso],
    queryFn: async ({ signal }) =>
      parseResponse(bookings, await api.get<unknown>("/bookings", { query: { mine: true, from: fromIso, limit: 200 }, signal }), "GET /api/bookings").items.flatMap((b) => (b.busy ? [] : [b])),
  });
export const useMyBookingsAhead = (fromIso: string) => useQuery(myBookingsQueryOptions(fromIso));
