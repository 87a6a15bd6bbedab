/** The rate review: POST /api/rates/review (break-even rates, changes nothing) and POST /api/rates/apply. */
import { useMutation } from "@tanstack/react-query";
import { rateReviewResponse, type RateApplyInput, type RateReviewInput } from "@shared/schemas/recharge";
import { api, parseResponse } from "@/lib/api-client";
import { useRatesChanged } from "./rates";

export function useReview() {
  return useMutation({
    mutationFn: async (input: RateReviewInput) => parseResponse(rateReviewResponse, await api.post<unknown>("/rates/review", input), "POST /api/rates/review"),
  });
}

export function useApplyRates() {
  const changed = useRatesChanged();
  return useMutation({ mutationFn: (input: RateApplyInput) => api.post("/rates/apply", input), onSuccess: changed });
}
