/** GET /api/scan-actions/locations: every place a container can go, by its full path. */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { locationChoiceDto } from "@shared/schemas/scan";
import { api, parseResponse } from "@/lib/api-client";
import { labelKeys } from "./keys";

const page = z.object({ items: z.array(locationChoiceDto), total: z.number() });

export const locationChoicesQueryOptions = () =>
  queryOptions({
    queryKey: labelKeys.locations(),
    queryFn: async ({ signal }) =>
      parseResponse(page, await api.get<unknown>("/scan-actions/locations", { signal }), "GET /api/scan-actions/locations").items,
    staleTime: 5 * 60_000,
  });

export const useLocationChoices = (enabled = true) => useQuery({ ...locationChoicesQueryOptions(), enabled });
