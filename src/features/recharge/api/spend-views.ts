/**
 * The money views: GET /api/billing/spend (a group lead's accounts), /revenue and /outstanding
 * (manager), /my-charges (everyone's own).
 */
import { useQuery } from "@tanstack/react-query";
import { myChargesDto, outstandingDto, revenueReportDto, spendReportDto } from "@shared/schemas/recharge";
import { api, parseResponse } from "@/lib/api-client";
import { rechargeKeys } from "./keys";

export const useSpend = () =>
  useQuery({
    queryKey: rechargeKeys.spend(),
    queryFn: async ({ signal }) => parseResponse(spendReportDto, await api.get<unknown>("/billing/spend", { signal }), "GET /api/billing/spend"),
  });

export const useRevenue = (enabled: boolean) =>
  useQuery({
    queryKey: rechargeKeys.revenue(),
    enabled,
    queryFn: async ({ signal }) => parseResponse(revenueReportDto, await api.get<unknown>("/billing/revenue", { signal }), "GET /api/billing/revenue"),
  });

export const useOutstanding = (enabled: boolean) =>
  useQuery({
    queryKey: rechargeKeys.outstanding(),
    enabled,
    queryFn: async ({ signal }) => parseResponse(outstandingDto, await api.get<unknown>("/billing/outstanding", { signal }), "GET /api/billing/outstanding"),
  });

export const useMyCharges = () =>
  useQuery({
    queryKey: rechargeKeys.myCharges(),
    queryFn: async ({ signal }) =>
      parseResponse(myChargesDto, await api.get<unknown>("/billing/my-charges", { query: { limit: 200 }, signal }), "GET /api/billing/my-charges"),
  });
