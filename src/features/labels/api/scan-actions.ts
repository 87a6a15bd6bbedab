/**
 * The quick actions on a scanned record. Ours: POST /api/scan-actions/… (problem, move, empty,
 * dispose, cleaned, fault) and POST /api/labels/:type/:id/reissue. The stockroom's and the
 * schedule's contract routes: POST /api/containers/:id/usage and POST /api/bookings/:id/check-in
 * or /check-out. Each refreshes the scanned record afterwards.
 */
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import type { LabelledTypeName } from "@shared/schemas/labels";
import { api } from "@/lib/api-client";
import { labelKeys } from "./keys";

export type ScanAction =
  | { kind: "problem"; containerId: number; note: string }
  | { kind: "move"; containerId: number; locationId: number }
  | { kind: "empty"; containerId: number; wasteNote: string }
  | { kind: "dispose"; containerId: number; wasteNote: string }
  | { kind: "usage" | "waste"; containerId: number; amount: number; unit: string }
  | { kind: "cleaned"; instrumentId: number; note: string }
  | { kind: "fault"; instrumentId: number; note: string }
  | { kind: "check-in" | "check-out"; bookingId: number };

export function runScanAction(a: ScanAction): Promise<unknown> {
  switch (a.kind) {
    case "problem":
      return api.post(`/scan-actions/containers/${a.containerId}/problem`, { note: a.note });
    case "move":
      return api.post(`/scan-actions/containers/${a.containerId}/move`, { locationId: a.locationId });
    case "empty":
      return api.post(`/scan-actions/containers/${a.containerId}/empty`, { wasteNote: a.wasteNote });
    case "dispose":
      return api.post(`/scan-actions/containers/${a.containerId}/dispose`, { wasteNote: a.wasteNote });
    case "usage":
    case "waste":
      return api.post(`/containers/${a.containerId}/${a.kind}`, { amount: a.amount, unit: a.unit });
    case "cleaned":
      return api.post(`/scan-actions/instruments/${a.instrumentId}/cleaned`, { note: a.note });
    case "fault":
      return api.post(`/scan-actions/instruments/${a.instrumentId}/fault`, { note: a.note });
    case "check-in":
    case "check-out":
      return api.post(`/bookings/${a.bookingId}/${a.kind}`, {});
  }
}

export function useScanAction() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: runScanAction,
    // Any action can change what the scanned page shows (quantity, status, bookings).
    onSuccess: () => queryClient.invalidateQueries({ queryKey: labelKeys.scans() }),
  });
}

const reissued = z.object({ token: z.string(), url: z.string() });

export function useReissueLabel() {
  return useMutation({
    mutationFn: async (v: { type: LabelledTypeName; id: number; reason: string }) =>
      reissued.parse(await api.post<unknown>(`/labels/${v.type}/${v.id}/reissue`, { reason: v.reason })),
  });
}
