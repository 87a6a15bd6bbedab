/** GET /api/users/organisations: external customers' organisations already known, offered when typing a person's. */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { organisationList } from "@shared/schemas/users";
import { api, parseResponse } from "@/lib/api-client";
import { adminKeys } from "./keys";

export async function getOrganisations(signal?: AbortSignal): Promise<string[]> {
  const data = await api.get<unknown>("/users/organisations", { signal });
  return parseResponse(organisationList, data, "GET /api/users/organisations").items;
}

export const organisationsQueryOptions = () =>
  queryOptions({ queryKey: adminKeys.organisations(), queryFn: ({ signal }) => getOrganisations(signal), staleTime: 5 * 60_000 });

export const useOrganisations = () => useQuery(organisationsQueryOptions());
