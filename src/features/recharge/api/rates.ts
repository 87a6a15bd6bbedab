/**
 * Rates: GET /api/rates, POST /api/rates, PATCH /api/rates/:id (end a rate). A rate change
 * alters what an unfinalised month would bill, so it also refreshes the previews.
 */
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { ratePage, rateResponse, type RateInput } from "@shared/schemas/recharge";
import { api, parseResponse } from "@/lib/api-client";
import { rechargeKeys } from "./keys";

export const useRates = () =>
  useQuery({
    queryKey: rechargeKeys.rates(),
    queryFn: async ({ signal }) => parseResponse(ratePage, await api.get<unknown>("/rates", { signal }), "GET /api/rates"),
  });

/** After a change to rates: the rates and every preview priced with them. */
export function useRatesChanged() {
  const qc = useQueryClient();
  return () => Promise.all([qc.invalidateQueries({ queryKey: rechargeKeys.rates() }), qc.invalidateQueries({ queryKey: rechargeKeys.previews() })]);
}

export function useCreateRate() {
  const changed = useRatesChanged();
  return useMutation({
    mutationFn: async (input: RateInput) => parseResponse(rateResponse, await api.post<unknown>("/rates", input), "POST /api/rates"),
    onSuccess: changed,
  });
}

export function useEndRate() {
  const changed = useRatesChanged();
  return useMutation({ mutationFn: (v: { id: number; effectiveTo: string }) => api.patch(`/rates/${v.id}`, { effectiveTo: v.effectiveTo }), onSuccess: changed });
}
