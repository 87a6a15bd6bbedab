/** GET /api/containers: the Stockroom search, paged, sorted and filtered on the server. */
import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { boundedPageOf } from "@shared/schemas/common";
import { containerDto } from "@shared/schemas/stock";
import { api, parseResponse } from "@/lib/api-client";
import { stockKeys, type ContainerFilters } from "./keys";

/** `totalIsExact: false`: counting stopped at `total`, more match. */
const containerPage = boundedPageOf(containerDto);

export async function getContainers(q: ContainerFilters, signal?: AbortSignal) {
  const data = await api.get<unknown>("/containers", { query: { ...q }, signal });
  return parseResponse(containerPage, data, "GET /api/containers");
}

export const containersQueryOptions = (q: ContainerFilters) =>
  queryOptions({ queryKey: stockKeys.containerList(q), queryFn: ({ signal }) => getContainers(q, signal), placeholderData: keepPreviousData });

export const useContainers = (q: ContainerFilters) => useQuery(containersQueryOptions(q));
