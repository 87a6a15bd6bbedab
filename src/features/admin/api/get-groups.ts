/** GET /api/groups: research groups, each in a department, for the person forms. */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { groupDto } from "@shared/schemas/users";
import { api, parseResponse } from "@/lib/api-client";
import { adminKeys } from "./keys";

const groupPage = z.object({ items: z.array(groupDto), total: z.number() });

export async function getGroups(signal?: AbortSignal) {
  const data = await api.get<unknown>("/groups", { query: { limit: 500 }, signal });
  return parseResponse(groupPage, data, "GET /api/groups");
}

export const groupsQueryOptions = () =>
  queryOptions({ queryKey: adminKeys.groups(), queryFn: ({ signal }) => getGroups(signal), staleTime: 5 * 60_000 });

export const useGroups = () => useQuery(groupsQueryOptions());
