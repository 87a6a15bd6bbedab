/** GET /api/system/status: mail, payments and the nightly backup, for the administrator. */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { systemStatusDto, type SystemStatusDto } from "@shared/schemas/system";
import { api, parseResponse } from "@/lib/api-client";
import { adminKeys } from "./keys";

export type SystemStatus = SystemStatusDto;

export async function getSystemStatus(signal?: AbortSignal): Promise<SystemStatus> {
  return parseResponse(systemStatusDto, await api.get<unknown>("/system/status", { signal }), "GET /api/system/status");
}

export const systemStatusQueryOptions = () =>
  queryOptions({
    queryKey: adminKeys.systemStatus(),
    queryFn: ({ signal }) => getSystemStatus(signal),
    // The outbox drains every few seconds; a minute keeps the counts honest without polling hard.
    refetchInterval: 60_000,
  });

export const useSystemStatus = () => useQuery(systemStatusQueryOptions());
