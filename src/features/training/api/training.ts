/**
 * Training records and requests: GET/POST /api/training, POST /api/training/:id/revoke,
 * GET /api/training/people, GET/POST /api/training/requests, POST /api/training/requests/:id/close.
 */
import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { pageOf } from "@shared/schemas/common";
import { trainablePersonDto, trainingDto, trainingRequestDto, type GrantTrainingInput, type TrainingListQuery } from "@shared/schemas/training";
import { api, parseResponse } from "@/lib/api-client";

export const trainingKeys = {
  all: ["training"] as const,
  list: (q: Partial<TrainingListQuery>) => [...trainingKeys.all, "list", q] as const,
  requests: (status?: string) => [...trainingKeys.all, "requests", status ?? "all"] as const,
  people: () => [...trainingKeys.all, "people"] as const,
};

const page = pageOf(trainingDto);
const requestPage = pageOf(trainingRequestDto);
const peoplePage = pageOf(trainablePersonDto);

export const trainingRecordsQueryOptions = (q: Partial<TrainingListQuery>) =>
  queryOptions({
    queryKey: trainingKeys.list(q),
    queryFn: async ({ signal }) => parseResponse(page, await api.get<unknown>("/training", { query: q, signal }), "GET /api/training"),
  });

export const useTrainingRecords = (q: Partial<TrainingListQuery>) => useQuery(trainingRecordsQueryOptions(q));

export const trainingRequestsQueryOptions = (status?: "open" | "granted" | "dismissed") =>
  queryOptions({
    queryKey: trainingKeys.requests(status),
    queryFn: async ({ signal }) => parseResponse(requestPage, await api.get<unknown>("/training/requests", { query: { status }, signal }), "GET /api/training/requests").items,
  });

export const useTrainingRequests = (status?: "open" | "granted" | "dismissed") => useQuery(trainingRequestsQueryOptions(status));

export const trainablePeopleQueryOptions = () =>
  queryOptions({
    queryKey: trainingKeys.people(),
    queryFn: async ({ signal }) => parseResponse(peoplePage, await api.get<unknown>("/training/people", { signal }), "GET /api/training/people"),
  });

export const useTrainablePeople = (enabled: boolean) => useQuery({ ...trainablePeopleQueryOptions(), enabled });

function useInvalidateTraining() {
  const qc = useQueryClient();
  return () => Promise.all([qc.invalidateQueries({ queryKey: trainingKeys.all }), qc.invalidateQueries({ queryKey: ["dashboard"] })]);
}

export function useGrantTraining() {
  const invalidate = useInvalidateTraining();
  return useMutation({ mutationFn: (input: GrantTrainingInput) => api.post("/training", input), onSuccess: invalidate });
}

export function useRevokeTraining() {
  const invalidate = useInvalidateTraining();
  return useMutation({ mutationFn: ({ id, reason }: { id: number; reason: string }) => api.post(`/training/${id}/revoke`, { reason }), onSuccess: invalidate });
}

export function useRequestTraining() {
  const invalidate = useInvalidateTraining();
  return useMutation({ mutationFn: (input: { instrumentId: number; note: string }) => api.post("/training/requests", input), onSuccess: invalidate });
}

export function useCloseTrainingRequest() {
  const invalidate = useInvalidateTraining();
  return useMutation({
    mutationFn: ({ id, outcome }: { id: number; outcome: "granted" | "dismissed" }) => api.post(`/training/requests/${id}/close`, { outcome }),
    onSuccess: invalidate,
  });
}
