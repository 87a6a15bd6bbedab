/**
 * What every route loader shares. A loader starts the screen's queries with the same
 * `queryOptions` its components use, while the router fetches the screen's code, so the data
 * and the code arrive together instead of one after the other. Moving from one screen to another,
 * it waits for them a short while (the next screen then opens complete, without spinners, while
 * the last one stays in view), never for ever: a slow answer is left to the screen's own loading
 * line. On the page's first load there is no screen in view yet, so nothing waits: the screen
 * appears (its title, its words, its loading lines) as soon as its code has arrived, and its data
 * fills in. Errors are left to the screens too: `prefetchQuery` never throws, and the component's
 * query shows the error in words where it belongs.
 */
import type { QueryClient } from "@tanstack/react-query";
import type { LoaderFunctionArgs } from "react-router-dom";
import type { Role, UserDto } from "@shared/schemas/auth";
import { meQueryOptions } from "@/lib/session/get-me";
import { hasRole } from "@/lib/auth";

export type ScreenLoader = (qc: QueryClient, args: LoaderFunctionArgs, user: UserDto) => Promise<unknown>[] | void;

/** How long a navigation waits for a screen's data before showing the screen with its loading lines. */
const PATIENCE_MS = 2500;

/**
 * Runs a screen's loader for a signed-in person with one of `roles` (any, when absent). Nobody
 * signed in, or not the right role: nothing is fetched, and the route's guard answers.
 */
export async function runLoader(
  qc: QueryClient,
  args: LoaderFunctionArgs,
  load: ScreenLoader,
  roles: readonly Role[] | undefined,
  firstLoad: boolean,
): Promise<null> {
  const user = await qc.ensureQueryData(meQueryOptions()).catch(() => null);
  if (!user || (roles && roles.length > 0 && !hasRole(user, ...roles))) return null;
  const pending = load(qc, args, user) ?? [];
  if (pending.length > 0 && !firstLoad) {
    let timer: ReturnType<typeof setTimeout> | undefined;
    await Promise.race([Promise.all(pending), new Promise((resolve) => (timer = setTimeout(resolve, PATIENCE_MS)))]);
    clearTimeout(timer);
  }
  return null;
}

/** A positive whole-number route parameter, or null (the screen shows its own "not found"). */
export function idParam(args: LoaderFunctionArgs, name = "id"): number | null {
  const id = Number(args.params[name]);
  return Number.isInteger(id) && id > 0 ? id : null;
}
