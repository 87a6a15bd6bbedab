/** Run plans: the preview (POST /api/run-plans/preview), saved plans, reserving and releasing. */
import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { runPlanPreviewDto, type RunPlanPreviewInput } from "@shared/schemas/run-plans";
import { oneRunPlan, runPlanSummaryDto, type ReserveInput, type RunPlanInput } from "@shared/schemas/run-plan-records";
import { api, parseResponse } from "@/lib/api-client";
import { runPlanKeys } from "./keys";

export const previewQueryOptions = (body: RunPlanPreviewInput | null) =>
  queryOptions({
    queryKey: runPlanKeys.preview(body),
    queryFn: async ({ signal }) => parseResponse(runPlanPreviewDto, await api.post<unknown>("/run-plans/preview", body, { signal }), "POST /api/run-plans/preview"),
    enabled: body !== null,
    placeholderData: keepPreviousData,
    retry: false,
  });
export const usePreview = (body: RunPlanPreviewInput | null) => useQuery(previewQueryOptions(body));

export const runPlanQueryOptions = (id: number) =>
  queryOptions({
    queryKey: runPlanKeys.detail(id),
    queryFn: async ({ signal }) => parseResponse(oneRunPlan, await api.get<unknown>(`/run-plans/${id}`, { signal }), "GET /api/run-plans/:id").runPlan,
  });
export const useRunPlan = (id: number) => useQuery(runPlanQueryOptions(id));

const summaries = z.object({ items: z.array(runPlanSummaryDto), total: z.number() });
export const runPlansQueryOptions = (q: { bookingId?: number; mine?: boolean }) =>
  queryOptions({
    queryKey: runPlanKeys.list(q),
    queryFn: async ({ signal }) =>
      parseResponse(summaries, await api.get<unknown>("/run-plans", { query: { bookingId: q.bookingId, mine: q.mine ? "true" : undefined, limit: 200 }, signal }), "GET /api/run-plans"),
  });
export const useRunPlans = (q: { bookingId?: number; mine?: boolean }) => useQuery(runPlansQueryOptions(q));

export function useCreateRunPlan() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (input: RunPlanInput) => parseResponse(oneRunPlan, await api.post<unknown>("/run-plans", input), "POST /api/run-plans").runPlan,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: runPlanKeys.plans() }),
  });
}

export function useReserve(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (input: ReserveInput) => parseResponse(oneRunPlan, await api.post<unknown>(`/run-plans/${id}/reserve`, input), "POST /api/run-plans/:id/reserve").runPlan,
    onSuccess: (plan) => {
      queryClient.setQueryData(runPlanKeys.detail(id), plan);
      return queryClient.invalidateQueries({ queryKey: runPlanKeys.plans() });
    },
  });
}

export function useRelease(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async () => parseResponse(oneRunPlan, await api.post<unknown>(`/run-plans/${id}/release`), "POST /api/run-plans/:id/release").runPlan,
    onSuccess: (plan) => {
      queryClient.setQueryData(runPlanKeys.detail(id), plan);
      return queryClient.invalidateQueries({ queryKey: runPlanKeys.plans() });
    },
  });
}
