/** The billing policy: GET and PUT /api/billing/policy (shares, mark-up); it changes what previews bill. */
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { policyResponse, type BillingPolicyDto } from "@shared/schemas/recharge";
import { api, parseResponse } from "@/lib/api-client";
import { rechargeKeys } from "./keys";

export const usePolicy = () =>
  useQuery({
    queryKey: rechargeKeys.policy(),
    queryFn: async ({ signal }) => parseResponse(policyResponse, await api.get<unknown>("/billing/policy", { signal }), "GET /api/billing/policy"),
  });

export function useSavePolicy() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (p: BillingPolicyDto) => api.put("/billing/policy", p),
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: rechargeKeys.policy() }), qc.invalidateQueries({ queryKey: rechargeKeys.previews() })]),
  });
}
