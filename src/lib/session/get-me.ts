/** GET /api/auth/me: who is signed in. A 401 is an answer here ("nobody"), not an error. */
import { queryOptions, useQuery } from "@tanstack/react-query";
import type { UserDto } from "@shared/schemas/auth";
import { api, isApiError } from "@/lib/api-client";
import { sessionUser } from "@/lib/boot-answers";
import { authKeys } from "./keys";

export async function getMe(signal?: AbortSignal): Promise<UserDto | null> {
  try {
    const data = await api.get<unknown>("/auth/me", { signal });
    return sessionUser(data, "GET /api/auth/me");
  } catch (error) {
    if (isApiError(error, 401)) return null;
    throw error;
  }
}

export const meQueryOptions = () =>
  queryOptions({
    queryKey: authKeys.me(),
    queryFn: ({ signal }) => getMe(signal),
    // Roles rarely change within a session; a focus refetch after five minutes notices an expired session.
    staleTime: 5 * 60_000,
    meta: { authRedirect: false },
  });

export const useMe = () => useQuery(meQueryOptions());
