/** GET /api/departments: for the person forms' department choice and the table's department column. */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { departmentDto } from "@shared/schemas/users";
import { api, parseResponse } from "@/lib/api-client";
import { adminKeys } from "./keys";

const departmentPage = z.object({ items: z.array(departmentDto), total: z.number() });

export async function getDepartments(signal?: AbortSignal) {
  const data = await api.get<unknown>("/departments", { query: { limit: 500 }, signal });
  return parseResponse(departmentPage, data, "GET /api/departments");
}

export const departmentsQueryOptions = () =>
  queryOptions({ queryKey: adminKeys.departments(), queryFn: ({ signal }) => getDepartments(signal), staleTime: 5 * 60_000 });

export const useDepartments = () => useQuery(departmentsQueryOptions());
