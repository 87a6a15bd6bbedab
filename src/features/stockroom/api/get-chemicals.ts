/** GET /api/chemicals: chemicals with their computed hazard classes, paged and sorted on the server. */
import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { boundedPageOf } from "@shared/schemas/common";
import { chemicalDto } from "@shared/schemas/stock";
import { api, parseResponse } from "@/lib/api-client";
import { stockKeys, type ChemicalFilters } from "./keys";

const chemicalPage = boundedPageOf(chemicalDto);

export async function getChemicals(q: ChemicalFilters, signal?: AbortSignal) {
  const data = await api.get<unknown>("/chemicals", { query: { ...q }, signal });
  return parseResponse(chemicalPage, data, "GET /api/chemicals");
}

export const chemicalsQueryOptions = (q: ChemicalFilters) =>
  queryOptions({ queryKey: stockKeys.chemicalList(q), queryFn: ({ signal }) => getChemicals(q, signal), placeholderData: keepPreviousData });

export const useChemicals = (q: ChemicalFilters) => useQuery(chemicalsQueryOptions(q));
