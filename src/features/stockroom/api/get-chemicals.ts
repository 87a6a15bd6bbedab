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

/** The chemicals table's page size, and its first page as the table and the route loader ask for it. */
export const CHEMICAL_PAGE = 50;
export const firstChemicalsPage: ChemicalFilters = { sort: "name", dir: "asc", limit: CHEMICAL_PAGE, offset: 0 };

export const chemicalsQueryOptions = (q: ChemicalFilters) =>
  queryOptions({ queryKey: stockKeys.chemicalList(q), queryFn: ({ signal }) => getChemicals(q, signal), placeholderData: keepPreviousData });

export const useChemicals = (q: ChemicalFilters) => useQuery(chemicalsQueryOptions(q));
