/** Locations with limits for the safety office: GET /api/locations, POST, PATCH /:id, DELETE /:id. */
import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { locationDto, type LocationInput, type LocationUpdate } from "@shared/schemas/stock";
import type { StorageLimitInput } from "@shared/schemas/storage";
import { api, parseResponse } from "@/lib/api-client";
import { safetyKeys } from "./keys";

export async function getLocations(signal?: AbortSignal) {
  return parseResponse(z.object({ items: z.array(locationDto), total: z.number() }), await api.get<unknown>("/locations", { signal }), "GET /api/locations").items;
}
export const locationListQueryOptions = () => queryOptions({ queryKey: safetyKeys.locations(), queryFn: ({ signal }) => getLocations(signal) });
export const useLocationList = () => useQuery(locationListQueryOptions());

function useLocationMutation<V>(run: (v: V) => Promise<unknown>) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: run, onSuccess: () => queryClient.invalidateQueries({ queryKey: safetyKeys.all }) });
}
export const useCreateLocation = () => useLocationMutation((v: LocationInput) => api.post("/locations", v));
export const useUpdateLocation = () => useLocationMutation(({ id, ...v }: LocationUpdate & { id: number }) => api.patch(`/locations/${id}`, v));
export const useDeleteLocation = () => useLocationMutation((id: number) => api.delete(`/locations/${id}`));

export const useAddLimit = () => useLocationMutation(({ locationId, ...v }: StorageLimitInput & { locationId: number }) => api.post(`/locations/${locationId}/limits`, v));
export const useReplaceLimit = () =>
  useLocationMutation(({ locationId, limitId, ...v }: StorageLimitInput & { locationId: number; limitId: number }) => api.put(`/locations/${locationId}/limits/${limitId}`, v));
export const useRemoveLimit = () => useLocationMutation(({ locationId, limitId }: { locationId: number; limitId: number }) => api.delete(`/locations/${locationId}/limits/${limitId}`));
