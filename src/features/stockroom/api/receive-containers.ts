/** POST /api/containers/receive: n containers of one delivery (201 { containers }). */
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { containerDto, type ReceiveInput } from "@shared/schemas/stock";
import { api, parseResponse } from "@/lib/api-client";
import { stockKeys } from "./keys";

export async function receiveContainers(input: ReceiveInput) {
  const data = await api.post<unknown>("/containers/receive", input);
  return parseResponse(z.object({ containers: z.array(containerDto) }), data, "POST /api/containers/receive").containers;
}

export function useReceiveContainers() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: receiveContainers, onSuccess: () => queryClient.invalidateQueries({ queryKey: stockKeys.containers() }) });
}
