/** GET /api/locations: every place with its path, for filters and the move and receive forms. */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { locationDto } from "@shared/schemas/stock";
import { api, parseResponse } from "@/lib/api-client";
import { stockKeys } from "./keys";

export async function getLocations(signal?: AbortSignal) {
  const data = await api.get<unknown>("/locations", { signal });
  return parseResponse(z.object({ items: z.array(locationDto), total: z.number() }), data, "GET /api/locations").items;
}

export const locationsQueryOptions = () => queryOptions({ queryKey: stockKeys.locations(), queryFn: ({ signal }) => getLocations(signal), staleTime: 60_000 });
export const useLocations = () => useQuery(locationsQueryOptions());
