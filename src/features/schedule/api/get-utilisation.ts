/** GET /api/reports/utilisation: bookable, booked and used hours per instrument per month (managers). */
import { useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { scheduleKeys } from "./keys";

export interface UtilisationRow {
  instrumentId: number;
  instrumentName: string;
  period: string;
  bookableHours: number;
  bookedHours: number;
  usedHours: number;
  bookedPct: number | null;
  usedPct: number | null;
}

export const useUtilisation = (q: { from: string; to: string }) =>
  useQuery({
    queryKey: scheduleKeys.utilisation(q),
    queryFn: ({ signal }) => api.get<{ items: UtilisationRow[]; tz: string }>("/reports/utilisation", { query: q, signal }),
  });

export const utilisationCsvHref = (q: { from: string; to: string }) => `/api/reports/utilisation.csv?from=${q.from}&to=${q.to}`;
