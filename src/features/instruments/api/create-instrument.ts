/** POST /api/instruments: the manager adds a potentiostat, interface cell or support item. */
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { instrumentDto, type InstrumentInput } from "@shared/schemas/instruments";
import { api, parseResponse } from "@/lib/api-client";
import { instrumentKeys } from "./keys";

const one = z.object({ instrument: instrumentDto });

export function useCreateInstrument() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (input: InstrumentInput) => parseResponse(one, await api.post<unknown>("/instruments", input), "POST /api/instruments").instrument,
    onSuccess: () => qc.invalidateQueries({ queryKey: instrumentKeys.lists() }),
  });
}
