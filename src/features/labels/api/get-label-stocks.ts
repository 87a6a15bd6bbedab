/** GET /api/labels/stocks: the label stocks the facility prints on, and the link to a label PDF. */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { labelStockDto } from "@shared/schemas/labels";
import { api, parseResponse } from "@/lib/api-client";
import { labelKeys } from "./keys";

const page = z.object({ items: z.array(labelStockDto), total: z.number() });

export const labelStocksQueryOptions = () =>
  queryOptions({
    queryKey: labelKeys.stocks(),
    queryFn: async ({ signal }) => parseResponse(page, await api.get<unknown>("/labels/stocks", { signal }), "GET /api/labels/stocks").items,
    staleTime: 10 * 60_000,
  });

export const useLabelStocks = (enabled = true) => useQuery({ ...labelStocksQueryOptions(), enabled });

/** The address of a label PDF (GET /api/labels.pdf); opened in a new tab, so it is a link, not a fetch. */
export function labelsPdfHref(q: { containerIds?: number[]; instrumentIds?: number[]; stockId?: number | null; skip?: number }): string {
  const params = new URLSearchParams();
  if (q.containerIds?.length) params.set("containerIds", q.containerIds.join(","));
  if (q.instrumentIds?.length) params.set("instrumentIds", q.instrumentIds.join(","));
  if (q.stockId) params.set("stockId", String(q.stockId));
  if (q.skip) params.set("skip", String(q.skip));
  return `/api/labels.pdf?${params.toString()}`;
}
