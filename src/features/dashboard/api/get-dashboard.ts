/**
 * GET /api/dashboard: the figures for each role's start page; a section is present only for
 * the roles it serves. No shared schema exists for it yet, so the shape is declared here from
 * the API note; move it to shared/schemas when the server publishes one.
 */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { dashboardKeys } from "./keys";

export interface DashboardBooking {
  id: number;
  start: string;
  end: string;
  status: string;
  instrumentNames: string[];
}

export interface Dashboard {
  member: { nextBookings: DashboardBooking[] };
  manager?: { pendingApprovals: number; openTrainingRequests: number; trainingExpiringSoon: number; instrumentsOutOfService: number };
  safety?: { expiredContainers: number; onHold: number; locationsOverLimit: number };
}

export function getDashboard(signal?: AbortSignal): Promise<Dashboard> {
  return api.get<Dashboard>("/dashboard", { signal });
}

export const dashboardQueryOptions = () =>
  queryOptions({ queryKey: dashboardKeys.summary(), queryFn: ({ signal }) => getDashboard(signal) });

export const useDashboard = () => useQuery(dashboardQueryOptions());
