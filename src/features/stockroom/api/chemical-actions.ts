/** POST /api/chemicals/:id/hold and /release (safety officer, manager). */
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { chemicalDto } from "@shared/schemas/stock";
import { api, parseResponse } from "@/lib/api-client";
import { stockKeys } from "./keys";

async function act(id: number, action: "hold" | "release", body?: unknown) {
  return parseResponse(z.object({ chemical: chemicalDto }), await api.post<unknown>(`/chemicals/${id}/${action}`, body ?? {}), `POST /api/chemicals/:id/${action}`).chemical;
}

export function useHoldChemical(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (v: { reason: string } | null) => (v ? act(id, "hold", v) : act(id, "release")),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: stockKeys.all }),
  });
}

/** PATCH /api/chemicals/:id with `ions` (safety officer, manager): the ions an electrolyte gives, or null. */
export function useSetChemicalIons(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (ions: { ion: string; charge: number; count: number }[] | null) =>
      parseResponse(z.object({ chemical: chemicalDto }), await api.patch<unknown>(`/chemicals/${id}`, { ions }), "PATCH /api/chemicals/:id").chemical,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: stockKeys.all }),
  });
}
