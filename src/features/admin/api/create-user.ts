/** POST /api/users: an administrator adds a person (201 { user }). */
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { userAdminDto, type CreateUserInput, type UserAdminDto } from "@shared/schemas/users";
import { api, parseResponse } from "@/lib/api-client";
import { adminKeys } from "./keys";

const userResponse = z.object({ user: userAdminDto });

export async function createUser(input: CreateUserInput): Promise<UserAdminDto> {
  const data = await api.post<unknown>("/users", input);
  return parseResponse(userResponse, data, "POST /api/users").user;
}

export function useCreateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createUser,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: adminKeys.users() }),
  });
}
