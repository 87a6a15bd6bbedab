/** POST /api/auth/password: a signed-in person changes their own password (422 when the current one is wrong). */
import { useMutation } from "@tanstack/react-query";
import type { ChangePasswordInput } from "@shared/schemas/auth";
import { api, refreshCsrfToken } from "@/lib/api-client";

export function changePassword(input: ChangePasswordInput): Promise<void> {
  return api.post<void>("/auth/password", input);
}

export function useChangePassword() {
  return useMutation({
    mutationFn: changePassword,
    // The server may rotate the session on a password change; the next request then needs its token.
    onSuccess: () => refreshCsrfToken(),
  });
}
