/** PATCH /api/users/:id: roles, name, department, group, or (de)activation. */
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { userAdminDto, type UpdateUserInput, type UserAdminDto } from "@shared/schemas/users";
import { api, parseResponse } from "@/lib/api-client";
import { adminKeys } from "./keys";

const userResponse = z.object({ user: userAdminDto });

export async function updateUser(id: number, input: UpdateUserInput): Promise<UserAdminDto> {
  const data = await api.patch<unknown>(`/users/${id}`, input);
  return parseResponse(userResponse, data, "PATCH /api/users/:id").user;
}

export function useUpdateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, input }: { id: number; input: UpdateUserInput }) => updateUser(id, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: adminKeys.users() }),
  });
}
