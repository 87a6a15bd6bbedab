/**
 * POST /api/auth/logout. Afterwards the page is loaded afresh at the sign-in screen: on a shared
 * bench computer nothing of the previous person's data may stay in memory, and the new page
 * fetches the new session's CSRF token before its first state-changing request.
 */
import { useMutation } from "@tanstack/react-query";
import { api, isApiError } from "@/lib/api-client";
import { paths } from "@/config/paths";

export async function logout(): Promise<void> {
  try {
    await api.post<void>("/auth/logout");
  } catch (error) {
    // Already signed out (expired session): the goal is reached.
    if (!isApiError(error, 401)) throw error;
  }
}

export function useLogout() {
  return useMutation({
    mutationFn: logout,
    meta: { authRedirect: false },
    onSuccess: () => {
      window.location.assign(paths.signIn.getHref());
    },
  });
}
