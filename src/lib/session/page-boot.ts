/**
 * What the server wrote into this page load (server/http/page-boot.ts): who is signed in and the
 * facility's settings, the answers GET /api/auth/me and GET /api/facility would give. They go into
 * the QueryClient before the first screen asks, so the first screen needs no round trip for them.
 * Read once: the block is removed, and anything later (a remount, another tab's sign-out noticed
 * on focus) asks the server as usual. Checked like the answers themselves (boot-answers.ts); a
 * page without the block (the development server's) simply asks.
 */
import type { QueryClient } from "@tanstack/react-query";
import { facilityAnswer, sessionUser } from "@/lib/boot-answers";
import { facilityQueryOptions } from "@/lib/facility";
import { authKeys } from "./keys";

export const PAGE_BOOT_ID = "phasebook-boot";

export function seedFromPage(qc: QueryClient, doc: Document = document): void {
  const block = doc.getElementById(PAGE_BOOT_ID);
  if (!block) return;
  block.remove();
  let boot: { user?: unknown; facility?: unknown };
  try {
    boot = JSON.parse(block.textContent ?? "") as typeof boot;
  } catch {
    return;
  }
  if (typeof boot !== "object" || boot === null) return;
  try {
    if ("user" in boot) qc.setQueryData(authKeys.me(), boot.user === null ? null : sessionUser({ user: boot.user }, "the page's session block"));
    if ("facility" in boot) qc.setQueryData(facilityQueryOptions().queryKey, facilityAnswer(boot.facility));
  } catch {
    // A block the client does not understand is no worse than no block: the queries ask the server.
    qc.removeQueries({ queryKey: authKeys.me() });
    qc.removeQueries({ queryKey: facilityQueryOptions().queryKey });
  }
}
