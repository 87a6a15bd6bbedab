/**
 * Recharge requests: rates, policy, billing runs, statements, accounts and who may charge them,
 * the rate review and the spend views. Every answer is parsed with its schema from
 * shared/schemas/recharge, so a server that drifts from the contract fails here, loudly.
 */
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import type { z } from "zod";
import {
  accountMemberPage,
  accountPage,
  billingPreviewResponse,
  billingRunPage,
  billingRunResponse,
  invoiceRetryResult,
  myChargesDto,
  outstandingDto,
  policyResponse,
  ratePage,
  rateResponse,
  rateReviewResponse,
  revenueReportDto,
  spendReportDto,
  type BillingPolicyDto,
  type RateApplyInput,
  type RateInput,
  type RateReviewInput,
} from "@shared/schemas/recharge";
import { api, parseResponse, type RequestOptions } from "@/lib/api-client";

export type { MyChargeDto as MyChargeRow, OutstandingRowDto as OutstandingRow, RevenueReportDto as RevenueReport, SpendRowDto as SpendRow } from "@shared/schemas/recharge";

export const rechargeKeys = {
  all: ["recharge"] as const,
  rates: () => ["recharge", "rates"] as const,
  policy: () => ["recharge", "policy"] as const,
  runs: () => ["recharge", "runs"] as const,
  run: (id: number) => ["recharge", "runs", id] as const,
  preview: (period: string) => ["recharge", "preview", period] as const,
  accounts: () => ["recharge", "accounts"] as const,
  members: (id: number) => ["recharge", "accounts", id, "members"] as const,
  spend: () => ["recharge", "spend"] as const,
  revenue: () => ["recharge", "revenue"] as const,
  outstanding: () => ["recharge", "outstanding"] as const,
  myCharges: () => ["recharge", "my-charges"] as const,
};

/** GET a route and parse its answer with the shared schema. */
async function getParsed<S extends z.ZodType>(schema: S, path: string, options?: RequestOptions): Promise<z.output<S>> {
  return parseResponse(schema, await api.get<unknown>(path, options), `GET /api${path}`);
}

export const getRates = (signal?: AbortSignal) => getParsed(ratePage, "/rates", { signal });
export const getPolicy = (signal?: AbortSignal) => getParsed(policyResponse, "/billing/policy", { signal });
export const getRuns = (signal?: AbortSignal) => getParsed(billingRunPage, "/billing/runs", { query: { limit: 100 }, signal });
export const getRun = (id: number, signal?: AbortSignal) => getParsed(billingRunResponse, `/billing/runs/${id}`, { signal });
export const getPreview = (period: string, signal?: AbortSignal) => getParsed(billingPreviewResponse, "/billing/preview", { query: { period }, signal });
export const getAccounts = (signal?: AbortSignal) => getParsed(accountPage, "/accounts", { query: { limit: 500 }, signal });
export const getMembers = (id: number, signal?: AbortSignal) => getParsed(accountMemberPage, `/accounts/${id}/members`, { signal });
export const getSpend = (signal?: AbortSignal) => getParsed(spendReportDto, "/billing/spend", { signal });
export const getRevenue = (signal?: AbortSignal) => getParsed(revenueReportDto, "/billing/revenue", { signal });
export const getOutstanding = (signal?: AbortSignal) => getParsed(outstandingDto, "/billing/outstanding", { signal });
export const getMyCharges = (signal?: AbortSignal) => getParsed(myChargesDto, "/billing/my-charges", { query: { limit: 200 }, signal });

export const useRates = () => useQuery({ queryKey: rechargeKeys.rates(), queryFn: ({ signal }) => getRates(signal) });
export const usePolicy = () => useQuery({ queryKey: rechargeKeys.policy(), queryFn: ({ signal }) => getPolicy(signal) });
export const useRuns = () => useQuery({ queryKey: rechargeKeys.runs(), queryFn: ({ signal }) => getRuns(signal) });
export const useRun = (id: number | null) =>
  useQuery({
    queryKey: rechargeKeys.run(id ?? 0),
    enabled: id != null,
    queryFn: ({ signal }) => getRun(id!, signal),
    // Invoice status follows the payment service's events; look again now and then.
    refetchInterval: 5_000,
  });
export const usePreview = (period: string | null) =>
  useQuery({ queryKey: rechargeKeys.preview(period ?? ""), enabled: period != null, retry: false, queryFn: ({ signal }) => getPreview(period!, signal) });
export const useAccounts = () => useQuery({ queryKey: rechargeKeys.accounts(), queryFn: ({ signal }) => getAccounts(signal) });
export const useMembers = (id: number | null) =>
  useQuery({ queryKey: rechargeKeys.members(id ?? 0), enabled: id != null, queryFn: ({ signal }) => getMembers(id!, signal) });
export const useSpend = () => useQuery({ queryKey: rechargeKeys.spend(), queryFn: ({ signal }) => getSpend(signal) });
export const useRevenue = (enabled: boolean) => useQuery({ queryKey: rechargeKeys.revenue(), enabled, queryFn: ({ signal }) => getRevenue(signal) });
export const useOutstanding = (enabled: boolean) =>
  useQuery({ queryKey: rechargeKeys.outstanding(), enabled, queryFn: ({ signal }) => getOutstanding(signal) });
export const useMyCharges = () => useQuery({ queryKey: rechargeKeys.myCharges(), queryFn: ({ signal }) => getMyCharges(signal) });

function useInvalidate() {
  const qc = useQueryClient();
  return () => qc.invalidateQueries({ queryKey: rechargeKeys.all });
}

export function useCreateRate() {
  const done = useInvalidate();
  return useMutation({
    mutationFn: async (input: RateInput) => parseResponse(rateResponse, await api.post<unknown>("/rates", input), "POST /api/rates"),
    onSuccess: done,
  });
}
export function useEndRate() {
  const done = useInvalidate();
  return useMutation({ mutationFn: (v: { id: number; effectiveTo: string }) => api.patch(`/rates/${v.id}`, { effectiveTo: v.effectiveTo }), onSuccess: done });
}
export function useSavePolicy() {
  const done = useInvalidate();
  return useMutation({ mutationFn: (p: BillingPolicyDto) => api.put("/billing/policy", p), onSuccess: done });
}
export function useFinaliseRun() {
  const done = useInvalidate();
  return useMutation({
    mutationFn: async (period: string) => parseResponse(billingRunResponse, await api.post<unknown>("/billing/runs", { period }), "POST /api/billing/runs"),
    onSuccess: done,
  });
}
export function useVoidRun() {
  const done = useInvalidate();
  return useMutation({ mutationFn: (v: { id: number; reason: string }) => api.post(`/billing/runs/${v.id}/void`, { reason: v.reason }), onSuccess: done });
}
export function useRetryInvoices() {
  const done = useInvalidate();
  return useMutation({
    mutationFn: async () => parseResponse(invoiceRetryResult, await api.post<unknown>("/billing/invoices/retry"), "POST /api/billing/invoices/retry"),
    onSuccess: done,
  });
}
export function useReview() {
  return useMutation({
    mutationFn: async (input: RateReviewInput) => parseResponse(rateReviewResponse, await api.post<unknown>("/rates/review", input), "POST /api/rates/review"),
  });
}
export function useApplyRates() {
  const done = useInvalidate();
  return useMutation({ mutationFn: (input: RateApplyInput) => api.post("/rates/apply", input), onSuccess: done });
}
export function useAddMember(accountId: number) {
  const done = useInvalidate();
  return useMutation({
    mutationFn: (v: { email: string; monthlyCapCents: number | null }) => api.post(`/accounts/${accountId}/members`, v),
    onSuccess: done,
  });
}
export function useUpdateMember(accountId: number) {
  const done = useInvalidate();
  return useMutation({
    mutationFn: (v: { userId: number; monthlyCapCents: number | null }) => api.patch(`/accounts/${accountId}/members/${v.userId}`, { monthlyCapCents: v.monthlyCapCents }),
    onSuccess: done,
  });
}
export function useRemoveMember(accountId: number) {
  const done = useInvalidate();
  return useMutation({ mutationFn: (userId: number) => api.delete(`/accounts/${accountId}/members/${userId}`), onSuccess: done });
}
export function useAddAdjustment(accountId: number) {
  const done = useInvalidate();
  return useMutation({ mutationFn: (v: { amountCents: number; reason: string }) => api.post(`/accounts/${accountId}/adjustments`, v), onSuccess: done });
}
