/** POST /api/auth/password-reset/request: always 202, so the answer never reveals whether an address has an account. */
import { useMutation } from "@tanstack/react-query";
import type { ResetRequestInput } from "@shared/schemas/auth";
import { api } from "@/lib/api-client";

export function requestPasswordReset(input: ResetRequestInput): Promise<void> {
  return api.post<void>("/auth/password-reset/request", input);
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
