/** GET /api/instruments: potentiostats, interface cells and support equipment with their status. */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { instrumentDto, type InstrumentListQuery } from "@shared/schemas/instruments";
import { api, parseResponse } from "@/lib/api-client";
import { instrumentKeys } from "./keys";

const instrumentPage = z.object({ items: z.array(instrumentDto), total: z.number() });
export type InstrumentPage = z.infer<typeof instrumentPage>;

export async function getInstruments(q: Partial<InstrumentListQuery>, signal?: AbortSignal): Promise<InstrumentPage> {
  const data = await api.get<unknown>("/instruments", { query: q, signal });
  return parseResponse(instrumentPage, data, "GET /api/instruments");
}

export const instrumentsQueryOptions = (q: Partial<InstrumentListQuery> = {}) =>
  queryOptions({ queryKey: instrumentKeys.list(q), queryFn: ({ signal }) => getInstruments(q, signal) });

export const useInstruments = (q: Partial<InstrumentListQuery> = {}) => useQuery(instrumentsQueryOptions(q));
