/** The manager's setup changes: POST /api/setups, PUT /api/setups/:id, DELETE /api/setups/:id. */
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { setupDto, type SetupInput } from "@shared/schemas/setups";
import { api, parseResponse } from "@/lib/api-client";
import { scheduleKeys } from "./keys";

const one = z.object({ setup: setupDto });

export function useSaveSetup() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async ({ id, input }: { id?: number; input: SetupInput }) =>
      id
        ? parseResponse(one, await api.put<unknown>(`/setups/${id}`, input), "PUT /api/setups/:id").setup
        : parseResponse(one, await api.post<unknown>("/setups", input), "POST /api/setups").setup,
    onSuccess: () => qc.invalidateQueries({ queryKey: scheduleKeys.setups() }),
  });
}

export function useDeleteSetup() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api.delete(`/setups/${id}`),
    onSuccess: () => qc.invalidateQueries({ queryKey: scheduleKeys.setups() }),
  });
}
