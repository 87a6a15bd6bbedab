/**
 * One instrument: GET /api/instruments/:id (with its open fault reports and what the caller may
 * do), the manager's PATCH, fault reports from anyone (POST …/faults) and the manager's closing
 * of one (POST …/faults/:faultId/close).
 */
import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { faultReportDto, instrumentDetailDto, instrumentDto, type InstrumentPatch } from "@shared/schemas/instruments";
import { api, parseResponse } from "@/lib/api-client";
import { instrumentKeys } from "./keys";

const detail = z.object({ instrument: instrumentDetailDto });
const one = z.object({ instrument: instrumentDto });
const oneFault = z.object({ fault: faultReportDto });

export const instrumentQueryOptions = (id: number) =>
  queryOptions({
    queryKey: instrumentKeys.detail(id),
    queryFn: async ({ signal }) => parseResponse(detail, await api.get<unknown>(`/instruments/${id}`, { signal }), "GET /api/instruments/:id").instrument,
  });

export const useInstrument = (id: number) => useQuery(instrumentQueryOptions(id));

export function useUpdateInstrument(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (patch: InstrumentPatch) => parseResponse(one, await api.patch<unknown>(`/instruments/${id}`, patch), "PATCH /api/instruments/:id").instrument,
    onSuccess: () => qc.invalidateQueries({ queryKey: instrumentKeys.all }),
  });
}

export function useReportFault(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (note: string) => parseResponse(oneFault, await api.post<unknown>(`/instruments/${id}/faults`, { note }), "POST /api/instruments/:id/faults").fault,
    onSuccess: () => qc.invalidateQueries({ queryKey: instrumentKeys.detail(id) }),
  });
}

export function useCloseFault(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async ({ faultId, resolution }: { faultId: number; resolution: string }) =>
      parseResponse(oneFault, await api.post<unknown>(`/instruments/${id}/faults/${faultId}/close`, { resolution }), "POST /api/instruments/:id/faults/:faultId/close").fault,
    onSuccess: () => qc.invalidateQueries({ queryKey: instrumentKeys.detail(id) }),
  });
}
