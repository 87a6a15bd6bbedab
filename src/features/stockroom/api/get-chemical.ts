/** GET /api/chemicals/:id and its safety data sheets (GET /api/chemicals/:id/sds). */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { chemicalDto, sdsDto } from "@shared/schemas/stock";
import { api, parseResponse } from "@/lib/api-client";
import { stockKeys } from "./keys";

export async function getChemical(id: number, signal?: AbortSignal) {
  const data = await api.get<unknown>(`/chemicals/${id}`, { signal });
  return parseResponse(z.object({ chemical: chemicalDto }), data, "GET /api/chemicals/:id").chemical;
}

export const chemicalQueryOptions = (id: number) => queryOptions({ queryKey: stockKeys.chemical(id), queryFn: ({ signal }) => getChemical(id, signal) });
export const useChemical = (id: number) => useQuery(chemicalQueryOptions(id));

export async function getSheets(chemicalId: number, signal?: AbortSignal) {
  const data = await api.get<unknown>(`/chemicals/${chemicalId}/sds`, { signal });
  return parseResponse(z.object({ items: z.array(sdsDto), total: z.number() }), data, "GET /api/chemicals/:id/sds").items;
}
export const sheetsQueryOptions = (chemicalId: number) => queryOptions({ queryKey: stockKeys.sds(chemicalId), queryFn: ({ signal }) => getSheets(chemicalId, signal) });
export const useSheets = (chemicalId: number) => useQuery(sheetsQueryOptions(chemicalId));
