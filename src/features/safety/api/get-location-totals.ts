/** GET /api/safety/locations: per-location flammable totals against limits, with over-limit flags. */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { locationTotalsDto } from "@shared/schemas/stock";
import { api, parseResponse } from "@/lib/api-client";
import { safetyKeys } from "./keys";

export async function getLocationTotals(signal?: AbortSignal) {
  const data = await api.get<unknown>("/safety/locations", { signal });
  return parseResponse(z.object({ items: z.array(locationTotalsDto), total: z.number() }), data, "GET /api/safety/locations").items;
}
export const locationTotalsQueryOptions = () => queryOptions({ queryKey: safetyKeys.totals(), queryFn: ({ signal }) => getLocationTotals(signal) });
export const useLocationTotals = () => useQuery(locationTotalsQueryOptions());
