/**
 * What the form tests share: signing in to the component tests' server (global-setup.ts) with
 * Phasebook's own client, reading demo records through the API, and rendering a component inside
 * the app's real QueryClient and a router, as the app does.
 */
import type { ReactNode } from "react";
import { QueryClientProvider } from "@tanstack/react-query";
import { createMemoryRouter, RouterProvider } from "react-router-dom";
import { render } from "@testing-library/react";
import { api, refreshCsrfToken } from "@/lib/api-client";
import { login } from "@/lib/session/login";
import { logout } from "@/lib/session/logout";
import { createQueryClient } from "@/lib/query-client";

export const DEMO_PASSWORD = "phasebook-demo";
export const FACILITY_TZ = "America/Halifax";

/** Signs in as a demo person (the session cookie stays in happy-dom's cookie jar). */
export async function signInAs(email: string): Promise<{ id: number; roles: string[] }> {
  await logout().catch(() => undefined);
  await refreshCsrfToken();
  const user = await login({ email, password: DEMO_PASSWORD });
  await refreshCsrfToken();
  return user;
}

export const get = <T,>(path: string) => api.get<T>(path);

/** Renders `ui` as one screen of the app: the app's QueryClient (or one a test filled first) and a memory router around it. */
export function renderScreen(ui: ReactNode, queryClient = createQueryClient()) {
  const router = createMemoryRouter([{ path: "*", element: ui }], { initialEntries: ["/"] });
  return { queryClient, ...render(<QueryClientProvider client={queryClient}><RouterProvider router={router} /></QueryClientProvider>) };
}
