/**
 * Monthly billing runs: GET /api/billing/runs, /runs/:id, /preview?period=; POST /runs (finalise),
 * /runs/:id/void, /invoices/retry. Finalising or voiding a month changes every Recharge view.
 */
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { billingPreviewResponse, billingRunPage, billingRunResponse, invoiceRetryResult } from "@shared/schemas/recharge";
import { api, parseResponse } from "@/lib/api-client";
import { rechargeKeys } from "./keys";

export const useRuns = () =>
  useQuery({
    queryKey: rechargeKeys.runs(),
    queryFn: async ({ signal }) =>
      parseResponse(billingRunPage, await api.get<unknown>("/billing/runs", { query: { limit: 100 }, signal }), "GET /api/billing/runs"),
  });

export const useRun = (id: number | null) =>
  useQuery({
    queryKey: rechargeKeys.run(id ?? 0),
    enabled: id != null,
    queryFn: async ({ signal }) => parseResponse(billingRunResponse, await api.get<unknown>(`/billing/runs/${id}`, { signal }), "GET /api/billing/runs/:id"),
    // Invoice status follows the payment service's events; look again now and then.
    refetchInterval: 5_000,
  });

export const usePreview = (period: string | null) =>
  useQuery({
    queryKey: rechargeKeys.preview(period ?? ""),
    enabled: period != null,
    retry: false,
    queryFn: async ({ signal }) =>
      parseResponse(billingPreviewResponse, await api.get<unknown>("/billing/preview", { query: { period: period! }, signal }), "GET /api/billing/preview"),
  });

/** A run finalised or voided: runs, previews, statements and every spend view move with it. */
function useRunsChanged() {
  const qc = useQueryClient();
  return () => qc.invalidateQueries({ queryKey: rechargeKeys.all });
}

export function useFinaliseRun() {
  const changed = useRunsChanged();
  return useMutation({
    mutationFn: async (period: string) => parseResponse(billingRunResponse, await api.post<unknown>("/billing/runs", { period }), "POST /api/billing/runs"),
    onSuccess: changed,
  });
}

export function useVoidRun() {
  const changed = useRunsChanged();
  return useMutation({ mutationFn: (v: { id: number; reason: string }) => api.post(`/billing/runs/${v.id}/void`, { reason: v.reason }), onSuccess: changed });
}

export function useRetryInvoices() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async () => parseResponse(invoiceRetryResult, await api.post<unknown>("/billing/invoices/retry"), "POST /api/billing/invoices/retry"),
    // Only invoices change: the runs that hold them and what is outstanding.
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: rechargeKeys.runs() }), qc.invalidateQueries({ queryKey: rechargeKeys.outstanding() })]),
  });
}
