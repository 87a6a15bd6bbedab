/**
 * The container's quick actions: POST /api/containers/:id/usage, /waste, /move, /hold, /release,
 * /empty. Each answers { container }; each invalidates that container and the lists.
 */
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { containerDto, type ContainerDto, type MoveInput, type UsageInput, type WasteAddInput } from "@shared/schemas/stock";
import { api, parseResponse } from "@/lib/api-client";
import { stockKeys } from "./keys";

const answer = z.object({ container: containerDto });

async function act(id: number, action: string, body?: unknown): Promise<ContainerDto> {
  const data = await api.post<unknown>(`/containers/${id}/${action}`, body ?? {});
  return parseResponse(answer, data, `POST /api/containers/:id/${action}`).container;
}

function useContainerAction<V>(id: number, run: (v: V) => Promise<ContainerDto>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: run,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: stockKeys.containers() }),
  });
}

export const useLogUsage = (id: number) => useContainerAction(id, (v: UsageInput) => act(id, "usage", v));
export const useAddWaste = (id: number) => useContainerAction(id, (v: WasteAddInput) => act(id, "waste", v));
export const useMoveContainer = (id: number) => useContainerAction(id, (v: MoveInput) => act(id, "move", v));
export const useHoldContainer = (id: number) => useContainerAction(id, (v: { reason: string }) => act(id, "hold", v));
export const useReleaseContainer = (id: number) => useContainerAction(id, () => act(id, "release"));
export const useEmptyContainer = (id: number) => useContainerAction(id, () => act(id, "empty"));
