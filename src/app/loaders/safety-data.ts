/** Loaders of the Safety review's screens (see load.ts). */
import { reviewQueryOptions } from "@/features/safety/api/get-review";
import { sdsDueQueryOptions } from "@/features/safety/api/get-sds-due";
import { locationTotalsQueryOptions } from "@/features/safety/api/get-location-totals";
import { locationListQueryOptions } from "@/features/safety/api/locations";
import type { ScreenLoader } from "./load";

export const safety: ScreenLoader = (qc) => [
  qc.prefetchQuery(locationTotalsQueryOptions()),
  qc.prefetchQuery(reviewQueryOptions()),
  qc.prefetchQuery(sdsDueQueryOptions()),
];

export const safetyLocations: ScreenLoader = (qc) => [qc.prefetchQuery(locationListQueryOptions())];
