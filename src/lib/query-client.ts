/**
 * The app's QueryClient. Its cache handlers are the one place a 401 turns into a trip to the
 * sign-in page (with `next` set to where the person was), so fetchers and screens never handle
 * an expired session themselves.
 */
import { MutationCache, QueryCache, QueryClient } from "@tanstack/react-query";
import { ApiError } from "./api-client";
import { isPublicPath, paths } from "@/config/paths";

declare module "@tanstack/react-query" {
  interface Register {
    defaultError: Error;
    /** `authRedirect: false` marks a request whose 401 means something else (wrong password at sign-in). */
    queryMeta: { authRedirect?: boolean };
    mutationMeta: { authRedirect?: boolean };
  }
}

let redirecting = false;
const LAST_REDIRECT_KEY = "phasebook.auth-redirect-at";

/**
 * If the session endpoint and another endpoint disagree (one says signed in, the other 401),
 * sign-in would bounce straight back and the page would reload forever; one trip per ten seconds stops that.
 */
function redirectedJustNow(): boolean {
  try {
    const last = Number(window.sessionStorage.getItem(LAST_REDIRECT_KEY) ?? 0);
    const now = Date.now();
    if (now - last < 10_000) return true;
    window.sessionStorage.setItem(LAST_REDIRECT_KEY, String(now));
  } catch {
    // Storage may be blocked (private mode); the in-memory flag still prevents repeats within this page.
  }
  return false;
}

function sendToSignIn(): void {
  const { pathname, search, hash } = window.location;
  if (redirecting || isPublicPath(pathname) || redirectedJustNow()) return;
  redirecting = true;
  // A full navigation also drops every cached answer that belonged to the lost session.
  window.location.assign(paths.signIn.getHref(`${pathname}${search}${hash}`));
}

function handleError(error: Error, meta: { authRedirect?: boolean } | undefined): void {
  if (error instanceof ApiError && error.status === 401 && meta?.authRedirect !== false) sendToSignIn();
}

export function createQueryClient(): QueryClient {
  return new QueryClient({
    queryCache: new QueryCache({ onError: (error, query) => handleError(error, query.meta) }),
    mutationCache: new MutationCache({
      onError: (error, _variables, _result, mutation) => handleError(error, mutation.meta),
    }),
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        // Client errors (4xx) will not change on a retry; network blips and 5xx might.
        retry: (failureCount, error) =>
          !(error instanceof ApiError && error.status >= 400 && error.status < 500) && failureCount < 2,
        refetchOnWindowFocus: true,
      },
      mutations: { retry: false },
    },
  });
}
