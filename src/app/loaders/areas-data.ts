/** Loaders of the start page, the Safety review and Administration (see load.ts). */
import { dashboardQueryOptions } from "@/features/dashboard/api/get-dashboard";
import { reviewQueryOptions } from "@/features/safety/api/get-review";
import { sdsDueQueryOptions } from "@/features/safety/api/get-sds-due";
import { locationTotalsQueryOptions } from "@/features/safety/api/get-location-totals";
import { locationListQueryOptions } from "@/features/safety/api/locations";
import { usersQueryOptions } from "@/features/admin/api/get-users";
import { departmentsQueryOptions } from "@/features/admin/api/get-departments";
import { groupsQueryOptions } from "@/features/admin/api/get-groups";
import { systemStatusQueryOptions } from "@/features/admin/api/get-system-status";
import { mailboxQueryOptions } from "@/features/admin/api/get-mailbox";
import type { ScreenLoader } from "./load";

export const home: ScreenLoader = (qc) => [qc.prefetchQuery(dashboardQueryOptions())];

export const safety: ScreenLoader = (qc) => [
  qc.prefetchQuery(locationTotalsQueryOptions()),
  qc.prefetchQuery(reviewQueryOptions()),
  qc.prefetchQuery(sdsDueQueryOptions()),
];

export const safetyLocations: ScreenLoader = (qc) => [qc.prefetchQuery(locationListQueryOptions())];

/** The people table's first answer: everyone, one page of 500 (people-table.tsx). */
export const people: ScreenLoader = (qc) => [
  qc.prefetchQuery(usersQueryOptions({ q: undefined, limit: 500, offset: 0 })),
  qc.prefetchQuery(departmentsQueryOptions()),
  qc.prefetchQuery(groupsQueryOptions()),
];

export const system: ScreenLoader = (qc) => [qc.prefetchQuery(systemStatusQueryOptions()), qc.prefetchQuery(mailboxQueryOptions())];
