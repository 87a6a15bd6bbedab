/** GET /api/containers/:id: one container with its chemical, history and lineage. */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { containerDetailDto } from "@shared/schemas/stock";
import { api, parseResponse } from "@/lib/api-client";
import { stockKeys } from "./keys";

export async function getContainer(id: number, signal?: AbortSignal) {
  const data = await api.get<unknown>(`/containers/${id}`, { signal });
  return parseResponse(containerDetailDto, data, "GET /api/containers/:id");
}

export const containerQueryOptions = (id: number) => queryOptions({ queryKey: stockKeys.container(id), queryFn: ({ signal }) => getContainer(id, signal) });
export const useContainer = (id: number) => useQuery(containerQueryOptions(id));
