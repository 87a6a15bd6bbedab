/** GET /api/reports/utilisation: bookable, booked and used hours per instrument per month (managers). */
import { useQuery } from "@tanstack/react-query";
import { utilisationReport, type UtilisationRow } from "@shared/schemas/reports";
import { api, parseResponse } from "@/lib/api-client";
import { scheduleKeys } from "./keys";

export type { UtilisationRow };

export const useUtilisation = (q: { from: string; to: string }) =>
  useQuery({
    queryKey: scheduleKeys.utilisation(q),
    queryFn: async ({ signal }) =>
      parseResponse(utilisationReport, await api.get<unknown>("/reports/utilisation", { query: q, signal }), "GET /api/reports/utilisation"),
  });

export const utilisationCsvHref = (q: { from: string; to: string }) => `/api/reports/utilisation.csv?from=${q.from}&to=${q.to}`;
