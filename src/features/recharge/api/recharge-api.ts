/**
 * Recharge requests: rates, policy, billing runs, statements, accounts and who may charge them,
 * the rate review and the spend views. Types come from shared/schemas/recharge.
 */
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import type {
  AccountDto,
  AccountMemberDto,
  BillingPolicyDto,
  BillingPreviewDto,
  BillingRunDto,
  BillingRunSummaryDto,
  RateDto,
  RateInput,
  RateReviewInput,
  RateReviewRowDto,
  RateApplyInput,
} from "@shared/schemas/recharge";
import { api } from "@/lib/api-client";

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

export interface Page<T> {
  items: T[];
  total: number;
}

export const useRates = () => useQuery({ queryKey: rechargeKeys.rates(), queryFn: ({ signal }) => api.get<Page<RateDto>>("/rates", { signal }) });
export const usePolicy = () =>
  useQuery({ queryKey: rechargeKeys.policy(), queryFn: ({ signal }) => api.get<{ policy: BillingPolicyDto }>("/billing/policy", { signal }) });
export const useRuns = () =>
  useQuery({ queryKey: rechargeKeys.runs(), queryFn: ({ signal }) => api.get<Page<BillingRunSummaryDto>>("/billing/runs", { query: { limit: 100 }, signal }) });
export const useRun = (id: number | null) =>
  useQuery({
    queryKey: rechargeKeys.run(id ?? 0),
    enabled: id != null,
    queryFn: ({ signal }) => api.get<{ run: BillingRunDto }>(`/billing/runs/${id}`, { signal }),
    // Invoice status follows the payment service's events; look again now and then.
    refetchInterval: 5_000,
  });
export const usePreview = (period: string | null) =>
  useQuery({
    queryKey: rechargeKeys.preview(period ?? ""),
    enabled: period != null,
    retry: false,
    queryFn: ({ signal }) =>
      api.get<{ preview: BillingPreviewDto & { missingRates: string[]; unbillableUsages: number } }>("/billing/preview", { query: { period }, signal }),
  });
export const useAccounts = () =>
  useQuery({ queryKey: rechargeKeys.accounts(), queryFn: ({ signal }) => api.get<Page<AccountDto>>("/accounts", { query: { limit: 500 }, signal }) });
export const useMembers = (id: number | null) =>
  useQuery({
    queryKey: rechargeKeys.members(id ?? 0),
    enabled: id != null,
    queryFn: ({ signal }) => api.get<Page<AccountMemberDto>>(`/accounts/${id}/members`, { signal }),
  });

export interface SpendRow {
  period: string;
  accountId: number;
  accountCode: string;
  accountName: string;
  userId: number | null;
  userName: string;
  total: number;
}
export const useSpend = () =>
  useQuery({ queryKey: rechargeKeys.spend(), queryFn: ({ signal }) => api.get<{ currency: string; items: SpendRow[] }>("/billing/spend", { signal }) });

export interface RevenueReport {
  currency: string;
  byMonth: { period: string; internal: number; external: number; total: number }[];
  byInstrument: { instrumentId: number | null; name: string; total: number; hours: number }[];
  byDepartment: { departmentId: number | null; name: string; total: number }[];
}
export const useRevenue = (enabled: boolean) =>
  useQuery({ queryKey: rechargeKeys.revenue(), enabled, queryFn: ({ signal }) => api.get<RevenueReport>("/billing/revenue", { signal }) });

export interface OutstandingRow {
  statementId: number;
  period: string;
  accountCode: string;
  accountName: string;
  total: number;
  currency: string;
  invoiceStatus: string;
  invoiceNumber: string | null;
  invoiceUrl: string | null;
  lastError: string | null;
}
export const useOutstanding = (enabled: boolean) =>
  useQuery({
    queryKey: rechargeKeys.outstanding(),
    enabled,
    queryFn: ({ signal }) => api.get<{ items: OutstandingRow[]; sum: number; currency: string }>("/billing/outstanding", { signal }),
  });

export interface MyChargeRow {
  id: number;
  period: string;
  accountCode: string;
  kind: string;
  description: string;
  amount: number;
  at: string;
}
export const useMyCharges = () =>
  useQuery({
    queryKey: rechargeKeys.myCharges(),
    queryFn: ({ signal }) => api.get<{ items: MyChargeRow[]; total: number; sum: number; currency: string }>("/billing/my-charges", { query: { limit: 200 }, signal }),
  });

function useInvalidate() {
  const qc = useQueryClient();
  return () => qc.invalidateQueries({ queryKey: rechargeKeys.all });
}

export function useCreateRate() {
  const done = useInvalidate();
  return useMutation({ mutationFn: (input: RateInput) => api.post<{ rate: RateDto }>("/rates", input), onSuccess: done });
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
  return useMutation({ mutationFn: (period: string) => api.post<{ run: BillingRunDto }>("/billing/runs", { period }), onSuccess: done });
}
export function useVoidRun() {
  const done = useInvalidate();
  return useMutation({ mutationFn: (v: { id: number; reason: string }) => api.post(`/billing/runs/${v.id}/void`, { reason: v.reason }), onSuccess: done });
}
export function useRetryInvoices() {
  const done = useInvalidate();
  return useMutation({ mutationFn: () => api.post("/billing/invoices/retry"), onSuccess: done });
}
export function useReview() {
  return useMutation({ mutationFn: (input: RateReviewInput) => api.post<{ items: RateReviewRowDto[] }>("/rates/review", input) });
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
