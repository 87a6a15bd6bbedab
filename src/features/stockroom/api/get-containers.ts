/** GET /api/containers: the Stockroom search, paged, sorted and filtered on the server. */
import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { boundedPageOf } from "@shared/schemas/common";
import { CONTAINER_STATUSES, containerDto, type CONTAINER_SORTS } from "@shared/schemas/stock";
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

/** The containers table's page size and its default status filter ("in stock"). */
export const CONTAINER_PAGE = 50;
export const IN_STOCK = "sealed,in_use,on_hold";

/** A status from a link, if it is one the Status filter offers; otherwise the default. */
export function statusFromLink(value: string | null): string | undefined {
  if (value === null) return undefined;
  return value === "" || value === IN_STOCK || (CONTAINER_STATUSES as readonly string[]).includes(value) ? value : undefined;
}

/**
 * The query the containers table sends for its filters, sort and page. The table and the
 * Stockroom's route loader both build it here, so the loader's prefetch is the table's first page.
 */
export function containerTableQuery(v: {
  q?: string;
  status: string;
  locationId?: number;
  chemicalId?: number;
  sort?: (typeof CONTAINER_SORTS)[number];
  desc?: boolean;
  page?: number;
}): ContainerFilters {
  return {
    q: v.q || undefined,
    status: v.status || undefined,
    locationId: v.locationId,
    within: v.locationId ? "true" : undefined,
    chemicalId: v.chemicalId,
    sort: v.sort ?? "chemical",
    dir: v.desc ? "desc" : "asc",
    limit: CONTAINER_PAGE,
    offset: (v.page ?? 0) * CONTAINER_PAGE,
  };
}

export const useContainers = (q: ContainerFilters) => useQuery(containersQueryOptions(q));
