/**
 * Phasebook's client entry. The router starts on the first address before React renders, so the
 * first paint is the first screen itself (its code loaded, the session known from the page), not
 * a spinner in front of it; until then the page shows the waiting line index.html carries. The
 * first render runs as a transition: React renders it in slices and leaves the main thread free
 * between them, instead of one long block on a slow phone. For the same reason the app starts in
 * the task after the one that evaluates the libraries, and in three short tasks rather than one
 * long one: the query client (with the answers the page carried), then the router (ranking the
 * routes), then its start on the first address (matching it, starting the screen's code and data).
 */
import { StrictMode, startTransition } from "react";
import { createRoot } from "react-dom/client";
import { AppProvider, createAppQueryClient } from "./app/provider";
import { AppRouter, createAppRouter, routerReady } from "./app/router";
import "./styles/index.css";

const root = document.getElementById("root");
if (!root) throw new Error("index.html has no #root element");

/** Resolves in a task of its own, after what is queued now: what follows the `await` runs there. */
const nextTask = () => new Promise<void>((resolve) => setTimeout(resolve));

async function start(container: HTMLElement) {
  await nextTask();
  const queryClient = createAppQueryClient();
  await nextTask();
  const router = createAppRouter(queryClient);
  await nextTask();
  router.initialize();
  await routerReady(router);
  startTransition(() =>
    createRoot(container).render(
      <StrictMode>
        <AppProvider client={queryClient}>
          <AppRouter router={router} />
        </AppProvider>
      </StrictMode>,
    ),
  );
}

void start(root);
