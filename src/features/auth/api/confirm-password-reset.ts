/** POST /api/auth/password-reset/confirm: sets a new password from an e-mailed link (422 when used or expired). */
import { useMutation } from "@tanstack/react-query";
import type { ResetConfirmInput } from "@shared/schemas/auth";
import { api } from "@/lib/api-client";

export function confirmPasswordReset(input: ResetConfirmInput): Promise<void> {
  return api.post<void>("/auth/password-reset/confirm", input);
}

export function useConfirmPasswordReset() {
  return useMutation({ mutationFn: confirmPasswordReset, meta: { authRedirect: false } });
}
