/** One instrument: GET /api/instruments/:id and the manager's PATCH /api/instruments/:id. */
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { instrumentDto, type InstrumentPatch } from "@shared/schemas/instruments";
import { api, parseResponse } from "@/lib/api-client";
import { instrumentKeys } from "./keys";

const one = z.object({ instrument: instrumentDto });

export const useInstrument = (id: number) =>
  useQuery({
    queryKey: [...instrumentKeys.all, "detail", id] as const,
    queryFn: async ({ signal }) => parseResponse(one, await api.get<unknown>(`/instruments/${id}`, { signal }), "GET /api/instruments/:id").instrument,
  });

export function useUpdateInstrument(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (patch: InstrumentPatch) => parseResponse(one, await api.patch<unknown>(`/instruments/${id}`, patch), "PATCH /api/instruments/:id").instrument,
    onSuccess: () => qc.invalidateQueries({ queryKey: instrumentKeys.all }),
  });
}
