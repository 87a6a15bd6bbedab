/** GET /api/safety/sds-due: every safety data sheet older than the facility's review period. */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { sdsDto } from "@shared/schemas/stock";
import { api, parseResponse } from "@/lib/api-client";
import { safetyKeys } from "./keys";

export async function getSdsDue(signal?: AbortSignal) {
  const data = await api.get<unknown>("/safety/sds-due", { signal });
  return parseResponse(z.object({ items: z.array(sdsDto), total: z.number() }), data, "GET /api/safety/sds-due").items;
}
export const sdsDueQueryOptions = () => queryOptions({ queryKey: safetyKeys.sdsDue(), queryFn: ({ signal }) => getSdsDue(signal) });
export const useSdsDue = () => useQuery(sdsDueQueryOptions());
