/** POST /api/solutions/plan (pure) and POST /api/solutions (prepare: one transaction). */
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { containerDto, solutionPlanDto, type PrepareSolutionInput, type SolutionPlanInput } from "@shared/schemas/stock";
import { api, parseResponse } from "@/lib/api-client";
import { stockKeys } from "./keys";

export async function planSolution(input: SolutionPlanInput) {
  return parseResponse(solutionPlanDto, await api.post<unknown>("/solutions/plan", input), "POST /api/solutions/plan");
}

const prepared = z.object({
  container: containerDto,
  plan: solutionPlanDto,
  massWeighedG: z.number(),
  actualConcentrationMolPerL: z.number(),
  parents: z.array(containerDto),
});

export async function prepareSolution(input: PrepareSolutionInput) {
  return parseResponse(prepared, await api.post<unknown>("/solutions", input), "POST /api/solutions");
}

export function usePrepareSolution() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: prepareSolution, onSuccess: () => queryClient.invalidateQueries({ queryKey: stockKeys.containers() }) });
}
