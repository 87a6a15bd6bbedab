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
  // Stockroom and Safety review
  "GET /api/chemicals": SIGNED_IN,
  "POST /api/chemicals": ["manager", "safety_officer"],
  "GET /api/chemicals/export.csv": SIGNED_IN,
  "POST /api/chemicals/import": ["manager", "safety_officer"],
  "GET /api/chemicals/:id": SIGNED_IN,
  "PATCH /api/chemicals/:id": ["manager", "safety_officer"],
  "POST /api/chemicals/:id/hold": ["manager", "safety_officer"],
  "POST /api/chemicals/:id/release": ["manager", "safety_officer"],
  "GET /api/chemicals/:id/sds": SIGNED_IN,
  "POST /api/chemicals/:id/sds": ["manager", "safety_officer"],
  "GET /api/containers": SIGNED_IN,
  "GET /api/containers/export.csv": SIGNED_IN,
  "POST /api/containers/receive": ["manager", "safety_officer"],
  "POST /api/containers/import": ["manager", "safety_officer"],
  "GET /api/containers/:id": SIGNED_IN,
  // Everyone at the bench logs what they take (a manager or safety officer is also a member).
  "POST /api/containers/:id/usage": SIGNED_IN,
  "POST /api/containers/:id/move": SIGNED_IN,
  "POST /api/containers/:id/hold": ["manager", "safety_officer"],
  "POST /api/containers/:id/release": ["manager", "safety_officer"],
  "POST /api/containers/:id/empty": SIGNED_IN,
  "POST /api/containers/:id/dispose": ["manager", "safety_officer"],
  "POST /api/solutions/plan": SIGNED_IN,
  "POST /api/solutions": SIGNED_IN,
  "GET /api/locations": SIGNED_IN,
  "POST /api/locations": ["safety_officer", "manager"],
  "PATCH /api/locations/:id": ["safety_officer", "manager"],
  "DELETE /api/locations/:id": ["safety_officer", "manager"],
  "GET /api/safety/locations": ["safety_officer", "manager"],
  "GET /api/safety/review": ["safety_officer", "manager"],
  "GET /api/safety/sds-due": ["safety_officer", "manager"],
  "GET /api/safety/report.pdf": ["safety_officer", "manager"],
  "GET /api/sds/:id/file": SIGNED_IN,
};

/** A concrete path for a route pattern: ids that need not exist (404 still proves the role got through). */
export function examplePath(pattern: string): string {
  return pattern.replace(/:([A-Za-z]+)/g, (_m, name: string) => (/token/i.test(name) ? "no-such-token" : "999999"));
}
