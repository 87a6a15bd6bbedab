/** GET /api/ion-transfer/solvents and /ions: the ion table the plan's salts and analytes come from. */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { ionsAnswer, solventsAnswer } from "@shared/schemas/ion-table";
import { api, parseResponse } from "@/lib/api-client";
import { runPlanKeys } from "./keys";

export const solventsQueryOptions = () =>
  queryOptions({
    queryKey: runPlanKeys.solvents(),
    queryFn: async ({ signal }) => parseResponse(solventsAnswer, await api.get<unknown>("/ion-transfer/solvents", { signal }), "GET /api/ion-transfer/solvents"),
    staleTime: 5 * 60_000,
  });
export const useSolvents = () => useQuery(solventsQueryOptions());

export const ionsQueryOptions = (solvent: string) =>
  queryOptions({
    queryKey: runPlanKeys.ions(solvent),
    queryFn: async ({ signal }) => parseResponse(ionsAnswer, await api.get<unknown>("/ion-transfer/ions", { query: { solvent }, signal }), "GET /api/ion-transfer/ions"),
    staleTime: 5 * 60_000,
  });
export const useIons = (solvent: string) => useQuery(ionsQueryOptions(solvent));
