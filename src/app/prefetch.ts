/**
 * Prefetch on intent: when the pointer rests on a link inside Phasebook, or the link gets the
 * keyboard's focus, the code of the screen it leads to starts loading (the route's lazy parts;
 * the browser keeps each module once). One listener on the document covers every link, in the
 * navigation and inside the screens, without each of them knowing about it. Data is not fetched
 * here: the screen's loader does that when the person actually goes.
 */
import { matchRoutes, type RouteObject } from "react-router-dom";

type LazyParts = Record<string, (() => Promise<unknown>) | undefined>;

/** Starts loading the lazy code of every route that `pathname` matches; safe to call again. */
export function warmRoute(routes: RouteObject[], pathname: string): void {
  for (const { route } of matchRoutes(routes, pathname) ?? []) {
    const lazy = route.lazy as LazyParts | (() => Promise<unknown>) | undefined;
    if (typeof lazy === "function") void lazy().catch(() => undefined);
    else if (lazy) for (const part of Object.values(lazy)) void part?.().catch(() => undefined);
  }
}

/** Listens for intent on links (pointer over, focus, touch) and warms their screens; returns the clean-up. */
export function warmLinksOnIntent(routes: RouteObject[]): () => void {
  const warmed = new Set<string>();
  const onIntent = (event: Event) => {
    const link = event.target instanceof Element ? event.target.closest("a[href]") : null;
    if (!(link instanceof HTMLAnchorElement) || link.target === "_blank" || link.hasAttribute("download")) return;
    const url = new URL(link.href, window.location.href);
    if (url.origin !== window.location.origin || url.pathname.startsWith("/api/") || warmed.has(url.pathname)) return;
    warmed.add(url.pathname);
    warmRoute(routes, url.pathname);
  };
  const events = ["pointerover", "focusin", "touchstart"] as const;
  for (const type of events) document.addEventListener(type, onIntent, { passive: true });
  return () => {
    for (const type of events) document.removeEventListener(type, onIntent);
  };
}
