/** Query keys for instruments; the list's filters are part of its key. */
import type { InstrumentListQuery } from "@shared/schemas/instruments";

export const instrumentKeys = {
  all: ["instruments"] as const,
  lists: () => [...instrumentKeys.all, "list"] as const,
  list: (q: Partial<InstrumentListQuery>) => [...instrumentKeys.lists(), q] as const,
  detail: (id: number) => [...instrumentKeys.all, "detail", id] as const,
};
