/** GET /api/dashboard: the figures for each role's start page, parsed with the shared schema. */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { dashboardDto, type DashboardDto } from "@shared/schemas/dashboard";
import { api, parseResponse } from "@/lib/api-client";
import { dashboardKeys } from "./keys";

export async function getDashboard(signal?: AbortSignal): Promise<DashboardDto> {
  return parseResponse(dashboardDto, await api.get<unknown>("/dashboard", { signal }), "GET /api/dashboard");
}

export const dashboardQueryOptions = () => queryOptions({ queryKey: dashboardKeys.summary(), queryFn: ({ signal }) => getDashboard(signal) });

export const useDashboard = () => useQuery(dashboardQueryOptions());
