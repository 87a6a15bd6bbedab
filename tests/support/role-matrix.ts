/**
 * Who may call each API route. The routes of the areas' route tables declare their own access
 * (server/http/route-table.ts); the role-matrix test reads those declarations from the app and
 * checks the server enforces each of them for every role. Two hand-kept tables remain:
 *
 * - CONTRACT_ACCESS: the "who" column of the HTTP contract as first published (API.md), so a
 *   declaration that drifts from the contract fails even though it is self-consistent;
 * - LEGACY_MATRIX: routes still mounted by hand-written routers, until their area moves to a
 *   route table.
 */
import type { Role } from "@shared/schemas/auth";

export const PUBLIC = "public" as const;
export const SIGNED_IN = "signed-in" as const;
export type Who = typeof PUBLIC | typeof SIGNED_IN | Role[];

/** The contract's own words on who may call its routes (API.md), with Phasebook's stated widenings. */
export const CONTRACT_ACCESS: Record<string, Who> = {
  "GET /api/health": PUBLIC,
  "GET /api/auth/csrf": PUBLIC,
  "POST /api/auth/login": PUBLIC,
  "POST /api/auth/logout": SIGNED_IN,
  "GET /api/auth/me": SIGNED_IN,
  "GET /api/instruments": SIGNED_IN,
  "GET /api/bookings": SIGNED_IN,
  // API.md: member; the manager books too.
  "POST /api/bookings": ["member", "manager"],
  "POST /api/bookings/:id/approve": ["manager"],
  "POST /api/bookings/:id/decline": ["manager"],
  "POST /api/bookings/:id/cancel": SIGNED_IN,
  "POST /api/bookings/:id/check-in": SIGNED_IN,
  "POST /api/bookings/:id/check-out": SIGNED_IN,
  "GET /api/calendar/:token.ics": PUBLIC,
  "GET /api/chemicals": SIGNED_IN,
  "POST /api/chemicals": ["manager", "safety_officer"],
  "GET /api/containers": SIGNED_IN,
  // API.md says "member"; the manager and the safety officer also work at the bench (BENCH_ROLES).
  "POST /api/containers/:id/usage": ["member", "manager", "safety_officer"],
  "POST /api/solutions/plan": ["member", "manager", "safety_officer"],
  "GET /api/scan/:labelToken": SIGNED_IN,
  "GET /api/labels.pdf": ["manager", "safety_officer"],
  "GET /api/safety/locations": ["safety_officer", "manager"],
  "GET /api/accounts": SIGNED_IN,
  "POST /api/billing/runs": ["manager"],
  "GET /api/billing/runs/:id/journal.csv": ["manager"],
  "POST /api/webhooks/stripe": PUBLIC,
  // Issue 12's contract routes: signed in.
  "POST /api/run-plans/preview": SIGNED_IN,
  "POST /api/run-plans/distribution": SIGNED_IN,
  "GET /api/ion-transfer/solvents": SIGNED_IN,
  "GET /api/ion-transfer/ions": SIGNED_IN,
};


/** A concrete path for a route pattern: ids that need not exist (404 still proves the role got through). */
export function examplePath(pattern: string): string {
  return pattern.replace(/:([A-Za-z]+)/g, (_m, name: string) => (/token/i.test(name) ? "no-such-token" : "999999"));
}
