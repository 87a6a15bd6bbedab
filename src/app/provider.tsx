/** Everything the app needs around its router: the QueryClient and a last-resort error boundary. */
import { useState, type ReactNode } from "react";
import { QueryClientProvider, type QueryClient } from "@tanstack/react-query";
import { createQueryClient } from "@/lib/query-client";
import { seedFromPage } from "@/lib/session/page-boot";
import { AppErrorBoundary } from "@/components/errors/error-boundary";

/** A QueryClient holding what the page load brought with it (the session, the facility). */
export function createAppQueryClient(): QueryClient {
  const qc = createQueryClient();
  seedFromPage(qc);
  return qc;
}

export function AppProvider({ client, children }: { client?: QueryClient; children: ReactNode }) {
  const [queryClient] = useState(() => client ?? createAppQueryClient());
  return (
    <AppErrorBoundary>
      <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>
    </AppErrorBoundary>
  );
}
