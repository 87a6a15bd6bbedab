/** Query keys of run plans: every input of a fetch is in its key. */
export const runPlanKeys = {
  all: ["run-plans"] as const,
  solvents: () => [...runPlanKeys.all, "solvents"] as const,
  ions: (solvent: string) => [...runPlanKeys.all, "ions", solvent] as const,
  electrolytes: () => [...runPlanKeys.all, "electrolytes"] as const,
  cells: () => [...runPlanKeys.all, "cells"] as const,
  plans: () => [...runPlanKeys.all, "plans"] as const,
  list: (q: { bookingId?: number; mine?: boolean }) => [...runPlanKeys.plans(), "list", q] as const,
  detail: (id: number) => [...runPlanKeys.plans(), "detail", id] as const,
  preview: (body: unknown) => [...runPlanKeys.all, "preview", body] as const,
  bookings: () => [...runPlanKeys.all, "my-bookings"] as const,
};
