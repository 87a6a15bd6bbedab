/** GET /api/scan/:labelToken: the record a label stands for, with what the bench needs to act on it. */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { scanResultDto, type ScanResultDto } from "@shared/schemas/scan";
import { api, isApiError, parseResponse } from "@/lib/api-client";
import { labelKeys } from "./keys";

export async function getScan(token: string, signal?: AbortSignal): Promise<ScanResultDto> {
  const data = await api.get<unknown>(`/scan/${encodeURIComponent(token)}`, { signal });
  return parseResponse(scanResultDto, data, "GET /api/scan/:labelToken");
}

export const scanQueryOptions = (token: string) =>
  queryOptions({
    queryKey: labelKeys.scan(token),
    queryFn: ({ signal }) => getScan(token, signal),
    // Unknown, replaced and malformed codes will not change on a retry.
    retry: (count, error) => !isApiError(error) || (error.status >= 500 && count < 2),
  });

export const useScan = (token: string) => useQuery(scanQueryOptions(token));
