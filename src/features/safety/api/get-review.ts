/** GET /api/safety/review: the review lists (hazardous substances, expired, no location, holds, halogenated waste, sheets due). */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { safetyReviewDto } from "@shared/schemas/safety";
import { api, parseResponse } from "@/lib/api-client";
import { safetyKeys } from "./keys";

export { safetyReviewDto };
export type { ReviewContainer } from "@shared/schemas/safety";

export async function getReview(signal?: AbortSignal) {
  return parseResponse(safetyReviewDto, await api.get<unknown>("/safety/review", { signal }), "GET /api/safety/review");
}
export const reviewQueryOptions = () => queryOptions({ queryKey: safetyKeys.review(), queryFn: ({ signal }) => getReview(signal) });
export const useReview = () => useQuery(reviewQueryOptions());
