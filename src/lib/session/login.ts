/** POST /api/auth/login. Sign-in replaces the session, so the CSRF token is fetched anew afterwards. */
import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { LoginInput, UserDto } from "@shared/schemas/auth";
import { api, refreshCsrfToken } from "@/lib/api-client";
import { sessionUser } from "@/lib/boot-answers";
import { authKeys } from "./keys";

export async function login(input: LoginInput): Promise<UserDto> {
  const data = await api.post<unknown>("/auth/login", input);
  return sessionUser(data, "POST /api/auth/login");
}

export function useLogin() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: login,
    // 401 here means "wrong e-mail or password", which the form explains; no redirect.
    meta: { authRedirect: false },
    onSuccess: async (user) => {
      await refreshCsrfToken();
      // Nothing cached before sign-in belongs to this person.
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== authKeys.all[0] });
      queryClient.setQueryData(authKeys.me(), user);
    },
  });
}
