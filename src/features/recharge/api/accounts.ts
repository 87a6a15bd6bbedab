/**
 * Accounts and who may charge them: GET /api/accounts, GET/POST/PATCH/DELETE
 * /api/accounts/:id/members, and POST /api/accounts/:id/adjustments (credits and corrections).
 */
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { accountMemberPage, accountMemberResponse, accountPage, type AccountMemberInput } from "@shared/schemas/recharge";
import { api, parseResponse } from "@/lib/api-client";
import { rechargeKeys } from "./keys";

export const useAccounts = () =>
  useQuery({
    queryKey: rechargeKeys.accounts(),
    queryFn: async ({ signal }) => parseResponse(accountPage, await api.get<unknown>("/accounts", { query: { limit: 500 }, signal }), "GET /api/accounts"),
  });

export const useMembers = (id: number | null) =>
  useQuery({
    queryKey: rechargeKeys.members(id ?? 0),
    enabled: id != null,
    queryFn: async ({ signal }) => parseResponse(accountMemberPage, await api.get<unknown>(`/accounts/${id}/members`, { signal }), "GET /api/accounts/:id/members"),
  });

/** Who may charge an account changed: that account's members (the accounts list counts them). */
function useMembersChanged(accountId: number) {
  const qc = useQueryClient();
  return () => Promise.all([qc.invalidateQueries({ queryKey: rechargeKeys.members(accountId) }), qc.invalidateQueries({ queryKey: rechargeKeys.accounts(), exact: true })]);
}

export function useAddMember(accountId: number) {
  const changed = useMembersChanged(accountId);
  return useMutation({
    mutationFn: async (v: AccountMemberInput) =>
      parseResponse(accountMemberResponse, await api.post<unknown>(`/accounts/${accountId}/members`, v), "POST /api/accounts/:id/members"),
    onSuccess: changed,
  });
}

export function useUpdateMember(accountId: number) {
  const changed = useMembersChanged(accountId);
  return useMutation({
    mutationFn: (v: { userId: number; monthlyCapCents: number | null }) => api.patch(`/accounts/${accountId}/members/${v.userId}`, { monthlyCapCents: v.monthlyCapCents }),
    onSuccess: changed,
  });
}

export function useRemoveMember(accountId: number) {
  const changed = useMembersChanged(accountId);
  return useMutation({ mutationFn: (userId: number) => api.delete(`/accounts/${accountId}/members/${userId}`), onSuccess: changed });
}

export function useAddAdjustment(accountId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (v: { amountCents: number; reason: string }) => api.post(`/accounts/${accountId}/adjustments`, v),
    // An adjustment is billed in the next run: the previews and the spend views show it.
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: rechargeKeys.previews() }), qc.invalidateQueries({ queryKey: rechargeKeys.views() })]),
  });
}
