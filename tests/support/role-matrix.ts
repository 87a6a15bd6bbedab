/**
 * Who may call each API route. PUBLIC: anyone, signed in or not. SIGNED_IN: every role.
 * Otherwise the roles allowed. Ownership rules (a member's own booking…) are tested beside
 * each feature; this table is about roles.
 */
import type { Role } from "@shared/schemas/auth";

export const PUBLIC = "public" as const;
export const SIGNED_IN = "signed-in" as const;
type Who = typeof PUBLIC | typeof SIGNED_IN | Role[];

export const ROLE_MATRIX: Record<string, Who> = {
  "GET /api/health": PUBLIC,
  "GET /api/auth/csrf": PUBLIC,
  "POST /api/auth/login": PUBLIC,
  "POST /api/auth/logout": SIGNED_IN,
  "GET /api/auth/me": SIGNED_IN,
  "POST /api/auth/password": SIGNED_IN,
  "POST /api/auth/password-reset/request": PUBLIC,
  "POST /api/auth/password-reset/confirm": PUBLIC,
  "GET /api/facility": PUBLIC,
  "GET /api/dashboard": SIGNED_IN,
  "GET /api/users": ["admin"],
  "POST /api/users": ["admin"],
  "PATCH /api/users/:id": ["admin"],
  "GET /api/departments": SIGNED_IN,
  "GET /api/groups": SIGNED_IN,
  "GET /api/instruments": SIGNED_IN,
  "GET /api/instruments/:id": SIGNED_IN,
  "GET /api/scan/:labelToken": SIGNED_IN,
  "GET /api/scan-actions/locations": SIGNED_IN,
  "POST /api/scan-actions/containers/:id/problem": SIGNED_IN,
  "POST /api/scan-actions/containers/:id/move": SIGNED_IN,
  "POST /api/scan-actions/containers/:id/empty": SIGNED_IN,
  "POST /api/scan-actions/containers/:id/dispose": SIGNED_IN,
  "POST /api/scan-actions/instruments/:id/cleaned": SIGNED_IN,
  "POST /api/scan-actions/instruments/:id/fault": SIGNED_IN,
  "GET /api/labels.pdf": ["manager", "safety_officer"],
  "GET /api/labels/stocks": ["manager", "safety_officer", "admin"],
  "POST /api/labels/stocks": ["manager", "admin"],
  "POST /api/labels/:type/:id/reissue": ["manager", "safety_officer"],
  "GET /api/labels/:type/:id/history": ["manager", "safety_officer"],
  "GET /api/audit": ["admin", "manager"],
  "GET /api/dev/mailbox": ["admin"],
};

/** A concrete path for a route pattern: ids that need not exist (404 still proves the role got through). */
export function examplePath(pattern: string): string {
  return pattern.replace(/:([A-Za-z]+)/g, (_m, name: string) => (/token/i.test(name) ? "no-such-token" : "999999"));
}
