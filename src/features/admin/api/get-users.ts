/** GET /api/users: people for the administrator, filtered by name or e-mail on the server. */
import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import type { z } from "zod";
import { boundedPageOf } from "@shared/schemas/common";
import { userAdminDto, type UserListQuery } from "@shared/schemas/users";
import { api, parseResponse } from "@/lib/api-client";
import { adminKeys } from "./keys";

const userPage = boundedPageOf(userAdminDto);
export type UserPage = z.infer<typeof userPage>;

export async function getUsers(q: Partial<UserListQuery>, signal?: AbortSignal): Promise<UserPage> {
  const data = await api.get<unknown>("/users", { query: q, signal });
  return parseResponse(userPage, data, "GET /api/users");
}

export const usersQueryOptions = (q: Partial<UserListQuery>) =>
  queryOptions({
    queryKey: adminKeys.userList(q),
    queryFn: ({ signal }) => getUsers(q, signal),
    // Keep the table on screen while a new filter loads, instead of flashing empty.
    placeholderData: keepPreviousData,
  });

export const useUsers = (q: Partial<UserListQuery>) => useQuery(usersQueryOptions(q));
