/** Loaders of the start page and Administration (see load.ts); the Safety review's are in safety-data.ts. */
import { dashboardQueryOptions } from "@/features/dashboard/api/get-dashboard";
import { usersQueryOptions } from "@/features/admin/api/get-users";
import { departmentsQueryOptions } from "@/features/admin/api/get-departments";
import { groupsQueryOptions } from "@/features/admin/api/get-groups";
import { systemStatusQueryOptions } from "@/features/admin/api/get-system-status";
import { mailboxQueryOptions } from "@/features/admin/api/get-mailbox";
import type { ScreenLoader } from "./load";

export const home: ScreenLoader = (qc) => [qc.prefetchQuery(dashboardQueryOptions())];

/** The people table's first answer: everyone, one page of 500 (people-table.tsx). */
export const people: ScreenLoader = (qc) => [
  qc.prefetchQuery(usersQueryOptions({ q: undefined, limit: 500, offset: 0 })),
  qc.prefetchQuery(departmentsQueryOptions()),
  qc.prefetchQuery(groupsQueryOptions()),
];

export const system: ScreenLoader = (qc) => [qc.prefetchQuery(systemStatusQueryOptions()), qc.prefetchQuery(mailboxQueryOptions())];
