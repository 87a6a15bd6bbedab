/** The Schedule's reference data: accounts the caller may charge (GET /api/accounts) and setups (GET /api/setups). */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { setupDto } from "@shared/schemas/setups";
import { api, parseResponse } from "@/lib/api-client";
import { scheduleKeys } from "./keys";

const accountDto = z.object({
  id: z.number(),
  code: z.string(),
  name: z.string(),
  kind: z.string(),
  chargeable: z.boolean(),
});
export type AccountOption = z.infer<typeof accountDto>;
const accountPage = z.object({ items: z.array(accountDto), total: z.number() });
const setupPage = z.object({ items: z.array(setupDto), total: z.number() });

export const accountOptionsQueryOptions = () =>
  queryOptions({
    queryKey: scheduleKeys.accounts(),
    queryFn: async ({ signal }) => parseResponse(accountPage, await api.get<unknown>("/accounts", { signal }), "GET /api/accounts").items,
    staleTime: 5 * 60_000,
  });

export const useAccounts = () => useQuery(accountOptionsQueryOptions());

export const setupsQueryOptions = () =>
  queryOptions({
    queryKey: scheduleKeys.setups(),
    queryFn: async ({ signal }) => parseResponse(setupPage, await api.get<unknown>("/setups", { signal }), "GET /api/setups").items,
    staleTime: 5 * 60_000,
  });

export const useSetups = () => useQuery(setupsQueryOptions());
