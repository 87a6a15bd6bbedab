/** Loader of the Scan page's record (see load.ts); its own module, so the Stockroom's loaders do not bring the scan's schemas. */
import { scanQueryOptions } from "@/features/labels/api/get-scan";
import { type ScreenLoader } from "./load";

export const scanToken: ScreenLoader = (qc, args) => {
  const token = args.params.token;
  if (!token) return;
  return [qc.prefetchQuery(scanQueryOptions(token))];
};
